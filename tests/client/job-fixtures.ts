/** Invented jobs, sites and sessions for the client tests of the job screens. */
import { vi } from 'vitest';
import { defineRulesFor } from '@domain/abilities';
import type { Role } from '@domain/roles';
import type { ApiJob, ApiSite, ApiUser, SessionInfo } from '@/types/api';
import { makePanel, makeZone } from './panel-fixtures';
import { jsonResponse } from './render';

export const TECH_ID = 'u-tech';
export const OFFICE_ID = 'u-office';

export function sessionAs(role: Role, id = role === 'technician' ? TECH_ID : OFFICE_ID): SessionInfo {
  const name = role === 'technician' ? 'Wren Aldous' : 'Ottilie Marsh';
  return {
    user: {
      id,
      tenantId: 't1',
      email: `${id}@lanternfield.example`,
      name,
      role,
      active: true,
      deactivatedAt: null,
      lastSignInAt: null,
      createdAt: '2026-01-01T00:00:00Z',
    },
    tenant: {
      id: 't1',
      name: 'Lanternfield Alarm Co.',
      shortName: 'lanternfield',
      accentColor: '#8f5c17',
      accentColorReadable: '#8f5c17',
      logoUrl: null,
      monitoringCenterName: 'Ridgeway Monitoring',
      monitoringCenterPhone: '+1 555 010 4400',
      timeZone: 'America/Chicago',
      state: 'active',
    },
    rules: defineRulesFor({ id, role, tenantId: 't1' }),
    csrfToken: 'token-1',
  };
}

export const technician: ApiUser = {
  id: TECH_ID,
  tenantId: 't1',
  email: 'wren@lanternfield.example',
  name: 'Wren Aldous',
  role: 'technician',
  active: true,
  deactivatedAt: null,
  lastSignInAt: null,
  createdAt: '2026-01-01T00:00:00Z',
};

export function makeSite(overrides: Partial<ApiSite> = {}): ApiSite {
  return {
    id: 's1',
    clientId: 'c1',
    clientName: 'Maren Osk',
    name: '14 Quarry Lane',
    address: { line1: '14 Quarry Lane', line2: '', city: 'Ashby Vale', region: 'IL', postalCode: '60999', country: 'US' },
    timeZone: 'America/Chicago',
    latitude: null,
    longitude: null,
    accessNotes: 'Key safe by the garage, code from the office.',
    permit: { number: '', authority: '', expiresOn: null },
    hasPasscode: false,
    createdAt: '2026-01-01T00:00:00Z',
    ...overrides,
  };
}

export function makeJob(overrides: Partial<ApiJob> = {}): ApiJob {
  return {
    id: 'j1',
    siteId: 's1',
    siteName: '14 Quarry Lane',
    kind: 'install',
    state: 'scheduled',
    scheduledStart: '2026-03-03T15:00:00.000Z',
    scheduledEnd: '2026-03-03T16:30:00.000Z',
    technicianId: TECH_ID,
    technicianName: 'Wren Aldous',
    summary: 'Fit back-door contact',
    clientNotes: '',
    internalNotes: '',
    parts: [],
    checklist: [
      { label: 'Contact on the fixed frame, magnet on the moving door or sash', done: false },
      { label: 'Walk-test every zone with the monitoring center', done: false },
    ],
    touchedZoneIds: ['z2'],
    cancelReason: '',
    completedAt: null,
    reportUrl: null,
    walkTest: [],
    files: [],
    overlaps: [],
    ...overrides,
  };
}

export const zones = [
  makeZone({ id: 'z1', number: 9, description: 'Front door' }),
  makeZone({ id: 'z2', number: 10, description: 'Back door', serial: '0412878' }),
];

type Handler = (url: string, init: RequestInit | undefined) => Response | undefined;

/** Stubs fetch: the session, the site with one panel and two zones, staff, and the given extra handler. */
export function stubJobApi(session: SessionInfo, job: ApiJob | ApiJob[], extra?: Handler) {
  const jobs = Array.isArray(job) ? job : [job];
  const fetchMock = vi.fn((url: string, init?: RequestInit) => {
    const answered = extra?.(url, init);
    if (answered) return Promise.resolve(answered);
    const path = url.split('?')[0]!;
    const found = jobs.find((j) => path === `/api/jobs/${j.id}`);
    if (path === '/api/session') return Promise.resolve(jsonResponse(200, session));
    if (found && (!init?.method || init.method === 'GET')) return Promise.resolve(jsonResponse(200, { data: found }));
    if (path === '/api/jobs') return Promise.resolve(jsonResponse(200, { data: jobs, page: { number: 1, size: 100, total: jobs.length } }));
    const site = /^\/api\/sites\/([^/]+)$/.exec(path);
    if (site)
      return Promise.resolve(
        jsonResponse(200, { data: makeSite({ id: site[1]!, name: jobs.find((j) => j.siteId === site[1])?.siteName ?? '14 Quarry Lane' }) }),
      );
    if (/^\/api\/sites\/[^/]+\/panels$/.test(path))
      return Promise.resolve(jsonResponse(200, { data: [makePanel()], page: { number: 1, size: 100, total: 1 } }));
    if (path === '/api/panels/p1/zones')
      return Promise.resolve(jsonResponse(200, { data: zones, page: { number: 1, size: 1000, total: zones.length } }));
    if (path === '/api/staff') return Promise.resolve(jsonResponse(200, { data: [technician], page: { number: 1, size: 100, total: 1 } }));
    return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

/** The calls made with a method and path. */
export function callsTo(fetchMock: ReturnType<typeof stubJobApi>, method: string, path: string) {
  return fetchMock.mock.calls.filter(([url, init]) => url.split('?')[0] === path && (init?.method ?? 'GET') === method);
}
