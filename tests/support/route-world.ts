/**
 * The data behind the route gates (route matrix, JSON fuzzing): two firms, each with staff of
 * every role and a household with a portal sign-in, and in firm A ("own firm") one of every
 * record a route can name — site, panel, zone, floor with a plan, room, opening, emergency
 * contact, job with a photo, shared document, staff and client invitations, a logo.
 *
 * `idFor(param)` answers firm A's shared record for a path parameter; `freshIdFor(param)`
 * builds a new one, so a route that changes or deletes its record never spoils the next call.
 */
import type { Express } from 'express';
import { Op } from 'sequelize';
import { AuditEvent } from '@server/models/AuditEvent';
import { Invitation } from '@server/models/Invitation';
import { User } from '@server/models/User';
import type { Floor } from '@server/models/Floor';
import type { Job } from '@server/models/Job';
import type { Opening } from '@server/models/Opening';
import type { Panel } from '@server/models/Panel';
import type { Room } from '@server/models/Room';
import type { Zone } from '@server/models/Zone';
import type { EmergencyContact } from '@server/models/EmergencyContact';
import type { MailMessage } from '@server/emails/mailer';
import {
  buildClient,
  buildContact,
  buildFirm,
  buildFirmWithSite,
  buildFloor,
  buildJob,
  buildOpening,
  buildPanel,
  buildRoom,
  buildSite,
  buildUser,
  buildZone,
  TEST_PASSWORD,
} from './factories';
import { linkFromMail, visitor, type Visitor } from './test-app';

/** A 1×1 PNG: a valid logo, floor plan, photo and document. */
export const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');

export const CALLERS = [
  'anon',
  'operator',
  'owner',
  'coordinator',
  'technician',
  'otherOwner',
  'otherCoordinator',
  'otherTechnician',
  'client',
  'otherClient',
] as const;
export type Caller = (typeof CALLERS)[number];

type FirmWithSite = Awaited<ReturnType<typeof buildFirmWithSite>>;

export interface World {
  app: Express;
  outbox: MailMessage[];
  a: FirmWithSite & {
    floor: Floor;
    room: Room;
    opening: Opening;
    panel: Panel;
    zone: Zone;
    contact: EmergencyContact;
    job: Job;
    /** a completed job: it has a report */
    completedJobId: string;
    documentId: string;
    jobPhotoId: string;
    staffInvitationId: string;
    staffInvitationToken: string;
    /** a sign-up waiting for confirmation */
    signUpToken: string;
    clientInvitationId: string;
  };
  b: FirmWithSite;
  operator: User;
  /** the user each caller signs in as (none for anon) */
  userOf(caller: Caller): User | null;
  /** a visitor signed in as this caller (anon: signed out), with a CSRF token */
  signedIn(caller: Caller): Promise<Visitor>;
  /** firm A's shared record for a path parameter */
  idFor(param: string, path: string): string;
  /** a new record of firm A for a path parameter (the route may change or delete it) */
  freshIdFor(param: string, path: string): Promise<string>;
  /**
   * Frees firm A's staff seats after a call: people and invitations made for one call are
   * deactivated and revoked, so the plan's seat limit never answers for the next call.
   */
  tidy(): Promise<void>;
  /** both firms' owners put a logo up (again) */
  uploadLogo(): Promise<void>;
  /** ids and words of firm A that no caller of firm B may ever see */
  secretsOfA(): string[];
}

let counter = 0;
const next = () => ++counter;

async function upload(v: Visitor, url: string, fields: Record<string, string> = {}): Promise<{ status: number; body: { data?: { id?: string } } }> {
  let req = v.agent.post(url).set('X-CSRF-Token', v.csrfToken);
  for (const [k, val] of Object.entries(fields)) req = req.field(k, val);
  const res = await req.attach('file', PNG, { filename: 'photo.png', contentType: 'image/png' });
  return { status: res.status, body: res.body as { data?: { id?: string } } };
}

function expectStatus(what: string, res: { status: number; body: unknown }, status: number): void {
  if (res.status !== status) throw new Error(`${what}: expected ${status}, got ${res.status} ${JSON.stringify(res.body)}`);
}

/** `flushMail` waits for mail a request sends after answering (password resets, sign-ups). */
export async function buildWorld(app: Express, outbox: MailMessage[], flushMail: () => Promise<void>): Promise<World> {
  const tokenFromMail = async (to: string, marker: string) => {
    await flushMail();
    return linkFromMail(outbox, to, marker).split('/').pop()!;
  };
  let signUps = 0;
  const askSignUp = async () => {
    const email = `signup-${++signUps}-${Date.now()}@test.example`;
    const anon = await visitor(app);
    const res = await anon.post('/api/signup', { firmName: `Signup ${signUps} Alarm Co`, name: 'Sam Signup', email, password: 'a long enough password' });
    expectStatus('sign-up asked', res, 202);
    return tokenFromMail(email, '/sign-up/confirm/');
  };
  const a0 = await buildFirmWithSite();
  const b = await buildFirmWithSite();
  const operator = await buildUser(null, 'operator');

  const floor = await buildFloor(a0.site);
  const room = await buildRoom(floor, { kind: 'bedroom', name: 'Main bedroom' });
  const opening = await buildOpening(room);
  const panel = await buildPanel(a0.site);
  const zone = await buildZone(panel, { openingId: opening.id, roomId: room.id });
  const contact = await buildContact(a0.site, 1);
  const tomorrow = new Date(Date.now() + 24 * 3600 * 1000);
  const job = await buildJob(a0.site, { technicianId: a0.technician.id, scheduledStart: tomorrow, scheduledEnd: new Date(tomorrow.getTime() + 3600 * 1000) });

  const owner = await visitor(app);
  expectStatus('owner signs in', await owner.signIn(a0.owner.email, TEST_PASSWORD), 200);
  const doc = await upload(owner, `/api/sites/${a0.site.id}/documents`, { kind: 'photo', title: 'Keypad', sharedWithClient: 'true' });
  expectStatus('document upload', doc, 201);
  const photo = await upload(owner, `/api/jobs/${job.id}/files`);
  expectStatus('job photo upload', photo, 201);
  expectStatus('floor plan upload', await upload(owner, `/api/floors/${floor.id}/plan`), 201);
  // firm B has a logo too, so its people asking for their own firm's logo get one
  const bOwner = await visitor(app);
  expectStatus('firm B owner signs in', await bOwner.signIn(b.owner.email, TEST_PASSWORD), 200);
  const uploadLogo = async () => {
    expectStatus('logo upload', await upload(owner, '/api/firm/logo'), 201);
    expectStatus('firm B logo upload', await upload(bOwner, '/api/firm/logo'), 201);
  };
  await uploadLogo();
  const done = await buildJob(a0.site, { technicianId: a0.technician.id, scheduledStart: tomorrow, scheduledEnd: new Date(tomorrow.getTime() + 3600 * 1000) });
  expectStatus('job started', await owner.post(`/api/jobs/${done.id}/transitions`, { to: 'in_progress' }), 200);
  expectStatus('job completed', await owner.post(`/api/jobs/${done.id}/transitions`, { to: 'completed' }), 200);
  const staffInv = await owner.post('/api/staff/invitations', { email: `invitee-${next()}@test.example`, role: 'technician' });
  expectStatus('staff invitation', staffInv, 201);
  const staffInvitationToken = await tokenFromMail((staffInv.body as { data: { email: string } }).data.email, '/invitations/');
  const signUpToken = await askSignUp();
  const clientInv = await owner.post(`/api/clients/${a0.client.id}/invitations`, { email: `household-${next()}@clients.example` });
  expectStatus('client invitation', clientInv, 201);

  const a = {
    ...a0,
    floor,
    room,
    opening,
    panel,
    zone,
    contact,
    job,
    completedJobId: done.id,
    documentId: doc.body.data!.id!,
    jobPhotoId: photo.body.data!.id!,
    staffInvitationId: (staffInv.body as { data: { id: string } }).data.id,
    staffInvitationToken,
    signUpToken,
    clientInvitationId: (clientInv.body as { data: { id: string } }).data.id,
  };

  const userOf = (caller: Caller): User | null => {
    switch (caller) {
      case 'anon':
        return null;
      case 'operator':
        return operator;
      case 'owner':
      case 'coordinator':
      case 'technician':
        return a[caller];
      case 'client':
        return a.clientUser;
      case 'otherOwner':
        return b.owner;
      case 'otherCoordinator':
        return b.coordinator;
      case 'otherTechnician':
        return b.technician;
      case 'otherClient':
        return b.clientUser;
    }
  };

  const signedIn = async (caller: Caller): Promise<Visitor> => {
    const v = await visitor(app);
    const user = userOf(caller);
    if (user) expectStatus(`${caller} signs in`, await v.signIn(user.email, TEST_PASSWORD), 200);
    return v;
  };

  const isClientInvitation = (path: string) => path.includes('/clients/:clientId/invitations');
  const isThumbnail = (path: string) => path.endsWith('/thumbnail');

  const idFor = (param: string, path: string): string => {
    switch (param) {
      case 'clientId':
        return a.client.id;
      case 'siteId':
        return a.site.id;
      case 'panelId':
        return a.panel.id;
      case 'zoneId':
        return a.zone.id;
      case 'floorId':
        return a.floor.id;
      case 'roomId':
        return a.room.id;
      case 'openingId':
        return a.opening.id;
      case 'contactId':
        return a.contact.id;
      case 'jobId':
        return path.endsWith('/report.pdf') ? a.completedJobId : a.job.id;
      case 'documentId':
        return isThumbnail(path) ? a.jobPhotoId : a.documentId;
      case 'userId':
        return a.technician.id;
      case 'invitationId':
        return isClientInvitation(path) ? a.clientInvitationId : a.staffInvitationId;
      case 'tenantId':
        return a.firm.id;
      case 'shortName':
        return a.firm.shortName;
      case 'token':
        return path.includes('/signups/') ? a.signUpToken : a.staffInvitationToken;
      default:
        throw new Error(`No record for the path parameter :${param} (${path}); teach tests/support/route-world.ts about it.`);
    }
  };

  const freshIdFor = async (param: string, path: string): Promise<string> => {
    switch (param) {
      case 'clientId':
        return (await buildClient(a.firm)).id;
      case 'siteId': {
        const site = await buildSite(a.firm, a.client);
        if (path.endsWith('/passcode/reveal')) expectStatus('passcode set', await owner.patch(`/api/sites/${site.id}`, { passcode: '4471' }), 200);
        return site.id;
      }
      case 'panelId':
        return (await buildPanel(a.site)).id;
      case 'zoneId': {
        const p = await buildPanel(a.site);
        return (await buildZone(p, { roomId: a.room.id })).id;
      }
      case 'floorId': {
        const f = await buildFloor(a.site, { name: `Floor ${next()}`, level: 1 });
        if (path.endsWith('/plan')) expectStatus('fresh floor plan', await upload(owner, `/api/floors/${f.id}/plan`), 201);
        return f.id;
      }
      case 'roomId':
        return (await buildRoom(a.floor, { name: `Room ${next()}`, position: next() })).id;
      case 'openingId':
        return (await buildOpening(a.room, { label: `Window ${next()}`, position: next() })).id;
      case 'contactId':
        return (await buildContact(a.site, 100 + next())).id;
      case 'jobId': {
        const start = new Date(Date.now() + 24 * 3600 * 1000);
        return (await buildJob(a.site, { technicianId: a.technician.id, scheduledStart: start, scheduledEnd: new Date(start.getTime() + 3600 * 1000) })).id;
      }
      case 'documentId': {
        const res = await upload(owner, `/api/sites/${a.site.id}/documents`, { kind: 'photo', title: `Photo ${next()}` });
        expectStatus('fresh document', res, 201);
        return res.body.data!.id!;
      }
      case 'userId':
        return (await buildUser(a.firm, 'technician')).id;
      case 'invitationId': {
        const res = isClientInvitation(path)
          ? await owner.post(`/api/clients/${a.client.id}/invitations`, { email: `household-${next()}@clients.example` })
          : await owner.post('/api/staff/invitations', { email: `invitee-${next()}@test.example`, role: 'technician' });
        expectStatus('fresh invitation', res, 201);
        return (res.body as { data: { id: string } }).data.id;
      }
      case 'tenantId':
        return (await buildFirm()).id;
      case 'shortName':
        return a.firm.shortName;
      case 'token': {
        if (path.includes('/signups/')) return askSignUp();
        if (path.includes('/password-resets/')) {
          const user = await buildUser(a.firm, 'technician');
          const anon = await visitor(app);
          expectStatus('password reset asked', await anon.post('/api/password-resets', { email: user.email }), 202);
          return tokenFromMail(user.email, '/reset-password/');
        }
        const email = `invitee-${next()}@test.example`;
        expectStatus('fresh invitation', await owner.post('/api/staff/invitations', { email, role: 'technician' }), 201);
        return tokenFromMail(email, '/invitations/');
      }
      default:
        throw new Error(`No record for the path parameter :${param} (${path}); teach tests/support/route-world.ts about it.`);
    }
  };

  const tidy = async () => {
    const keep = [a.owner.id, a.coordinator.id, a.technician.id];
    await User.update(
      { deactivatedAt: new Date() },
      { where: { tenantId: a.firm.id, role: { [Op.in]: ['owner', 'coordinator', 'technician'] }, id: { [Op.notIn]: keep }, deactivatedAt: null } },
    );
    // The matrix sends far more invitations than a person may in an hour; it is not a test of
    // the mail limits (mail-limits.test.ts is), so earlier sends are dated out of the window.
    await AuditEvent.sequelize!.query(
      `UPDATE audit_events SET createdAt = :earlier WHERE tenantId = :tenantId AND action IN ('invitation.sent', 'invitation.resent')`,
      { replacements: { earlier: new Date(Date.now() - 2 * 60 * 60 * 1000), tenantId: a.firm.id } },
    );
    await Invitation.update(
      { revokedAt: new Date() },
      { where: { tenantId: a.firm.id, role: { [Op.ne]: 'client' }, id: { [Op.ne]: a.staffInvitationId }, acceptedAt: null, revokedAt: null } },
    );
  };

  const secretsOfA = () => [
    a.firm.id,
    a.firm.name,
    a.client.id,
    a.client.name,
    a.site.id,
    a.site.name,
    a.panel.id,
    a.zone.id,
    a.floor.id,
    a.room.id,
    a.opening.id,
    a.contact.id,
    a.job.id,
    a.documentId,
    a.jobPhotoId,
    a.owner.id,
    a.owner.email,
    a.technician.id,
    a.clientUser.id,
    a.clientUser.email,
  ];

  return { app, outbox, a, b, operator, userOf, signedIn, idFor, freshIdFor, tidy, uploadLogo, secretsOfA };
}

