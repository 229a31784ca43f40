/**
 * Coverage: protected openings, the summary line, interior detection, and the life-safety rules
 * with their sources. Every rule checked below names its source beside the check: the document,
 * edition and clause, and the references.md row (PUBLIC or MEMORY), or "common practice, no
 * published source". All premises are invented.
 */
import { describe, expect, it } from 'vitest';
import {
  COVERAGE_FINDING_CODES,
  COVERAGE_RULES,
  SLEEPING_AREA_HALL_KINDS,
  canServeSleepingArea,
  computeCoverage,
  countOpeningsInWords,
  coverageCaution,
  coverageSummary,
  type CoverageFinding,
  type CoverageFloorInput,
  type CoverageInput,
  type CoverageOpeningInput,
  type CoverageResult,
  type CoverageRoomInput,
  type CoverageZoneInput,
} from '@domain/coverage';
import type { DeviceType } from '@domain/devices';
import { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import { ROOM_KINDS, type OpeningKind } from '@domain/premises';
import { zoneDefaultsFor } from '@domain/zones';

// --- small invented premises ------------------------------------------------------------------

function floor(id: string, name: string, level: number, belowGrade = level < 0): CoverageFloorInput {
  return { id, name, level, belowGrade };
}
function room(id: string, floorId: string, name: string, kind: CoverageRoomInput['kind'], extra: Partial<CoverageRoomInput> = {}): CoverageRoomInput {
  return { id, floorId, name, kind, fuelBurningAppliance: false, attachedGarage: false, ...extra };
}
/** A bedroom that names the hall serving its sleeping area, its door confirmed within 21 ft of that hall's alarm. */
function bedroom(id: string, floorId: string, name: string, hallId: string | null, extra: Partial<CoverageRoomInput> = {}): CoverageRoomInput {
  return room(id, floorId, name, 'bedroom', { servedByHallId: hallId, hallWithin21FtConfirmed: hallId !== null, ...extra });
}
function opening(id: string, roomId: string, label: string, kind: OpeningKind = 'window', groundReachable = true): CoverageOpeningInput {
  return { id, roomId, kind, label, groundReachable };
}
/** The Behaviour fields a zone gets from its device type (zones.ts), as a technician enrols it. */
function behaviour(deviceType: DeviceType): Pick<CoverageZoneInput, 'zoneType' | 'reportsToMonitoring' | 'supervised'> {
  const { zoneType, reportsToMonitoring, supervised } = zoneDefaultsFor(deviceType);
  return { zoneType, reportsToMonitoring, supervised };
}
/** A contact on an opening, programmed with the defaults for its device type. */
function contact(id: string, openingId: string, description: string, extra: Partial<CoverageZoneInput> = {}): CoverageZoneInput {
  const deviceType = extra.deviceType ?? 'window_contact';
  return { id, description, deviceType, ...behaviour(deviceType), status: 'active', roomId: null, openingId, ...extra };
}
/** A room device (motion, glass-break, smoke, heat, CO), programmed with the defaults for its device type. */
function device(id: string, roomId: string, deviceType: DeviceType, extra: Partial<CoverageZoneInput> = {}): CoverageZoneInput {
  return { id, description: `${roomId} ${deviceType}`, deviceType, ...behaviour(deviceType), status: 'active', roomId, openingId: null, ...extra };
}
/** A combination smoke and CO alarm enrolled as two zones with one serial: smoke input on a fire zone, CO input on a CO zone. */
function combination(id: string, roomId: string, serial: string): CoverageZoneInput[] {
  return [
    device(`${id}-fire`, roomId, 'smoke_co', { description: `${roomId} smoke/CO (smoke)`, serial }),
    device(`${id}-co`, roomId, 'smoke_co', { description: `${roomId} smoke/CO (CO)`, serial, zoneType: 'co_24h' }),
  ];
}
function premises(parts: Partial<CoverageInput>): CoverageInput {
  return { floors: [], rooms: [], openings: [], zones: [], ...parts };
}
const codes = (r: CoverageResult) => r.findings.map((f) => f.code);
const withCode = (r: CoverageResult, code: string) => r.findings.filter((f) => f.code === code);
const lifeSafety = (r: CoverageResult) => r.findings.filter((f) => f.lifeSafety);
/** The codes one result has and the other lacks. */
const difference = (a: CoverageResult, b: CoverageResult) => codes(a).filter((c) => !codes(b).includes(c));

/**
 * A compliant two-storey house with a basement (invented): a furnace in the basement utility room
 * and an attached garage, so CO alarms are required too. Both bedrooms name the landing as the
 * hall serving their sleeping area, and their doors are confirmed within 21 ft of its alarm.
 */
function compliantHouse(): CoverageInput {
  return premises({
    floors: [floor('up', 'Upstairs', 1), floor('gf', 'Ground floor', 0), floor('bs', 'Basement', -1)],
    rooms: [
      room('bs-rec', 'bs', 'Rec room', 'basement'),
      room('bs-util', 'bs', 'Utility', 'utility', { fuelBurningAppliance: true }),
      room('gf-hall', 'gf', 'Hall', 'hall'),
      room('gf-kit', 'gf', 'Kitchen', 'kitchen'),
      room('gf-gar', 'gf', 'Garage', 'garage', { attachedGarage: true }),
      bedroom('up-b1', 'up', 'Bedroom 1', 'up-land'),
      bedroom('up-b2', 'up', 'Bedroom 2', 'up-land'),
      room('up-land', 'up', 'Landing', 'hall'),
    ],
    openings: [
      opening('o-front', 'gf-hall', 'Front door', 'door'),
      opening('o-kit', 'gf-kit', 'Kitchen window'),
      opening('o-gar', 'gf-gar', 'Garage door', 'garage_door'),
      opening('o-rec', 'bs-rec', 'Rec room window'),
      opening('o-b1', 'up-b1', 'Bedroom 1 window', 'window', false),
    ],
    zones: [
      contact('z1', 'o-front', 'Front door', { deviceType: 'door_contact' }),
      contact('z2', 'o-kit', 'Kitchen window'),
      contact('z3', 'o-gar', 'Garage door', { deviceType: 'garage_door_tilt' }),
      contact('z4', 'o-rec', 'Rec room window'),
      contact('z5', 'o-b1', 'Bedroom 1 window'),
      device('z6', 'gf-hall', 'motion'),
      device('z7', 'gf-kit', 'glass_break'),
      device('z8', 'gf-gar', 'motion'),
      device('z9', 'bs-rec', 'motion'),
      device('z10', 'up-b1', 'glass_break'),
      device('s1', 'bs-rec', 'smoke'),
      device('s2', 'gf-hall', 'smoke'),
      device('s3', 'up-b1', 'smoke'),
      device('s4', 'up-b2', 'smoke'),
      device('s5', 'up-land', 'smoke'),
      device('c1', 'bs-rec', 'co'),
      device('c2', 'gf-hall', 'co'),
      device('c3', 'up-land', 'co'),
    ],
  });
}

/** One floor, one bedroom served by the landing (door within 21 ft confirmed): the base for the sleeping-room rules. */
function oneBedroomFloor(zones: CoverageZoneInput[], extraRooms: CoverageRoomInput[] = [], bed: Partial<CoverageRoomInput> = {}): CoverageInput {
  return premises({
    floors: [floor('f1', 'Upstairs', 1)],
    rooms: [bedroom('bed', 'f1', 'Bedroom', 'land', bed), room('land', 'f1', 'Landing', 'hall'), ...extraRooms],
    zones,
  });
}

// --- openings -----------------------------------------------------------------------------------

describe('openings', () => {
  const base = premises({
    floors: [floor('f', 'Ground floor', 0)],
    rooms: [room('den', 'f', 'Den', 'living')],
    openings: [opening('w', 'den', 'Den window')],
  });

  it('are protected by an active contact linked to them, with that zone’s description', () => {
    const r = computeCoverage({ ...base, zones: [contact('z', 'w', 'Den window')] });
    expect(r.floors[0]?.rooms[0]?.openings[0]).toEqual({
      id: 'w',
      kind: 'window',
      label: 'Den window',
      groundReachable: true,
      protected: true,
      zoneDescription: 'Den window',
    });
    expect(r.openings).toEqual({ total: 1, protected: 1, unprotectedGroundReachable: 0 });
  });

  it('take the first description in order when several contacts protect one opening', () => {
    const r = computeCoverage({ ...base, zones: [contact('z1', 'w', 'Den window upper'), contact('z2', 'w', 'Den window lower')] });
    expect(r.floors[0]?.rooms[0]?.openings[0]?.zoneDescription).toBe('Den window lower');
  });

  it('protected only by a bypassed or removed zone count as unprotected', () => {
    for (const status of ['bypassed', 'removed'] as const) {
      const r = computeCoverage({ ...base, zones: [contact('z', 'w', 'Den window', { status })] });
      expect(r.openings, status).toEqual({ total: 1, protected: 0, unprotectedGroundReachable: 1 });
      expect(r.floors[0]?.rooms[0]?.openings[0]?.zoneDescription, status).toBeNull();
      expect(codes(r), status).toContain('opening_unprotected_ground');
    }
  });

  it('are not protected by a glass-break or motion detector, even one linked to the opening', () => {
    for (const deviceType of ['glass_break', 'motion'] as const) {
      const r = computeCoverage({ ...base, zones: [contact('z', 'w', 'Den glass', { deviceType, roomId: 'den' })] });
      expect(r.openings.protected, deviceType).toBe(0);
      expect(r.floors[0]?.rooms[0]?.openings[0]?.protected, deviceType).toBe(false);
    }
  });

  it('are not protected by a contact linked only to the room', () => {
    const r = computeCoverage({ ...base, zones: [contact('z', 'w', 'Den window', { openingId: null, roomId: 'den' })] });
    expect(r.openings.protected).toBe(0);
  });

  it('count ground-reachable gaps only among unprotected openings that can be reached from the ground', () => {
    const r = computeCoverage(
      premises({
        floors: [floor('f', 'Ground floor', 0)],
        rooms: [room('den', 'f', 'Den', 'living')],
        openings: [opening('a', 'den', 'A'), opening('b', 'den', 'B', 'window', false), opening('c', 'den', 'C')],
        zones: [contact('z', 'c', 'C')],
      }),
    );
    expect(r.openings).toEqual({ total: 3, protected: 1, unprotectedGroundReachable: 1 });
  });
});

// --- summary ------------------------------------------------------------------------------------

describe('the summary line', () => {
  const o = (kind: OpeningKind, isProtected: boolean, groundReachable = true) => ({ kind, protected: isProtected, groundReachable });

  it('reads "14 of 17 openings protected; 2 windows reachable from the ground have no sensor"', () => {
    const openings: CoverageOpeningInput[] = [];
    const zones: CoverageZoneInput[] = [];
    for (let i = 1; i <= 17; i += 1) {
      openings.push(opening(`o${i}`, 'r', `Window ${i}`, 'window', i !== 17));
      if (i <= 14) zones.push(contact(`z${i}`, `o${i}`, `Window ${i}`));
    }
    const r = computeCoverage(
      premises({ floors: [floor('f', 'Ground floor', 0)], rooms: [room('r', 'f', 'Living room', 'living')], openings, zones }),
    );
    expect(r.summary).toBe('14 of 17 openings protected; 2 windows reachable from the ground have no sensor');
    expect(r.openings).toEqual({ total: 17, protected: 14, unprotectedGroundReachable: 2 });
  });

  it('uses the singular for one opening of one kind', () => {
    expect(coverageSummary([o('window', true), o('window', false)])).toBe(
      '1 of 2 openings protected; 1 window reachable from the ground has no sensor',
    );
    expect(coverageSummary([o('sliding_door', false), o('door', true)])).toBe(
      '1 of 2 openings protected; 1 sliding door reachable from the ground has no sensor',
    );
  });

  it('names several kinds in plain words', () => {
    expect(coverageSummary([o('window', false), o('door', false), o('window', false), o('door', true)])).toBe(
      '1 of 4 openings protected; 1 door and 2 windows reachable from the ground have no sensor',
    );
    expect(coverageSummary([o('skylight', false), o('window', false), o('door', false), o('window', false)])).toBe(
      '0 of 4 openings protected; 1 door, 2 windows and 1 skylight reachable from the ground have no sensor',
    );
    expect(countOpeningsInWords(2, 'garage_door')).toBe('2 garage doors');
  });

  it('leaves the second clause out when no unprotected opening can be reached from the ground', () => {
    expect(coverageSummary([o('window', true), o('window', false, false), o('skylight', false, false)])).toBe('1 of 3 openings protected');
  });

  it('says when all are protected, and when none are recorded', () => {
    expect(coverageSummary([o('door', true), o('window', true), o('window', true), o('sliding_door', true), o('skylight', true, false)])).toBe(
      'All 5 openings protected',
    );
    expect(coverageSummary([])).toBe('No openings recorded yet');
    expect(computeCoverage(premises({})).summary).toBe('No openings recorded yet');
  });
});

// --- layout ---------------------------------------------------------------------------------------

describe('floors, rooms and openings', () => {
  it('are ordered by level from the lowest up, rooms by name, openings by label', () => {
    const r = computeCoverage(
      premises({
        floors: [floor('up', 'Upstairs', 1), floor('gf', 'Ground floor', 0), floor('bs', 'Basement', -1)],
        rooms: [room('b10', 'up', 'Bedroom 10', 'bedroom'), room('b2', 'up', 'Bedroom 2', 'bedroom'), room('bath', 'up', 'bath', 'bath')],
        openings: [opening('w2', 'b2', 'West window'), opening('w1', 'b2', 'East window')],
      }),
    );
    expect(r.floors.map((f) => f.name)).toEqual(['Basement', 'Ground floor', 'Upstairs']);
    expect(r.floors[0]?.belowGrade).toBe(true);
    expect(r.floors[2]?.rooms.map((x) => x.name)).toEqual(['bath', 'Bedroom 2', 'Bedroom 10']);
    expect(r.floors[2]?.rooms[1]?.openings.map((x) => x.label)).toEqual(['East window', 'West window']);
  });

  it('list each room’s active room devices, not contacts and not bypassed or removed zones', () => {
    const r = computeCoverage(
      premises({
        floors: [floor('f', 'Ground floor', 0)],
        rooms: [room('k', 'f', 'Kitchen', 'kitchen')],
        openings: [opening('w', 'k', 'Kitchen window')],
        zones: [
          device('m', 'k', 'motion', { description: 'Kitchen motion' }),
          device('s', 'k', 'smoke', { description: 'Kitchen smoke', status: 'bypassed' }),
          device('c', 'k', 'co', { description: 'Kitchen CO', status: 'removed' }),
          device('x', 'k', 'door_contact', { description: 'Stray contact' }),
          contact('z', 'w', 'Kitchen window'),
        ],
      }),
    );
    // `counts` is new: false only for a life-safety device whose zone cannot protect (life-safety-zone.ts)
    expect(r.floors[0]?.rooms[0]?.devices).toEqual([{ zoneId: 'm', description: 'Kitchen motion', deviceType: 'motion', counts: true }]);
  });
});

// --- life safety: the zone check --------------------------------------------------------------------

describe('a smoke alarm counts only as its zone is programmed (life-safety-zone.ts)', () => {
  /** The same house each time; only the landing alarm's zone differs. */
  const house = (landing: Partial<CoverageZoneInput> = {}) =>
    computeCoverage(
      oneBedroomFloor([device('s-bed', 'bed', 'smoke'), device('s-land', 'land', 'smoke', { number: 7, description: 'Landing smoke', ...landing })]),
    );
  const baseline = house();

  it('programmed as the defaults give it (fire, reported, supervised), the house has no findings', () => {
    // NFPA 72 Ch. 29 required detection: sleeping room and outside the sleeping area — references.md 4.1 (PUBLIC)
    expect(baseline.findings).toEqual([]);
    expect(baseline.floors[0]?.rooms.find((r) => r.id === 'land')?.devices).toEqual([
      { zoneId: 's-land', description: 'Landing smoke', deviceType: 'smoke', counts: true },
    ]);
  });

  it('on a chime-only zone it does not count, and the hall is left without an alarm', () => {
    // CP-01 §4.2.5.1 fire exempt from any abort window — references.md 1.14 (PUBLIC); a chime-only zone never raises an alarm at all
    const r = house({ zoneType: 'monitor_only' });
    expect(difference(r, baseline).sort()).toEqual(['life_safety_zone_programming', 'smoke_missing_outside_sleeping_area']);
    const [zoneFinding] = withCode(r, 'life_safety_zone_programming');
    expect(zoneFinding).toMatchObject({ severity: 'error', evidence: 'public', zoneId: 's-land', roomId: 'land', floorId: 'f1', lifeSafety: true });
    expect(zoneFinding?.source).toContain('references.md 1.14 (PUBLIC)');
    expect(zoneFinding?.message).toMatch(/^Zone 7 “Landing smoke”: /);
    expect(zoneFinding?.message).toContain('only chimes');
    expect(zoneFinding?.message).toContain('set its zone type to Fire, always armed');
    // NFPA 72 Ch. 29 outside each separate sleeping area — references.md 4.1 (PUBLIC)
    expect(withCode(r, 'smoke_missing_outside_sleeping_area')[0]?.message).toContain('“Landing smoke” is not programmed to protect');
    expect(r.floors[0]?.rooms.find((x) => x.id === 'land')?.devices[0]?.counts).toBe(false);
  });

  it('on a burglary zone it does not count, because the abort window and swinger shutdown would apply', () => {
    // CP-01 §4.2.5.1 fire exempt from the abort window — references.md 1.14 (PUBLIC); §4.3.2 swinger shutdown not on fire — references.md 1.20 (from memory)
    const r = house({ zoneType: 'perimeter' });
    expect(difference(r, baseline).sort()).toEqual(['life_safety_zone_programming', 'smoke_missing_outside_sleeping_area']);
    expect(withCode(r, 'life_safety_zone_programming')[0]?.message).toContain('abort window and swinger shutdown');
  });

  it('when it does not report to the monitoring center it does not count', () => {
    // A monitored life-safety device reports to the monitoring center — common practice, no published source
    const r = house({ reportsToMonitoring: false });
    expect(difference(r, baseline).sort()).toEqual(['life_safety_zone_programming', 'smoke_missing_outside_sleeping_area']);
    expect(withCode(r, 'life_safety_zone_programming')[0]?.message).toContain('turn on “Reports to the monitoring center”');
  });

  it('when it is not supervised it does not count', () => {
    // NFPA 72 §23.16.2 low-power radio: depletion signal and trouble resound — references.md 4.11–4.12 (PUBLIC); household supervision window 4.14 (from memory)
    const r = house({ supervised: false });
    expect(difference(r, baseline).sort()).toEqual(['life_safety_zone_programming', 'smoke_missing_outside_sleeping_area']);
    expect(withCode(r, 'life_safety_zone_programming')[0]?.message).toContain('turn on “Supervised”');
  });

  it('in a bedroom, programmed wrong, leaves the bedroom without an alarm', () => {
    // NFPA 72 Ch. 29 a smoke alarm in every sleeping room — references.md 4.1 (PUBLIC)
    const r = computeCoverage(oneBedroomFloor([device('s-bed', 'bed', 'smoke', { description: 'Bedroom smoke', zoneType: 'entry_exit' }), device('s-land', 'land', 'smoke')]));
    expect(codes(r).sort()).toEqual(['life_safety_zone_programming', 'smoke_missing_sleeping_room']);
    expect(withCode(r, 'smoke_missing_sleeping_room')[0]?.message).toContain('“Bedroom smoke” is not programmed to protect');
  });

  it('a system smoke detector on a fire zone counts as the smoke detection a bedroom needs', () => {
    // NFPA 72 Ch. 29 required smoke alarm / detector locations — references.md 4.1 (PUBLIC)
    const r = computeCoverage(oneBedroomFloor([device('d-bed', 'bed', 'smoke_detector'), device('s-land', 'land', 'smoke')]));
    expect(r.findings).toEqual([]);
  });

  it('a wrongly programmed alarm that is bypassed is named as bypassed, not as a programming problem', () => {
    // A bypassed alarm protects no one — common practice, no published source
    const r = computeCoverage(oneBedroomFloor([device('s-bed', 'bed', 'smoke', { status: 'bypassed', zoneType: 'perimeter' }), device('s-land', 'land', 'smoke')]));
    expect(codes(r).sort()).toEqual(['smoke_bypassed_only', 'smoke_missing_sleeping_room']);
  });
});

describe('a combination smoke and CO alarm', () => {
  // The attached garage makes CO alarms required — IRC 2018 §R315.1 — references.md 4.15 (PUBLIC)
  const garage = room('gar', 'f1', 'Garage', 'garage', { attachedGarage: true });

  it('enrolled as two zones with one serial protects against smoke and CO', () => {
    // NFPA 72 Ch. 29 — references.md 4.1 (PUBLIC); IRC §R315.3 CO outside each sleeping area — references.md 4.16 (PUBLIC)
    const r = computeCoverage(oneBedroomFloor([...combination('bed', 'bed', 'SN-100'), ...combination('land', 'land', 'SN-200')], [garage]));
    expect(r.findings).toEqual([]);
  });

  it('enrolled on the fire zone only protects against smoke, and the CO half is asked for', () => {
    // IRC 2015/2018 §R315.3 CO outside each separate sleeping area — references.md 4.16 (PUBLIC)
    const [landingFire] = combination('land', 'land', 'SN-200');
    const r = computeCoverage(oneBedroomFloor([...combination('bed', 'bed', 'SN-100'), landingFire!], [garage]));
    const [half] = withCode(r, 'life_safety_zone_programming');
    // only a half missing: a warning, because the enrolled smoke half still protects
    expect(half).toMatchObject({ severity: 'warning', zoneId: 'land-fire' });
    expect(half?.message).toContain('a combination alarm whose CO input has no CO, always armed zone');
    expect(codes(r)).not.toContain('smoke_missing_outside_sleeping_area');
    expect(withCode(r, 'co_missing_outside_sleeping_area')[0]?.message).toContain('is not programmed to protect');
  });

  it('with its two zones under different serials: each half is asked to be paired, and each still protects what it carries', () => {
    // IRC 2015/2018 §R315.3 — references.md 4.16 (PUBLIC): the CO zone is on a CO zone type, in service,
    // reported and supervised, so it counts near the bedrooms; the serials only fail to pair the halves.
    const [fire, co] = combination('land', 'land', 'SN-200');
    const r = computeCoverage(oneBedroomFloor([...combination('bed', 'bed', 'SN-100'), fire!, { ...co!, serial: 'SN-201' }], [garage]));
    expect(codes(r)).toEqual(['life_safety_zone_programming', 'life_safety_zone_programming']);
    expect(withCode(r, 'life_safety_zone_programming').map((f) => [f.zoneId, f.severity]).sort()).toEqual([
      ['land-co', 'warning'],
      ['land-fire', 'warning'],
    ]);
  });
});

// --- life safety: sleeping rooms, sleeping areas, levels --------------------------------------------

describe('smoke alarms (NFPA 72 Chapter 29)', () => {
  it('are required in every sleeping room', () => {
    // NFPA 72 Ch. 29: a smoke alarm in every sleeping room — references.md 4.1 (PUBLIC)
    const r = computeCoverage(oneBedroomFloor([device('s', 'land', 'smoke')]));
    const [f] = withCode(r, 'smoke_missing_sleeping_room');
    expect(f).toMatchObject({ severity: 'error', evidence: 'public', floorId: 'f1', roomId: 'bed', zoneId: null, lifeSafety: true });
    expect(f?.source).toContain('NFPA 72');
    expect(f?.source).toContain('references.md 4.1 (PUBLIC)');
    expect(f?.message).toContain('Bedroom (Upstairs)');
    expect(codes(r)).toEqual(['smoke_missing_sleeping_room']);
  });

  it('are not replaced by a heat alarm', () => {
    // NFPA 72 Ch. 29: a smoke alarm in every sleeping room — references.md 4.1 (PUBLIC); a heat alarm is not one
    const r = computeCoverage(oneBedroomFloor([device('s', 'land', 'smoke'), device('h', 'bed', 'heat')]));
    expect(codes(r)).toEqual(['smoke_missing_sleeping_room']);
    expect(withCode(r, 'smoke_missing_sleeping_room')[0]?.message).toContain('heat alarm there does not count');
  });

  it('do not count while bypassed, and the message says so', () => {
    // NFPA 72 Ch. 29: a smoke alarm in every sleeping room — references.md 4.1 (PUBLIC)
    const r = computeCoverage(
      oneBedroomFloor([device('s', 'land', 'smoke'), device('b', 'bed', 'smoke', { description: 'Bedroom smoke', status: 'bypassed' })]),
    );
    expect(withCode(r, 'smoke_missing_sleeping_room')[0]?.message).toContain('“Bedroom smoke” is bypassed');
    // A bypassed alarm protects no one — common practice, no published source
    const [w] = withCode(r, 'smoke_bypassed_only');
    expect(w).toMatchObject({ severity: 'warning', evidence: 'practice', roomId: 'bed', lifeSafety: true });
    expect(w?.source).toContain('common practice, no published source');
  });

  it('are required outside each sleeping area, in the hall that serves it', () => {
    // NFPA 72 Ch. 29: outside each separate sleeping area — references.md 4.1 (PUBLIC)
    // Changed on purpose: the finding used to have no room (roomId null); it now names the hall the
    // bedroom records as serving its sleeping area, because only that hall can satisfy the rule.
    const r = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke')]));
    expect(withCode(r, 'smoke_missing_outside_sleeping_area')).toEqual([
      expect.objectContaining({ severity: 'error', evidence: 'public', floorId: 'f1', roomId: 'land', zoneId: null }),
    ]);
    const [f] = withCode(r, 'smoke_missing_outside_sleeping_area');
    expect(f?.source).toContain('references.md 4.1 (PUBLIC)');
    expect(f?.message).toContain('The sleeping area of Bedroom has no smoke alarm in service in Landing (Upstairs), the hall that serves it.');
  });

  it('outside the sleeping area: in the hall serving the bedrooms passes, in the kitchen or a bathroom it does not', () => {
    // NFPA 72 Ch. 29: outside each separate sleeping area, within 21 ft of the bedroom doors — references.md 4.1 (PUBLIC)
    // Changed on purpose: an alarm in any other non-bedroom room on the floor used to satisfy this.
    const others = [room('kit', 'f1', 'Kitchen', 'kitchen'), room('bath', 'f1', 'Bathroom', 'bath')];
    const inHall = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('x', 'land', 'smoke')], others));
    const inKitchen = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('x', 'kit', 'smoke')], others));
    const inBath = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('x', 'bath', 'smoke')], others));
    expect(inHall.findings).toEqual([]);
    expect(codes(inKitchen)).toEqual(['smoke_missing_outside_sleeping_area']);
    expect(withCode(inKitchen, 'smoke_missing_outside_sleeping_area')[0]?.message).toContain('The smoke alarm in Kitchen does not stand in for it');
    expect(codes(inBath)).toEqual(['smoke_missing_outside_sleeping_area']);
    expect(withCode(inBath, 'smoke_missing_outside_sleeping_area')[0]?.message).toContain('The smoke alarm in Bathroom does not stand in for it');
  });

  it('outside the sleeping area: an alarm in the garage never stands in for the hall', () => {
    // NFPA 72 Ch. 29 outside each sleeping area — references.md 4.1 (PUBLIC); garages are not living spaces — from memory
    const garage = room('gar', 'f1', 'Garage', 'garage', { attachedGarage: true });
    const r = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('g', 'gar', 'smoke'), device('c', 'land', 'co')], [garage]));
    expect(codes(r).sort()).toEqual(['smoke_in_garage', 'smoke_missing_outside_sleeping_area']);
  });

  it('outside the sleeping area cannot be judged when the bedroom names no hall, and an alarm nearby is not taken as enough', () => {
    // NFPA 72 Ch. 29 outside each separate sleeping area — references.md 4.1 (PUBLIC); IRC §R315.3 — references.md 4.16 (PUBLIC)
    // Changed on purpose: a bedroom that names no hall used to be satisfied by any alarm on its floor.
    const known = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke')]));
    const unknown = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke')], [], { servedByHallId: null }));
    expect(known.findings).toEqual([]);
    expect(codes(unknown)).toEqual(['sleeping_area_unknown']);
    const [f] = withCode(unknown, 'sleeping_area_unknown');
    expect(f).toMatchObject({ severity: 'warning', evidence: 'public', roomId: 'bed', floorId: 'f1', lifeSafety: true });
    expect(f?.message).toContain('Record which hall or landing serves Bedroom (Upstairs)');
    expect(f?.message).toContain('whether a smoke alarm outside its sleeping area');
    expect(f?.source).toContain('references.md 4.16 (PUBLIC)');
  });

  it('outside the sleeping area: a bedroom that names a kitchen as its hall is treated as naming none', () => {
    // IRC §R315.3 "in the immediate vicinity of the bedrooms" — references.md 4.16 (PUBLIC)
    const kitchen = room('kit', 'f1', 'Kitchen', 'kitchen');
    const r = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('k', 'kit', 'smoke')], [kitchen], { servedByHallId: 'kit' }));
    expect(codes(r)).toEqual(['sleeping_area_unknown']);
    expect(canServeSleepingArea('kitchen')).toBe(false);
    expect(canServeSleepingArea('hall')).toBe(true);
    // every kind that may serve is a kind of room the premises know, and none is a bedroom, bathroom, kitchen, garage, utility or basement room
    for (const kind of SLEEPING_AREA_HALL_KINDS) expect(ROOM_KINDS).toContain(kind);
    for (const kind of ['bedroom', 'bath', 'kitchen', 'garage', 'utility', 'basement'] as const) expect(canServeSleepingArea(kind), kind).toBe(false);
  });

  it('with the hall alarm in place, ask the technician to confirm 21 ft from each bedroom door until it is confirmed', () => {
    // NFPA 72 Ch. 29: within 21 ft (6.4 m) of any sleeping-room door, along the path of travel — references.md 4.1 (PUBLIC)
    const confirmed = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke')]));
    const unconfirmed = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke')], [], { hallWithin21FtConfirmed: false }));
    expect(confirmed.findings).toEqual([]);
    expect(codes(unconfirmed)).toEqual(['sleeping_area_distance_unconfirmed']);
    const [f] = withCode(unconfirmed, 'sleeping_area_distance_unconfirmed');
    expect(f).toMatchObject({ severity: 'warning', evidence: 'public', roomId: 'bed', lifeSafety: true });
    expect(f?.message).toContain('within 21 ft (6.4 m) of the smoke alarm in Landing');
    // no alarm in the hall: the missing alarm is the finding, not the distance
    const noHallAlarm = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke')], [], { hallWithin21FtConfirmed: false }));
    expect(codes(noHallAlarm)).toEqual(['smoke_missing_outside_sleeping_area']);
  });

  it('judge each separate sleeping area by its own hall', () => {
    // NFPA 72 Ch. 29: outside each separate sleeping area — references.md 4.1 (PUBLIC)
    const r = computeCoverage(
      premises({
        floors: [floor('up', 'Upstairs', 1), floor('gf', 'Ground floor', 0)],
        rooms: [
          bedroom('a', 'up', 'Bedroom A', 'land'),
          bedroom('b', 'up', 'Bedroom B', 'land'),
          room('land', 'up', 'Landing', 'hall'),
          bedroom('c', 'gf', 'Guest room', 'gh'),
          room('gh', 'gf', 'Back hall', 'hall'),
          room('liv', 'gf', 'Living room', 'living'),
        ],
        zones: [device('sa', 'a', 'smoke'), device('sb', 'b', 'smoke'), device('sc', 'c', 'smoke'), device('sl', 'land', 'smoke'), device('sv', 'liv', 'smoke')],
      }),
    );
    expect(codes(r)).toEqual(['smoke_missing_outside_sleeping_area']);
    const [f] = withCode(r, 'smoke_missing_outside_sleeping_area');
    expect(f?.roomId).toBe('gh');
    expect(f?.message).toContain('The sleeping area of Guest room has no smoke alarm in service in Back hall (Ground floor)');
    expect(f?.message).toContain('The smoke alarm in Living room does not stand in for it');
  });

  it('are required on a basement level', () => {
    // NFPA 72 Ch. 29: every level, including basements — references.md 4.1 (PUBLIC)
    const r = computeCoverage(
      premises({
        floors: [floor('gf', 'Ground floor', 0), floor('bs', 'Basement', -1)],
        rooms: [room('hall', 'gf', 'Hall', 'hall'), room('rec', 'bs', 'Rec room', 'basement')],
        zones: [device('s', 'hall', 'smoke')],
      }),
    );
    const [f] = withCode(r, 'smoke_missing_level');
    expect(f).toMatchObject({ severity: 'error', evidence: 'public', floorId: 'bs', roomId: null, lifeSafety: true });
    expect(f?.message).toContain('Basement');
    expect(f?.message).toContain('Basements need one too.');
    expect(f?.source).toContain('references.md 4.1 (PUBLIC)');
    expect(codes(r)).toEqual(['smoke_missing_level']);
  });

  it('are required on a level whose rooms are not entered yet, but not on a level that is only a garage', () => {
    // NFPA 72 Ch. 29: every level — references.md 4.1 (PUBLIC); a garage is not a living level — from memory
    const r = computeCoverage(
      premises({
        floors: [floor('a', 'Attic room', 2), floor('g', 'Garage level', -1)],
        rooms: [room('gar', 'g', 'Garage', 'garage')],
      }),
    );
    expect(withCode(r, 'smoke_missing_level').map((f) => f.floorId)).toEqual(['a']);
  });

  it('on a level: the only alarm in a garage does not count, the same alarm in a utility room does', () => {
    // NFPA 72 Ch. 29: every level — references.md 4.1 (PUBLIC); not in a garage (exhaust, dust, temperature) — from memory
    const level = (kind: 'garage' | 'utility') =>
      computeCoverage(
        premises({
          floors: [floor('gf', 'Ground floor', 0)],
          rooms: [room('kit', 'gf', 'Kitchen', 'kitchen'), room('x', 'gf', kind === 'garage' ? 'Garage' : 'Utility', kind)],
          zones: [device('s', 'x', 'smoke', { description: 'Side smoke' })],
        }),
      );
    const garage = level('garage');
    const utility = level('utility');
    expect(utility.findings).toEqual([]);
    expect(codes(garage).sort()).toEqual(['smoke_in_garage', 'smoke_missing_level']);
    expect(withCode(garage, 'smoke_missing_level')[0]?.message).toContain('The smoke alarm in Garage does not count: it needs one in a living space.');
    const [note] = withCode(garage, 'smoke_in_garage');
    expect(note).toMatchObject({ severity: 'info', evidence: 'memory', zoneId: 's', roomId: 'x', lifeSafety: true });
    expect(note?.source).toContain('from memory');
    expect(note?.message).toContain('“Side smoke” is in Garage (Ground floor)');
  });
});

describe('CO alarms (IRC R315, NFPA 720)', () => {
  it('are not asked for without a fuel-burning appliance or an attached garage', () => {
    // IRC 2018 §R315.1 trigger: fuel-burning appliance or attached garage — references.md 4.15 (PUBLIC)
    const r = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke')]));
    expect(r.findings).toEqual([]);
  });

  it('are required outside the sleeping area with an attached garage and no fuel-burning appliance, and not without it', () => {
    // IRC 2018 §R315.1 trigger: fuel-burning appliance or attached garage — references.md 4.15 (PUBLIC)
    // IRC 2015/2018 §R315.3: outside each separate sleeping area — references.md 4.16 (PUBLIC)
    const withGarage = (attachedGarage: boolean) =>
      computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke')], [room('gar', 'f1', 'Garage', 'garage', { attachedGarage })]));
    const attached = withGarage(true);
    const detached = withGarage(false);
    expect(detached.findings).toEqual([]);
    // NFPA 720 §9.4.1 every occupiable level — references.md 4.17 (from memory): the floor has no CO alarm either
    expect(codes(attached).sort()).toEqual(['co_missing_level', 'co_missing_outside_sleeping_area']);
    const [f] = withCode(attached, 'co_missing_outside_sleeping_area');
    // Changed on purpose: the finding names the hall that serves the sleeping area (was roomId null).
    expect(f).toMatchObject({ severity: 'error', evidence: 'public', floorId: 'f1', roomId: 'land', lifeSafety: true });
    expect(f?.source).toContain('IRC');
    expect(f?.source).toContain('references.md 4.15 and 4.16 (PUBLIC)');
    expect(f?.message).toContain('This home has an attached garage');
    expect(
      codes(computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke'), device('c', 'land', 'co')], [room('gar', 'f1', 'Garage', 'garage', { attachedGarage: true })]))),
    ).toEqual([]);
  });

  it('outside the sleeping area: a CO alarm in the kitchen does not stand in for the one in the hall', () => {
    // IRC 2015/2018 §R315.3 "in the immediate vicinity of the bedrooms" — references.md 4.16 (PUBLIC)
    const kitchen = room('kit', 'f1', 'Kitchen', 'kitchen', { fuelBurningAppliance: true });
    const r = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke'), device('c', 'kit', 'co')], [kitchen]));
    expect(codes(r)).toEqual(['co_missing_outside_sleeping_area']);
    expect(withCode(r, 'co_missing_outside_sleeping_area')[0]?.message).toContain('a fuel-burning appliance (Kitchen)');
    expect(withCode(r, 'co_missing_outside_sleeping_area')[0]?.message).toContain('The CO alarm in Kitchen does not stand in for it');
  });

  it('are asked for on every occupiable level, from memory, with the mark kept out of the message', () => {
    // NFPA 720 §9.4.1: every occupiable level including basements — references.md 4.17 (from memory)
    // Changed on purpose: the message used to say "(from memory)"; households read messages, so the
    // mark now lives in `evidence` and `source`, which only staff see.
    const r = computeCoverage(
      premises({
        floors: [floor('gf', 'Ground floor', 0), floor('bs', 'Basement', -1)],
        rooms: [room('hall', 'gf', 'Hall', 'hall'), room('util', 'bs', 'Utility', 'utility', { fuelBurningAppliance: true })],
        zones: [device('s1', 'hall', 'smoke'), device('s2', 'util', 'smoke'), device('c', 'hall', 'co')],
      }),
    );
    const [f] = withCode(r, 'co_missing_level');
    expect(f).toMatchObject({ severity: 'warning', evidence: 'memory', floorId: 'bs', lifeSafety: true });
    expect(f?.message).not.toMatch(/memory/i);
    expect(f?.source).toContain('references.md 4.17 (MEMORY)');
    expect(codes(r)).toEqual(['co_missing_level']);
  });

  it('are required inside a bedroom that has a fuel-burning appliance', () => {
    // IRC 2015/2018 §R315.3: a CO alarm within a bedroom with a fuel-burning appliance — references.md 4.16 (PUBLIC)
    const rooms = [bedroom('bed', 'f1', 'Guest room', 'land', { fuelBurningAppliance: true }), room('land', 'f1', 'Landing', 'hall')];
    const zones = [device('s1', 'bed', 'smoke'), device('s2', 'land', 'smoke'), device('c1', 'land', 'co')];
    const r = computeCoverage(premises({ floors: [floor('f1', 'Ground floor', 0)], rooms, zones }));
    const [f] = withCode(r, 'co_missing_in_bedroom_with_appliance');
    expect(f).toMatchObject({ severity: 'error', evidence: 'public', floorId: 'f1', roomId: 'bed', lifeSafety: true });
    expect(f?.message).toContain('Guest room (Ground floor) has a fuel-burning appliance but no CO alarm in service inside the bedroom.');
    expect(f?.source).toContain('references.md 4.16 (PUBLIC)');
    expect(codes(r)).toEqual(['co_missing_in_bedroom_with_appliance']);
    // a CO alarm inside the bedroom satisfies it; so does a combination alarm with both halves enrolled
    expect(codes(computeCoverage(premises({ floors: [floor('f1', 'Ground floor', 0)], rooms, zones: [...zones, device('c2', 'bed', 'co')] })))).toEqual([]);
    const combo = [device('s2', 'land', 'smoke'), device('c1', 'land', 'co'), ...combination('g', 'bed', 'SN-300')];
    expect(codes(computeCoverage(premises({ floors: [floor('f1', 'Ground floor', 0)], rooms, zones: combo })))).toEqual([]);
  });

  it('inside the bedroom: an appliance in its attached bathroom needs one, the same appliance in an unattached bathroom does not', () => {
    // IRC 2015/2018 §R315.3: "a fuel-burning appliance … within a bedroom or its attached bathroom" — references.md 4.16 (PUBLIC)
    const house = (attachedToBedroomId: string | null) =>
      computeCoverage(
        oneBedroomFloor(
          [device('s', 'bed', 'smoke'), device('l', 'land', 'smoke'), device('c', 'land', 'co')],
          [room('bath', 'f1', 'En suite', 'bath', { fuelBurningAppliance: true, attachedToBedroomId })],
        ),
      );
    const attached = house('bed');
    const unattached = house(null);
    expect(unattached.findings).toEqual([]);
    expect(codes(attached)).toEqual(['co_missing_in_bedroom_with_appliance']);
    const [f] = withCode(attached, 'co_missing_in_bedroom_with_appliance');
    expect(f?.roomId).toBe('bed');
    expect(f?.message).toContain('a fuel-burning appliance in its attached bathroom (En suite)');
  });

  it('do not count while bypassed', () => {
    // IRC §R315.3 — references.md 4.16 (PUBLIC); a bypassed alarm protects no one — common practice, no published source
    const garage = room('gar', 'f1', 'Garage', 'garage', { attachedGarage: true });
    const r = computeCoverage(
      oneBedroomFloor(
        [device('s', 'bed', 'smoke'), device('l', 'land', 'smoke'), device('c', 'land', 'co', { description: 'Landing CO', status: 'bypassed' })],
        [garage],
      ),
    );
    expect(withCode(r, 'co_missing_outside_sleeping_area')[0]?.message).toContain('“Landing CO” is bypassed');
    expect(withCode(r, 'co_bypassed_only')).toEqual([expect.objectContaining({ severity: 'warning', evidence: 'practice', roomId: 'land' })]);
  });

  it('on a CO zone count, on a fire zone do not', () => {
    // CO alarms on a CO zone: Mullion holds CO to the fire exemptions of CP-01 §4.2.5.1 — references.md 1.14 (from memory for CO)
    const garage = room('gar', 'f1', 'Garage', 'garage', { attachedGarage: true });
    const r = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke'), device('c', 'land', 'co', { zoneType: 'fire_24h' })], [garage]));
    expect(codes(r).sort()).toEqual(['co_missing_level', 'co_missing_outside_sleeping_area', 'life_safety_zone_programming']);
    expect(withCode(r, 'life_safety_zone_programming')[0]?.message).toContain('set its zone type to CO, always armed');
  });
});

// --- trade practice -----------------------------------------------------------------------------------

describe('trade-practice findings', () => {
  const r = computeCoverage(
    premises({
      floors: [floor('gf', 'Ground floor', 0)],
      rooms: [room('den', 'gf', 'Den', 'living'), room('hall', 'gf', 'Hall', 'hall'), room('store', 'gf', 'Store', 'utility')],
      openings: [
        opening('dw', 'den', 'Den window'),
        opening('hw', 'hall', 'Hall window', 'window', false),
        opening('fd', 'hall', 'Front door', 'door'),
      ],
      zones: [contact('z', 'fd', 'Front door', { deviceType: 'door_contact' }), device('s', 'hall', 'smoke'), device('g', 'hall', 'glass_break')],
    }),
  );

  it('name each unprotected opening reachable from the ground', () => {
    // Every ground-reachable opening has a sensor — common practice, no published source
    const found = withCode(r, 'opening_unprotected_ground');
    expect(found).toEqual([expect.objectContaining({ severity: 'warning', evidence: 'practice', floorId: 'gf', roomId: 'den', lifeSafety: false })]);
    expect(found[0]?.message).toContain('Den window');
    expect(found[0]?.source).toContain('common practice, no published source');
  });

  it('name each room with openings but no motion or glass-break detector', () => {
    // Interior detection in rooms with openings — common practice, no published source
    const found = withCode(r, 'room_without_interior_detection');
    expect(found).toEqual([expect.objectContaining({ severity: 'info', evidence: 'practice', roomId: 'den', lifeSafety: false })]);
    expect(found[0]?.source).toContain('common practice, no published source');
  });
});

// --- all together -------------------------------------------------------------------------------------

/**
 * A house (invented) with something wrong of every kind, so every finding code appears once or more:
 * upstairs, one bedroom with no alarm whose door is not confirmed within 21 ft of the landing alarm,
 * one bedroom that names no hall, and a guest room with a fireplace served by the ground-floor hall,
 * whose only alarm is on a chime-only zone; a kitchen with an open window and a bypassed CO alarm; an
 * attached garage holding a smoke alarm; a basement whose only smoke alarm is bypassed.
 */
function everythingWrongHouse(): CoverageInput {
  return premises({
    floors: [floor('up', 'Upstairs', 1), floor('gf', 'Ground floor', 0), floor('bs', 'Basement', -1)],
    rooms: [
      bedroom('b1', 'up', 'Bedroom 1', 'land', { hallWithin21FtConfirmed: false }),
      bedroom('b2', 'up', 'Bedroom 2', null),
      bedroom('b3', 'up', 'Guest room', 'gh', { fuelBurningAppliance: true }),
      room('land', 'up', 'Landing', 'hall'),
      room('gh', 'gf', 'Hall', 'hall'),
      room('kit', 'gf', 'Kitchen', 'kitchen'),
      room('gar', 'gf', 'Garage', 'garage', { attachedGarage: true }),
      room('rec', 'bs', 'Rec room', 'basement'),
    ],
    openings: [opening('kw', 'kit', 'Kitchen window')],
    zones: [
      device('s-land', 'land', 'smoke'),
      device('s-b2', 'b2', 'smoke'),
      device('c-b2', 'b2', 'co'),
      device('s-b3', 'b3', 'smoke'),
      device('s-gh', 'gh', 'smoke', { number: 3, description: 'Hall smoke', zoneType: 'monitor_only' }),
      device('s-kit', 'kit', 'smoke'),
      device('c-kit', 'kit', 'co', { description: 'Kitchen CO', status: 'bypassed' }),
      device('s-gar', 'gar', 'smoke', { description: 'Garage smoke' }),
      device('s-rec', 'rec', 'smoke', { description: 'Rec room smoke', status: 'bypassed' }),
    ],
  });
}

describe('the findings as a whole', () => {
  it('give a compliant two-storey house with a basement no life-safety findings', () => {
    const r = computeCoverage(compliantHouse());
    expect(lifeSafety(r)).toEqual([]);
    expect(r.findings.filter((f) => f.severity === 'error')).toEqual([]);
    expect(r.summary).toBe('All 5 openings protected');
  });

  it('list errors first, then warnings, then info', () => {
    const house = compliantHouse();
    const r = computeCoverage({
      ...house,
      // take out every smoke and CO alarm and the kitchen glass-break, and open a gap
      zones: house.zones.filter((z) => !['smoke', 'co'].includes(z.deviceType) && z.id !== 'z7' && z.id !== 'z2'),
    });
    const rank = { error: 0, warning: 1, info: 2 };
    const ranks = r.findings.map((f) => rank[f.severity]);
    expect(ranks).toEqual([...ranks].sort((a, b) => a - b));
    expect(new Set(codes(r))).toEqual(
      new Set([
        'smoke_missing_sleeping_room',
        'smoke_missing_outside_sleeping_area',
        'smoke_missing_level',
        'co_missing_outside_sleeping_area',
        'co_missing_level',
        'opening_unprotected_ground',
        'room_without_interior_detection',
      ]),
    );
    expect(withCode(r, 'smoke_missing_sleeping_room').map((f) => f.roomId)).toEqual(['up-b1', 'up-b2']);
    expect(withCode(r, 'smoke_missing_level').map((f) => f.floorId)).toEqual(['bs', 'gf', 'up']);
  });

  it('cover every finding code in a house with everything wrong, each where the house says', () => {
    const r = computeCoverage(everythingWrongHouse());
    expect(new Set(codes(r))).toEqual(new Set(COVERAGE_FINDING_CODES));
    const at = (code: string) => withCode(r, code).map((f) => f.roomId ?? f.floorId);
    // NFPA 72 Ch. 29 required detection — references.md 4.1 (PUBLIC)
    expect(at('smoke_missing_sleeping_room')).toEqual(['b1']);
    expect(at('smoke_missing_outside_sleeping_area')).toEqual(['gh']);
    expect(at('sleeping_area_distance_unconfirmed')).toEqual(['b1']);
    expect(at('sleeping_area_unknown')).toEqual(['b2']);
    // the basement's only alarm is bypassed — references.md 4.1 (PUBLIC)
    expect(at('smoke_missing_level')).toEqual(['bs']);
    // garage alarm is a note — from memory
    expect(at('smoke_in_garage')).toEqual(['gar']);
    // IRC §R315.3 — references.md 4.16 (PUBLIC): both halls, and the guest room with its fireplace
    expect(at('co_missing_outside_sleeping_area').sort()).toEqual(['gh', 'land']);
    expect(at('co_missing_in_bedroom_with_appliance')).toEqual(['b3']);
    // NFPA 720 every occupiable level — references.md 4.17 (from memory): the kitchen CO is bypassed
    expect(at('co_missing_level').sort()).toEqual(['bs', 'gf']);
    expect(withCode(r, 'life_safety_zone_programming').map((f) => f.zoneId)).toEqual(['s-gh']);
  });

  it('never write "from memory" (or any source mark) in a message: those live in evidence and source, for staff', () => {
    const r = computeCoverage(everythingWrongHouse());
    expect(r.findings.length).toBeGreaterThanOrEqual(COVERAGE_FINDING_CODES.length);
    for (const f of r.findings) {
      expect(f.message, f.code).not.toMatch(/from memory/i);
      expect(f.message, f.code).not.toMatch(/MEMORY|PUBLIC|references\.md|no published source/);
      // each finding carries its rule's evidence and source unchanged
      const rule = COVERAGE_RULES[f.code as (typeof COVERAGE_FINDING_CODES)[number]];
      expect(f.evidence, f.code).toBe(rule.evidence);
      expect(f.source, f.code).toBe(rule.source);
      expect(f.lifeSafety, f.code).toBe(rule.lifeSafety);
    }
    // and a finding from memory is still marked, where staff see it
    expect(r.findings.filter((f) => f.evidence === 'memory').map((f) => f.code).sort()).toEqual(['co_missing_level', 'co_missing_level', 'smoke_in_garage']);
  });

  it('each name a rule and a source whose mark agrees with its evidence', () => {
    expect(Object.keys(COVERAGE_RULES).sort()).toEqual([...COVERAGE_FINDING_CODES].sort());
    for (const code of COVERAGE_FINDING_CODES) {
      const { rule, source, evidence, lifeSafety: ls } = COVERAGE_RULES[code];
      expect(rule.length, code).toBeGreaterThan(10);
      if (evidence === 'public') expect(source, code).toMatch(/references\.md 4\.\d+.*\(PUBLIC\)/);
      if (evidence === 'memory') expect(source, code).toMatch(/from memory|\(MEMORY\)/);
      if (evidence === 'practice') expect(source, code).toContain('common practice, no published source');
      expect(['public', 'memory', 'practice'], code).toContain(evidence);
      // Changed on purpose: rules from memory used to say "from memory" in the rule text; the mark is now in evidence and source only.
      expect(rule, code).not.toMatch(/from memory/i);
      expect(ls, code).toBe(!['opening_unprotected_ground', 'room_without_interior_detection'].includes(code));
    }
  });

  it('make published rules errors and the rest warnings or notes', () => {
    for (const code of COVERAGE_FINDING_CODES) {
      const { severity, evidence } = COVERAGE_RULES[code];
      if (severity === 'error') expect(evidence, code).toBe('public');
    }
  });
});

describe('the life-safety caution', () => {
  it('comes from the one constant when there is a life-safety finding', () => {
    const r = computeCoverage(oneBedroomFloor([]));
    expect(coverageCaution(r)).toBe(LIFE_SAFETY_CAUTION);
  });

  it('shows when the premises have smoke or CO alarms, even with nothing missing', () => {
    const r = computeCoverage(compliantHouse());
    expect(lifeSafety(r)).toEqual([]);
    expect(coverageCaution(r)).toBe(LIFE_SAFETY_CAUTION);
  });

  it('is left out when nothing concerns life safety', () => {
    expect(coverageCaution(computeCoverage(premises({})))).toBeNull();
    const intrusionOnly: CoverageFinding = {
      ...COVERAGE_RULES.opening_unprotected_ground,
      code: 'opening_unprotected_ground',
      message: 'x',
      floorId: null,
      roomId: null,
      zoneId: null,
    };
    expect(
      coverageCaution({ openings: { total: 1, protected: 0, unprotectedGroundReachable: 1 }, summary: '', findings: [intrusionOnly], floors: [] }),
    ).toBeNull();
  });
});
