/**
 * The signed-in person's abilities on the client, built from the rules GET /api/session
 * sends (the same rules the server enforces). They only shape the UI: the server decides.
 */
import { useMemo } from 'react';
import { AbilityProvider, Can, useAbility } from '@casl/react';
import { createAbility, type AppAbility, type AppRule } from '@domain/abilities';

export { AbilityProvider, Can };

export function useAppAbility(): AppAbility {
  return useAbility<AppAbility>();
}

export function useAbilityFromRules(rules: AppRule[]): AppAbility {
  return useMemo(() => createAbility(rules), [rules]);
}
