/**
 * The life-safety zone check: a smoke, heat or CO device protects the household only when the
 * panel is programmed to treat it as one. It is judged on how its zone is programmed, not on its
 * name or device type alone:
 *
 * - smoke and heat devices on a fire zone (`fire_24h`), CO alarms on a CO zone (`co_24h`); a
 *   combination smoke and CO alarm on one of each (its two inputs enrolled as two zones);
 * - in service, reported to the monitoring center, and supervised.
 *
 * On any other zone type the panel's abort window and swinger shutdown would apply to the device,
 * and CP-01 exempts fire from both (§4.2.5.1 abort window — references.md 1.14, PUBLIC; §4.3.2
 * swinger shutdown — references.md 1.20, MEMORY). CP-01 names fire zones in these exemptions and,
 * as far as we know, says nothing of CO (from memory); Mullion holds CO zones to the same rule.
 * A device that fails the check does not count as protection anywhere in coverage. Pure: no I/O.
 */
import { CO_DEVICE_TYPES, FIRE_DEVICE_TYPES, SMOKE_DEVICE_TYPES, ZONE_TYPE_LABELS, type DeviceType, type ZoneStatus, type ZoneType } from './devices';

/** What a device can protect against. */
export type LifeSafetyFunction = 'smoke' | 'heat' | 'co';

/** What the check needs to know of a zone. */
export interface LifeSafetyZoneInput {
  id: string;
  /** the zone number on its panel, when known (named in messages) */
  number?: number | null;
  description: string;
  deviceType: DeviceType;
  zoneType: ZoneType;
  reportsToMonitoring: boolean;
  supervised: boolean;
  status: ZoneStatus;
  /** serial and panel, to find the other half of a combination alarm */
  serial?: string | null;
  panelId?: string | null;
}

export type LifeSafetyZoneProblemCode = 'wrong_zone_type' | 'not_reported' | 'not_supervised' | 'combination_half_missing';

/** One thing wrong with how a life-safety device is programmed, and what to change. */
export interface LifeSafetyZoneProblem {
  code: LifeSafetyZoneProblemCode;
  /** the zone field to change */
  field: 'zoneType' | 'reportsToMonitoring' | 'supervised' | null;
  /** what is wrong, in the trade's words */
  what: string;
  /** what to change */
  fix: string;
}

/** The check of one zone. */
export interface LifeSafetyZoneCheck {
  zoneId: string;
  /** what the device is meant to sense, from its type */
  senses: LifeSafetyFunction[];
  /** what the zone counts as protection for, as programmed (empty when it fails the check or is not in service) */
  protects: LifeSafetyFunction[];
  problems: LifeSafetyZoneProblem[];
}

/** What a device type senses; empty for devices that are not life-safety. */
export function sensesOf(deviceType: DeviceType): LifeSafetyFunction[] {
  const senses: LifeSafetyFunction[] = [];
  if (SMOKE_DEVICE_TYPES.includes(deviceType)) senses.push('smoke');
  if (deviceType === 'heat') senses.push('heat');
  if (CO_DEVICE_TYPES.includes(deviceType)) senses.push('co');
  return senses;
}

/** The zone types a device type may be programmed on to count as life safety. */
export function lifeSafetyZoneTypesFor(deviceType: DeviceType): ZoneType[] {
  const types: ZoneType[] = [];
  if (FIRE_DEVICE_TYPES.includes(deviceType)) types.push('fire_24h');
  if (CO_DEVICE_TYPES.includes(deviceType)) types.push('co_24h');
  return types;
}

/** What a zone's type makes of the device's senses: a fire zone carries smoke and heat, a CO zone carries CO. */
function carriedBy(zoneType: ZoneType, senses: readonly LifeSafetyFunction[]): LifeSafetyFunction[] {
  if (zoneType === 'fire_24h') return senses.filter((s) => s === 'smoke' || s === 'heat');
  if (zoneType === 'co_24h') return senses.filter((s) => s === 'co');
  return [];
}

/** "zone 7 “Hall smoke”" or "“Hall smoke”". */
export function zoneName(zone: Pick<LifeSafetyZoneInput, 'number' | 'description'>): string {
  return zone.number != null ? `zone ${zone.number} “${zone.description}”` : `“${zone.description}”`;
}

const FIRE_LABEL = ZONE_TYPE_LABELS.fire_24h;
const CO_LABEL = ZONE_TYPE_LABELS.co_24h;

/** The zone-type problem, or null when the zone type carries at least one of what the device senses. */
function zoneTypeProblem(zone: LifeSafetyZoneInput, senses: readonly LifeSafetyFunction[]): LifeSafetyZoneProblem | null {
  if (carriedBy(zone.zoneType, senses).length > 0) return null;
  const current = ZONE_TYPE_LABELS[zone.zoneType] ?? zone.zoneType;
  const wanted = zone.deviceType === 'smoke_co' ? `${FIRE_LABEL} (and enrol its CO input on ${CO_LABEL})` : senses.includes('co') ? CO_LABEL : FIRE_LABEL;
  const consequence =
    zone.zoneType === 'monitor_only'
      ? 'the panel only chimes and never raises an alarm for it'
      : 'the panel treats it as a burglary or other zone, with the abort window and swinger shutdown that fire and CO must never have';
  return {
    code: 'wrong_zone_type',
    field: 'zoneType',
    what: `it is on a “${current}” zone, so ${consequence}`,
    fix: `set its zone type to ${wanted}`,
  };
}

/**
 * Checks one zone. Devices that are not life-safety pass with nothing to say. A zone that is not in
 * service (bypassed or removed) protects nothing but has no programming problem of its own.
 */
export function checkLifeSafetyZone(zone: LifeSafetyZoneInput, siblings: readonly LifeSafetyZoneInput[] = []): LifeSafetyZoneCheck {
  const senses = sensesOf(zone.deviceType);
  if (senses.length === 0) return { zoneId: zone.id, senses, protects: [], problems: [] };
  const problems: LifeSafetyZoneProblem[] = [];
  const typeProblem = zoneTypeProblem(zone, senses);
  if (typeProblem) problems.push(typeProblem);
  if (!zone.reportsToMonitoring) {
    problems.push({
      code: 'not_reported',
      field: 'reportsToMonitoring',
      what: 'it does not report to the monitoring center, so nobody is called when it sounds',
      fix: 'turn on “Reports to the monitoring center”',
    });
  }
  if (!zone.supervised) {
    problems.push({
      code: 'not_supervised',
      field: 'supervised',
      what: 'it is not supervised, so the panel shows no trouble if it goes silent or its battery dies',
      fix: 'turn on “Supervised”',
    });
  }
  // A combination alarm enrolled on only one zone: its other half protects nothing.
  if (zone.deviceType === 'smoke_co' && !typeProblem) {
    const other: ZoneType = zone.zoneType === 'fire_24h' ? 'co_24h' : 'fire_24h';
    const serial = zone.serial?.trim() ?? '';
    const enrolled = siblings.some(
      (s) =>
        s.id !== zone.id &&
        s.deviceType === 'smoke_co' &&
        s.status !== 'removed' &&
        s.zoneType === other &&
        serial !== '' &&
        (s.serial?.trim() ?? '') === serial &&
        (zone.panelId == null || s.panelId == null || s.panelId === zone.panelId),
    );
    if (!enrolled) {
      const half = other === 'co_24h' ? 'CO' : 'smoke';
      problems.push({
        code: 'combination_half_missing',
        field: null,
        what: `it is a combination alarm whose ${half} input has no ${other === 'co_24h' ? CO_LABEL : FIRE_LABEL} zone, so its ${half} warning reaches nobody`,
        fix: `enrol its ${half} input as a second zone with the same serial on ${other === 'co_24h' ? CO_LABEL : FIRE_LABEL}`,
      });
    }
  }
  // The missing half of a combination alarm does not stop the enrolled half from protecting.
  const blocking = problems.filter((p) => p.code !== 'combination_half_missing');
  const protects = zone.status === 'active' && blocking.length === 0 ? carriedBy(zone.zoneType, senses) : [];
  return { zoneId: zone.id, senses, protects, problems };
}

/** True when the zone counts as protection for `what`, as programmed. */
export function protectsAgainst(zone: LifeSafetyZoneInput, what: LifeSafetyFunction, siblings: readonly LifeSafetyZoneInput[] = []): boolean {
  return checkLifeSafetyZone(zone, siblings).protects.includes(what);
}

/** "Hall smoke" (zone 7) is …, and …. Change it: …; …. — one sentence pair for a failed check. */
export function lifeSafetyZoneMessage(zone: LifeSafetyZoneInput, problems: readonly LifeSafetyZoneProblem[]): string {
  const whats = problems.map((p) => p.what);
  const fixes = problems.map((p) => p.fix);
  const name = zoneName(zone);
  const joined = whats.length <= 1 ? whats.join('') : `${whats.slice(0, -1).join('; ')}; and ${whats[whats.length - 1]}`;
  const counts = problems.some((p) => p.code !== 'combination_half_missing') ? ' It does not count as protection until this is changed.' : '';
  return `${name[0]!.toUpperCase()}${name.slice(1)}: ${joined}.${counts} To fix: ${fixes.join('; ')}.`;
}
