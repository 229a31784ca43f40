/**
 * Coverage of a site's premises (product.md, "Premises and coverage"): which openings are
 * protected, which ground-reachable openings have no sensor, which rooms lack interior
 * detection, and the life-safety findings (NFPA 72 dwelling rules, CO guidance), each
 * naming its rule and source. Pure: no I/O.
 */
import type { DeviceType, ZoneStatus } from './devices';
import type { OpeningKind, RoomKind } from './premises';

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

export function computeCoverage(_input: CoverageInput): CoverageResult {
  throw new Error('computeCoverage is being written');
}
