import { Op } from 'sequelize';
import type { z } from 'zod';
import { CONTACT_CHANGE_ACTIONS, type ContactSnapshot } from '@domain/contact-changes';
import type { contactListSchema, contactPatchSchema, contactSchema } from '@domain/schemas/contact';
import { scoped, type Ctx } from '../context';
import { errors } from '../errors';
import { AuditEvent } from '../models/AuditEvent';
import { EmergencyContact } from '../models/EmergencyContact';
import type { Site } from '../models/Site';
import { User } from '../models/User';
import { recordAudit } from './audit-recorder';

/** The monitoring center calls at most this many people per site (contactListSchema agrees). */
export const MAX_CONTACTS = 10;

export type ContactValues = z.output<typeof contactSchema>;
export type ContactPatch = z.output<typeof contactPatchSchema>;
export type ContactList = z.output<typeof contactListSchema>;

/** A site's emergency contacts in calling order. */
export function listContacts(ctx: Ctx, siteId: string): Promise<EmergencyContact[]> {
  return EmergencyContact.findAll({ where: scoped(ctx, { siteId }), order: [['position', 'ASC'], ['createdAt', 'ASC'], ['id', 'ASC']], transaction: ctx.transaction });
}

/** Writes positions 1..n in the order given (only rows whose position changes are saved). */
async function renumber(ctx: Ctx, ordered: EmergencyContact[]): Promise<void> {
  for (const [index, contact] of ordered.entries()) {
    if (contact.position !== index + 1) {
      contact.position = index + 1;
      await contact.save({ transaction: ctx.transaction });
    }
  }
}

function clampPosition(position: number | undefined, count: number): number {
  if (position === undefined) return count;
  return Math.min(Math.max(position, 1), count);
}

/** Adds a contact at the end, or at `position` (the ones from there on move down one). */
export async function addContact(ctx: Ctx, site: Site, input: ContactValues): Promise<EmergencyContact> {
  const current = await listContacts(ctx, site.id);
  if (current.length >= MAX_CONTACTS) {
    throw errors.conflict(`This site already has ${MAX_CONTACTS} emergency contacts. Remove one before adding another.`);
  }
  const at = clampPosition(input.position, current.length + 1);
  const contact = EmergencyContact.build({
    tenantId: site.tenantId,
    siteId: site.id,
    position: at,
    name: input.name,
    relation: input.relation,
    phone: input.phone,
    altPhone: input.altPhone,
  });
  const ordered = [...current];
  ordered.splice(at - 1, 0, contact);
  await contact.save({ transaction: ctx.transaction });
  await renumber(ctx, ordered);
  await recordAudit(ctx, { action: 'contact.created', subjectType: 'Contact', subjectId: contact.id, details: { siteId: site.id, name: contact.name, position: contact.position } });
  return contact;
}

/** Changes the fields sent; a new `position` moves the contact and closes the gap it leaves. */
export async function updateContact(ctx: Ctx, contact: EmergencyContact, patch: ContactPatch): Promise<EmergencyContact> {
  const { position, ...fields } = patch;
  const previousName = contact.name;
  const keys = (Object.keys(fields) as (keyof typeof fields)[]).filter((k) => fields[k] !== undefined && fields[k] !== contact.get(k));
  for (const key of keys) contact.set(key, fields[key] as never);
  const changed: string[] = [...keys];
  if (changed.length > 0) await contact.save({ transaction: ctx.transaction });
  if (position !== undefined) {
    const current = await listContacts(ctx, contact.siteId);
    const others = current.filter((c) => c.id !== contact.id);
    const at = clampPosition(position, others.length + 1);
    const from = current.findIndex((c) => c.id === contact.id) + 1;
    if (at !== from) {
      others.splice(at - 1, 0, contact);
      await renumber(ctx, others);
      changed.push('position');
    }
  }
  if (changed.length > 0) {
    const names = changed.includes('name') ? { name: contact.name, previousName } : { name: contact.name };
    await recordAudit(ctx, {
      action: 'contact.updated',
      subjectType: 'Contact',
      subjectId: contact.id,
      details: { siteId: contact.siteId, changed, ...names, position: contact.position },
    });
  }
  return contact;
}

/** Removes a contact; the ones after it move up, so positions stay 1..n. */
export async function removeContact(ctx: Ctx, contact: EmergencyContact): Promise<void> {
  await contact.destroy({ transaction: ctx.transaction });
  await renumber(ctx, await listContacts(ctx, contact.siteId));
  await recordAudit(ctx, { action: 'contact.deleted', subjectType: 'Contact', subjectId: contact.id, details: { siteId: contact.siteId, name: contact.name } });
}

/** A contact as the history and e-mails keep it (no ids or positions: order is calling order). */
export function snapshotOf(contact: EmergencyContact): ContactSnapshot {
  return { name: contact.name, relation: contact.relation, phone: contact.phone, altPhone: contact.altPhone };
}

export interface ReplacedList {
  contacts: EmergencyContact[];
  before: ContactSnapshot[];
  after: ContactSnapshot[];
}

/**
 * Replaces the site's whole ordered list (positions follow the order given). The audit keeps
 * the list before and after, so staff can see what changed and who changed it.
 */
export async function replaceContactList(ctx: Ctx, site: Site, list: ContactList): Promise<ReplacedList> {
  const before = (await listContacts(ctx, site.id)).map(snapshotOf);
  await EmergencyContact.destroy({ where: scoped(ctx, { siteId: site.id }), transaction: ctx.transaction });
  const created: EmergencyContact[] = [];
  for (const [index, input] of list.contacts.entries()) {
    created.push(
      await EmergencyContact.create(
        { tenantId: site.tenantId, siteId: site.id, position: index + 1, name: input.name, relation: input.relation, phone: input.phone, altPhone: input.altPhone },
        { transaction: ctx.transaction },
      ),
    );
  }
  const after = created.map(snapshotOf);
  await recordAudit(ctx, { action: 'contacts.replaced', subjectType: 'Site', subjectId: site.id, details: { count: created.length, before, after } });
  return { contacts: created, before, after };
}

/** Replaces the site's whole ordered list; see `replaceContactList`. */
export async function replaceContacts(ctx: Ctx, site: Site, list: ContactList): Promise<EmergencyContact[]> {
  return (await replaceContactList(ctx, site, list)).contacts;
}

/** How many changes the history shows. */
export const CONTACT_HISTORY_LIMIT = 50;

/** One change to a site's contacts with the person who made it (null when unknown). */
export interface ContactChangeRecord {
  event: AuditEvent;
  actor: User | null;
}

/**
 * The site's contact changes, newest first: whole lists replaced (staff or the household)
 * and single contacts added, changed or removed by staff. Actors are looked up in the firm.
 */
export async function contactChanges(ctx: Ctx, siteId: string): Promise<ContactChangeRecord[]> {
  const single = CONTACT_CHANGE_ACTIONS.filter((a) => a !== 'contacts.replaced');
  const events = await AuditEvent.findAll({
    where: scoped(ctx, {
      [Op.or]: [
        { action: 'contacts.replaced', subjectType: 'Site', subjectId: siteId },
        { action: { [Op.in]: single }, subjectType: 'Contact', details: { siteId } },
      ],
    }),
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: CONTACT_HISTORY_LIMIT,
    transaction: ctx.transaction,
  });
  const actorIds = [...new Set(events.map((e) => e.actorId).filter((id): id is string => Boolean(id)))];
  const actors = actorIds.length ? await User.findAll({ where: scoped(ctx, { id: { [Op.in]: actorIds } }), attributes: ['id', 'name', 'role'], transaction: ctx.transaction }) : [];
  const byId = new Map(actors.map((u) => [u.id, u]));
  return events.map((event) => ({ event, actor: event.actorId ? (byId.get(event.actorId) ?? null) : null }));
}
