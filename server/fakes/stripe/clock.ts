/** Time for the stand-in: unix seconds from an injectable clock, and calendar months in UTC. */
export interface Clock {
  /** seconds since the epoch, as Stripe's timestamps are */
  unix(): number;
}

export function createClock(now: () => Date = () => new Date()): Clock {
  return { unix: () => Math.floor(now().getTime() / 1000) };
}

/** The same day of the month `months` later (clamped to the month's last day), UTC. */
export function addMonths(unixSeconds: number, months: number): number {
  const start = new Date(unixSeconds * 1000);
  const target = new Date(start.getTime());
  target.setUTCDate(1);
  target.setUTCMonth(target.getUTCMonth() + months);
  const lastDay = new Date(Date.UTC(target.getUTCFullYear(), target.getUTCMonth() + 1, 0)).getUTCDate();
  target.setUTCDate(Math.min(start.getUTCDate(), lastDay));
  return Math.floor(target.getTime() / 1000);
}
