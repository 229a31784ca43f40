import { describe, expect, it } from 'vitest';
import { contractEndsOn, dateState } from '@/features/sites/site-dates';

describe('site dates', () => {
  it('marks a permit expired, due for renewal within 60 days, or fine', () => {
    expect(dateState('2026-11-30', '2026-12-01')).toBe('past');
    expect(dateState('2026-12-01', '2026-12-01')).toBe('soon');
    expect(dateState('2027-01-30', '2026-12-01')).toBe('soon');
    expect(dateState('2027-01-31', '2026-12-01')).toBe('ok');
    expect(dateState(null, '2026-12-01')).toBeNull();
  });

  it('ends a contract term the day before its anniversary', () => {
    expect(contractEndsOn('2025-03-15', 12)).toBe('2026-03-14');
    expect(contractEndsOn('2024-01-01', 36)).toBe('2026-12-31');
    expect(contractEndsOn(null, 12)).toBeNull();
  });
});
