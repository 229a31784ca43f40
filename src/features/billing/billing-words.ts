/** The Billing page's sentences: state in words, plan fit, invoice states. */
import { formatCents } from '@domain/plans';
import type { BadgeTone } from '@/components/ui/badge';
import { formatDate } from '@/lib/format';
import type { ApiBilling } from '@/types/api';

const count = new Intl.NumberFormat('en-US');

/** The badge beside the page title: a word and a tone (the word carries the meaning). */
export function stateBadge(billing: ApiBilling): { label: string; tone: BadgeTone } {
  if (billing.readOnly?.code === 'trial_ended') return { label: 'Trial ended', tone: 'bad' };
  switch (billing.state) {
    case 'trialing':
      return { label: billing.stateLabel, tone: 'brass' };
    case 'active':
      return { label: billing.stateLabel, tone: 'ok' };
    case 'past_due':
      return { label: billing.stateLabel, tone: billing.readOnly ? 'bad' : 'warn' };
    case 'cancelled':
    case 'suspended':
      return { label: billing.stateLabel, tone: 'bad' };
  }
}

/** One line of context under the title: where the firm stands and the date that matters next. */
export function billingContext(billing: ApiBilling, timeZone?: string): string {
  const on = (iso: string | null) => formatDate(iso, timeZone);
  const plan = billing.plan ? `${billing.plan.name} plan, ${formatCents(billing.plan.monthlyPriceCents)} a month` : null;
  switch (billing.state) {
    case 'trialing': {
      if (billing.readOnly?.code === 'trial_ended') return `Trial ended on ${on(billing.trialEndsAt)}. Choose a plan to carry on.`;
      if (plan) return billing.trialEndsAt ? `${plan}, trial ends ${on(billing.trialEndsAt)}` : plan;
      const days = billing.trialDaysLeft;
      if (days === null || !billing.trialEndsAt) return 'Trial';
      return `Trial — ${days} ${days === 1 ? 'day' : 'days'} left, ends ${on(billing.trialEndsAt)}`;
    }
    case 'active':
      if (!plan) return 'Subscription active';
      if (!billing.currentPeriodEnd) return plan;
      return `${plan}, ${billing.cancelAtPeriodEnd ? 'ends' : 'renews'} ${on(billing.currentPeriodEnd)}`;
    case 'past_due':
      if (!billing.pastDueSince) return 'A payment failed. Update your card to keep your plan.';
      if (billing.readOnly) return `Payment failed on ${on(billing.pastDueSince)}; the grace period ended on ${on(billing.graceEndsAt)}.`;
      return `Payment failed on ${on(billing.pastDueSince)}; you have until ${on(billing.graceEndsAt)} to update your card.`;
    case 'cancelled':
      return 'Your subscription has ended. Choose a plan to carry on.';
    case 'suspended':
      return 'The service operator has suspended this firm.';
  }
}

/** True once the firm's subscription is in place (what the return from Checkout waits for). */
export function isSubscribed(billing: ApiBilling | undefined): boolean {
  return Boolean(billing && billing.hasSubscription && billing.plan && (billing.state === 'active' || billing.state === 'trialing'));
}

/**
 * Why a plan cannot hold what the firm already uses ("You have 120 active sites; Bench allows
 * 75."), or null when it fits. Being exactly at a limit still fits.
 */
export function planMisfit(plan: { name: string; activeSites: number; staffSeats: number }, usage: ApiBilling['usage']): string | null {
  const reasons: string[] = [];
  if (usage.activeSites > plan.activeSites)
    reasons.push(`You have ${count.format(usage.activeSites)} active sites; ${plan.name} allows ${count.format(plan.activeSites)}.`);
  if (usage.staffSeats > plan.staffSeats)
    reasons.push(`You have ${count.format(usage.staffSeats)} staff seats in use; ${plan.name} allows ${count.format(plan.staffSeats)}.`);
  return reasons.length > 0 ? reasons.join(' ') : null;
}

const INVOICE_STATES: Record<string, { label: string; tone: BadgeTone }> = {
  paid: { label: 'Paid', tone: 'ok' },
  open: { label: 'Due', tone: 'warn' },
  draft: { label: 'Draft', tone: 'neutral' },
  void: { label: 'Void', tone: 'neutral' },
  uncollectible: { label: 'Not collected', tone: 'bad' },
};

export function invoiceState(status: string | null): { label: string; tone: BadgeTone } {
  if (!status) return { label: 'Unknown', tone: 'neutral' };
  return INVOICE_STATES[status] ?? { label: status.charAt(0).toUpperCase() + status.slice(1).replace(/_/g, ' '), tone: 'neutral' };
}
