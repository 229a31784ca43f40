import { CONTACT_CHANGE_ACTIONS, summarizeContactChange, type ContactChangeAction, type ContactSnapshot } from '@domain/contact-changes';
import type { EmergencyContact } from '../models/EmergencyContact';
import type { ContactChangeRecord } from '../services/contacts';

/** An emergency contact (api-resources.md): the same fields for staff and the site's client. */
export function presentContact(contact: EmergencyContact) {
  return {
    id: contact.id,
    siteId: contact.siteId,
    position: contact.position,
    name: contact.name,
    relation: contact.relation,
    phone: contact.phone,
    altPhone: contact.altPhone,
  };
}
export type PresentedContact = ReturnType<typeof presentContact>;

/** A list kept in an audit record, or null when the record has none (older or single-contact changes). */
function snapshotsOf(value: unknown): ContactSnapshot[] | null {
  if (!Array.isArray(value)) return null;
  return value
    .filter((item): item is Record<string, unknown> => typeof item === 'object' && item !== null)
    .map((item) => ({ name: textOf(item.name), relation: textOf(item.relation), phone: textOf(item.phone), altPhone: textOf(item.altPhone) }));
}

function textOf(value: unknown): string {
  return typeof value === 'string' ? value : '';
}

function isChangeAction(action: string): action is ContactChangeAction {
  return (CONTACT_CHANGE_ACTIONS as readonly string[]).includes(action);
}

/**
 * One entry of a site's contact history for staff: when, who (with their role at the time),
 * whether the household made it, the lists before and after, and a summary in plain words.
 */
export function presentContactChange({ event, actor }: ContactChangeRecord) {
  const details = event.details ?? {};
  const before = snapshotsOf(details.before);
  const after = snapshotsOf(details.after);
  const action = isChangeAction(event.action) ? event.action : 'contacts.replaced';
  const changed = Array.isArray(details.changed) ? details.changed.filter((c): c is string => typeof c === 'string') : null;
  return {
    id: event.id,
    at: event.createdAt.toISOString(),
    action: event.action,
    actor: actor ? { name: actor.name, role: event.actorRole ?? actor.role } : null,
    byHousehold: event.actorRole === 'client',
    before,
    after,
    summary: summarizeContactChange({
      action,
      before,
      after,
      count: typeof details.count === 'number' ? details.count : null,
      name: typeof details.name === 'string' ? details.name : null,
      previousName: typeof details.previousName === 'string' ? details.previousName : null,
      position: typeof details.position === 'number' ? details.position : null,
      changed,
    }),
  };
}
export type PresentedContactChange = ReturnType<typeof presentContactChange>;
