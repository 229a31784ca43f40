/** The plan catalogue must match product.md ("Billing") exactly. */
import { describe, expect, it } from 'vitest';
import { PLANS, PLAN_KEYS, formatCents, planByKey } from '@domain/plans';
import { TRIAL_DAYS } from '@domain/tenant-states';

describe('PLANS', () => {
  it('is Bench, Crew and Fleet with the seats, sites, prices and trial of product.md', () => {
    const catalogue = PLANS.map(({ key, name, staffSeats, activeSites, monthlyPriceCents, trialDays }) => ({
      key,
      name,
      staffSeats,
      activeSites,
      monthlyPriceCents,
      trialDays,
    }));
    expect(catalogue).toEqual([
      { key: 'bench', name: 'Bench', staffSeats: 3, activeSites: 75, monthlyPriceCents: 4900, trialDays: 14 },
      { key: 'crew', name: 'Crew', staffSeats: 10, activeSites: 400, monthlyPriceCents: 14900, trialDays: 14 },
      { key: 'fleet', name: 'Fleet', staffSeats: 40, activeSites: 2000, monthlyPriceCents: 39900, trialDays: 14 },
    ]);
  });

  it('lists the plan keys in catalogue order', () => {
    expect(PLAN_KEYS).toEqual(['bench', 'crew', 'fleet']);
    expect(PLANS.map((p) => p.key)).toEqual([...PLAN_KEYS]);
  });

  it('gives every plan the same trial as a new firm gets', () => {
    for (const plan of PLANS) expect(plan.trialDays, plan.key).toBe(TRIAL_DAYS);
  });

  it('keeps prices in integer cents and gives every plan a pitch', () => {
    for (const plan of PLANS) {
      expect(Number.isInteger(plan.monthlyPriceCents), plan.key).toBe(true);
      expect(plan.pitch.trim().length, plan.key).toBeGreaterThan(0);
    }
  });
});

describe('planByKey', () => {
  it('finds each plan by its key', () => {
    expect(planByKey('bench')?.name).toBe('Bench');
    expect(planByKey('crew')?.staffSeats).toBe(10);
    expect(planByKey('fleet')?.activeSites).toBe(2000);
  });

  it('answers undefined for an unknown key', () => {
    expect(planByKey('enterprise')).toBeUndefined();
    expect(planByKey('')).toBeUndefined();
  });
});

describe('formatCents', () => {
  it('shows whole dollars without cents', () => {
    expect(formatCents(4900)).toBe('$49');
    expect(formatCents(14900)).toBe('$149');
    expect(formatCents(39900)).toBe('$399');
    expect(formatCents(0)).toBe('$0');
  });

  it('shows cents and a thousands separator when there are cents', () => {
    expect(formatCents(123450)).toBe('$1,234.50');
    expect(formatCents(14950)).toBe('$149.50');
    expect(formatCents(5)).toBe('$0.05');
  });

  it('formats each plan price as product.md writes it', () => {
    expect(PLANS.map((p) => formatCents(p.monthlyPriceCents))).toEqual(['$49', '$149', '$399']);
  });
});
