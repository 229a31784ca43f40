import { TENANT_STATE_LABELS, type TenantState } from '@domain/tenant-states';
import { Badge, type BadgeTone } from '@/components/ui/badge';

const TONES: Record<TenantState, BadgeTone> = {
  trialing: 'brass',
  active: 'ok',
  past_due: 'warn',
  suspended: 'bad',
  cancelled: 'neutral',
};

export function TenantStateBadge({ state }: { state: TenantState }) {
  return <Badge tone={TONES[state]}>{TENANT_STATE_LABELS[state]}</Badge>;
}
