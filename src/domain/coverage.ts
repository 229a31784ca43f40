/**
 * Coverage of a site's premises (product.md, "Premises and coverage"): which openings are
 * protected, which ground-reachable openings have no sensor, which rooms lack interior
 * detection, and the life-safety findings (NFPA 72 dwelling rules, CO guidance), each
 * naming its rule and source. Pure: no I/O.
 */
import { OPENING_DEVICE_TYPES, ROOM_DEVICE_TYPES, type DeviceType, type ZoneStatus } from './devices';
import { LIFE_SAFETY_CAUTION } from './life-safety';
import { OPENING_KINDS, type OpeningKind, type RoomKind } from './premises';

export interface CoverageFloorInput {
  id: string;
  name: string;
  level: number;
  belowGrade: boolean;
}
export interface CoverageRoomInput {
  id: string;
  floorId: string;
  name: string;
  kind: RoomKind;
  fuelBurningAppliance: boolean;
  attachedGarage: boolean;
}
export interface CoverageOpeningInput {
  id: string;
  roomId: string;
  kind: OpeningKind;
  label: string;
  groundReachable: boolean;
}
export interface CoverageZoneInput {
  id: string;
  description: string;
  deviceType: DeviceType;
  status: ZoneStatus;
  roomId: string | null;
  openingId: string | null;
}

export type FindingSeverity = 'error' | 'warning' | 'info';

export interface CoverageFinding {
  code: string;
  severity: FindingSeverity;
  /** the rule in words, e.g. "NFPA 72: a smoke alarm in every sleeping room" */
  rule: string;
  /** where the rule comes from: document, section, and the references.md row with PUBLIC/MEMORY */
  source: string;
  message: string;
  floorId: string | null;
  roomId: string | null;
  /** life-safety findings (smoke/CO) carry the caution when shown */
  lifeSafety: boolean;
}

export interface CoverageOpeningResult {
  id: string;
  kind: OpeningKind;
  label: string;
  groundReachable: boolean;
  protected: boolean;
  /** the description of the protecting zone, or null */
  zoneDescription: string | null;
}

export interface CoverageRoomResult {
  id: string;
  name: string;
  kind: RoomKind;
  openings: CoverageOpeningResult[];
  /** descriptions of active room devices (motion, glass-break, smoke, heat, CO, …) */
  devices: { zoneId: string; description: string; deviceType: DeviceType }[];
}

export interface CoverageFloorResult {
  id: string;
  name: string;
  level: number;
  belowGrade: boolean;
  rooms: CoverageRoomResult[];
}

export interface CoverageResult {
  openings: { total: number; protected: number; unprotectedGroundReachable: number };
  /** "14 of 17 openings protected; 2 windows reachable from the ground have no sensor" */
  summary: string;
  findings: CoverageFinding[];
  floors: CoverageFloorResult[];
}

export interface CoverageInput {
  floors: readonly CoverageFloorInput[];
  rooms: readonly CoverageRoomInput[];
  openings: readonly CoverageOpeningInput[];
  zones: readonly CoverageZoneInput[];
}

// ---------------------------------------------------------------------------------------------
// Rules. Each finding names its rule in words and where the rule comes from: the document and
// section, and the references.md row with PUBLIC (a public text was found) or MEMORY.
// ---------------------------------------------------------------------------------------------

export const COVERAGE_FINDING_CODES = [
  'smoke_missing_sleeping_room',
  'smoke_missing_outside_sleeping_area',
  'smoke_missing_level',
  'co_missing_outside_sleeping_area',
  'co_missing_in_bedroom_with_appliance',
  'co_missing_level',
  'smoke_bypassed_only',
  'co_bypassed_only',
  'opening_unprotected_ground',
  'room_without_interior_detection',
] as const;
export type CoverageFindingCode = (typeof COVERAGE_FINDING_CODES)[number];

export interface CoverageRule {
  severity: FindingSeverity;
  rule: string;
  source: string;
  lifeSafety: boolean;
}

const TRADE_PRACTICE = 'Alarm trade practice — common practice, no published source';

/** The rule behind every finding code: severity, the rule in words, its source. */
export const COVERAGE_RULES: Record<CoverageFindingCode, CoverageRule> = {
  smoke_missing_sleeping_room: {
    severity: 'error',
    rule: 'NFPA 72: a smoke alarm in every sleeping room',
    source: 'NFPA 72 Chapter 29, required detection — references.md 4.1 (PUBLIC)',
    lifeSafety: true,
  },
  smoke_missing_outside_sleeping_area: {
    severity: 'error',
    rule: 'NFPA 72: a smoke alarm outside each separate sleeping area, within 21 ft of any bedroom door',
    source: 'NFPA 72 Chapter 29, required detection — references.md 4.1 (PUBLIC)',
    lifeSafety: true,
  },
  smoke_missing_level: {
    severity: 'error',
    rule: 'NFPA 72: a smoke alarm on every level, including basements',
    source: 'NFPA 72 Chapter 29, required detection — references.md 4.1 (PUBLIC)',
    lifeSafety: true,
  },
  co_missing_outside_sleeping_area: {
    severity: 'error',
    rule: 'IRC: where there is a fuel-burning appliance or an attached garage, a CO alarm outside each separate sleeping area, near the bedrooms',
    source: 'IRC 2018 §R315.1 (2021 §R315.2) and IRC 2015/2018 §R315.3 — references.md 4.15 and 4.16 (PUBLIC)',
    lifeSafety: true,
  },
  co_missing_in_bedroom_with_appliance: {
    severity: 'error',
    rule: 'IRC: a CO alarm inside a bedroom that has a fuel-burning appliance',
    source: 'IRC 2015/2018 §R315.3 — references.md 4.16 (PUBLIC)',
    lifeSafety: true,
  },
  co_missing_level: {
    severity: 'warning',
    rule: 'NFPA 720: a CO alarm on every occupiable level, including basements (from memory)',
    source: 'NFPA 720-2012/2015 §9.4.1, now in NFPA 72-2022 — references.md 4.17 (MEMORY)',
    lifeSafety: true,
  },
  smoke_bypassed_only: {
    severity: 'warning',
    rule: 'A bypassed smoke alarm protects no one until it is back in service',
    source: TRADE_PRACTICE,
    lifeSafety: true,
  },
  co_bypassed_only: {
    severity: 'warning',
    rule: 'A bypassed CO alarm protects no one until it is back in service',
    source: TRADE_PRACTICE,
    lifeSafety: true,
  },
  opening_unprotected_ground: {
    severity: 'warning',
    rule: 'Every door and window reachable from the ground has a sensor',
    source: TRADE_PRACTICE,
    lifeSafety: false,
  },
  room_without_interior_detection: {
    severity: 'info',
    rule: 'A room with doors or windows has a motion or glass-break detector',
    source: TRADE_PRACTICE,
    lifeSafety: false,
  },
};

const SEVERITY_ORDER: Record<FindingSeverity, number> = { error: 0, warning: 1, info: 2 };

/** Device types that are life-safety alarms; their presence brings the caution. */
export const LIFE_SAFETY_DEVICE_TYPES: readonly DeviceType[] = ['smoke', 'heat', 'co'];

/** Room devices that count as interior detection (intrusion). */
export const INTERIOR_DETECTION_DEVICE_TYPES: readonly DeviceType[] = ['motion', 'glass_break'];

// ---------------------------------------------------------------------------------------------
// Summary sentence
// ---------------------------------------------------------------------------------------------

const OPENING_KIND_WORDS: Record<OpeningKind, readonly [string, string]> = {
  door: ['door', 'doors'],
  window: ['window', 'windows'],
  sliding_door: ['sliding door', 'sliding doors'],
  garage_door: ['garage door', 'garage doors'],
  skylight: ['skylight', 'skylights'],
};

/** "1 window", "2 sliding doors". */
export function countOpeningsInWords(count: number, kind: OpeningKind): string {
  const [one, many] = OPENING_KIND_WORDS[kind];
  return `${count} ${count === 1 ? one : many}`;
}

/** "a", "a and b", "a, b and c". */
function listInWords(parts: readonly string[]): string {
  if (parts.length <= 1) return parts.join('');
  return `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
}

/**
 * The coverage summary line: "14 of 17 openings protected; 2 windows reachable from the ground
 * have no sensor", "All 5 openings protected", "No openings recorded yet".
 */
export function coverageSummary(openings: readonly Pick<CoverageOpeningResult, 'kind' | 'protected' | 'groundReachable'>[]): string {
  const total = openings.length;
  if (total === 0) return 'No openings recorded yet';
  const protectedCount = openings.filter((o) => o.protected).length;
  if (protectedCount === total) return total === 1 ? 'The 1 opening is protected' : `All ${total} openings protected`;
  const first = `${protectedCount} of ${total} ${total === 1 ? 'opening' : 'openings'} protected`;
  const gaps = openings.filter((o) => !o.protected && o.groundReachable);
  if (gaps.length === 0) return first;
  const parts = OPENING_KINDS.map((kind) => ({ kind, count: gaps.filter((o) => o.kind === kind).length }))
    .filter((p) => p.count > 0)
    .map((p) => countOpeningsInWords(p.count, p.kind));
  return `${first}; ${listInWords(parts)} reachable from the ground ${gaps.length === 1 ? 'has' : 'have'} no sensor`;
}

// ---------------------------------------------------------------------------------------------
// Computation
// ---------------------------------------------------------------------------------------------

const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });
const byText = (a: string, b: string): number => collator.compare(a, b);
function byTextThenId<T extends { id: string }>(text: (t: T) => string) {
  return (a: T, b: T): number => byText(text(a), text(b)) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
}

/** A zone protects an opening when it is in service, is a contact, and is linked to the opening. */
export function zoneProtectsOpening(zone: CoverageZoneInput, openingId: string): boolean {
  return zone.status === 'active' && OPENING_DEVICE_TYPES.includes(zone.deviceType) && zone.openingId === openingId;
}

/**
 * Which floors count as a level for the "every level" rules: every floor, except one whose
 * recorded rooms are all garages (alarms are not placed in a garage, and a garage is not an
 * occupiable level). A floor with no rooms recorded yet still counts, so a level is never
 * passed over because its rooms have not been entered.
 */
function isLivingLevel(rooms: readonly CoverageRoomInput[]): boolean {
  return rooms.length === 0 || rooms.some((r) => r.kind !== 'garage');
}

/**
 * The rooms that serve as "outside the sleeping area" on a floor: any room that is not a
 * bedroom (a hall or landing usually) and not a garage. The 21 ft (6.4 m) distance from the
 * bedroom doors in NFPA 72 (references.md 4.1) is not modelled: Mullion has no distances, so an
 * alarm anywhere else on the same floor is taken as outside the sleeping area.
 */
function isOutsideSleepingArea(room: CoverageRoomInput): boolean {
  return room.kind !== 'bedroom' && room.kind !== 'garage';
}

/**
 * Computes coverage for one site's premises. Openings count when their room is on a recorded
 * floor; anything that cannot be placed on a floor is left out of totals and findings alike,
 * so the summary always matches what the floors show. Only zones in service ('active') count,
 * for openings and for life safety alike.
 */
export function computeCoverage(input: CoverageInput): CoverageResult {
  // Floors from the lowest level up (basement, ground, upstairs), then by name: the order in
  // which the premises are built and read, the same on every page.
  const floors = [...input.floors].sort((a, b) => a.level - b.level || byTextThenId<CoverageFloorInput>((f) => f.name)(a, b));
  const floorIds = new Set(floors.map((f) => f.id));
  const rooms = input.rooms.filter((r) => floorIds.has(r.floorId)).sort(byTextThenId<CoverageRoomInput>((r) => r.name));
  const roomIds = new Set(rooms.map((r) => r.id));
  const openings = input.openings.filter((o) => roomIds.has(o.roomId)).sort(byTextThenId<CoverageOpeningInput>((o) => o.label));
  const zones = [...input.zones].sort(byTextThenId<CoverageZoneInput>((z) => z.description));
  const activeZones = zones.filter((z) => z.status === 'active');

  const roomsOf = (floorId: string) => rooms.filter((r) => r.floorId === floorId);
  const zonesIn = (roomId: string, type: DeviceType, from = activeZones) => from.filter((z) => z.roomId === roomId && z.deviceType === type);
  const hasActive = (room: CoverageRoomInput, type: DeviceType) => zonesIn(room.id, type).length > 0;
  const bypassedIn = (room: CoverageRoomInput, type: DeviceType) => zonesIn(room.id, type, zones).filter((z) => z.status === 'bypassed');

  // Openings
  const openingResults = new Map<string, CoverageOpeningResult>();
  for (const o of openings) {
    const zone = activeZones.find((z) => zoneProtectsOpening(z, o.id));
    openingResults.set(o.id, {
      id: o.id,
      kind: o.kind,
      label: o.label,
      groundReachable: o.groundReachable,
      protected: zone !== undefined,
      zoneDescription: zone?.description ?? null,
    });
  }
  const allOpenings = [...openingResults.values()];
  const openingRoom = new Map(openings.map((o) => [o.id, o.roomId]));

  // Floors → rooms → openings
  const floorResults: CoverageFloorResult[] = floors.map((f) => ({
    id: f.id,
    name: f.name,
    level: f.level,
    belowGrade: f.belowGrade,
    rooms: roomsOf(f.id).map((r) => ({
      id: r.id,
      name: r.name,
      kind: r.kind,
      openings: allOpenings.filter((o) => openingRoom.get(o.id) === r.id),
      devices: activeZones
        .filter((z) => z.roomId === r.id && ROOM_DEVICE_TYPES.includes(z.deviceType))
        .map((z) => ({ zoneId: z.id, description: z.description, deviceType: z.deviceType })),
    })),
  }));

  // Findings
  const findings: CoverageFinding[] = [];
  const floorName = new Map(floors.map((f) => [f.id, f.name]));
  const where = (room: CoverageRoomInput) => `${room.name} (${floorName.get(room.floorId)})`;
  const add = (code: CoverageFindingCode, message: string, floorId: string | null, roomId: string | null) => {
    const { severity, rule, source, lifeSafety } = COVERAGE_RULES[code];
    findings.push({ code, severity, rule, source, message, floorId, roomId, lifeSafety });
  };
  // A bypassed alarm does not count; say so where one stands in for a missing alarm.
  const bypassedSentence = (bypassed: readonly CoverageZoneInput[]) => {
    if (bypassed.length === 0) return '';
    const names = listInWords(bypassed.map((z) => `“${z.description}”`));
    return ` ${names} ${bypassed.length === 1 ? 'is' : 'are'} bypassed, and a bypassed alarm does not protect anyone.`;
  };
  const bypassedNote = (room: CoverageRoomInput, type: 'smoke' | 'co') => bypassedSentence(bypassedIn(room, type));
  const bypassedOnFloor = (floorRooms: readonly CoverageRoomInput[], type: 'smoke' | 'co') =>
    bypassedSentence(floorRooms.flatMap((r) => bypassedIn(r, type)));
  const bedrooms = rooms.filter((r) => r.kind === 'bedroom');

  // NFPA 72 Ch. 29: a smoke alarm in every sleeping room — references.md 4.1 (PUBLIC).
  // A heat alarm is not a smoke alarm.
  for (const room of bedrooms) {
    if (hasActive(room, 'smoke')) continue;
    const heat = hasActive(room, 'heat') ? ' The heat alarm there does not count as a smoke alarm.' : '';
    add('smoke_missing_sleeping_room', `${where(room)} has no smoke alarm in service.${bypassedNote(room, 'smoke')}${heat}`, room.floorId, room.id);
  }

  // NFPA 72 Ch. 29: outside each separate sleeping area — references.md 4.1 (PUBLIC). Each floor
  // with bedrooms is taken as one sleeping area (distance not modelled, see isOutsideSleepingArea).
  for (const floor of floors) {
    const floorRooms = roomsOf(floor.id);
    if (!floorRooms.some((r) => r.kind === 'bedroom')) continue;
    const outside = floorRooms.filter(isOutsideSleepingArea);
    if (outside.some((r) => hasActive(r, 'smoke'))) continue;
    add(
      'smoke_missing_outside_sleeping_area',
      `${floor.name} has bedrooms but no smoke alarm in service outside them, such as in the hall or on the landing.${bypassedOnFloor(outside, 'smoke')}`,
      floor.id,
      null,
    );
  }

  // NFPA 72 Ch. 29: every level, including basements — references.md 4.1 (PUBLIC).
  for (const floor of floors) {
    const floorRooms = roomsOf(floor.id);
    if (!isLivingLevel(floorRooms)) continue;
    if (floorRooms.some((r) => hasActive(r, 'smoke'))) continue;
    const basement = floor.belowGrade ? ' Basements need one too.' : '';
    add(
      'smoke_missing_level',
      `${floor.name} has no smoke alarm in service on this level.${basement}${bypassedOnFloor(floorRooms, 'smoke')}`,
      floor.id,
      null,
    );
  }

  // IRC R315: CO alarms are required where there is a fuel-burning appliance or an attached
  // garage — references.md 4.15 (PUBLIC).
  const appliances = rooms.filter((r) => r.fuelBurningAppliance);
  const garages = rooms.filter((r) => r.attachedGarage);
  const coRequired = appliances.length > 0 || garages.length > 0;
  const because = listInWords([
    ...(appliances.length > 0 ? [`a fuel-burning appliance (${listInWords(appliances.map((r) => r.name))})`] : []),
    ...(garages.length > 0 ? ['an attached garage'] : []),
  ]);

  if (coRequired) {
    // IRC R315.3: outside each separate sleeping area, near the bedrooms — references.md 4.16 (PUBLIC).
    for (const floor of floors) {
      const floorRooms = roomsOf(floor.id);
      if (!floorRooms.some((r) => r.kind === 'bedroom')) continue;
      const outside = floorRooms.filter(isOutsideSleepingArea);
      if (outside.some((r) => hasActive(r, 'co'))) continue;
      add(
        'co_missing_outside_sleeping_area',
        `${floor.name} has bedrooms but no CO alarm in service outside them. This home has ${because}, so one is needed near the bedrooms.${bypassedOnFloor(outside, 'co')}`,
        floor.id,
        null,
      );
    }
  }

  // IRC R315.3: inside a bedroom that has a fuel-burning appliance — references.md 4.16 (PUBLIC).
  for (const room of bedrooms) {
    if (!room.fuelBurningAppliance || hasActive(room, 'co')) continue;
    add(
      'co_missing_in_bedroom_with_appliance',
      `${where(room)} has a fuel-burning appliance but no CO alarm in service inside it.${bypassedNote(room, 'co')}`,
      room.floorId,
      room.id,
    );
  }

  if (coRequired) {
    // NFPA 720: every occupiable level, including basements — references.md 4.17 (MEMORY).
    for (const floor of floors) {
      const floorRooms = roomsOf(floor.id);
      if (!isLivingLevel(floorRooms)) continue;
      if (floorRooms.some((r) => hasActive(r, 'co'))) continue;
      add(
        'co_missing_level',
        `${floor.name} has no CO alarm in service. NFPA 720 asks for one on every occupiable level, including basements (from memory).${bypassedOnFloor(floorRooms, 'co')}`,
        floor.id,
        null,
      );
    }
  }

  // A bypassed alarm is not protection: name each room whose only smoke or CO alarms are bypassed.
  for (const [type, code, word] of [
    ['smoke', 'smoke_bypassed_only', 'smoke alarm'],
    ['co', 'co_bypassed_only', 'CO alarm'],
  ] as const) {
    for (const room of rooms) {
      const bypassed = bypassedIn(room, type);
      if (bypassed.length === 0 || hasActive(room, type)) continue;
      const names = listInWords(bypassed.map((z) => `“${z.description}”`));
      const plural = bypassed.length > 1;
      add(
        code,
        `The ${word}${plural ? 's' : ''} in ${where(room)}, ${names}, ${plural ? 'are' : 'is'} bypassed and ${plural ? 'protect' : 'protects'} no one until ${plural ? 'they are' : 'it is'} back in service.`,
        room.floorId,
        room.id,
      );
    }
  }

  // Trade practice (common practice, no published source): every ground-reachable opening has a sensor.
  for (const room of rooms) {
    for (const o of allOpenings.filter((x) => openingRoom.get(x.id) === room.id)) {
      if (!o.groundReachable || o.protected) continue;
      const kind = OPENING_KIND_WORDS[o.kind][0];
      add(
        'opening_unprotected_ground',
        `${o.label}, a ${kind} in ${where(room)}, can be reached from the ground and has no sensor.`,
        room.floorId,
        room.id,
      );
    }
  }

  // Trade practice (common practice, no published source): a room with openings has interior detection.
  for (const room of rooms) {
    if (!openings.some((o) => o.roomId === room.id)) continue;
    if (INTERIOR_DETECTION_DEVICE_TYPES.some((t) => hasActive(room, t))) continue;
    add(
      'room_without_interior_detection',
      `${where(room)} has doors or windows but no motion or glass-break detector in service.`,
      room.floorId,
      room.id,
    );
  }

  // Errors first, then warnings, then info; Array.prototype.sort is stable, so the order above holds within.
  findings.sort((a, b) => SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity]);

  return {
    openings: {
      total: allOpenings.length,
      protected: allOpenings.filter((o) => o.protected).length,
      unprotectedGroundReachable: allOpenings.filter((o) => !o.protected && o.groundReachable).length,
    },
    summary: coverageSummary(allOpenings),
    findings,
    floors: floorResults,
  };
}

/**
 * The life-safety caution (product.md, "Rules the product enforces") when the coverage shows a
 * smoke/CO finding or the premises have smoke, heat or CO alarms in service; otherwise null.
 */
export function coverageCaution(result: CoverageResult): typeof LIFE_SAFETY_CAUTION | null {
  const finding = result.findings.some((f) => f.lifeSafety);
  const devices = result.floors.some((f) => f.rooms.some((r) => r.devices.some((d) => LIFE_SAFETY_DEVICE_TYPES.includes(d.deviceType))));
  return finding || devices ? LIFE_SAFETY_CAUTION : null;
}
