/**
 * A panel's zone list as CSV: export (exact columns, serials as strings, round trip) and
 * import (all or nothing, errors by row and field, dry run, adds and updates by zone number).
 */
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ZONE_CSV_COLUMNS } from '@domain/schemas/zone';
import { AuditEvent } from '@server/models/AuditEvent';
import { Panel } from '@server/models/Panel';
import { Zone } from '@server/models/Zone';
import { ZoneChange } from '@server/models/ZoneChange';
import type { User } from '@server/models/User';
import { escapeCsvText, unescapeCsvText } from '@server/services/zone-export';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildPanel, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
let a: Awaited<ReturnType<typeof buildFirmWithSite>>;
let b: Awaited<ReturnType<typeof buildFirmWithSite>>;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anonymous', Visitor> = {} as never;
const STAFF = ['owner', 'coordinator', 'technician'] as const;
const HEADER = ZONE_CSV_COLUMNS.join(',');

const fixture = (name: string) => fs.readFileSync(path.join(import.meta.dirname, '..', 'fixtures', name), 'utf8');

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

function importFile(
  v: Visitor,
  panelId: string,
  content: string | Buffer,
  { dryRun = false, filename = 'zones.csv', contentType = 'text/csv' }: { dryRun?: boolean; filename?: string; contentType?: string } = {},
) {
  return v.agent
    .post(`/api/panels/${panelId}/zones/import${dryRun ? '?dryRun=true' : ''}`)
    .set('X-CSRF-Token', v.csrfToken)
    .attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content, 'utf8'), { filename, contentType });
}

async function exportText(v: Visitor, panelId: string): Promise<string> {
  const res = await v.get(`/api/panels/${panelId}/zones.csv`);
  expect(res.status).toBe(200);
  return res.text;
}

const zoneCount = (panelId: string, tenantId = a.firm.id) => Zone.count({ where: { tenantId, panelId } });

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

describe('GET /api/panels/:panelId/zones.csv', () => {
  it('writes the exact columns, true/false, YYYY-MM-DD, serials as strings, ordered by number', async () => {
    const panel = await buildPanel(a.site, { label: 'Main panel' });
    await buildZone(panel, { number: 12, description: 'Hall smoke', deviceType: 'smoke', serial: '0099120', manufacturedOn: '2024-11-02' });
    await buildZone(panel, { number: 9, description: 'Den window, east', serial: '0412877', batteryType: 'CR2032', installedOn: '2025-03-14' });
    const res = await as.technician.get(`/api/panels/${panel.id}/zones.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe('attachment; filename="zones-main-panel.csv"');
    expect(res.text).toBe(
      [
        HEADER,
        '9,"Den window, east",window_contact,perimeter,0412877,1,true,true,true,active,2025-03-14,CR2032,,',
        '12,Hall smoke,smoke,fire_24h,0099120,1,true,false,true,active,,,,2024-11-02',
        '',
      ].join('\r\n'),
    );
  });

  it('answers every staff role; 404 to a client and for another firm; 403 to the operator; 401 signed out', async () => {
    const panel = await buildPanel(a.site);
    const other = await buildPanel(b.site);
    await buildZone(other, { serial: '0777001' });
    for (const role of STAFF) expect((await as[role].get(`/api/panels/${panel.id}/zones.csv`)).status, role).toBe(200);
    expect((await as.client.get(`/api/panels/${panel.id}/zones.csv`)).status).toBe(404);
    const foreign = await as.owner.get(`/api/panels/${other.id}/zones.csv`);
    expect(foreign.status).toBe(404);
    expect(foreign.text).not.toContain('0777001');
    expect((await as.operator.get(`/api/panels/${panel.id}/zones.csv`)).status).toBe(403);
    expect((await as.anonymous.get(`/api/panels/${panel.id}/zones.csv`)).status).toBe(401);
  });
});

describe('export → import → export', () => {
  it('round-trips exactly, removed zones, awkward text and formula-like cells included', async () => {
    const source = await buildPanel(a.site, { label: 'Source panel' });
    await buildZone(source, { number: 9, description: 'Front door', deviceType: 'door_contact', serial: '0412877', batteryType: 'CR2032', batteryChangedOn: '2025-03-14', installedOn: '2025-03-14' });
    await buildZone(source, { number: 9, description: 'Front door (old)', deviceType: 'door_contact', serial: '0412800', status: 'removed' });
    await buildZone(source, { number: 10, description: 'Hall "upstairs" smoke, east', deviceType: 'smoke', serial: '0099120', manufacturedOn: '2024-11-02', batteryType: 'sealed 10-year' });
    await buildZone(source, { number: 11, description: '=Den window', serial: '-0412879' });
    await buildZone(source, { number: 12, description: "'+Attic hatch", serial: '0412880', input: 2, status: 'bypassed' });
    await buildZone(source, { number: 13, description: 'Garage tilt', deviceType: 'garage_door_tilt', zoneType: 'perimeter', serial: '0412881' });
    await buildZone(source, { number: 3, description: 'Kitchen wired', deviceType: 'door_contact', serial: '' });
    const first = await exportText(as.owner, source.id);
    // a spreadsheet would read "=Den window" as a formula: the cell is guarded with an apostrophe
    expect(first).toContain(",'=Den window,");
    expect(first).toContain(",'-0412879,");

    const target = await buildPanel(a.site, { label: 'Target panel' });
    const imported = await importFile(as.technician, target.id, first);
    expect(imported.status).toBe(200);
    expect(imported.body.data).toEqual({ dryRun: false, creates: 7, updates: 0, unchanged: 0 });
    const second = await exportText(as.owner, target.id);
    expect(second).toBe(first);
    const stored = await Zone.findAll({ where: { tenantId: a.firm.id, panelId: target.id } });
    expect(stored.find((z) => z.number === 11)).toMatchObject({ description: '=Den window', serial: '-0412879' });
    expect(stored.find((z) => z.number === 12)!.description).toBe("'+Attic hatch");

    // importing the same file again changes nothing
    const again = await importFile(as.technician, target.id, second);
    expect(again.body.data).toEqual({ dryRun: false, creates: 0, updates: 0, unchanged: 7 });
    expect(await exportText(as.owner, target.id)).toBe(first);
  });

  it('reproduces a fixture file byte for byte', async () => {
    const text = fixture('zones-valid.csv');
    const panel = await buildPanel(a.site);
    expect((await importFile(as.owner, panel.id, text)).status).toBe(200);
    expect(await exportText(as.owner, panel.id)).toBe(text);
  });

  it('escapes and unescapes formula-like text as exact inverses', () => {
    for (const value of ['=SUM(A1)', "'=x", "''@y", '-12', '+1', '@home', 'plain', "'quoted", '', "'"]) {
      expect(unescapeCsvText(escapeCsvText(value))).toBe(value);
    }
    expect(escapeCsvText('plain')).toBe('plain');
    expect(escapeCsvText("'quoted")).toBe("'quoted");
  });
});

describe('POST /api/panels/:panelId/zones/import', () => {
  it('saves nothing when one row is bad, and names the row and field', async () => {
    const panel = await buildPanel(a.site);
    await buildZone(panel, { number: 30, description: 'Existing', serial: '0400030' });
    const before = await zoneCount(panel.id);
    const res = await importFile(as.owner, panel.id, fixture('zones-one-bad-row.csv'));
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.fields).toEqual({ 'rows.3.serial': 'Use the digits and letters printed on the device.' });
    expect(res.body.error.message).toContain('1 row has errors; nothing was imported');
    expect(await zoneCount(panel.id)).toBe(before);
    expect(await ZoneChange.count({ where: { tenantId: a.firm.id, panelId: panel.id } })).toBe(0);
    expect((await Panel.findOne({ where: { tenantId: a.firm.id, id: panel.id } }))!.changedSinceProgrammed).toBe(false);
  });

  it('reports every bad row and field at once', async () => {
    const panel = await buildPanel(a.site, { zoneCapacity: 20, wirelessZoneFrom: 9, wirelessZoneTo: 20 });
    await buildZone(panel, { number: 15, description: 'Existing', serial: '0400015' });
    const csv = [
      'number,description,deviceType,serial,input,chime,installedOn',
      '9,Front door,door_contact,0412877,1,true,2025-03-14',
      '10,,door_contact,0412878,1,true,', // no description
      '11,Den window,laser_grid,0412879,1,maybe,2025-02-30', // bad type, switch and date
      '9,Back door,door_contact,0412890,1,true,', // number 9 twice
      '12,Side door,door_contact,0412877,1,true,', // same serial+input as row 1
      '13,Hall,motion,0400015,1,,', // same serial+input as existing zone 15
      '25,Shed,door_contact,0412891,1,,', // beyond the 20 zones
      'twelve,Porch,door_contact,0412892,1,,',
    ].join('\n');
    const res = await importFile(as.owner, panel.id, csv);
    expect(res.status).toBe(400);
    const fields = res.body.error.fields as Record<string, string>;
    expect(Object.keys(fields)).toEqual([
      'rows.2.description',
      'rows.3.deviceType',
      'rows.3.chime',
      'rows.3.installedOn',
      'rows.4.number',
      'rows.5.serial',
      'rows.6.serial',
      'rows.7.number',
      'rows.8.number',
    ]);
    expect(fields['rows.4.number']).toBe('Zone 9 is also on row 1 of this file. A zone number may appear on one row only.');
    expect(fields['rows.5.serial']).toBe('Serial 0412877 input 1 is also on row 1 of this file. Each device input is enrolled once.');
    expect(fields['rows.6.serial']).toContain('already zone 15');
    expect(fields['rows.7.number']).toContain('beyond this panel');
    expect(res.body.error.message).toContain('7 rows have errors; nothing was imported. Row 2, description:');
    expect(await zoneCount(panel.id)).toBe(1);
  });

  it('previews a dry run and saves nothing', async () => {
    const panel = await buildPanel(a.site);
    await buildZone(panel, { number: 9, description: 'Front door', deviceType: 'door_contact', serial: '0412877' });
    const csv = [HEADER, '9,Front door (main),door_contact,entry_exit,0412877,1,true,true,true,active,,,,', '10,Den window,window_contact,,0412878,,,,,,,,,'].join('\r\n');
    const res = await importFile(as.technician, panel.id, csv, { dryRun: true });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ dryRun: true, creates: 1, updates: 1, unchanged: 0 });
    expect(res.body.data.rows).toEqual([
      expect.objectContaining({
        row: 1,
        action: 'update',
        zoneId: expect.any(String),
        number: 9,
        description: 'Front door (main)',
        changes: [{ field: 'description', from: 'Front door', to: 'Front door (main)' }],
        warnings: [],
      }),
      expect.objectContaining({ row: 2, action: 'create', zoneId: null, number: 10, zoneType: 'perimeter', chime: true, serial: '0412878', input: 1 }),
    ]);
    expect(await zoneCount(panel.id)).toBe(1);
    expect((await Zone.findOne({ where: { tenantId: a.firm.id, panelId: panel.id } }))!.description).toBe('Front door');
    expect(await ZoneChange.count({ where: { tenantId: a.firm.id, panelId: panel.id } })).toBe(0);
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'zones.imported', subjectId: panel.id } })).toBe(0);
    // a bad dry run answers the same errors as a real import
    const bad = await importFile(as.technician, panel.id, fixture('zones-one-bad-row.csv'), { dryRun: true });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty(['rows.3.serial']);
  });

  it('adds and updates by zone number, logs each change as imported and marks the panel', async () => {
    const panel = await buildPanel(a.site);
    const kept = await buildZone(panel, { number: 20, description: 'Untouched', serial: '0400020' });
    const updated = await buildZone(panel, { number: 9, description: 'Front door', deviceType: 'door_contact', serial: '0412877' });
    const csv = ['number,description,deviceType,serial', '9,Front door (main),door_contact,0412877', '10,Den window,window_contact,0412878'].join('\n');
    const res = await importFile(as.coordinator, panel.id, csv);
    expect(res.status).toBe(200);
    expect(res.body.data).toEqual({ dryRun: false, creates: 1, updates: 1, unchanged: 0 });
    const zones = await Zone.findAll({ where: { tenantId: a.firm.id, panelId: panel.id }, order: [['number', 'ASC']] });
    expect(zones.map((z) => [z.number, z.description])).toEqual([
      [9, 'Front door (main)'],
      [10, 'Den window'],
      [20, 'Untouched'],
    ]);
    expect(zones[0]!.id).toBe(updated.id);
    expect(zones[2]!.id).toBe(kept.id);
    const log = await ZoneChange.findAll({ where: { tenantId: a.firm.id, panelId: panel.id } });
    expect(log.map((c) => [c.action, c.zoneNumber]).sort()).toEqual([
      ['imported', 10],
      ['imported', 9],
    ]);
    expect(log.find((c) => c.zoneNumber === 9)!.changes).toEqual({ description: ['Front door', 'Front door (main)'] });
    expect(log.every((c) => c.actorName === a.coordinator.name)).toBe(true);
    expect((await Panel.findOne({ where: { tenantId: a.firm.id, id: panel.id } }))!.changedSinceProgrammed).toBe(true);
    const audit = await AuditEvent.findOne({ where: { tenantId: a.firm.id, action: 'zones.imported', subjectId: panel.id } });
    expect(audit!.details).toEqual({ rows: 2, creates: 1, updates: 1, unchanged: 0 });
  });

  it('fills missing columns from the device type and numbers from the next free wireless number', async () => {
    const panel = await buildPanel(a.site);
    await buildZone(panel, { number: 10 });
    const res = await importFile(as.owner, panel.id, fixture('zones-minimal.csv'));
    expect(res.status).toBe(200);
    const zones = await Zone.findAll({ where: { tenantId: a.firm.id, panelId: panel.id }, order: [['number', 'ASC']] });
    expect(zones.map((z) => [z.number, z.description, z.zoneType, z.chime, z.serial])).toEqual([
      [9, 'Kitchen window', 'perimeter', true, '0300101'],
      [10, 'Den window', 'perimeter', true, ''],
      [11, 'Back door', 'entry_exit', true, '0300102'],
      [12, 'Hall motion', 'interior_follower', false, '0300103'],
      [13, 'Landing smoke', 'fire_24h', false, '0300104'],
    ]);
  });

  it('keeps an updated zone’s values for columns the file leaves out', async () => {
    const panel = await buildPanel(a.site);
    const zone = await buildZone(panel, { number: 9, description: 'Front door', deviceType: 'door_contact', serial: '0412877', batteryType: 'CR2032', installedOn: '2025-03-14' });
    await Zone.update({ chime: false }, { where: { tenantId: a.firm.id, id: zone.id } });
    const res = await importFile(as.owner, panel.id, 'number,description,deviceType\n9,Front door (main),door_contact\n');
    expect(res.body.data).toMatchObject({ updates: 1 });
    const stored = await Zone.findOne({ where: { tenantId: a.firm.id, id: zone.id } });
    expect(stored).toMatchObject({ description: 'Front door (main)', serial: '0412877', batteryType: 'CR2032', installedOn: '2025-03-14', chime: false });
  });

  it('removes a zone given the status removed, and keeps the row', async () => {
    const panel = await buildPanel(a.site);
    const zone = await buildZone(panel, { number: 9, description: 'Front door', deviceType: 'door_contact', serial: '0412877' });
    const res = await importFile(as.owner, panel.id, 'number,description,deviceType,serial,status\n9,Front door,door_contact,0412877,removed\n');
    expect(res.body.data).toMatchObject({ updates: 1, creates: 0 });
    expect((await Zone.findOne({ where: { tenantId: a.firm.id, id: zone.id } }))!.status).toBe('removed');
  });

  it('refuses a file with unknown or missing columns, an empty file and broken quotes, naming the file', async () => {
    const panel = await buildPanel(a.site);
    const cases: [string, string][] = [
      ['zone,description,deviceType\n9,Den,window_contact\n', 'Unknown column “zone”'],
      ['number,serial\n9,0412877\n', 'needs the columns description and deviceType'],
      ['', 'empty'],
      [`${HEADER}\n`, 'no zones'],
      ['number,description,deviceType\n9,"Den window,window_contact\n10,Hall,motion\n', 'quote'],
    ];
    for (const [csv, message] of cases) {
      const res = await importFile(as.owner, panel.id, csv);
      expect(res.status, message).toBe(400);
      expect(res.body.error.fields.file, message).toContain(message);
    }
    const cells = await importFile(as.owner, panel.id, 'number,description,deviceType\n9,Den,window_contact,extra\n');
    expect(cells.body.error.fields).toHaveProperty(['rows.1']);
    expect(await zoneCount(panel.id)).toBe(0);
  });

  it('accepts a spreadsheet’s byte-order mark, semicolons, letter case and yes/no', async () => {
    const panel = await buildPanel(a.site);
    const res = await importFile(as.owner, panel.id, '\uFEFFNumber;Description;DeviceType;Chime\r\n9;Den window;window_contact;no\r\n');
    expect(res.status).toBe(200);
    expect(await Zone.findOne({ where: { tenantId: a.firm.id, panelId: panel.id } })).toMatchObject({ number: 9, description: 'Den window', chime: false });
  });

  it('refuses a file that is not text (415), one over 1 MB (413) and a missing file (400)', async () => {
    const panel = await buildPanel(a.site);
    const png = Buffer.from('89504e470d0a1a0a0000000d49484452', 'hex');
    const binary = await importFile(as.owner, panel.id, png, { filename: 'zones.csv' });
    expect(binary.status).toBe(415);
    expect(binary.body.error.code).toBe('unsupported_type');
    expect((await importFile(as.owner, panel.id, 'description,deviceType\nDen,window_contact\n', { filename: 'zones.png', contentType: 'image/png' })).status).toBe(415);
    const big = `${HEADER}\r\n${'9,Den window,window_contact,perimeter,0412877,1,true,true,true,active,,,,\r\n'.repeat(15000)}`;
    expect(Buffer.byteLength(big)).toBeGreaterThan(1024 * 1024);
    const tooLarge = await importFile(as.owner, panel.id, big);
    expect(tooLarge.status).toBe(413);
    expect(tooLarge.body.error.code).toBe('too_large');
    const none = await as.owner.post(`/api/panels/${panel.id}/zones/import`, {});
    expect(none.status).toBe(400);
    expect(none.body.error.fields).toHaveProperty('file');
    expect((await as.owner.agent.post(`/api/panels/${panel.id}/zones/import?dryRun=perhaps`).set('X-CSRF-Token', as.owner.csrfToken)).body.error.fields).toHaveProperty('dryRun');
    expect(await zoneCount(panel.id)).toBe(0);
  });

  it('lets every staff role import; refuses a client (404), another firm (404), the operator (403), signed out (401)', async () => {
    const csv = 'description,deviceType\nDen window,window_contact\n';
    for (const role of STAFF) {
      const panel = await buildPanel(a.site);
      expect((await importFile(as[role], panel.id, csv)).status, role).toBe(200);
    }
    const panel = await buildPanel(a.site);
    const other = await buildPanel(b.site);
    expect((await importFile(as.client, panel.id, csv)).status).toBe(404);
    expect((await importFile(as.owner, other.id, csv)).status).toBe(404);
    expect((await importFile(as.operator, panel.id, csv)).status).toBe(403);
    expect((await importFile(as.anonymous, panel.id, csv)).status).toBe(401);
    expect(await zoneCount(panel.id)).toBe(0);
    expect(await zoneCount(other.id, b.firm.id)).toBe(0);
  });
});
