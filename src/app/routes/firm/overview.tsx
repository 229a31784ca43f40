import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { CheckCircle2, Circle } from 'lucide-react';
import { planByKey, formatCents } from '@domain/plans';
import { TENANT_STATE_LABELS } from '@domain/tenant-states';
import { ROLE_LABELS } from '@domain/roles';
import { paths } from '@/config/paths';
import { Badge } from '@/components/ui/badge';
import { Card } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { useAppAbility } from '@/lib/ability';
import { useSession } from '@/lib/auth';
import { formatDate } from '@/lib/format';
import { staffListQuery } from '@/features/staff/api/staff-queries';

export default function OverviewPage() {
  const { user, tenant } = useSession();
  const ability = useAppAbility();
  const isOwner = ability.can('update', 'Tenant');
  const staff = useQuery({ ...staffListQuery({ page: 1, pageSize: 100 }), enabled: ability.can('read', 'User') });
  const plan = tenant?.planKey ? planByKey(tenant.planKey) : undefined;
  const people = staff.data?.data ?? [];
  const active = people.filter((p) => p.active);
  const firstName = user?.name.split(' ')[0] ?? '';

  const steps = [
    { done: !!tenant?.licenceNumber && !!tenant.monitoringCenterName, label: 'Complete the firm profile: licence number and monitoring center', to: paths.firm.settings },
    { done: !!tenant?.logoUrl, label: 'Add your logo for the client portal', to: paths.firm.settings },
    { done: active.some((p) => p.role === 'coordinator'), label: 'Invite your office coordinator', to: paths.firm.staff },
    { done: active.some((p) => p.role === 'technician'), label: 'Invite your technicians', to: paths.firm.staff },
  ];

  return (
    <>
      <PageHeader title={`Good to see you, ${firstName}`} context={`${tenant?.name ?? ''} · signed in as ${user ? ROLE_LABELS[user.role].toLowerCase() : ''}`} />
      <div className="grid gap-6 lg:grid-cols-3">
        <Card title="Subscription" className="lg:col-span-1">
          <dl className="space-y-3 text-sm">
            <div className="flex items-center justify-between gap-2">
              <dt className="text-slate-500">State</dt>
              <dd>{tenant?.state && <Badge tone={tenant.state === 'active' ? 'ok' : tenant.state === 'trialing' ? 'brass' : 'bad'}>{TENANT_STATE_LABELS[tenant.state]}</Badge>}</dd>
            </div>
            {tenant?.state === 'trialing' && (
              <div className="flex items-center justify-between gap-2">
                <dt className="text-slate-500">Trial ends</dt>
                <dd>
                  {formatDate(tenant.trialEndsAt, tenant.timeZone)} ({tenant.trialDaysLeft} {tenant.trialDaysLeft === 1 ? 'day' : 'days'} left)
                </dd>
              </div>
            )}
            <div className="flex items-center justify-between gap-2">
              <dt className="text-slate-500">Plan</dt>
              <dd>{plan ? `${plan.name} · ${formatCents(plan.monthlyPriceCents)}/month` : 'None chosen yet'}</dd>
            </div>
            {plan && (
              <div className="flex items-center justify-between gap-2">
                <dt className="text-slate-500">Staff seats</dt>
                <dd>
                  {active.length} of {plan.staffSeats}
                </dd>
              </div>
            )}
          </dl>
        </Card>

        <Card title={isOwner ? 'Getting your firm ready' : 'Your firm'} className="lg:col-span-2">
          {isOwner ? (
            <ol className="space-y-3">
              {steps.map((s) => (
                <li key={s.label} className="flex items-start gap-3 text-sm">
                  {s.done ? <CheckCircle2 className="mt-0.5 size-4 shrink-0 text-sage-600" aria-hidden="true" /> : <Circle className="mt-0.5 size-4 shrink-0 text-slate-500" aria-hidden="true" />}
                  <span className={s.done ? 'text-slate-500 line-through' : ''}>
                    <span className="sr-only">{s.done ? 'Done: ' : 'To do: '}</span>
                    {s.done ? (
                      s.label
                    ) : (
                      <Link to={s.to} className="font-medium text-brass-700 underline">
                        {s.label}
                      </Link>
                    )}
                  </span>
                </li>
              ))}
            </ol>
          ) : (
            <dl className="grid gap-3 text-sm sm:grid-cols-2">
              <div>
                <dt className="text-slate-500">Monitoring center</dt>
                <dd className="font-medium">{tenant?.monitoringCenterName || 'Not set yet'}</dd>
              </div>
              <div>
                <dt className="text-slate-500">Monitoring center phone</dt>
                <dd className="font-mono">{tenant?.monitoringCenterPhone || '—'}</dd>
              </div>
              <div>
                <dt className="text-slate-500">Licence</dt>
                <dd className="font-mono">{tenant?.licenceNumber || '—'}</dd>
              </div>
              <div>
                <dt className="text-slate-500">Colleagues</dt>
                <dd>
                  <Link to={paths.firm.staff} className="font-medium text-brass-700 underline">
                    {active.length} active
                  </Link>
                </dd>
              </div>
            </dl>
          )}
        </Card>
      </div>
    </>
  );
}
