/** "past" when the date is before today, "soon" within `soonDays`, else "ok"; null without a date. */
export function dateState(date: string | null, today: string, soonDays = 60): 'past' | 'soon' | 'ok' | null {
  if (!date) return null;
  if (date < today) return 'past';
  const soon = new Date(`${today}T00:00:00Z`);
  soon.setUTCDate(soon.getUTCDate() + soonDays);
  return date <= soon.toISOString().slice(0, 10) ? 'soon' : 'ok';
}

/** The last day of a contract term: start + term months − 1 day. */
export function contractEndsOn(startsOn: string | null, termMonths: number | null): string | null {
  if (!startsOn || !termMonths) return null;
  const [y, m, d] = startsOn.split('-').map(Number) as [number, number, number];
  const end = new Date(Date.UTC(y, m - 1 + termMonths, d));
  end.setUTCDate(end.getUTCDate() - 1);
  return end.toISOString().slice(0, 10);
}
