/**
 * Stripe's `expand[]`: ids named by dotted paths ("subscription", "subscription.latest_invoice",
 * "data.customer" on a list) are replaced by copies of the objects they name.
 */
import { StripeApiError } from './errors';
import type { StandInStore } from './store';

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

export function expand<T>(object: T, paths: string[], store: StandInStore): T {
  const copy = structuredClone(object);
  for (const path of paths) {
    const parts = path.split('.');
    if (parts.length > 4) throw cannotExpand(path, 'You cannot expand more than 4 levels of a property.');
    expandPath(copy, parts, store, path);
  }
  return copy;
}

function expandPath(target: unknown, parts: string[], store: StandInStore, path: string): void {
  const [head, ...rest] = parts;
  if (head === undefined || !isRecord(target)) throw cannotExpand(path);
  if (head === 'data' && target.object === 'list' && Array.isArray(target.data)) {
    for (const item of target.data) expandPath(item, rest, store, path);
    return;
  }
  if (!(head in target)) throw cannotExpand(path);
  let value = target[head];
  if (typeof value === 'string') {
    const found = store.byId(value);
    if (!found) throw cannotExpand(path);
    value = structuredClone(found);
    target[head] = value;
  } else if (value !== null && !isRecord(value)) {
    throw cannotExpand(path);
  }
  if (value === null || rest.length === 0) return;
  expandPath(value, rest, store, path);
}

function cannotExpand(path: string, message = `This property cannot be expanded (${path}).`): StripeApiError {
  return new StripeApiError(400, message, { param: 'expand' });
}
