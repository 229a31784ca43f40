/**
 * The life-safety zone check: a smoke, heat or CO device protects only on a fire or CO zone, in
 * service, reported and supervised; a combination alarm needs both halves enrolled. Each rule names
 * its source beside the check. Zones are invented and start from their device type's defaults.
 */
import { describe, expect, it } from 'vitest';
import { DEVICE_TYPES, LIFE_SAFETY_DEVICE_TYPES, ZONE_TYPES, isLifeSafetyDevice, type DeviceType } from '@domain/devices';
import {
  checkLifeSafetyZone,
  lifeSafetyZoneMessage,
  lifeSafetyZoneTypesFor,
  protectsAgainst,
  sensesOf,
  zoneName,
  type LifeSafetyZoneInput,
} from '@domain/life-safety-zone';
import { zoneDefaultsFor } from '@domain/zones';

let nextId = 0;
/** A zone enrolled with its device type's defaults (zones.ts), then any changes. */
function zone(deviceType: DeviceType, changes: Partial<LifeSafetyZoneInput> = {}): LifeSafetyZoneInput {
  const { zoneType, reportsToMonitoring, supervised } = zoneDefaultsFor(deviceType);
  nextId += 1;
  return { id: `z${nextId}`, description: `Test ${deviceType}`, deviceType, zoneType, reportsToMonitoring, supervised, status: 'active', ...changes };
}
const problemCodes = (z: LifeSafetyZoneInput, siblings: LifeSafetyZoneInput[] = []) => checkLifeSafetyZone(z, siblings).problems.map((p) => p.code);

describe('what each device type senses, and where it may be programmed', () => {
  it('smoke devices sense smoke, heat senses heat, CO senses CO, a combination both', () => {
    expect(sensesOf('smoke')).toEqual(['smoke']);
    expect(sensesOf('smoke_detector')).toEqual(['smoke']);
    expect(sensesOf('heat')).toEqual(['heat']);
    expect(sensesOf('co')).toEqual(['co']);
    expect(sensesOf('smoke_co')).toEqual(['smoke', 'co']);
    for (const type of DEVICE_TYPES) expect(sensesOf(type).length > 0, type).toBe(isLifeSafetyDevice(type));
  });

  it('fire devices belong on a fire zone, CO on a CO zone, a combination on one of each', () => {
    // CP-01 §4.2.5.1 fire zones exempt from the abort window — references.md 1.14 (PUBLIC); CO held to the same (from memory)
    expect(lifeSafetyZoneTypesFor('smoke')).toEqual(['fire_24h']);
    expect(lifeSafetyZoneTypesFor('smoke_detector')).toEqual(['fire_24h']);
    expect(lifeSafetyZoneTypesFor('heat')).toEqual(['fire_24h']);
    expect(lifeSafetyZoneTypesFor('co')).toEqual(['co_24h']);
    expect(lifeSafetyZoneTypesFor('smoke_co')).toEqual(['fire_24h', 'co_24h']);
    expect(lifeSafetyZoneTypesFor('motion')).toEqual([]);
  });
});

describe('checkLifeSafetyZone', () => {
  it('passes every life-safety device enrolled with its defaults, protecting what it senses on that zone', () => {
    expect(checkLifeSafetyZone(zone('smoke'))).toMatchObject({ senses: ['smoke'], protects: ['smoke'], problems: [] });
    expect(checkLifeSafetyZone(zone('smoke_detector'))).toMatchObject({ protects: ['smoke'], problems: [] });
    expect(checkLifeSafetyZone(zone('heat'))).toMatchObject({ protects: ['heat'], problems: [] });
    expect(checkLifeSafetyZone(zone('co'))).toMatchObject({ protects: ['co'], problems: [] });
  });

  it('has nothing to say about devices that are not life safety, whatever their programming', () => {
    for (const type of DEVICE_TYPES.filter((t) => !isLifeSafetyDevice(t))) {
      expect(checkLifeSafetyZone(zone(type, { zoneType: 'monitor_only', reportsToMonitoring: false, supervised: false })), type).toMatchObject({
        senses: [],
        protects: [],
        problems: [],
      });
    }
  });

  it('refuses a smoke alarm on every zone type but fire', () => {
    // CP-01 §4.2.5.1 fire exempt from the abort window — references.md 1.14 (PUBLIC); §4.3.2 swinger shutdown — references.md 1.20 (from memory)
    for (const zoneType of ZONE_TYPES) {
      const check = checkLifeSafetyZone(zone('smoke', { zoneType }));
      if (zoneType === 'fire_24h') {
        expect(check.problems, zoneType).toEqual([]);
      } else {
        expect(check.problems.map((p) => p.code), zoneType).toEqual(['wrong_zone_type']);
        expect(check.problems[0]?.field, zoneType).toBe('zoneType');
        expect(check.protects, zoneType).toEqual([]);
      }
    }
  });

  it('says a chime-only zone never raises an alarm, and a burglary zone brings the abort window and swinger shutdown', () => {
    // CP-01 §4.2.5.1 — references.md 1.14 (PUBLIC); swinger — references.md 1.20 (from memory)
    const chime = checkLifeSafetyZone(zone('smoke', { zoneType: 'monitor_only' })).problems[0];
    expect(chime?.what).toBe('it is on a “Chime only: no alarm, never reported” zone, so the panel only chimes and never raises an alarm for it');
    expect(chime?.fix).toBe('set its zone type to Fire, always armed');
    const burglary = checkLifeSafetyZone(zone('heat', { zoneType: 'entry_exit' })).problems[0];
    expect(burglary?.what).toContain('with the abort window and swinger shutdown that fire and CO must never have');
  });

  it('wants a CO zone for a CO alarm and refuses a fire zone for it; refuses a CO zone for a heat alarm', () => {
    // CO held to the fire exemptions of CP-01 §4.2.5.1 — references.md 1.14 (from memory for CO)
    const co = checkLifeSafetyZone(zone('co', { zoneType: 'fire_24h' }));
    expect(co.problems.map((p) => p.code)).toEqual(['wrong_zone_type']);
    expect(co.problems[0]?.fix).toBe('set its zone type to CO, always armed');
    expect(co.protects).toEqual([]);
    expect(problemCodes(zone('heat', { zoneType: 'co_24h' }))).toEqual(['wrong_zone_type']);
    expect(problemCodes(zone('smoke', { zoneType: 'co_24h' }))).toEqual(['wrong_zone_type']);
  });

  it('refuses a zone that does not report to the monitoring center', () => {
    // A monitored life-safety device reports to the monitoring center — common practice, no published source
    const check = checkLifeSafetyZone(zone('smoke', { reportsToMonitoring: false }));
    expect(check.problems).toEqual([expect.objectContaining({ code: 'not_reported', field: 'reportsToMonitoring', fix: 'turn on “Reports to the monitoring center”' })]);
    expect(check.protects).toEqual([]);
  });

  it('refuses a zone that is not supervised', () => {
    // NFPA 72 §23.16.2 low-power radio: depletion signal and trouble resound — references.md 4.11–4.12 (PUBLIC); supervision window 4.14 (from memory)
    const check = checkLifeSafetyZone(zone('co', { supervised: false }));
    expect(check.problems).toEqual([expect.objectContaining({ code: 'not_supervised', field: 'supervised', fix: 'turn on “Supervised”' })]);
    expect(check.protects).toEqual([]);
  });

  it('lists every problem at once, in the order zone type, reporting, supervision', () => {
    expect(problemCodes(zone('smoke', { zoneType: 'perimeter', reportsToMonitoring: false, supervised: false }))).toEqual(['wrong_zone_type', 'not_reported', 'not_supervised']);
  });

  it('protects nothing when bypassed or removed, with no programming problem of its own', () => {
    // A bypassed alarm protects no one — common practice, no published source
    for (const status of ['bypassed', 'removed'] as const) {
      expect(checkLifeSafetyZone(zone('smoke', { status })), status).toMatchObject({ senses: ['smoke'], protects: [], problems: [] });
    }
  });
});

describe('combination smoke and CO alarms', () => {
  const fireHalf = (changes: Partial<LifeSafetyZoneInput> = {}) => zone('smoke_co', { serial: '0044101', panelId: 'p1', ...changes });
  const coHalf = (changes: Partial<LifeSafetyZoneInput> = {}) => zone('smoke_co', { serial: '0044101', panelId: 'p1', zoneType: 'co_24h', ...changes });

  it('with both halves enrolled under one serial, each half protects what its zone carries', () => {
    // NFPA 72 Ch. 29 smoke — references.md 4.1 (PUBLIC); IRC §R315.3 CO — references.md 4.16 (PUBLIC)
    const fire = fireHalf();
    const co = coHalf();
    expect(checkLifeSafetyZone(fire, [fire, co])).toMatchObject({ senses: ['smoke', 'co'], protects: ['smoke'], problems: [] });
    expect(checkLifeSafetyZone(co, [fire, co])).toMatchObject({ protects: ['co'], problems: [] });
    expect(protectsAgainst(fire, 'smoke', [fire, co])).toBe(true);
    expect(protectsAgainst(fire, 'co', [fire, co])).toBe(false);
  });

  it('with one half enrolled, asks for the other, and the enrolled half still protects', () => {
    const fire = fireHalf();
    const check = checkLifeSafetyZone(fire, [fire]);
    expect(check.problems.map((p) => p.code)).toEqual(['combination_half_missing']);
    expect(check.problems[0]?.field).toBeNull();
    expect(check.problems[0]?.fix).toBe('enrol its CO input as a second zone with the same serial on CO, always armed');
    expect(check.protects).toEqual(['smoke']);
    const co = coHalf();
    expect(checkLifeSafetyZone(co, [co]).problems[0]?.what).toContain('whose smoke input has no Fire, always armed zone');
    expect(checkLifeSafetyZone(co, [co]).protects).toEqual(['co']);
  });

  it('does not pair halves with a different serial, an empty serial, another panel, or a removed zone', () => {
    const fire = fireHalf();
    expect(problemCodes(fire, [fire, coHalf({ serial: '0044102' })])).toEqual(['combination_half_missing']);
    expect(problemCodes(fire, [fire, coHalf({ panelId: 'p2' })])).toEqual(['combination_half_missing']);
    expect(problemCodes(fire, [fire, coHalf({ status: 'removed' })])).toEqual(['combination_half_missing']);
    expect(problemCodes(fire, [fire, zone('co', { serial: '0044101', panelId: 'p1' })])).toEqual(['combination_half_missing']);
    const blank = fireHalf({ serial: '  ' });
    expect(problemCodes(blank, [blank, coHalf({ serial: '  ' })])).toEqual(['combination_half_missing']);
    // serials are strings: leading zeros matter, surrounding spaces do not
    expect(problemCodes(fire, [fire, coHalf({ serial: '44101' })])).toEqual(['combination_half_missing']);
    expect(problemCodes(fire, [fire, coHalf({ serial: ' 0044101 ' })])).toEqual([]);
    // a bypassed half is still enrolled (the bypass is its own finding)
    expect(problemCodes(fire, [fire, coHalf({ status: 'bypassed' })])).toEqual([]);
  });

  it('on a burglary zone is wrongly programmed, with both zone types named in the fix', () => {
    // CP-01 §4.2.5.1 — references.md 1.14 (PUBLIC)
    const check = checkLifeSafetyZone(fireHalf({ zoneType: 'perimeter' }), []);
    expect(check.problems.map((p) => p.code)).toEqual(['wrong_zone_type']);
    expect(check.problems[0]?.fix).toBe('set its zone type to Fire, always armed (and enrol its CO input on CO, always armed)');
    expect(check.protects).toEqual([]);
  });
});

describe('lifeSafetyZoneMessage', () => {
  it('names the zone, what is wrong and what to change, and says it does not count', () => {
    const z = zone('smoke', { number: 7, description: 'Hall smoke', zoneType: 'monitor_only', supervised: false });
    const message = lifeSafetyZoneMessage(z, checkLifeSafetyZone(z).problems);
    expect(message).toBe(
      'Zone 7 “Hall smoke”: it is on a “Chime only: no alarm, never reported” zone, so the panel only chimes and never raises an alarm for it; and it is not supervised, so the panel shows no trouble if it goes silent or its battery dies. It does not count as protection until this is changed. To fix: set its zone type to Fire, always armed; turn on “Supervised”.',
    );
  });

  it('does not say "does not count" when only a combination half is missing', () => {
    const z = zone('smoke_co', { description: 'Landing smoke/CO', serial: 'A1' });
    const message = lifeSafetyZoneMessage(z, checkLifeSafetyZone(z, [z]).problems);
    expect(message).toMatch(/^“Landing smoke\/CO”: it is a combination alarm/);
    expect(message).not.toContain('does not count');
  });

  it('never carries a source mark, which is for staff only', () => {
    for (const deviceType of LIFE_SAFETY_DEVICE_TYPES) {
      const z = zone(deviceType, { zoneType: 'perimeter', reportsToMonitoring: false, supervised: false });
      expect(lifeSafetyZoneMessage(z, checkLifeSafetyZone(z).problems), deviceType).not.toMatch(/from memory|MEMORY|PUBLIC|references\.md/i);
    }
  });

  it('names a zone with and without a number', () => {
    expect(zoneName({ number: 12, description: 'Kitchen heat' })).toBe('zone 12 “Kitchen heat”');
    expect(zoneName({ number: null, description: 'Kitchen heat' })).toBe('“Kitchen heat”');
  });
});
