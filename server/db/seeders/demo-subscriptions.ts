/**
 * The demo's subscription history, so the operator's revenue view has a year to show: the two
 * demo firms' own changes, and a handful of small invented firms that joined, changed plan,
 * fell behind or left over the last twelve months. Invented names only.
 */
import type { Transaction } from 'sequelize';
import { planByKey, type PlanKey } from '@domain/plans';
import type { TenantState } from '@domain/tenant-states';
import { SubscriptionChange } from '../../models/SubscriptionChange';
import { Tenant } from '../../models/Tenant';
import { User } from '../../models/User';

const DAY_MS = 24 * 60 * 60 * 1000;

type Step = [daysAgo: number, state: TenantState, plan: PlanKey | null];

/** Small firms that exist only as subscribers (one owner each, no installed base). */
const OTHER_FIRMS: { name: string; shortName: string; owner: string; steps: Step[] }[] = [
  { name: 'Hollowmere Alarms', shortName: 'hollowmere', owner: 'Ines Calloway', steps: [[350, 'trialing', null], [336, 'active', 'bench'], [180, 'active', 'crew']] },
  { name: 'Brackenridge Security', shortName: 'brackenridge', owner: 'Tomas Reyes', steps: [[300, 'trialing', null], [286, 'active', 'crew']] },
  { name: 'Saltmarsh Systems', shortName: 'saltmarsh', owner: 'Petra Lund', steps: [[270, 'trialing', null], [256, 'active', 'bench'], [120, 'past_due', 'bench'], [112, 'active', 'bench']] },
  { name: 'Kestrel Gate Alarms', shortName: 'kestrel-gate', owner: 'Oren Blake', steps: [[240, 'trialing', null], [226, 'active', 'bench'], [60, 'cancelled', 'bench']] },
  { name: 'Orchard Lane Protection', shortName: 'orchard-lane', owner: 'Maud Ferris', steps: [[200, 'trialing', null], [186, 'active', 'fleet']] },
  { name: 'Wicklow Ridge Alarms', shortName: 'wicklow-ridge', owner: 'Jonah Pryce', steps: [[90, 'trialing', null], [76, 'active', 'bench']] },
  { name: 'Fennick & Daughters', shortName: 'fennick', owner: 'Ada Fennick', steps: [[10, 'trialing', null]] },
];

function amountOf(state: TenantState, plan: PlanKey | null): number {
  return (state === 'active' || state === 'past_due') && plan ? (planByKey(plan)?.monthlyPriceCents ?? 0) : 0;
}

async function recordSteps(tenantId: string, steps: Step[], now: Date, transaction: Transaction): Promise<void> {
  for (const [daysAgo, state, plan] of steps) {
    await SubscriptionChange.create(
      { tenantId, planKey: plan, state, monthlyAmountCents: amountOf(state, plan), from: new Date(now.getTime() - daysAgo * DAY_MS), stripeEventId: null },
      { transaction },
    );
  }
}

/** History rows for a demo firm created `createdDaysAgo` days ago that is now in `state` on `plan`. */
export async function seedFirmSubscriptionHistory(
  tenant: Pick<Tenant, 'id'>,
  input: { createdDaysAgo: number; state: TenantState; plan: PlanKey | null; trialDays: number; now: Date; transaction: Transaction },
): Promise<void> {
  const steps: Step[] = [[input.createdDaysAgo, 'trialing', null]];
  if (input.state !== 'trialing') steps.push([input.createdDaysAgo - input.trialDays, input.state, input.plan]);
  await recordSteps(tenant.id, steps, input.now, input.transaction);
}

/** The other invented subscribers, each with one owner (sign-in with the demo password). */
export async function seedOtherSubscribers(options: { now: Date; passwordHash: string; transaction: Transaction }): Promise<void> {
  const { now, transaction } = options;
  for (const firm of OTHER_FIRMS) {
    const [firstDaysAgo] = firm.steps[0]!;
    const [, state, plan] = firm.steps[firm.steps.length - 1]!;
    const created = new Date(now.getTime() - firstDaysAgo * DAY_MS);
    const tenant = await Tenant.create(
      {
        name: firm.name,
        shortName: firm.shortName,
        state,
        planKey: plan,
        trialEndsAt: new Date(created.getTime() + 14 * DAY_MS),
        pastDueSince: state === 'past_due' ? new Date(now.getTime() - 3 * DAY_MS) : null,
        timeZone: 'America/Chicago',
        createdAt: created,
      },
      { transaction },
    );
    const local = firm.owner.split(' ')[0]!.toLowerCase();
    await User.create({ tenantId: tenant.id, email: `${local}@${firm.shortName}.example`, name: firm.owner, role: 'owner', passwordHash: options.passwordHash }, { transaction });
    await recordSteps(tenant.id, firm.steps, now, transaction);
  }
}
