/**
 * How the route gates call a route: a valid body (so "allowed" means the call got past
 * authorization and did its work), an upload for the multipart routes, and whether the call
 * changes who is signed in (then it gets a visitor of its own). A route not listed here is
 * called with an empty JSON body.
 */
import fs from 'node:fs';
import path from 'node:path';
import { PNG, type World } from './route-world';

export interface RouteRequest {
  /** a valid JSON body */
  body?: (w: World) => object;
  /** a multipart upload: fields and one file under `file` */
  upload?: { fields?: Record<string, string>; file: Buffer; filename: string; contentType: string };
  /** the call signs someone in or out: it gets a fresh visitor of the caller */
  changesSession?: true;
  /** puts back, before each call, what an earlier call of this route took away */
  prepare?: (w: World) => Promise<void>;
}

let n = 0;
const unique = (what: string) => `${what}-${++n}-${Date.now().toString(36)}`;
const NEW_PASSWORD = 'a new password that is long';
const png = { file: PNG, filename: 'plan.png', contentType: 'image/png' };
const zonesCsv = fs.readFileSync(path.join(import.meta.dirname, '../fixtures/zones-minimal.csv'));

export const ROUTE_REQUESTS: Record<string, RouteRequest> = {
  'POST /api/session': { body: (w) => ({ email: w.a.owner.email, password: 'correct horse battery' }), changesSession: true },
  'DELETE /api/session': { changesSession: true },
  'POST /api/signup': { body: () => ({ firmName: 'Signup Alarm Co', name: 'Sam Signup', email: `${unique('signup')}@test.example`, password: NEW_PASSWORD }), changesSession: true },
  'POST /api/signups/:token': { changesSession: true },
  'POST /api/password-resets': { body: (w) => ({ email: w.a.technician.email }) },
  'POST /api/password-resets/:token': { body: () => ({ password: NEW_PASSWORD }) },
  'POST /api/invitations/:token/accept': { body: () => ({ name: 'New Person', password: NEW_PASSWORD }), changesSession: true },

  'POST /api/staff/invitations': { body: () => ({ email: `${unique('invitee')}@test.example`, role: 'technician' }) },
  'PATCH /api/staff/:userId': { body: () => ({ role: 'coordinator' }) },
  'PATCH /api/firm': { body: () => ({ licenceNumber: 'LIC-2040' }) },
  'DELETE /api/firm/logo': { prepare: (w) => w.uploadLogo() },
  'POST /api/firm/logo': { upload: { file: PNG, filename: 'logo.png', contentType: 'image/png' } },
  'PUT /api/firm/upkeep-settings': {
    body: () => ({ smokeEndOfLifeYears: 10, coEndOfLifeYears: 7, soonDays: 30, batteryYearsOverride: {}, averageCurrentMicroAmps: {} }),
  },
  'PUT /api/firm/checklists': { body: () => ({ install: ['Walk test every zone'] }) },
  'POST /api/billing/checkout': { body: () => ({ planKey: 'crew' }) },
  'POST /api/operator/tenants/:tenantId/suspend': { body: () => ({ reason: 'Asked by the firm to pause' }) },
  'POST /api/operator/tenants/:tenantId/restore': { body: () => ({ reason: 'The firm asked to come back' }) },

  'POST /api/clients': { body: () => ({ name: 'New Household' }) },
  'PATCH /api/clients/:clientId': { body: () => ({ notes: 'Prefers calls after 5pm.' }) },
  'POST /api/clients/:clientId/invitations': { body: () => ({ email: `${unique('household')}@clients.example` }) },
  'POST /api/sites': {
    body: (w) => ({ clientId: w.a.client.id, name: 'Lake house', address: { line1: '1 Shore Road', city: 'Ashby Vale' }, timeZone: 'America/Chicago' }),
  },
  'PATCH /api/sites/:siteId': { body: () => ({ name: 'Renamed home' }) },
  'POST /api/sites/:siteId/contacts': { body: () => ({ name: 'Neighbour', phone: '+15550104401' }) },
  'PUT /api/sites/:siteId/contacts': { body: () => ({ contacts: [{ name: 'Neighbour', phone: '+15550104401' }] }) },
  'PATCH /api/contacts/:contactId': { body: () => ({ name: 'Renamed contact' }) },
  'POST /api/sites/:siteId/documents': { upload: { fields: { kind: 'photo', title: 'Keypad' }, ...png } },
  'PATCH /api/documents/:documentId': { body: () => ({ title: 'Renamed document' }) },

  'POST /api/sites/:siteId/panels': { body: () => ({ label: 'Garage panel', zoneCapacity: 32, wirelessZoneFrom: 9, wirelessZoneTo: 32, commPath: 'cellular' }) },
  'PATCH /api/panels/:panelId': { body: () => ({ label: 'Renamed panel' }) },
  'POST /api/panels/:panelId/zones': { body: () => ({ description: 'Back door', deviceType: 'door_contact' }) },
  'POST /api/panels/:panelId/zones/import': { upload: { file: zonesCsv, filename: 'zones.csv', contentType: 'text/csv' } },
  'PATCH /api/zones/:zoneId': { body: () => ({ description: 'Renamed zone' }) },
  'PUT /api/zones/:zoneId/pin': { body: (w) => ({ floorId: w.a.floor.id, x: 0.5, y: 0.25 }) },

  'POST /api/sites/:siteId/floors': { body: () => ({ name: 'Upstairs', level: 1 }) },
  'PATCH /api/floors/:floorId': { body: () => ({ name: 'Renamed floor' }) },
  'POST /api/floors/:floorId/plan': { upload: png },
  'POST /api/floors/:floorId/rooms': { body: () => ({ name: 'Kitchen', kind: 'kitchen' }) },
  'PATCH /api/rooms/:roomId': { body: () => ({ name: 'Renamed room' }) },
  'POST /api/rooms/:roomId/openings': { body: () => ({ kind: 'window', label: 'Side window' }) },
  'PATCH /api/openings/:openingId': { body: () => ({ label: 'Renamed opening' }) },

  'POST /api/jobs': { body: (w) => ({ siteId: w.a.site.id, kind: 'service_call', summary: 'Keypad beeps' }) },
  'PATCH /api/jobs/:jobId': { body: () => ({ clientNotes: 'Ring the bell first.' }) },
  'POST /api/jobs/:jobId/transitions': { body: () => ({ to: 'in_progress' }) },
  'PUT /api/jobs/:jobId/walk-test': { body: (w) => [{ zoneId: w.a.zone.id, result: 'passed', monitoringConfirmed: true }] },
  'POST /api/jobs/:jobId/files': { upload: png },

  'POST /api/portal/sites/:siteId/service-requests': { body: () => ({ description: 'The keypad beeps at night.', preferredTimes: 'Weekday mornings' }) },
  'PUT /api/portal/sites/:siteId/contacts': { body: () => ({ contacts: [{ name: 'Neighbour', phone: '+15550104401' }] }) },
};

/** The path parameters of a route path, in order (`/api/a/:x/b/:y` → x, y). */
export function paramsOf(routePath: string): string[] {
  return [...routePath.matchAll(/:([A-Za-z]+)/g)].map((m) => m[1]!);
}
