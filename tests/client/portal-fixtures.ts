/** Invented household, firm and home for the client tests of the signed-in portal. */
import { defineRulesFor } from '@domain/abilities';
import { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import type {
  ApiContact,
  PortalCoverage,
  PortalDevice,
  PortalDocument,
  PortalFirmContact,
  PortalService,
  PortalSite,
  PortalSiteSummary,
  SessionInfo,
} from '@/types/api';

export const TENANT_ID = '0b6f2d9e-4c1a-4e7b-9a3d-5f8e2c1b7a60';
export const USER_ID = '7d3e9a1c-2b4f-4d6a-8e5c-9f0a1b2c3d41';
export const CLIENT_ID = '3a9c7e5b-1d2f-4a6e-b8c0-d4e2f6a8b0c2';
/** Elm Hollow house, the household's main home. */
export const SITE_ID = 'e1a7c3b9-5d2f-4e8a-9c6b-1f3d5a7e9b20';
/** Lake cabin, their second home. */
export const OTHER_SITE_ID = 'c4f8a2d6-9b1e-4c3a-8f5d-2e6b0a4c8d31';

export const GROUND_FLOOR_ID = 'f0a1b2c3-d4e5-4f60-8a7b-9c0d1e2f3a01';
export const UPSTAIRS_ID = 'f0a1b2c3-d4e5-4f60-8a7b-9c0d1e2f3a02';
export const MAIN_BEDROOM_ID = 'b7c8d9e0-f1a2-4b3c-8d4e-5f6a7b8c9d03';

/** Device (zone) ids: the request form sends one as zoneId, which must be a uuid. */
export const KITCHEN_WINDOW_ZONE = '9e1d2c3b-4a5f-4e6d-8c7b-0a1f2e3d4c01';
export const HALL_SMOKE_ZONE = '9e1d2c3b-4a5f-4e6d-8c7b-0a1f2e3d4c02';
export const LANDING_CO_ZONE = '9e1d2c3b-4a5f-4e6d-8c7b-0a1f2e3d4c03';
export const BACK_DOOR_ZONE = '9e1d2c3b-4a5f-4e6d-8c7b-0a1f2e3d4c04';
export const GARAGE_HEAT_ZONE = '9e1d2c3b-4a5f-4e6d-8c7b-0a1f2e3d4c05';
export const STAIR_SMOKE_ZONE = '9e1d2c3b-4a5f-4e6d-8c7b-0a1f2e3d4c06';

export const FIRM_NAME = 'Lanternfield Alarm Co.';
export const FIRM_PHONE = '(555) 010-2870';
export const CENTER_PHONE = '(555) 010-4400';
export const ACCENT_READABLE = '#7a4f12';

export const clientSession: SessionInfo = {
  user: {
    id: USER_ID,
    tenantId: TENANT_ID,
    email: 'ines@pike-household.example',
    name: 'Ines Pike',
    role: 'client',
    active: true,
    deactivatedAt: null,
    lastSignInAt: '2026-11-20T18:04:00Z',
    createdAt: '2026-10-01T00:00:00Z',
  },
  tenant: {
    id: TENANT_ID,
    name: FIRM_NAME,
    shortName: 'lanternfield',
    accentColor: '#d9a441',
    accentColorReadable: ACCENT_READABLE,
    logoUrl: '/api/public/firms/lanternfield/logo?v=91c2e0aa',
    phone: FIRM_PHONE,
    monitoringCenterName: 'Ridgeway Monitoring',
    monitoringCenterPhone: CENTER_PHONE,
    timeZone: 'America/Chicago',
  },
  rules: defineRulesFor({ id: USER_ID, role: 'client', tenantId: TENANT_ID, clientId: CLIENT_ID }),
  csrfToken: 'portal-token-1',
};

export const signedOutSession: SessionInfo = { user: null, tenant: null, rules: [], csrfToken: 'portal-token-2' };

export const firmContact: PortalFirmContact = {
  name: FIRM_NAME,
  phone: FIRM_PHONE,
  monitoringCenterName: 'Ridgeway Monitoring',
  monitoringCenterPhone: CENTER_PHONE,
};

export const elmHollow: PortalSite = {
  id: SITE_ID,
  name: 'Elm Hollow house',
  address: { line1: '27 Elm Hollow Road', line2: '', city: 'Fenwick Falls', region: 'WI', postalCode: '53999', country: 'US' },
  timeZone: 'America/Chicago',
  firm: firmContact,
};

export const lakeCabin: PortalSite = {
  id: OTHER_SITE_ID,
  name: 'Lake cabin',
  address: { line1: '4 Heron Point Trail', line2: '', city: 'Marsh Bend', region: 'WI', postalCode: '53998', country: 'US' },
  timeZone: 'America/Chicago',
  firm: firmContact,
};

export const kitchenWindowDevice: PortalDevice = {
  id: KITCHEN_WINDOW_ZONE,
  description: 'Kitchen window',
  kind: 'Window contact',
  whenArmed: 'When the alarm is set, opening it sounds the alarm straight away.',
  chime: true,
  lifeSafety: false,
  protects: true,
  life: { state: 'ok', batteryDueOn: '2029-06-30', endOfLifeOn: null, endOfLifeBasis: null },
};

/** A smoke alarm whose battery is due soon; its manufacture date is on record. */
export const hallSmokeDevice: PortalDevice = {
  id: HALL_SMOKE_ZONE,
  description: 'Hall smoke alarm',
  kind: 'Smoke alarm',
  whenArmed: 'Always on, even when the alarm is off: it sounds the fire alarm and the monitoring center is called.',
  chime: false,
  lifeSafety: true,
  protects: true,
  life: { state: 'soon', batteryDueOn: '2027-03-14', endOfLifeOn: '2034-08-01', endOfLifeBasis: 'manufactured' },
};

/** A sealed CO alarm past its end of life. */
export const landingCoDevice: PortalDevice = {
  id: LANDING_CO_ZONE,
  description: 'Landing CO alarm',
  kind: 'CO alarm',
  whenArmed: 'Always on, even when the alarm is off: it warns of carbon monoxide and the monitoring center is called.',
  chime: false,
  lifeSafety: true,
  protects: true,
  life: { state: 'due', batteryDueOn: null, endOfLifeOn: '2026-11-02', endOfLifeBasis: 'manufactured' },
};

export const backDoorDevice: PortalDevice = {
  id: BACK_DOOR_ZONE,
  description: 'Back door',
  kind: 'Door contact',
  whenArmed: 'When the alarm is set, opening it starts the entry countdown so you can switch the alarm off.',
  chime: true,
  lifeSafety: false,
  protects: true,
  life: { state: 'ok', batteryDueOn: null, endOfLifeOn: null, endOfLifeBasis: null },
};

/** A heat alarm without its manufacture date: replace by installation + 10 years at the latest. */
export const garageHeatDevice: PortalDevice = {
  id: GARAGE_HEAT_ZONE,
  description: 'Garage heat alarm',
  kind: 'Heat alarm',
  whenArmed: 'Always on, even when the alarm is off: it sounds the fire alarm and the monitoring center is called.',
  chime: false,
  lifeSafety: true,
  protects: true,
  life: { state: 'check', batteryDueOn: null, endOfLifeOn: '2031-03-20', endOfLifeBasis: 'installed' },
};

export const NOT_PROTECTING_WORDS =
  'It is not set up to raise the alarm and call for help, so it does not count as protection. Ask your alarm firm to change how it is programmed.';

/** A sealed smoke alarm in good time, on a zone that is not programmed to protect. */
export const stairSmokeDevice: PortalDevice = {
  id: STAIR_SMOKE_ZONE,
  description: 'Stair smoke alarm',
  kind: 'Smoke alarm',
  whenArmed: NOT_PROTECTING_WORDS,
  chime: false,
  lifeSafety: true,
  protects: false,
  life: { state: 'ok', batteryDueOn: null, endOfLifeOn: '2033-05-10', endOfLifeBasis: 'manufactured' },
};

/** As the server lists them: by description. */
export const devices: PortalDevice[] = [backDoorDevice, garageHeatDevice, hallSmokeDevice, kitchenWindowDevice, landingCoDevice, stairSmokeDevice];

export const SUMMARY_SENTENCE = '4 of 7 doors and windows protected; 2 windows reachable from the ground have no sensor';

/** Six life-safety findings: the home page lists four and points to the rest. */
export const lifeSafetyMessages = [
  'Main bedroom (Upstairs) has no smoke alarm in service.',
  'Guest room (Upstairs) has no smoke alarm in service.',
  'Upstairs has no smoke alarm outside the sleeping rooms.',
  'Basement has no smoke alarm in service.',
  'Upstairs has no CO alarm near the sleeping rooms.',
  'Garage (Ground floor) has no heat alarm.',
];

export function makeSummary(overrides: Partial<PortalSiteSummary> = {}): PortalSiteSummary {
  return {
    site: elmHollow,
    coverage: { openings: { total: 7, protected: 4, unprotectedGroundReachable: 2 }, summary: SUMMARY_SENTENCE },
    lifeSafety: {
      findings: lifeSafetyMessages.map((message, i) => ({ code: i === 4 ? 'co_missing_sleeping_area' : 'smoke_missing_sleeping_room', severity: i < 3 ? 'error' : 'warning', message })),
      caution: LIFE_SAFETY_CAUTION,
    },
    // due, soon, and the smoke, heat and CO devices whose label date must be checked
    devicesDueSoon: [garageHeatDevice, hallSmokeDevice, landingCoDevice],
    nextVisit: { kind: 'inspection', scheduledStart: '2026-12-08T15:30:00.000Z' },
    firm: firmContact,
    ...overrides,
  };
}

export const COVERAGE_SUMMARY = '3 of 6 doors and windows protected; 1 window reachable from the ground has no sensor';
export const PLAN_URL = `/api/portal/sites/${SITE_ID}/floors/${GROUND_FLOOR_ID}/plan?v=3c9d1e0a`;

export function makeCoverage(overrides: Partial<PortalCoverage> = {}): PortalCoverage {
  return {
    openings: { total: 6, protected: 3, unprotectedGroundReachable: 1 },
    summary: COVERAGE_SUMMARY,
    findings: [
      {
        code: 'smoke_missing_sleeping_room',
        severity: 'error',
        rule: 'NFPA 72: a smoke alarm in every sleeping room',
        message: 'Main bedroom (Upstairs) has no smoke alarm in service.',
        floorId: UPSTAIRS_ID,
        roomId: MAIN_BEDROOM_ID,
        lifeSafety: true,
      },
      {
        code: 'smoke_in_garage',
        severity: 'info',
        rule: 'A smoke alarm in a garage does not count for its level',
        message: '“Garage smoke alarm” is in Garage (Ground floor). A smoke alarm in a garage does not count for its level.',
        floorId: GROUND_FLOOR_ID,
        roomId: null,
        lifeSafety: true,
      },
      {
        code: 'life_safety_zone_programming',
        severity: 'error',
        rule: 'A smoke, heat or CO device protects only on a fire or CO zone that is in service, reported to the monitoring center and supervised',
        message: '“Stair smoke alarm” is not reported to the monitoring center. It does not count as protection until this is changed.',
        floorId: UPSTAIRS_ID,
        roomId: MAIN_BEDROOM_ID,
        zoneId: STAIR_SMOKE_ZONE,
        lifeSafety: true,
      },
    ],
    caution: LIFE_SAFETY_CAUTION,
    floors: [
      {
        id: GROUND_FLOOR_ID,
        name: 'Ground floor',
        level: 0,
        belowGrade: false,
        rooms: [
          {
            id: 'b7c8d9e0-f1a2-4b3c-8d4e-5f6a7b8c9d01',
            name: 'Kitchen',
            kind: 'kitchen',
            openings: [
              { id: 'a0000000-0000-4000-8000-000000000001', kind: 'window', label: 'Kitchen window', groundReachable: true, protected: true, zoneDescription: 'Kitchen window' },
              { id: 'a0000000-0000-4000-8000-000000000006', kind: 'skylight', label: 'Kitchen skylight', groundReachable: false, protected: false, zoneDescription: null },
              { id: 'a0000000-0000-4000-8000-000000000002', kind: 'window', label: 'Pantry window', groundReachable: true, protected: false, zoneDescription: null },
            ],
          },
          {
            id: 'b7c8d9e0-f1a2-4b3c-8d4e-5f6a7b8c9d02',
            name: 'Hall',
            kind: 'hall',
            openings: [
              { id: 'a0000000-0000-4000-8000-000000000003', kind: 'door', label: 'Back door', groundReachable: true, protected: true, zoneDescription: 'Back door' },
              { id: 'a0000000-0000-4000-8000-000000000004', kind: 'door', label: 'Front door', groundReachable: true, protected: true, zoneDescription: 'Front door' },
            ],
            devices: [{ zoneId: HALL_SMOKE_ZONE, description: 'Hall smoke alarm', deviceType: 'smoke', counts: true }],
          },
        ],
      },
      {
        id: UPSTAIRS_ID,
        name: 'Upstairs',
        level: 1,
        belowGrade: false,
        rooms: [
          {
            id: MAIN_BEDROOM_ID,
            name: 'Main bedroom',
            kind: 'bedroom',
            openings: [{ id: 'a0000000-0000-4000-8000-000000000005', kind: 'window', label: 'Dormer window', groundReachable: false, protected: false, zoneDescription: null }],
            // on a zone that is not programmed to protect: not protection
            devices: [{ zoneId: STAIR_SMOKE_ZONE, description: 'Stair smoke alarm', deviceType: 'smoke', counts: false }],
          },
        ],
      },
    ],
    plans: [
      {
        floorId: GROUND_FLOOR_ID,
        imageUrl: PLAN_URL,
        pins: [{ zoneId: KITCHEN_WINDOW_ZONE, number: 3, description: 'Kitchen window', kind: 'Window contact', x: 0.3, y: 0.4 }],
      },
    ],
    ...overrides,
  };
}

export const REPORT_URL = `/api/portal/sites/${SITE_ID}/documents/d0c00000-0000-4000-8000-000000000009/file`;
export const KEYPAD_PHOTO_URL = `/api/portal/sites/${SITE_ID}/documents/d0c00000-0000-4000-8000-000000000008/file`;

export function makeService(overrides: Partial<PortalService> = {}): PortalService {
  return {
    upcoming: [
      {
        id: '10b00000-0000-4000-8000-000000000001',
        kind: 'inspection',
        kindLabel: 'Yearly inspection',
        state: 'scheduled',
        scheduledStart: '2026-12-08T15:30:00.000Z',
        technicianFirstName: 'Corin',
        summary: 'Yearly check of every sensor and the siren.',
        requestedByClient: false,
      },
      {
        id: '10b00000-0000-4000-8000-000000000002',
        kind: 'service_call',
        kindLabel: 'Service call',
        state: 'requested',
        scheduledStart: null,
        technicianFirstName: null,
        summary: 'The garage keypad beeps every few minutes.',
        requestedByClient: true,
      },
    ],
    past: [
      {
        id: '10b00000-0000-4000-8000-000000000003',
        kind: 'install',
        kindLabel: 'Install',
        state: 'completed',
        completedAt: '2026-10-15T02:10:00.000Z',
        scheduledStart: '2026-10-14T14:00:00.000Z',
        summary: 'New panel and sensors.',
        clientNotes: 'Your new keypad is by the back door.\nThe code we set together is yours to change.',
        files: [{ id: 'd0c00000-0000-4000-8000-000000000008', title: 'Photo of the new keypad', contentType: 'image/jpeg', fileUrl: KEYPAD_PHOTO_URL }],
        reportUrl: REPORT_URL,
      },
    ],
    ...overrides,
  };
}

export const contacts: ApiContact[] = [
  { id: 'c0000000-0000-4000-8000-000000000001', siteId: SITE_ID, position: 1, name: 'Dario Pike', relation: 'Owner', phone: '+15550107711', altPhone: '' },
  { id: 'c0000000-0000-4000-8000-000000000002', siteId: SITE_ID, position: 2, name: 'Maren Aldwick', relation: 'Neighbour', phone: '+15550103390', altPhone: '+15550103391' },
];

export const documents: PortalDocument[] = [
  {
    id: 'd0c00000-0000-4000-8000-000000000009',
    kind: 'certificate',
    kindLabel: 'Certificate',
    title: 'Installation certificate',
    contentType: 'application/pdf',
    sizeBytes: 248_000,
    createdAt: '2026-10-14T12:05:00.000Z',
    visit: { kindLabel: 'Install', on: '2026-10-14T12:00:00.000Z' },
    fileUrl: REPORT_URL,
  },
  {
    id: 'd0c00000-0000-4000-8000-000000000007',
    kind: 'permit',
    kindLabel: 'Alarm permit',
    title: '',
    contentType: 'application/pdf',
    sizeBytes: 812,
    createdAt: '2026-09-30T12:00:00.000Z',
    visit: null,
    fileUrl: `/api/portal/sites/${SITE_ID}/documents/d0c00000-0000-4000-8000-000000000007/file`,
  },
];
