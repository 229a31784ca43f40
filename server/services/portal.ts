/**
 * The household’s side of the portal: a service request from a client becomes a
 * `requested` job of the firm, and every active coordinator hears about it by e-mail (the
 * owner, when the firm has no active coordinator, so no request goes unheard). A
 * household's change to its emergency contacts is e-mailed to the owner and coordinators,
 * who confirm it with the monitoring center.
 */
import { randomUUID } from 'node:crypto';
import type { ServiceRequestInput } from '@domain/schemas/portal';
import { Op } from 'sequelize';
import { contactListsDiffer, describeListChange } from '@domain/contact-changes';
import { type Ctx, requireTransaction, scoped } from '../context';
import type { AppDeps } from '../deps';
import { assertMailAllowed } from '../emails/mail-limits';
import { householdContactsChangedEmail } from '../emails/templates';
import { errors } from '../errors';
import { Client } from '../models/Client';
import type { EmergencyContact } from '../models/EmergencyContact';
import { Job } from '../models/Job';
import type { Site } from '../models/Site';
import { User } from '../models/User';
import { Zone } from '../models/Zone';
import { recordAudit } from './audit-recorder';
import { replaceContactList, type ContactList } from './contacts';
import { checklistFor } from './jobs';

function summaryOf(description: string): string {
  const firstLine = description.trim().split(/\r?\n/)[0] ?? '';
  return firstLine.length > 200 ? `${firstLine.slice(0, 197)}…` : firstLine;
}

/** Active coordinators, or the firm's active owners when it has no coordinator. */
async function serviceRequestRecipients(ctx: Ctx, options: { transaction: NonNullable<Ctx['transaction']> }): Promise<User[]> {
  const active = (role: 'coordinator' | 'owner') => User.findAll({ where: scoped(ctx, { role, deactivatedAt: { [Op.is]: null } }), ...options });
  const coordinators = await active('coordinator');
  return coordinators.length > 0 ? coordinators : active('owner');
}

export async function requestService(
  ctx: Ctx,
  site: Site,
  input: ServiceRequestInput,
  deps: Pick<AppDeps, 'outbox' | 'appUrl'>,
): Promise<Job> {
  const transaction = requireTransaction(ctx);
  const options = { transaction };
  const coordinators = await serviceRequestRecipients(ctx, options);
  await assertMailAllowed(transaction, {
    purpose: 'service_request',
    tenantId: site.tenantId,
    actorId: ctx.user?.id ?? null,
    recipients: coordinators.map((c) => c.email),
  });
  let zone: Zone | null = null;
  if (input.zoneId) {
    zone = await Zone.findOne({ where: scoped(ctx, { id: input.zoneId, siteId: site.id }), ...options });
    if (!zone) throw errors.validation('zoneId: not a device of this site.', { zoneId: 'Not a device of this site.' });
  }
  const notes = [input.description.trim(), `Preferred times: ${input.preferredTimes.trim()}`];
  if (zone) notes.push(`Device: ${zone.description}`);
  const job = await Job.create(
    {
      tenantId: site.tenantId,
      siteId: site.id,
      kind: 'service_call',
      state: 'requested',
      scheduledStart: null,
      scheduledEnd: null,
      technicianId: null,
      summary: summaryOf(input.description),
      clientNotes: notes.join('\n\n'),
      internalNotes: '',
      parts: [],
      checklist: checklistFor(ctx.tenant, 'service_call'),
      touchedZoneIds: zone ? [zone.id] : [],
      requestedByClient: true,
    },
    options,
  );
  await recordAudit(ctx, { action: 'job.requested_by_client', subjectType: 'Job', subjectId: job.id, details: { siteId: site.id } });

  const who = ctx.user?.name ?? 'A client';
  const subject = `Service request from ${who} — ${site.name}`;
  const link = `${deps.appUrl}/app/jobs/${job.id}`;
  for (const coordinator of coordinators) {
    const lines = [
      `${who} asked for a service visit at ${site.name}.`,
      `What they wrote: ${input.description.trim()}`,
      `Preferred times: ${input.preferredTimes.trim()}`,
    ];
    await deps.outbox.enqueue(transaction, {
      key: `service-request:${job.id}:${coordinator.id}`,
      purpose: 'service_request',
      tenantId: site.tenantId,
      actorId: ctx.user?.id ?? null,
      message: {
        to: coordinator.email,
        subject,
        text: `${lines.join('\n\n')}\n\nOpen the job: ${link}\n`,
        html: `${lines.map((l) => `<p>${escapeHtml(l)}</p>`).join('')}<p><a href="${escapeHtml(link)}">Open the job</a></p>`,
      },
    });
  }
  return job;
}

/**
 * The household replaces its site's emergency contacts. When the list really changed, each
 * active coordinator and the owner get an e-mail with the list before and now, to confirm
 * with the monitoring center; a save that changes nothing e-mails nobody.
 */
export async function changeHouseholdContacts(
  ctx: Ctx,
  site: Site,
  list: ContactList,
  deps: Pick<AppDeps, 'outbox' | 'appUrl'>,
): Promise<EmergencyContact[]> {
  const transaction = requireTransaction(ctx);
  const options = { transaction };
  const recipients = await User.findAll({
    where: scoped(ctx, { role: { [Op.in]: ['owner', 'coordinator'] }, deactivatedAt: { [Op.is]: null } }),
    ...options,
  });
  // A household's every save may e-mail the office, so every save counts towards the limit.
  if (ctx.user?.role === 'client') {
    await assertMailAllowed(transaction, {
      purpose: 'contacts_changed',
      tenantId: site.tenantId,
      actorId: ctx.user.id,
      recipients: recipients.map((r) => r.email),
    });
  }
  const { contacts, before, after } = await replaceContactList(ctx, site, list);
  if (ctx.user?.role !== 'client' || !contactListsDiffer(before, after)) return contacts;

  const client = await Client.findOne({ where: scoped(ctx, { id: site.clientId }), attributes: ['id', 'name'], ...options });
  const householdName = client?.name ?? ctx.user.name;
  const summary = describeListChange(before, after);
  const link = `${deps.appUrl}/app/sites/${site.id}`;
  // Each save that changes the list is its own message to each recipient.
  const changeId = randomUUID();
  for (const recipient of recipients) {
    await deps.outbox.enqueue(transaction, {
      key: `contacts-changed:${site.id}:${changeId}:${recipient.id}`,
      purpose: 'contacts_changed',
      tenantId: site.tenantId,
      actorId: ctx.user.id,
      message: householdContactsChangedEmail({
        to: recipient.email,
        householdName,
        siteName: site.name,
        summary,
        before,
        after,
        monitoringCenterName: ctx.tenant?.monitoringCenterName ?? '',
        monitoringCenterPhone: ctx.tenant?.monitoringCenterPhone ?? '',
        link,
      }),
    });
  }
  return contacts;
}

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);
}
