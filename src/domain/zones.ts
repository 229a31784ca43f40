/**
 * Zone rules (product.md, "The job, as the trade does it" and "Panels and zones"): defaults by
 * device type, the next free zone number, clashes within a panel, the same serial elsewhere in
 * the firm, and the change set that goes to the zone change log.
 */
import { type DeviceType, type ZoneStatus, type ZoneType } from './devices';

// ---------------------------------------------------------------------------------------------
// Defaults by device type
// ---------------------------------------------------------------------------------------------

/** The Behaviour fields of a zone that follow from its device type until a technician changes them. */
export interface ZoneDefaults {
  zoneType: ZoneType;
  reportsToMonitoring: boolean;
  chime: boolean;
  supervised: boolean;
}

/**
 * Trade practice for each device type (product.md). Contacts chime; room detectors and always-armed
 * zones do not. Keyfobs, keypads and sirens are enrolled for supervision only: they detect nothing.
 */
export const ZONE_DEFAULTS: Readonly<Record<DeviceType, Readonly<ZoneDefaults>>> = {
  window_contact: { zoneType: 'perimeter', reportsToMonitoring: true, chime: true, supervised: true },
  door_contact: { zoneType: 'entry_exit', reportsToMonitoring: true, chime: true, supervised: true },
  sliding_door_contact: { zoneType: 'entry_exit', reportsToMonitoring: true, chime: true, supervised: true },
  // Entry/exit rather than perimeter: where a garage door is protected at all, the household
  // usually drives in through it and walks to the keypad, so an instant zone would cause false
  // alarms. A garage nobody enters by can be switched to perimeter by the technician.
  garage_door_tilt: { zoneType: 'entry_exit', reportsToMonitoring: true, chime: true, supervised: true },
  motion: { zoneType: 'interior_follower', reportsToMonitoring: true, chime: false, supervised: true },
  glass_break: { zoneType: 'perimeter', reportsToMonitoring: true, chime: false, supervised: true },
  smoke: { zoneType: 'fire_24h', reportsToMonitoring: true, chime: false, supervised: true },
  smoke_detector: { zoneType: 'fire_24h', reportsToMonitoring: true, chime: false, supervised: true },
  // A combination alarm is enrolled twice: input 1 on a fire zone (this default), input 2 on a
  // CO zone. The life-safety zone check asks for the second when only one is enrolled.
  smoke_co: { zoneType: 'fire_24h', reportsToMonitoring: true, chime: false, supervised: true },
  heat: { zoneType: 'fire_24h', reportsToMonitoring: true, chime: false, supervised: true },
  co: { zoneType: 'co_24h', reportsToMonitoring: true, chime: false, supervised: true },
  water: { zoneType: 'water_24h', reportsToMonitoring: true, chime: false, supervised: true },
  temperature: { zoneType: 'temperature_24h', reportsToMonitoring: true, chime: false, supervised: true },
  panic_button: { zoneType: 'panic_audible', reportsToMonitoring: true, chime: false, supervised: true },
  // A keyfob leaves the premises with its owner; supervising it would raise a trouble every time
  // the household goes away, so the trade leaves fobs unsupervised.
  keyfob: { zoneType: 'monitor_only', reportsToMonitoring: false, chime: false, supervised: false },
  keypad: { zoneType: 'monitor_only', reportsToMonitoring: false, chime: false, supervised: true },
  siren: { zoneType: 'monitor_only', reportsToMonitoring: false, chime: false, supervised: true },
  other: { zoneType: 'monitor_only', reportsToMonitoring: false, chime: false, supervised: true },
};

/** A fresh copy of the default Behaviour fields for a device type, ready to prefill the zone form. */
export function zoneDefaultsFor(deviceType: DeviceType): ZoneDefaults {
  return { ...ZONE_DEFAULTS[deviceType] };
}

// ---------------------------------------------------------------------------------------------
// Numbers, serials and clashes within a panel
// ---------------------------------------------------------------------------------------------

/** What the zone rules need to know about a panel. */
export interface PanelRange {
  zoneCapacity: number;
  wirelessZoneFrom: number;
  wirelessZoneTo: number;
}

/** What the zone rules need to know about a zone already on the panel. */
export interface ZoneLike {
  id: string;
  number: number;
  serial: string;
  input: number;
  status: ZoneStatus;
  description?: string;
}

/** A zone being created (no id) or edited (its own id), checked against the panel. */
export interface ZoneCandidate {
  id?: string;
  number: number;
  serial: string;
  input: number;
}

export type ZoneProblemCode = 'zone_number_taken' | 'serial_input_taken' | 'over_capacity' | 'outside_wireless_range';

/** A refusal (from `zoneProblems`) or a note (from `zoneWarnings`) about one field of a zone. */
export interface ZoneProblem {
  code: ZoneProblemCode;
  field: 'number' | 'serial' | 'input';
  message: string;
  clashZoneId?: string;
}

/** Zones that hold their number and serial: every zone but a removed one. */
export function occupyingZones<Z extends { status: ZoneStatus }>(zones: readonly Z[]): Z[] {
  return zones.filter((zone) => zone.status !== 'removed');
}

/** The zone numbers a panel accepts: 1 to its capacity. */
function isWithinCapacity(number: number, panel: PanelRange): boolean {
  return number >= 1 && number <= panel.zoneCapacity;
}

/** Lowest number in the panel's wireless range (and within capacity) that no occupying zone uses; null when full. */
export function nextFreeZoneNumber(panel: PanelRange, zones: readonly ZoneLike[]): number | null {
  const used = new Set(occupyingZones(zones).map((zone) => zone.number));
  const first = Math.max(1, Math.ceil(panel.wirelessZoneFrom));
  const last = Math.min(Math.floor(panel.wirelessZoneTo), Math.floor(panel.zoneCapacity));
  for (let number = first; number <= last; number++) {
    if (!used.has(number)) return number;
  }
  return null;
}

/** A serial that can clash: an empty (or blank) serial is not yet known and never clashes. */
function hasSerial(serial: string): boolean {
  return serial.trim() !== '';
}

/** The other occupying zones of the panel: the candidate's own saved row does not clash with itself. */
function otherOccupyingZones(candidate: ZoneCandidate, zones: readonly ZoneLike[]): ZoneLike[] {
  return occupyingZones(zones).filter((zone) => candidate.id === undefined || zone.id !== candidate.id);
}

/** "Zone 130 is beyond …" when the number is outside 1 to the panel's capacity; null otherwise. */
function capacityProblem(candidate: ZoneCandidate, panel: PanelRange): ZoneProblem | null {
  if (isWithinCapacity(candidate.number, panel)) return null;
  const choose = `Choose a number from 1 to ${panel.zoneCapacity}.`;
  const message =
    candidate.number < 1
      ? `Zone numbers start at 1. ${choose}`
      : `Zone ${candidate.number} is beyond this panel's ${panel.zoneCapacity} zones. ${choose}`;
  return { code: 'over_capacity', field: 'number', message };
}

/** A clash when another occupying zone already has the candidate's number; null otherwise. */
function numberClash(candidate: ZoneCandidate, others: readonly ZoneLike[]): ZoneProblem | null {
  const clash = others.find((zone) => zone.number === candidate.number);
  if (!clash) return null;
  const description = clash.description?.trim();
  const holder = description ? `“${description}”` : 'in use';
  return {
    code: 'zone_number_taken',
    field: 'number',
    message: `Zone ${clash.number} is already ${holder} on this panel. Choose another number or edit zone ${clash.number}.`,
    clashZoneId: clash.id,
  };
}

/** A clash when another occupying zone has exactly the same serial (as a string) and input; null otherwise. */
function serialInputClash(candidate: ZoneCandidate, others: readonly ZoneLike[]): ZoneProblem | null {
  if (!hasSerial(candidate.serial)) return null;
  const clash = others.find((zone) => zone.serial === candidate.serial && zone.input === candidate.input);
  if (!clash) return null;
  return {
    code: 'serial_input_taken',
    // Named on the serial: that is what the technician typed or scanned; the message names the input too.
    field: 'serial',
    message: `Serial ${candidate.serial} input ${candidate.input} is already zone ${clash.number} on this panel. Choose another input or edit zone ${clash.number}.`,
    clashZoneId: clash.id,
  };
}

/** The reasons a zone cannot be saved on this panel (empty when it can): capacity, number clash, serial+input clash. */
export function zoneProblems(candidate: ZoneCandidate, panel: PanelRange, zones: readonly ZoneLike[]): ZoneProblem[] {
  const others = otherOccupyingZones(candidate, zones);
  return [capacityProblem(candidate, panel), numberClash(candidate, others), serialInputClash(candidate, others)].filter(
    (problem): problem is ZoneProblem => problem !== null,
  );
}

/** Notes that do not block saving: a number outside the wireless range (fine for a hardwired zone). */
export function zoneWarnings(candidate: ZoneCandidate, panel: PanelRange): ZoneProblem[] {
  // A number beyond capacity is already refused by zoneProblems; one message is enough.
  if (!isWithinCapacity(candidate.number, panel)) return [];
  if (candidate.number >= panel.wirelessZoneFrom && candidate.number <= panel.wirelessZoneTo) return [];
  return [
    {
      code: 'outside_wireless_range',
      field: 'number',
      message: `Zone ${candidate.number} is outside this panel's wireless zones (${panel.wirelessZoneFrom}–${panel.wirelessZoneTo}). That is fine for a hardwired zone; for a wireless device, choose a number in the range.`,
    },
  ];
}

// ---------------------------------------------------------------------------------------------
// The same serial elsewhere in the firm
// ---------------------------------------------------------------------------------------------

/** A zone on another panel of the firm, as the serial check needs it. */
export interface ZoneElsewhere {
  serial: string;
  panelLabel: string;
  siteName: string;
  number: number;
}

/** The zones on other panels that use exactly this serial (a flag, not an error); none for an empty serial. */
export function serialsElsewhere<Z extends ZoneElsewhere>(serial: string, zonesOfOtherPanels: readonly Z[]): Z[] {
  if (!hasSerial(serial)) return [];
  return zonesOfOtherPanels.filter((zone) => zone.serial === serial);
}

/** "Serial 0412877 is also zone 4 on Panel 1 at 12 Elm Street." — one line per place found by serialsElsewhere. */
export function serialElsewhereNote(place: ZoneElsewhere): string {
  return `Serial ${place.serial} is also zone ${place.number} on ${place.panelLabel} at ${place.siteName}.`;
}

// ---------------------------------------------------------------------------------------------
// Change log and "changed since last programmed"
// ---------------------------------------------------------------------------------------------

/** Old and new value of each changed field: `{ serial: ['0412877', '0412878'] }`. */
export type ChangeSet = Record<string, [unknown, unknown]>;

/** The zone fields that are programmed into the panel: changing any of them means the panel needs programming. */
export const ZONE_CHANGE_FIELDS = [
  'number',
  'description',
  'deviceType',
  'zoneType',
  'serial',
  'input',
  'reportsToMonitoring',
  'chime',
  'supervised',
  'status',
] as const;
export type ZoneChangeField = (typeof ZONE_CHANGE_FIELDS)[number];

/** Null and undefined both mean "no value"; the log stores null. */
function emptyAsNull(value: unknown): unknown {
  return value === undefined ? null : value;
}

/** Same value: dates by instant, everything else (strings, numbers, booleans, null) strictly. */
function sameValue(a: unknown, b: unknown): boolean {
  if (a instanceof Date && b instanceof Date) return a.getTime() === b.getTime();
  return Object.is(emptyAsNull(a), emptyAsNull(b));
}

/** The listed fields whose value differs between before and after, as [old, new] pairs for the change log. */
export function zoneChangeSet(before: Record<string, unknown>, after: Record<string, unknown>, fields: readonly string[]): ChangeSet {
  const changes: ChangeSet = {};
  for (const field of fields) {
    const [oldValue, newValue] = [emptyAsNull(before[field]), emptyAsNull(after[field])];
    if (!sameValue(oldValue, newValue)) changes[field] = [oldValue, newValue];
  }
  return changes;
}

/** True when a change set touches a programmed field, so the panel is "changed since last programmed". */
export function marksPanelChanged(changeSet: ChangeSet): boolean {
  return ZONE_CHANGE_FIELDS.some((field) => Object.hasOwn(changeSet, field));
}
