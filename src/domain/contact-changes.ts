/**
 * Changes to a site's emergency contacts in plain words, for the staff history and the
 * e-mail that tells the firm a household changed its list. The array order of a list is the
 * calling order (the first is called first).
 */

/** A contact as the history keeps it. */
export interface ContactSnapshot {
  name: string;
  relation: string;
  phone: string;
  altPhone: string;
}

/** The audit actions that change a site's contacts. */
export const CONTACT_CHANGE_ACTIONS = ['contacts.replaced', 'contact.created', 'contact.updated', 'contact.deleted'] as const;
export type ContactChangeAction = (typeof CONTACT_CHANGE_ACTIONS)[number];

/** What one change recorded; older records may lack the names or the lists. */
export interface ContactChangeFacts {
  action: ContactChangeAction;
  /** the whole list before and after (a replaced list) */
  before?: ContactSnapshot[] | null;
  after?: ContactSnapshot[] | null;
  /** a replaced list without `after`: how many contacts it held */
  count?: number | null;
  /** one contact (added, changed or removed): its name, and its name before a rename */
  name?: string | null;
  previousName?: string | null;
  /** one contact's place in the calling order after the change */
  position?: number | null;
  /** one contact's changed fields: name, relation, phone, altPhone, position */
  changed?: string[] | null;
}

const PLACES = ['first', 'second', 'third', 'fourth', 'fifth', 'sixth', 'seventh', 'eighth', 'ninth', 'tenth'];

/** 1 → "first", 2 → "second" … 10 → "tenth"; later places by number. */
export function callingPlace(position: number): string {
  return PLACES[position - 1] ?? `number ${position}`;
}

const FIELD_WORDS: Record<string, string> = { phone: 'phone', altPhone: 'other phone', relation: 'relation' };

/** "A", "A and B", "A, B and C" */
function listOf(words: string[]): string {
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]!}`;
}

function capitalized(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

const nameKey = (name: string) => name.trim().toLowerCase().replace(/\s+/g, ' ');
const phoneKey = (phone: string) => phone.replace(/\D/g, '');

/** True when the two lists differ in any person, detail or order. */
export function contactListsDiffer(before: ContactSnapshot[], after: ContactSnapshot[]): boolean {
  if (before.length !== after.length) return true;
  return before.some((b, i) => {
    const a = after[i]!;
    return b.name !== a.name || b.relation !== a.relation || b.phone !== a.phone || b.altPhone !== a.altPhone;
  });
}

/**
 * Pairs each contact kept from `before` with its place in `after`: first by name, then (for
 * a renamed contact) by main phone. Returns after-index by before-index.
 */
function matchContacts(before: ContactSnapshot[], after: ContactSnapshot[]): Map<number, number> {
  const matched = new Map<number, number>();
  const taken = new Set<number>();
  const pass = (same: (b: ContactSnapshot, a: ContactSnapshot) => boolean) => {
    before.forEach((b, i) => {
      if (matched.has(i)) return;
      const j = after.findIndex((a, k) => !taken.has(k) && same(b, a));
      if (j >= 0) {
        matched.set(i, j);
        taken.add(j);
      }
    });
  };
  pass((b, a) => nameKey(b.name) === nameKey(a.name));
  pass((b, a) => phoneKey(b.phone) !== '' && phoneKey(b.phone) === phoneKey(a.phone));
  return matched;
}

/**
 * The kept contacts that changed place relative to the others: everyone outside the longest
 * run still in the old relative order. Among equally long runs, the one keeping the later
 * places wins, so a contact lifted up the list is the one named as moved.
 */
function movedAfterIndexes(matched: Map<number, number>): Set<number> {
  const order = [...matched.entries()].sort(([x], [y]) => x - y).map(([, j]) => j);
  const best = order.map((j) => ({ length: 1, sum: j, previous: -1 }));
  order.forEach((j, i) => {
    for (let k = 0; k < i; k++) {
      if (order[k]! >= j) continue;
      const length = best[k]!.length + 1;
      const sum = best[k]!.sum + j;
      if (length > best[i]!.length || (length === best[i]!.length && sum > best[i]!.sum)) best[i] = { length, sum, previous: k };
    }
  });
  let end = -1;
  best.forEach((b, i) => {
    if (end < 0 || b.length > best[end]!.length || (b.length === best[end]!.length && b.sum > best[end]!.sum)) end = i;
  });
  const kept = new Set<number>();
  for (let i = end; i >= 0; i = best[i]!.previous) kept.add(order[i]!);
  return new Set(order.filter((j) => !kept.has(j)));
}

/**
 * A replaced list in plain words, e.g. "Replaced the list: added Ora Neighbour; removed Bram
 * Trevane; Lena Quill moved to first".
 */
export function describeListChange(before: ContactSnapshot[], after: ContactSnapshot[]): string {
  if (!contactListsDiffer(before, after)) return 'Saved the list without changes';
  const matched = matchContacts(before, after);
  const keptAfter = new Set(matched.values());
  const clauses: string[] = [];

  const added = after.filter((_, j) => !keptAfter.has(j)).map((a) => a.name);
  if (added.length > 0) clauses.push(`added ${listOf(added)}`);
  const removed = before.filter((_, i) => !matched.has(i)).map((b) => b.name);
  if (removed.length > 0) clauses.push(`removed ${listOf(removed)}`);

  const pairs = [...matched.entries()].sort(([, x], [, y]) => x - y);
  for (const [i, j] of pairs) {
    if (nameKey(before[i]!.name) !== nameKey(after[j]!.name)) clauses.push(`renamed ${before[i]!.name} to ${after[j]!.name}`);
  }

  const moved = movedAfterIndexes(matched);
  // Whoever is now called first is always named when that changed, even if the others only
  // closed up behind a removal.
  const newFirst = [...matched.entries()].find(([, j]) => j === 0);
  if (newFirst && newFirst[0] !== 0) moved.add(0);
  for (const j of [...moved].sort((x, y) => x - y)) clauses.push(`${after[j]!.name} moved to ${callingPlace(j + 1)}`);

  for (const [i, j] of pairs) {
    const b = before[i]!;
    const a = after[j]!;
    const fields = (['phone', 'altPhone', 'relation'] as const).filter((f) => b[f] !== a[f]).map((f) => FIELD_WORDS[f]!);
    if (fields.length > 0) clauses.push(`new ${listOf(fields)} for ${a.name}`);
  }

  if (after.length === 0) return `Cleared the list: ${clauses.join('; ')}`;
  return `Replaced the list: ${clauses.join('; ')}`;
}

/** One change to a site's contacts in plain words. */
export function summarizeContactChange(change: ContactChangeFacts): string {
  const who = change.name?.trim() || 'a contact';
  switch (change.action) {
    case 'contacts.replaced': {
      if (change.before && change.after) return describeListChange(change.before, change.after);
      const count = change.after?.length ?? change.count;
      if (count === undefined || count === null) return 'Replaced the list';
      return `Replaced the list (${count === 1 ? '1 contact' : `${count} contacts`})`;
    }
    case 'contact.created':
      return capitalized(`added ${who}${change.position ? ` in ${callingPlace(change.position)} place` : ''}`);
    case 'contact.deleted':
      return capitalized(`removed ${who}`);
    case 'contact.updated': {
      const changed = change.changed ?? [];
      const clauses: string[] = [];
      if (changed.includes('name')) clauses.push(change.previousName ? `renamed ${change.previousName} to ${who}` : `new name for ${who}`);
      const fields = (['phone', 'altPhone', 'relation'] as const).filter((f) => changed.includes(f)).map((f) => FIELD_WORDS[f]!);
      if (fields.length > 0) clauses.push(`new ${listOf(fields)} for ${who}`);
      if (changed.includes('position')) clauses.push(change.position ? `${who} moved to ${callingPlace(change.position)}` : `${who} moved in the calling order`);
      return clauses.length > 0 ? capitalized(clauses.join('; ')) : capitalized(`changed ${who}`);
    }
  }
}
