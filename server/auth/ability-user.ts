import type { AbilityUser } from '@domain/abilities';
import type { User } from '../models/User';

/** The fields of a signed-in user that abilities depend on. */
export function abilityUserOf(user: User): AbilityUser {
  return { id: user.id, role: user.role, tenantId: user.tenantId, clientId: user.clientId ?? null };
}
