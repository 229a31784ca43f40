/** Coverage: protected openings, the summary line, interior detection, and the life-safety rules with their sources. */
import { describe, expect, it } from 'vitest';
import {
  COVERAGE_FINDING_CODES,
  COVERAGE_RULES,
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
import { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import type { OpeningKind } from '@domain/premises';

// --- small invented premises ------------------------------------------------------------------

function floor(id: string, name: string, level: number, belowGrade = level < 0): CoverageFloorInput {
  return { id, name, level, belowGrade };
}
function room(id: string, floorId: string, name: string, kind: CoverageRoomInput['kind'], extra: Partial<CoverageRoomInput> = {}): CoverageRoomInput {
  return { id, floorId, name, kind, fuelBurningAppliance: false, attachedGarage: false, ...extra };
}
function opening(id: string, roomId: string, label: string, kind: OpeningKind = 'window', groundReachable = true): CoverageOpeningInput {
  return { id, roomId, kind, label, groundReachable };
}
/** A contact on an opening. */
function contact(id: string, openingId: string, description: string, extra: Partial<CoverageZoneInput> = {}): CoverageZoneInput {
  return { id, description, deviceType: 'window_contact', status: 'active', roomId: null, openingId, ...extra };
}
/** A room device (motion, glass-break, smoke, heat, CO). */
function device(id: string, roomId: string, deviceType: CoverageZoneInput['deviceType'], extra: Partial<CoverageZoneInput> = {}): CoverageZoneInput {
  return { id, description: `${roomId} ${deviceType}`, deviceType, status: 'active', roomId, openingId: null, ...extra };
}
function premises(parts: Partial<CoverageInput>): CoverageInput {
  return { floors: [], rooms: [], openings: [], zones: [], ...parts };
}
const codes = (r: CoverageResult) => r.findings.map((f) => f.code);
const withCode = (r: CoverageResult, code: string) => r.findings.filter((f) => f.code === code);
const lifeSafety = (r: CoverageResult) => r.findings.filter((f) => f.lifeSafety);

/**
 * A compliant two-storey house with a basement (invented): a furnace in the basement utility room
 * and an attached garage, so CO alarms are required too.
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
      room('up-b1', 'up', 'Bedroom 1', 'bedroom'),
      room('up-b2', 'up', 'Bedroom 2', 'bedroom'),
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

/** One floor, one bedroom and a landing: the base for the sleeping-room rules. */
function oneBedroomFloor(zones: CoverageZoneInput[], extraRooms: CoverageRoomInput[] = []): CoverageInput {
  return premises({
    floors: [floor('f1', 'Upstairs', 1)],
    rooms: [room('bed', 'f1', 'Bedroom', 'bedroom'), room('land', 'f1', 'Landing', 'hall'), ...extraRooms],
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
    expect(r.floors[0]?.rooms[0]?.devices).toEqual([{ zoneId: 'm', description: 'Kitchen motion', deviceType: 'motion' }]);
  });
});

// --- life safety ------------------------------------------------------------------------------------

describe('smoke alarms (NFPA 72 Chapter 29)', () => {
  it('are required in every sleeping room', () => {
    // NFPA 72 Ch. 29: a smoke alarm in every sleeping room — references.md 4.1 (PUBLIC)
    const r = computeCoverage(oneBedroomFloor([device('s', 'land', 'smoke')]));
    const [f] = withCode(r, 'smoke_missing_sleeping_room');
    expect(f).toMatchObject({ severity: 'error', floorId: 'f1', roomId: 'bed', lifeSafety: true });
    expect(f?.source).toContain('NFPA 72');
    expect(f?.source).toContain('references.md 4.1 (PUBLIC)');
    expect(f?.message).toContain('Bedroom (Upstairs)');
    expect(codes(r)).toEqual(['smoke_missing_sleeping_room']);
  });

  it('are not replaced by a heat alarm', () => {
    // NFPA 72 Ch. 29: a smoke alarm in every sleeping room — references.md 4.1 (PUBLIC); a heat alarm is not one
    const r = computeCoverage(oneBedroomFloor([device('s', 'land', 'smoke'), device('h', 'bed', 'heat')]));
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
    expect(w).toMatchObject({ severity: 'warning', roomId: 'bed', lifeSafety: true });
    expect(w?.source).toContain('common practice, no published source');
  });

  it('are required outside each sleeping area, not only inside the bedrooms', () => {
    // NFPA 72 Ch. 29: outside each separate sleeping area (21 ft not modelled) — references.md 4.1 (PUBLIC)
    const r = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke')]));
    expect(withCode(r, 'smoke_missing_outside_sleeping_area')).toEqual([expect.objectContaining({ severity: 'error', floorId: 'f1', roomId: null })]);
    expect(withCode(r, 'smoke_missing_outside_sleeping_area')[0]?.source).toContain('references.md 4.1 (PUBLIC)');
    // any non-bedroom room on the floor will do, but not a garage
    expect(codes(computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke')])))).toEqual([]);
    const garage = room('gar', 'f1', 'Garage', 'garage', { attachedGarage: true });
    const withGarage = computeCoverage(
      oneBedroomFloor([device('s', 'bed', 'smoke'), device('g', 'gar', 'smoke'), device('c', 'land', 'co')], [garage]),
    );
    expect(codes(withGarage)).toContain('smoke_missing_outside_sleeping_area');
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
    expect(f).toMatchObject({ severity: 'error', floorId: 'bs', roomId: null, lifeSafety: true });
    expect(f?.message).toContain('Basement');
    expect(f?.source).toContain('references.md 4.1 (PUBLIC)');
    expect(codes(r)).toEqual(['smoke_missing_level']);
  });

  it('are required on a level whose rooms are not entered yet, but not on a level that is only a garage', () => {
    // NFPA 72 Ch. 29: every level — references.md 4.1 (PUBLIC); garages are not living levels — common practice, no published source
    const r = computeCoverage(
      premises({
        floors: [floor('a', 'Attic room', 2), floor('g', 'Garage level', -1)],
        rooms: [room('gar', 'g', 'Garage', 'garage')],
      }),
    );
    expect(withCode(r, 'smoke_missing_level').map((f) => f.floorId)).toEqual(['a']);
  });
});

describe('CO alarms (IRC R315, NFPA 720)', () => {
  it('are not asked for without a fuel-burning appliance or an attached garage', () => {
    const r = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke')]));
    expect(r.findings).toEqual([]);
  });

  it('are still required outside sleeping areas in a house with an attached garage and no fuel-burning appliance', () => {
    // IRC R315.1 (2018) trigger: fuel-burning appliance or attached garage — references.md 4.15 (PUBLIC)
    // IRC R315.3: outside each separate sleeping area — references.md 4.16 (PUBLIC)
    const garage = room('gar', 'f1', 'Garage', 'garage', { attachedGarage: true });
    const r = computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke')], [garage]));
    const [f] = withCode(r, 'co_missing_outside_sleeping_area');
    expect(f).toMatchObject({ severity: 'error', floorId: 'f1', roomId: null, lifeSafety: true });
    expect(f?.source).toContain('IRC');
    expect(f?.source).toContain('references.md 4.15 and 4.16 (PUBLIC)');
    expect(f?.message).toContain('attached garage');
    expect(
      codes(computeCoverage(oneBedroomFloor([device('s', 'bed', 'smoke'), device('l', 'land', 'smoke'), device('c', 'land', 'co')], [garage]))),
    ).toEqual([]);
  });

  it('are asked for on every occupiable level, from memory', () => {
    // NFPA 720 §9.4.1: every occupiable level including basements — references.md 4.17 (MEMORY), from memory
    const r = computeCoverage(
      premises({
        floors: [floor('gf', 'Ground floor', 0), floor('bs', 'Basement', -1)],
        rooms: [room('hall', 'gf', 'Hall', 'hall'), room('util', 'bs', 'Utility', 'utility', { fuelBurningAppliance: true })],
        zones: [device('s1', 'hall', 'smoke'), device('s2', 'util', 'smoke'), device('c', 'hall', 'co')],
      }),
    );
    const [f] = withCode(r, 'co_missing_level');
    expect(f).toMatchObject({ severity: 'warning', floorId: 'bs', lifeSafety: true });
    expect(f?.message).toContain('(from memory)');
    expect(f?.source).toContain('references.md 4.17 (MEMORY)');
    expect(codes(r)).toEqual(['co_missing_level']);
  });

  it('are required inside a bedroom that has a fuel-burning appliance', () => {
    // IRC R315.3: a CO alarm within a bedroom with a fuel-burning appliance — references.md 4.16 (PUBLIC)
    const rooms = [room('bed', 'f1', 'Guest room', 'bedroom', { fuelBurningAppliance: true }), room('land', 'f1', 'Landing', 'hall')];
    const zones = [device('s1', 'bed', 'smoke'), device('s2', 'land', 'smoke'), device('c1', 'land', 'co')];
    const r = computeCoverage(premises({ floors: [floor('f1', 'Ground floor', 0)], rooms, zones }));
    const [f] = withCode(r, 'co_missing_in_bedroom_with_appliance');
    expect(f).toMatchObject({ severity: 'error', floorId: 'f1', roomId: 'bed', lifeSafety: true });
    expect(f?.message).toContain('Guest room (Ground floor)');
    expect(f?.source).toContain('references.md 4.16 (PUBLIC)');
    expect(codes(r)).toEqual(['co_missing_in_bedroom_with_appliance']);
    // a CO alarm inside the bedroom satisfies it
    expect(
      codes(computeCoverage(premises({ floors: [floor('f1', 'Ground floor', 0)], rooms, zones: [...zones, device('c2', 'bed', 'co')] }))),
    ).toEqual([]);
  });

  it('do not count while bypassed', () => {
    // IRC R315.3 — references.md 4.16 (PUBLIC); a bypassed alarm protects no one — common practice, no published source
    const garage = room('gar', 'f1', 'Garage', 'garage', { attachedGarage: true });
    const r = computeCoverage(
      oneBedroomFloor(
        [device('s', 'bed', 'smoke'), device('l', 'land', 'smoke'), device('c', 'land', 'co', { description: 'Landing CO', status: 'bypassed' })],
        [garage],
      ),
    );
    expect(withCode(r, 'co_missing_outside_sleeping_area')[0]?.message).toContain('“Landing CO” is bypassed');
    expect(codes(r)).toContain('co_bypassed_only');
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
    expect(found).toEqual([expect.objectContaining({ severity: 'warning', floorId: 'gf', roomId: 'den', lifeSafety: false })]);
    expect(found[0]?.message).toContain('Den window');
    expect(found[0]?.source).toContain('common practice, no published source');
  });

  it('name each room with openings but no motion or glass-break detector', () => {
    // Interior detection in rooms with openings — common practice, no published source
    const found = withCode(r, 'room_without_interior_detection');
    expect(found).toEqual([expect.objectContaining({ severity: 'info', roomId: 'den', lifeSafety: false })]);
    expect(found[0]?.source).toContain('common practice, no published source');
  });
});

// --- all together -------------------------------------------------------------------------------------

describe('the findings as a whole', () => {
  it('give a compliant two-storey house with a basement no life-safety errors', () => {
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

  it('each name a rule and a source: a references.md row marked PUBLIC or MEMORY, or common practice', () => {
    expect(Object.keys(COVERAGE_RULES).sort()).toEqual([...COVERAGE_FINDING_CODES].sort());
    for (const code of COVERAGE_FINDING_CODES) {
      const { rule, source, lifeSafety: ls } = COVERAGE_RULES[code];
      expect(rule.length, code).toBeGreaterThan(10);
      expect(/references\.md 4\.\d+.*\((PUBLIC|MEMORY)\)$/.test(source) || source.includes('common practice, no published source'), code).toBe(true);
      if (source.includes('MEMORY')) expect(rule, code).toContain('from memory');
      expect(ls, code).toBe(code.startsWith('smoke_') || code.startsWith('co_'));
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
    };
    expect(
      coverageCaution({ openings: { total: 1, protected: 0, unprotectedGroundReachable: 1 }, summary: '', findings: [intrusionOnly], floors: [] }),
    ).toBeNull();
  });
});
