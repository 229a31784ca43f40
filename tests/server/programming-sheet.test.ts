/**
 * The programming sheet: a landscape Letter PDF with the firm, site, panel, CP-01 settings and
 * findings, and every zone in service; the table header repeats on each page.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CP01_DEFAULTS, auditPanelSettings } from '@domain/cp01';
import { zoneDefaultsFor } from '@domain/zones';
import type { User } from '@server/models/User';
import { buildProgrammingSheet, switchesOf, type ProgrammingSheetData, type SheetZone } from '@server/services/programming-sheet';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildPanel, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
let a: Awaited<ReturnType<typeof buildFirmWithSite>>;
let b: Awaited<ReturnType<typeof buildFirmWithSite>>;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anonymous', Visitor> = {} as never;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

type StreamParser = Exclude<Parameters<ReturnType<Visitor['get']>['parse']>[0], (str: string) => unknown>;
/** Reads a binary response body as a Buffer. */
const binary: StreamParser = (res, cb) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(Buffer.from(c)));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

function zone(number: number, overrides: Partial<SheetZone> = {}): SheetZone {
  return {
    number,
    description: `Window ${number}`,
    deviceType: 'window_contact',
    ...zoneDefaultsFor('window_contact'),
    serial: `04${String(100000 + number)}`,
    input: 1,
    status: 'active',
    roomId: null,
    openingId: null,
    installedOn: null,
    batteryType: null,
    batteryChangedOn: null,
    manufacturedOn: null,
    location: null,
    ...overrides,
  };
}

function sheetData(zones: SheetZone[], settings = { ...CP01_DEFAULTS }): ProgrammingSheetData {
  return {
    firmName: 'Lanternfield Alarm Co.',
    site: { name: 'Quarry Lane home', addressLines: ['14 Quarry Lane', 'Ashby Vale, NE 68001'], timeZone: 'America/Chicago' },
    panel: {
      label: 'Main panel',
      makeModel: 'Test panel TP-64',
      commPath: 'cellular',
      installedOn: '2025-03-14',
      zoneCapacity: 64,
      wirelessZoneFrom: 9,
      wirelessZoneTo: 64,
      programmedAt: null,
      changedSinceProgrammed: true,
    },
    settings,
    findings: auditPanelSettings(settings, zones),
    zones,
    generatedAt: new Date('2026-06-15T17:30:00Z'),
  };
}

beforeAll(async () => {
  t = await createTestApp();
  a = await buildFirmWithSite();
  b = await buildFirmWithSite();
  as.owner = await signedIn(a.owner);
  as.coordinator = await signedIn(a.coordinator);
  as.technician = await signedIn(a.technician);
  as.client = await signedIn(a.clientUser);
  as.operator = await signedIn(await buildUser(null, 'operator'));
  as.anonymous = await visitor(t.app);
});
afterAll(async () => {
  await t.close();
});

describe('buildProgrammingSheet', () => {
  it('writes the firm, site, panel, settings, findings and each zone’s serial and description', async () => {
    const zones = [
      zone(9, { description: 'Front door', deviceType: 'door_contact', zoneType: 'entry_exit', serial: '0412877' }),
      zone(10, { description: 'Hall smoke', deviceType: 'smoke', zoneType: 'fire_24h', chime: false, serial: '0099120', status: 'bypassed' }),
    ];
    const sheet = await buildProgrammingSheet(sheetData(zones, { ...CP01_DEFAULTS, exitDelaySec: 30 }));
    expect(sheet.pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(sheet.pages).toBe(1);
    for (const text of [
      'Lanternfield Alarm Co.',
      'Quarry Lane home',
      '14 Quarry Lane',
      'Main panel',
      'Test panel TP-64',
      'Cellular',
      '2025-03-14',
      'Generated',
      '2026-06-15 12:30 (America/Chicago)',
      'Exit delay',
      '30 s',
      'Yes — program the panel',
    ]) {
      expect(sheet.lines, text).toContain(text);
    }
    expect(sheet.lines.some((line) => line.includes('Exit delay is 30 s'))).toBe(true);
    for (const z of zones) {
      expect(sheet.lines).toContain(z.serial);
      expect(sheet.lines).toContain(z.description);
    }
    expect(sheet.lines).toEqual(expect.arrayContaining(['Door contact', 'Entry/exit (delayed)', 'Smoke alarm', 'Fire, always armed', 'Bypassed', 'R – S', 'R C S', '—']));
    // the fonts are embedded (font names are outside the compressed streams)
    const raw = sheet.pdf.toString('latin1');
    expect(raw).toMatch(/IBMPlexSans/);
    expect(raw).toMatch(/IBMPlexMono/);
    expect(raw).toContain('/MediaBox [0 0 792 612]');
  });

  it('repeats the table header on every page of a long zone list', async () => {
    const zones = Array.from({ length: 120 }, (_, i) => zone(i + 1));
    const sheet = await buildProgrammingSheet(sheetData(zones));
    expect(sheet.pages).toBeGreaterThan(2);
    expect(sheet.lines.filter((line) => line === 'Serial')).toHaveLength(sheet.pages);
    expect(sheet.lines.filter((line) => /^Lanternfield Alarm Co\. · Quarry Lane home · Main panel · page \d+ of \d+$/.test(line))).toHaveLength(sheet.pages);
    for (const z of zones) expect(sheet.lines).toContain(z.serial);
  });

  it('writes the switches as letters', () => {
    expect(switchesOf({ reportsToMonitoring: true, chime: true, supervised: true })).toBe('R C S');
    expect(switchesOf({ reportsToMonitoring: false, chime: false, supervised: true })).toBe('– – S');
  });
});

describe('GET /api/panels/:panelId/programming-sheet.pdf', () => {
  it('answers a PDF to every staff role', async () => {
    const panel = await buildPanel(a.site, { label: 'Main panel' });
    await buildZone(panel, { number: 9, description: 'Front door', deviceType: 'door_contact', serial: '0412877' });
    await buildZone(panel, { number: 10, description: 'Old window', serial: '0412800', status: 'removed' });
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      const res = await as[role].get(`/api/panels/${panel.id}/programming-sheet.pdf`).buffer(true).parse(binary);
      expect(res.status, role).toBe(200);
      expect(res.headers['content-type']).toBe('application/pdf');
      expect(res.headers['content-disposition']).toBe('attachment; filename="programming-sheet-main-panel.pdf"');
      const body = res.body as Buffer;
      expect(body.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      expect(body.length).toBeGreaterThan(10_000); // three embedded fonts
      expect(body.subarray(-6).toString('latin1')).toContain('%%EOF');
    }
  });

  it('refuses a client (404), another firm (404), the operator (403) and a signed-out visitor (401)', async () => {
    const panel = await buildPanel(a.site);
    const other = await buildPanel(b.site);
    expect((await as.client.get(`/api/panels/${panel.id}/programming-sheet.pdf`)).status).toBe(404);
    expect((await as.owner.get(`/api/panels/${other.id}/programming-sheet.pdf`)).status).toBe(404);
    expect((await as.operator.get(`/api/panels/${panel.id}/programming-sheet.pdf`)).status).toBe(403);
    expect((await as.anonymous.get(`/api/panels/${panel.id}/programming-sheet.pdf`)).status).toBe(401);
  });
});
