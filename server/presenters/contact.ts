import type { EmergencyContact } from '../models/EmergencyContact';

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
