import { Router, type Request } from 'express';
import { subject } from '@domain/abilities';
import { contactListSchema, contactPatchSchema, contactSchema } from '@domain/schemas/contact';
import { scoped } from '../../context';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { inputOf, validate } from '../../middlewares/validate';
import { EmergencyContact } from '../../models/EmergencyContact';
import { Site } from '../../models/Site';
import { presentContact, presentContactChange } from '../../presenters/contact';
import { addContact, contactChanges, listContacts, MAX_CONTACTS, removeContact, replaceContacts, updateContact } from '../../services/contacts';
import { authorizeRecord, inTransaction, pageOf, requireFirm } from '../helpers';
import { contactParams, siteContactsParams } from './schema';

/**
 * A site's emergency contacts, in calling order (position 1 is called first). The site must
 * be readable (else 404); then the role must be allowed the contacts themselves (else 403).
 */
export function contactsRouter(deps: AppDeps): Router {
  const router = Router();
  router.use('/sites/:siteId/contacts', requireFirm);
  router.use('/contacts', requireFirm);

  async function loadSite(req: Request, siteId: string): Promise<Site> {
    const site = await Site.findOne({ where: scoped(req.ctx, { id: siteId }) });
    if (!site) throw errors.notFound('site');
    authorizeRecord(req, 'read', 'Site', site.get({ plain: true }), 'site');
    return site;
  }

  async function loadContact(req: Request, contactId: string): Promise<EmergencyContact> {
    const contact = await EmergencyContact.findOne({ where: scoped(req.ctx, { id: contactId }) });
    if (!contact) throw errors.notFound('emergency contact');
    return contact;
  }

  /**
   * Rights on a readable site's contact list: a role that may read the site but not its
   * contacts (a client here; the portal has its own routes) is refused with 403.
   */
  function authorizeContacts(req: Request, action: 'read' | 'create' | 'update', site: Site): void {
    const contacts = subject('Contact', { tenantId: site.tenantId, siteId: site.id });
    if (!req.ability.can('read', contacts) || !req.ability.can(action, contacts)) throw errors.forbidden();
  }

  function listOf(contacts: EmergencyContact[]) {
    return { data: contacts.map(presentContact), page: pageOf(1, MAX_CONTACTS, contacts.length) };
  }

  router.get('/sites/:siteId/contacts', validate({ params: siteContactsParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteContactsParams });
    const site = await loadSite(req, params.siteId);
    authorizeContacts(req, 'read', site);
    res.json(listOf(await listContacts(req.ctx, site.id)));
  });

  /**
   * Who changed the site's contacts and what changed, newest first (staff who may read the
   * contacts; the household's own changes are marked so staff confirm them with the
   * monitoring center).
   */
  router.get('/sites/:siteId/contacts/changes', validate({ params: siteContactsParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteContactsParams });
    const site = await loadSite(req, params.siteId);
    authorizeContacts(req, 'read', site);
    const changes = await contactChanges(req.ctx, site.id);
    res.json({ data: changes.map(presentContactChange) });
  });

  router.post('/sites/:siteId/contacts', validate({ params: siteContactsParams, body: contactSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: siteContactsParams, body: contactSchema });
    const site = await loadSite(req, params.siteId);
    authorizeContacts(req, 'create', site);
    const contact = await inTransaction(req, deps, (ctx) => addContact(ctx, site, body));
    res.status(201).json({ data: presentContact(contact) });
  });

  router.put('/sites/:siteId/contacts', validate({ params: siteContactsParams, body: contactListSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: siteContactsParams, body: contactListSchema });
    const site = await loadSite(req, params.siteId);
    authorizeContacts(req, 'update', site);
    const contacts = await inTransaction(req, deps, (ctx) => replaceContacts(ctx, site, body));
    res.json(listOf(contacts));
  });

  router.patch('/contacts/:contactId', validate({ params: contactParams, body: contactPatchSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: contactParams, body: contactPatchSchema });
    const contact = await loadContact(req, params.contactId);
    authorizeRecord(req, 'update', 'Contact', contact.get({ plain: true }), 'emergency contact');
    const updated = await inTransaction(req, deps, (ctx) => updateContact(ctx, contact, body));
    res.json({ data: presentContact(updated) });
  });

  router.delete('/contacts/:contactId', validate({ params: contactParams }), async (req, res) => {
    const { params } = inputOf(req, { params: contactParams });
    const contact = await loadContact(req, params.contactId);
    authorizeRecord(req, 'delete', 'Contact', contact.get({ plain: true }), 'emergency contact');
    await inTransaction(req, deps, (ctx) => removeContact(ctx, contact));
    res.status(204).end();
  });

  return router;
}
