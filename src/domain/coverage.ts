/**
 * Coverage of a site's premises (product.md, "Premises and coverage"): which openings are
 * protected, which ground-reachable openings have no sensor, which rooms lack interior
 * detection, and the life-safety findings (NFPA 72 dwelling rules, IRC and NFPA 720 CO
 * guidance), each naming its rule and source.
 *
 * A smoke, heat or CO device counts as protection only as it is programmed: in service, on a
 * fire or CO zone, reported and supervised (life-safety-zone.ts). "Outside the sleeping area"
 * is satisfied only by an alarm in the hall or landing the premises record as serving those
 * bedrooms; a garage counts for no level. Pure: no I/O.
 */
import { ROOM_DEVICE_TYPES, OPENING_DEVICE_TYPES, LIFE_SAFETY_DEVICE_TYPES, type DeviceType, type ZoneStatus, type ZoneType } from './devices';
import { LIFE_SAFETY_CAUTION } from './life-safety';
import { checkLifeSafetyZone, lifeSafetyZoneMessage, type LifeSafetyFunction, type LifeSafetyZoneInput } from './life-safety-zone';
import { OPENING_KINDS, type OpeningKind, type RoomKind } from './premises';
import { bySeverity, type Evidence, type Severity } from './severity';

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
  /** a bedroom: the hall or landing that serves its sleeping area (bedrooms with the same hall form one sleeping area) */
  servedByHallId?: string | null;
  /** a bedroom: the technician confirmed its door is within 21 ft of that hall's alarm, along the path of travel */
  hallWithin21FtConfirmed?: boolean;
  /** a bathroom: the bedroom it is attached to */
  attachedToBedroomId?: string | null;
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
  number?: number | null;
  description: string;
  deviceType: DeviceType;
  zoneType: ZoneType;
  reportsToMonitoring: boolean;
  supervised: boolean;
  status: ZoneStatus;
  roomId: string | null;
  openingId: string | null;
  serial?: string | null;
  panelId?: string | null;
}

export type FindingSeverity = Severity;

export interface CoverageFinding {
  code: string;
  severity: FindingSeverity;
  /** the rule in words, e.g. "NFPA 72: a smoke alarm in every sleeping room" */
  rule: string;
  /** where the rule comes from: document, section, and the references.md row with PUBLIC/MEMORY */
  source: string;
  /** public text, memory (staff only) or trade practice */
  evidence: Evidence;
  message: string;
  floorId: string | null;
  roomId: string | null;
  /** the zone the finding is about, when there is one */
  zoneId: string | null;
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

export interface CoverageRoomDevice {
  zoneId: string;
  description: string;
  deviceType: DeviceType;
  /** false for a life-safety device whose zone is not programmed to protect (life-safety-zone.ts) */
  counts: boolean;
}

export interface CoverageRoomResult {
  id: string;
  name: string;
  kind: RoomKind;
  openings: CoverageOpeningResult[];
  /** active room devices (motion, glass-break, smoke, heat, CO, …) */
  devices: CoverageRoomDevice[];
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
  'life_safety_zone_programming',
  'smoke_missing_sleeping_room',
  'smoke_missing_outside_sleeping_area',
  'sleeping_area_unknown',
  'sleeping_area_distance_unconfirmed',
  'smoke_missing_level',
  'smoke_in_garage',
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
  evidence: Evidence;
  lifeSafety: boolean;
}

const TRADE_PRACTICE = 'Alarm trade practice — common practice, no published source';
const NFPA72_REQUIRED = 'NFPA 72 Chapter 29, required detection (§29.8.1 in 2019, §29.5.1 in 2010; clause numbers from memory) — references.md 4.1 (PUBLIC)';

/** The rule behind every finding code: severity, the rule in words, its source. */
export const COVERAGE_RULES: Record<CoverageFindingCode, CoverageRule> = {
  life_safety_zone_programming: {
    severity: 'error',
    rule: 'A smoke, heat or CO device protects only on a fire or CO zone that is in service, reported to the monitoring center and supervised',
    source:
      'ANSI/SIA CP-01 §4.2.5.1, fire exempt from the abort window — references.md 1.14 (PUBLIC); CP-01 §4.3.2, swinger shutdown not applied to fire — references.md 1.20 (MEMORY); NFPA 72 §23.16.2, supervised low-power radio — references.md 4.10–4.12 (PUBLIC)',
    evidence: 'public',
    lifeSafety: true,
  },
  smoke_missing_sleeping_room: {
    severity: 'error',
    rule: 'NFPA 72: a smoke alarm in every sleeping room',
    source: NFPA72_REQUIRED,
    evidence: 'public',
    lifeSafety: true,
  },
  smoke_missing_outside_sleeping_area: {
    severity: 'error',
    rule: 'NFPA 72: a smoke alarm outside each separate sleeping area, within 21 ft of every bedroom door along the path of travel',
    source: `${NFPA72_REQUIRED}; IRC §R314.3 (from memory)`,
    evidence: 'public',
    lifeSafety: true,
  },
  sleeping_area_unknown: {
    severity: 'warning',
    rule: 'The premises say which hall or landing serves each sleeping area, so “outside the sleeping area” can be judged',
    source: `${NFPA72_REQUIRED}; IRC §R314.3 (from memory) and §R315.3 — references.md 4.16 (PUBLIC)`,
    evidence: 'public',
    lifeSafety: true,
  },
  sleeping_area_distance_unconfirmed: {
    severity: 'warning',
    rule: 'NFPA 72: every bedroom door within 21 ft of the alarm outside the sleeping area, measured along the path of travel',
    source: NFPA72_REQUIRED,
    evidence: 'public',
    lifeSafety: true,
  },
  smoke_missing_level: {
    severity: 'error',
    rule: 'NFPA 72: a smoke alarm on every level, including basements',
    source: NFPA72_REQUIRED,
    evidence: 'public',
    lifeSafety: true,
  },
  smoke_in_garage: {
    severity: 'info',
    rule: 'A smoke alarm in a garage does not count for its level',
    source: 'NFPA 72 Chapter 29, locations to avoid (garages: exhaust, dust, temperature) — from memory',
    evidence: 'memory',
    lifeSafety: true,
  },
  co_missing_outside_sleeping_area: {
    severity: 'error',
    rule: 'IRC: where there is a fuel-burning appliance or an attached garage, a CO alarm outside each separate sleeping area, near the bedrooms',
    source: 'IRC 2018 §R315.1 (2021 §R315.2) and IRC 2015/2018 §R315.3 — references.md 4.15 and 4.16 (PUBLIC)',
    evidence: 'public',
    lifeSafety: true,
  },
  co_missing_in_bedroom_with_appliance: {
    severity: 'error',
    rule: 'IRC: a CO alarm inside a bedroom that has a fuel-burning appliance, in the bedroom or its attached bathroom',
    source: 'IRC 2015/2018 §R315.3 — references.md 4.16 (PUBLIC)',
    evidence: 'public',
    lifeSafety: true,
  },
  co_missing_level: {
    severity: 'warning',
    rule: 'NFPA 720: a CO alarm on every occupiable level, including basements',
    source: 'NFPA 720-2012/2015 §9.4.1, now in NFPA 72-2022 — references.md 4.17 (MEMORY)',
    evidence: 'memory',
    lifeSafety: true,
  },
  smoke_bypassed_only: {
    severity: 'warning',
    rule: 'A bypassed smoke alarm protects no one until it is back in service',
    source: TRADE_PRACTICE,
    evidence: 'practice',
    lifeSafety: true,
  },
  co_bypassed_only: {
    severity: 'warning',
    rule: 'A bypassed CO alarm protects no one until it is back in service',
    source: TRADE_PRACTICE,
    evidence: 'practice',
    lifeSafety: true,
  },
  opening_unprotected_ground: {
    severity: 'warning',
    rule: 'Every door and window reachable from the ground has a sensor',
    source: TRADE_PRACTICE,
    evidence: 'practice',
    lifeSafety: false,
  },
  room_without_interior_detection: {
    severity: 'info',
    rule: 'A room with doors or windows has a motion or glass-break detector',
    source: TRADE_PRACTICE,
    evidence: 'practice',
    lifeSafety: false,
  },
};

/** Device types that are life-safety alarms; their presence brings the caution. */
export { LIFE_SAFETY_DEVICE_TYPES };

/** Room devices that count as interior detection (intrusion). */
export const INTERIOR_DETECTION_DEVICE_TYPES: readonly DeviceType[] = ['motion', 'glass_break'];

/**
 * Rooms that can serve as "outside the sleeping area": a hall, landing or other room people pass
 * through to the bedrooms. Not a bedroom, a bathroom, a kitchen (cooking sets alarms off), a
 * garage, a utility room or a basement room: an alarm there does not stand in for the one in
 * the hall by the bedrooms (IRC §R314.3, "in the immediate vicinity of the bedrooms").
 */
export const SLEEPING_AREA_HALL_KINDS: readonly RoomKind[] = ['hall', 'living', 'dining', 'office', 'other'];

/** True when a room of this kind may be recorded as the hall serving a sleeping area. */
export function canServeSleepingArea(kind: RoomKind): boolean {
  return SLEEPING_AREA_HALL_KINDS.includes(kind);
}

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
export function zoneProtectsOpening(zone: Pick<CoverageZoneInput, 'status' | 'deviceType' | 'openingId'>, openingId: string): boolean {
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

const FUNCTION_WORDS: Record<LifeSafetyFunction, string> = { smoke: 'smoke alarm', heat: 'heat alarm', co: 'CO alarm' };

/**
 * Computes coverage for one site's premises. Openings count when their room is on a recorded
 * floor; anything that cannot be placed on a floor is left out of totals and findings alike,
 * so the summary always matches what the floors show. Only zones in service ('active') count;
 * smoke, heat and CO devices count only as programmed (life-safety-zone.ts).
 */
export function computeCoverage(input: CoverageInput): CoverageResult {
  // Floors from the lowest level up (basement, ground, upstairs), then by name: the order in
  // which the premises are built and read, the same on every page.
  const floors = [...input.floors].sort((a, b) => a.level - b.level || byTextThenId<CoverageFloorInput>((f) => f.name)(a, b));
  const floorIds = new Set(floors.map((f) => f.id));
  const rooms = input.rooms.filter((r) => floorIds.has(r.floorId)).sort(byTextThenId<CoverageRoomInput>((r) => r.name));
  const roomById = new Map(rooms.map((r) => [r.id, r]));
  const openings = input.openings.filter((o) => roomById.has(o.roomId)).sort(byTextThenId<CoverageOpeningInput>((o) => o.label));
  const zones = [...input.zones].sort(byTextThenId<CoverageZoneInput>((z) => z.description));
  const activeZones = zones.filter((z) => z.status === 'active');
  const lifeSafetyInputs: LifeSafetyZoneInput[] = zones;
  const checks = new Map(zones.map((z) => [z.id, checkLifeSafetyZone(z, lifeSafetyInputs)]));

  const roomsOf = (floorId: string) => rooms.filter((r) => r.floorId === floorId);
  /** Zones in a room that count as protection against `what`, as programmed. */
  const protecting = (roomId: string, what: LifeSafetyFunction) => activeZones.filter((z) => z.roomId === roomId && (checks.get(z.id)?.protects.includes(what) ?? false));
  const hasProtection = (room: CoverageRoomInput, what: LifeSafetyFunction) => protecting(room.id, what).length > 0;
  const hasActive = (room: CoverageRoomInput, type: DeviceType) => activeZones.some((z) => z.roomId === room.id && z.deviceType === type);
  /** Zones in a room that sense `what` but do not count: bypassed, or in service but wrongly programmed. */
  const senseButNotCount = (roomId: string, what: LifeSafetyFunction) =>
    zones.filter((z) => z.roomId === roomId && z.status !== 'removed' && (checks.get(z.id)?.senses.includes(what) ?? false) && !(checks.get(z.id)?.protects.includes(what) ?? false));
  const bypassedIn = (roomId: string, what: 'smoke' | 'co') => senseButNotCount(roomId, what).filter((z) => z.status === 'bypassed');
  const misprogrammedIn = (roomId: string, what: 'smoke' | 'co') => senseButNotCount(roomId, what).filter((z) => z.status === 'active');

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
        .map((z) => {
          const check = checks.get(z.id);
          const counts = !LIFE_SAFETY_DEVICE_TYPES.includes(z.deviceType) || (check?.protects.length ?? 0) > 0;
          return { zoneId: z.id, description: z.description, deviceType: z.deviceType, counts };
        }),
    })),
  }));

  // Findings
  const findings: CoverageFinding[] = [];
  const floorName = new Map(floors.map((f) => [f.id, f.name]));
  const where = (room: CoverageRoomInput) => `${room.name} (${floorName.get(room.floorId)})`;
  const add = (code: CoverageFindingCode, message: string, floorId: string | null, roomId: string | null, zoneId: string | null = null, severity?: FindingSeverity) => {
    const rule = COVERAGE_RULES[code];
    findings.push({ code, severity: severity ?? rule.severity, rule: rule.rule, source: rule.source, evidence: rule.evidence, message, floorId, roomId, zoneId, lifeSafety: rule.lifeSafety });
  };
  // A bypassed or wrongly programmed alarm does not count; say so where one stands in for a missing alarm.
  const notCountingSentence = (roomIds: readonly string[], what: 'smoke' | 'co') => {
    const bypassed = roomIds.flatMap((id) => bypassedIn(id, what));
    const wrong = roomIds.flatMap((id) => misprogrammedIn(id, what));
    const parts: string[] = [];
    if (bypassed.length > 0) {
      const names = listInWords(bypassed.map((z) => `“${z.description}”`));
      parts.push(` ${names} ${bypassed.length === 1 ? 'is' : 'are'} bypassed, and a bypassed alarm does not protect anyone.`);
    }
    if (wrong.length > 0) {
      const names = listInWords(wrong.map((z) => `“${z.description}”`));
      parts.push(` ${names} ${wrong.length === 1 ? 'is' : 'are'} not programmed to protect (see the zone finding).`);
    }
    return parts.join('');
  };
  const bedrooms = rooms.filter((r) => r.kind === 'bedroom');

  // The life-safety zone check: every smoke, heat or CO device in service on a zone that cannot
  // protect, named with what to change.
  for (const zone of activeZones) {
    const check = checks.get(zone.id);
    if (!check || check.problems.length === 0) continue;
    const room = zone.roomId ? roomById.get(zone.roomId) : undefined;
    const onlyHalf = check.problems.every((p) => p.code === 'combination_half_missing');
    add('life_safety_zone_programming', lifeSafetyZoneMessage(zone, check.problems), room?.floorId ?? null, room?.id ?? null, zone.id, onlyHalf ? 'warning' : 'error');
  }

  // NFPA 72 Ch. 29: a smoke alarm in every sleeping room — references.md 4.1 (PUBLIC).
  // A heat alarm is not a smoke alarm.
  for (const room of bedrooms) {
    if (hasProtection(room, 'smoke')) continue;
    const heat = hasActive(room, 'heat') ? ' The heat alarm there does not count as a smoke alarm.' : '';
    add('smoke_missing_sleeping_room', `${where(room)} has no smoke alarm in service.${notCountingSentence([room.id], 'smoke')}${heat}`, room.floorId, room.id);
  }

  // Sleeping areas: bedrooms that name the same hall form one sleeping area. Only an alarm in that
  // hall satisfies "outside the sleeping area" (NFPA 72 Ch. 29, IRC R314.3 / R315.3). A bedroom
  // with no hall recorded cannot be judged, and is never taken as satisfied.
  const halls = new Map<string, CoverageRoomInput[]>();
  const unknownArea: CoverageRoomInput[] = [];
  for (const bedroom of bedrooms) {
    const hall = bedroom.servedByHallId ? roomById.get(bedroom.servedByHallId) : undefined;
    if (!hall || !canServeSleepingArea(hall.kind)) unknownArea.push(bedroom);
    else halls.set(hall.id, [...(halls.get(hall.id) ?? []), bedroom]);
  }
  const appliances = rooms.filter((r) => r.fuelBurningAppliance);
  const garages = rooms.filter((r) => r.attachedGarage);
  // IRC R315: CO alarms are required where there is a fuel-burning appliance or an attached
  // garage (even with no appliance) — references.md 4.15 (PUBLIC).
  const coRequired = appliances.length > 0 || garages.length > 0;
  const because = listInWords([
    ...(appliances.length > 0 ? [`a fuel-burning appliance (${listInWords(appliances.map((r) => r.name))})`] : []),
    ...(garages.length > 0 ? ['an attached garage'] : []),
  ]);
  const elsewhereOnFloor = (hall: CoverageRoomInput, sleeping: readonly CoverageRoomInput[], what: LifeSafetyFunction) => {
    const others = rooms.filter((r) => r.floorId === hall.floorId && r.id !== hall.id && !sleeping.includes(r) && hasProtection(r, what));
    if (others.length === 0) return '';
    const names = listInWords(others.map((r) => r.name));
    return ` The ${FUNCTION_WORDS[what]} in ${names} does not stand in for it: it must be in the hall or landing by the bedrooms.`;
  };

  for (const [hallId, sleeping] of halls) {
    const hall = roomById.get(hallId)!;
    const names = listInWords(sleeping.map((r) => r.name));
    if (!hasProtection(hall, 'smoke')) {
      add(
        'smoke_missing_outside_sleeping_area',
        `The sleeping area of ${names} has no smoke alarm in service in ${where(hall)}, the hall that serves it.${notCountingSentence([hall.id], 'smoke')}${elsewhereOnFloor(hall, sleeping, 'smoke')}`,
        hall.floorId,
        hall.id,
      );
    } else {
      for (const bedroom of sleeping.filter((r) => !r.hallWithin21FtConfirmed)) {
        add(
          'sleeping_area_distance_unconfirmed',
          `Confirm that the door of ${where(bedroom)} is within 21 ft (6.4 m) of the smoke alarm in ${hall.name}, measured along the path of travel. Mullion has no distances, so it cannot tell.`,
          bedroom.floorId,
          bedroom.id,
        );
      }
    }
    // IRC R315.3: CO outside each separate sleeping area, near the bedrooms — references.md 4.16 (PUBLIC).
    if (coRequired && !hasProtection(hall, 'co')) {
      add(
        'co_missing_outside_sleeping_area',
        `The sleeping area of ${names} has no CO alarm in service in ${where(hall)}, the hall that serves it. This home has ${because}, so one is needed near the bedrooms.${notCountingSentence([hall.id], 'co')}${elsewhereOnFloor(hall, sleeping, 'co')}`,
        hall.floorId,
        hall.id,
      );
    }
  }
  for (const bedroom of unknownArea) {
    const needs = coRequired ? 'a smoke alarm and a CO alarm' : 'a smoke alarm';
    add(
      'sleeping_area_unknown',
      `Record which hall or landing serves ${where(bedroom)}. Until then Mullion cannot tell whether ${needs} outside its sleeping area protects it, and does not count one.`,
      bedroom.floorId,
      bedroom.id,
    );
  }

  // NFPA 72 Ch. 29: every level, including basements — references.md 4.1 (PUBLIC). An alarm in a
  // garage does not count for the level, and a level of only a garage needs none.
  for (const floor of floors) {
    const floorRooms = roomsOf(floor.id);
    if (!isLivingLevel(floorRooms)) continue;
    const living = floorRooms.filter((r) => r.kind !== 'garage');
    if (living.some((r) => hasProtection(r, 'smoke'))) continue;
    const basement = floor.belowGrade ? ' Basements need one too.' : '';
    const inGarage = floorRooms.filter((r) => r.kind === 'garage' && hasProtection(r, 'smoke'));
    const garageNote = inGarage.length > 0 ? ` The smoke alarm in ${listInWords(inGarage.map((r) => r.name))} does not count: it needs one in a living space.` : '';
    add(
      'smoke_missing_level',
      `${floor.name} has no smoke alarm in service on this level.${basement}${garageNote}${notCountingSentence(
        living.map((r) => r.id),
        'smoke',
      )}`,
      floor.id,
      null,
    );
  }
  for (const room of rooms.filter((r) => r.kind === 'garage')) {
    for (const zone of activeZones.filter((z) => z.roomId === room.id && (checks.get(z.id)?.senses.includes('smoke') ?? false))) {
      add(
        'smoke_in_garage',
        `“${zone.description}” is in ${where(room)}. A smoke alarm in a garage does not count for its level: exhaust, dust and temperature swings set it off or stop it working. A heat alarm is the usual choice there.`,
        room.floorId,
        room.id,
        zone.id,
      );
    }
  }

  // IRC R315.3: inside a bedroom whose own space or attached bathroom has a fuel-burning appliance —
  // references.md 4.16 (PUBLIC).
  for (const room of bedrooms) {
    const bath = rooms.filter((r) => r.kind === 'bath' && r.attachedToBedroomId === room.id && r.fuelBurningAppliance);
    if (!room.fuelBurningAppliance && bath.length === 0) continue;
    if (hasProtection(room, 'co')) continue;
    const source = room.fuelBurningAppliance ? 'a fuel-burning appliance' : `a fuel-burning appliance in its attached bathroom (${listInWords(bath.map((r) => r.name))})`;
    add(
      'co_missing_in_bedroom_with_appliance',
      `${where(room)} has ${source} but no CO alarm in service inside the bedroom.${notCountingSentence([room.id], 'co')}`,
      room.floorId,
      room.id,
    );
  }

  if (coRequired) {
    // NFPA 720: every occupiable level, including basements — references.md 4.17 (MEMORY).
    for (const floor of floors) {
      const floorRooms = roomsOf(floor.id);
      if (!isLivingLevel(floorRooms)) continue;
      const living = floorRooms.filter((r) => r.kind !== 'garage');
      if (living.some((r) => hasProtection(r, 'co'))) continue;
      add(
        'co_missing_level',
        `${floor.name} has no CO alarm in service. NFPA 720 asks for one on every occupiable level, including basements.${notCountingSentence(
          living.map((r) => r.id),
          'co',
        )}`,
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
      const bypassed = bypassedIn(room.id, type);
      if (bypassed.length === 0 || hasProtection(room, type)) continue;
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
      add('opening_unprotected_ground', `${o.label}, a ${kind} in ${where(room)}, can be reached from the ground and has no sensor.`, room.floorId, room.id);
    }
  }

  // Trade practice (common practice, no published source): a room with openings has interior detection.
  for (const room of rooms) {
    if (!openings.some((o) => o.roomId === room.id)) continue;
    if (INTERIOR_DETECTION_DEVICE_TYPES.some((t) => hasActive(room, t))) continue;
    add('room_without_interior_detection', `${where(room)} has doors or windows but no motion or glass-break detector in service.`, room.floorId, room.id);
  }

  return {
    openings: {
      total: allOpenings.length,
      protected: allOpenings.filter((o) => o.protected).length,
      unprotectedGroundReachable: allOpenings.filter((o) => !o.protected && o.groundReachable).length,
    },
    summary: coverageSummary(allOpenings),
    // Errors first, then warnings, then notes; the order above holds within each.
    findings: bySeverity(findings),
    floors: floorResults,
  };
}

/**
 * The life-safety caution (product.md, "Rules the product enforces") when the coverage shows a
 * smoke/CO finding or the premises have smoke, heat or CO devices; otherwise null.
 */
export function coverageCaution(result: CoverageResult): typeof LIFE_SAFETY_CAUTION | null {
  const finding = result.findings.some((f) => f.lifeSafety);
  const devices = result.floors.some((f) => f.rooms.some((r) => r.devices.some((d) => LIFE_SAFETY_DEVICE_TYPES.includes(d.deviceType))));
  return finding || devices ? LIFE_SAFETY_CAUTION : null;
}
