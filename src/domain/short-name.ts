import { LIMITS } from './limits';

/** The short name in a firm's portal address: lowercase letters, digits and single hyphens. */
export const SHORT_NAME_PATTERN = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

/** "Lanternfield Alarm Co." → "lanternfield-alarm-co" */
export function shortNameFrom(firmName: string): string {
  const base = firmName
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/&/g, ' and ')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, LIMITS.shortNameMax)
    .replace(/-+$/g, '');
  return base.length >= LIMITS.shortNameMin ? base : `${base || 'firm'}-alarms`.slice(0, LIMITS.shortNameMax);
}

/** Adds "-2", "-3", … until `taken` says the name is free. */
export function uniqueShortName(base: string, taken: (candidate: string) => boolean): string {
  if (!taken(base)) return base;
  for (let n = 2; n < 10_000; n++) {
    const suffix = `-${n}`;
    const candidate = base.slice(0, LIMITS.shortNameMax - suffix.length).replace(/-+$/, '') + suffix;
    if (!taken(candidate)) return candidate;
  }
  throw new Error('No free short name');
}

/** The public address of a firm's client portal, by its short name: "/p/lanternfield". */
export function portalPath(shortName: string): string {
  return `/p/${encodeURIComponent(shortName)}`;
}
