/**
 * The panel's standby battery and its path to the monitoring center, for panels that carry fire
 * or CO devices:
 *
 * - the battery a panel needs from its standby and alarm currents, against the battery fitted,
 *   and the age of that battery (sealed lead-acid, about 5 years from manufacture);
 * - a fire-reporting panel on a single path that cannot report its own failure within the time
 *   NFPA 72 allows.
 *
 * Each requirement names its source; values known only from memory say so, and staff see that
 * mark (never households). Pure: no I/O.
 */
import { CO_DEVICE_TYPES, FIRE_DEVICE_TYPES, type CommPath, type DeviceType, type ZoneStatus, type ZoneType } from './devices';
import { addYearsToDate, isOnOrBefore } from './device-life';
import type { Evidence, Severity } from './severity';

export const PANEL_OCCUPANCIES = ['household', 'commercial'] as const;
export type PanelOccupancy = (typeof PANEL_OCCUPANCIES)[number];

export const PANEL_OCCUPANCY_LABELS: Record<PanelOccupancy, string> = {
  household: 'Home (household system)',
  commercial: 'Business (commercial system)',
};

/** What the panel is sized for: household fire, commercial fire, or intrusion only. */
export type StandbyDuty = 'household_fire' | 'commercial_fire' | 'intrusion';

export interface StandbyRequirement {
  standbyHours: number;
  alarmMinutes: number;
  /** the duty in words */
  label: string;
  clause: string;
  evidence: Evidence;
}

/**
 * Secondary power each duty needs. Household fire: 24 h standby (NFPA 72 Ch. 29 — references.md
 * 4.19, PUBLIC) then 4 min of alarm (from memory). Commercial fire: 24 h standby then 5 min of
 * alarm (NFPA 72 §10.6.7.2.1, from memory). Intrusion: 4 h standby (UL 1023 household burglar
 * units, from memory) and, like household fire, 4 min of alarm (from memory).
 */
export const STANDBY_REQUIREMENTS: Readonly<Record<StandbyDuty, StandbyRequirement>> = {
  household_fire: {
    standbyHours: 24,
    alarmMinutes: 4,
    label: 'household fire',
    // 24 h: references.md 4.19 (PUBLIC); 4 min: from memory
    clause: 'NFPA 72 Chapter 29, household fire secondary power: 24 h standby, then 4 min of alarm (the 4 min from memory)',
    evidence: 'public',
  },
  commercial_fire: {
    standbyHours: 24,
    alarmMinutes: 5,
    label: 'commercial fire',
    clause: 'NFPA 72 §10.6.7.2.1, secondary power: 24 h standby, then 5 min of alarm (from memory)',
    evidence: 'memory',
  },
  intrusion: {
    standbyHours: 4,
    alarmMinutes: 4,
    label: 'intrusion',
    clause: 'UL 1023, household burglar-alarm units: 4 h standby, 4 min of alarm (from memory)',
    evidence: 'memory',
  },
};

/**
 * Headroom added to the calculated capacity for ageing and temperature: 20%. Common practice, no
 * published source (battery worksheets in the trade add it; the standards state hours, not margins).
 */
export const STANDBY_SAFETY_MARGIN = 0.2;

/** Sealed lead-acid standby batteries are replaced about 5 years after manufacture: NFPA 72 Ch. 14 (from memory); common practice. */
export const SEALED_LEAD_ACID_LIFE_YEARS = 5;

/** The panel's power as recorded. */
export interface PanelPowerInput {
  occupancy: PanelOccupancy;
  commPath: CommPath;
  /** supervisory (standby) current in mA, with everything the panel powers */
  standbyCurrentMa: number | null;
  /** current in alarm in mA (sirens sounding, every device in alarm) */
  alarmCurrentMa: number | null;
  /** capacity of the fitted standby battery in Ah */
  batteryAh: number | null;
  /** the date on the standby battery's label */
  batteryManufacturedOn: string | null;
  /** how many minutes until the monitoring center learns that the panel's path has failed */
  pathFailureReportMin: number | null;
}

/** The panel's zones, as these checks need them. */
export interface PanelPowerZone {
  deviceType: DeviceType;
  zoneType: ZoneType;
  status: ZoneStatus;
  reportsToMonitoring: boolean;
}

export interface PanelPowerFinding {
  code:
    | 'standby_battery_short'
    | 'standby_battery_unknown'
    | 'standby_battery_old'
    | 'standby_battery_age_unknown'
    | 'fire_single_path_unsupervised'
    | 'fire_single_path_unknown'
    | 'fire_phone_line_only';
  severity: Severity;
  field: keyof PanelPowerInput | null;
  clause: string;
  evidence: Evidence;
  message: string;
  lifeSafety: boolean;
}

/** True when the panel carries a fire or CO device (by device type or zone type) that is still programmed. */
export function carriesLifeSafety(zones: readonly PanelPowerZone[]): boolean {
  return zones.some(
    (z) =>
      z.status !== 'removed' &&
      (z.zoneType === 'fire_24h' || z.zoneType === 'co_24h' || FIRE_DEVICE_TYPES.includes(z.deviceType) || CO_DEVICE_TYPES.includes(z.deviceType)),
  );
}

/** The duty a panel is sized for: fire (household or commercial) when it carries fire or CO devices, else intrusion. */
export function standbyDutyOf(occupancy: PanelOccupancy, zones: readonly PanelPowerZone[]): StandbyDuty {
  if (!carriesLifeSafety(zones)) return 'intrusion';
  return occupancy === 'commercial' ? 'commercial_fire' : 'household_fire';
}

export interface StandbyCalculation {
  duty: StandbyDuty;
  /** standby current × standby hours, in mAh */
  standbyMah: number;
  /** alarm current × alarm minutes ÷ 60, in mAh */
  alarmMah: number;
  /** (standby + alarm) ÷ 1000, in Ah, before the margin */
  neededAh: number;
  /** needed × (1 + margin), in Ah: the battery to fit at least */
  requiredAh: number;
}

/** Rounds to 3 decimals, for amp-hours people read. */
function round3(value: number): number {
  return Math.round(value * 1000) / 1000;
}

/**
 * The standby battery a panel needs: (standby mA × standby h + alarm mA × alarm min ÷ 60) ÷ 1000
 * Ah, then the safety margin. Throws RangeError on a negative current.
 */
export function requiredStandbyAh(duty: StandbyDuty, standbyCurrentMa: number, alarmCurrentMa: number, margin = STANDBY_SAFETY_MARGIN): StandbyCalculation {
  if (!(standbyCurrentMa >= 0) || !(alarmCurrentMa >= 0)) throw new RangeError('Currents cannot be negative.');
  const req = STANDBY_REQUIREMENTS[duty];
  const standbyMah = standbyCurrentMa * req.standbyHours;
  const alarmMah = (alarmCurrentMa * req.alarmMinutes) / 60;
  const neededAh = (standbyMah + alarmMah) / 1000;
  return { duty, standbyMah: round3(standbyMah), alarmMah: round3(alarmMah), neededAh: round3(neededAh), requiredAh: round3(neededAh * (1 + margin)) };
}

/** The battery's replacement date: its label date plus 5 years. */
export function standbyBatteryDueOn(manufacturedOn: string): string {
  return addYearsToDate(manufacturedOn, SEALED_LEAD_ACID_LIFE_YEARS);
}

/** NFPA 72-2013: a single communications path must report its own failure within 5 minutes — references.md 3.13 (PUBLIC). */
export const SINGLE_PATH_FAILURE_REPORT_MAX_MIN = 5;

// references.md 3.13 (PUBLIC) for the 5 min; the sub-clause number is from memory
const SINGLE_PATH_CLAUSE = 'NFPA 72-2013 §26.6.3, one communications technology: a failure of the path is annunciated at the supervising station within 5 min (sub-clause number from memory)';

/** Standby battery: sized and dated. Findings are Fix/Check for fire panels and notes for intrusion panels. */
function standbyFindings(panel: PanelPowerInput, zones: readonly PanelPowerZone[], today: string): PanelPowerFinding[] {
  const duty = standbyDutyOf(panel.occupancy, zones);
  const req = STANDBY_REQUIREMENTS[duty];
  const fire = duty !== 'intrusion';
  const findings: PanelPowerFinding[] = [];
  if (panel.standbyCurrentMa === null || panel.alarmCurrentMa === null || panel.batteryAh === null) {
    findings.push({
      code: 'standby_battery_unknown',
      severity: fire ? 'warning' : 'info',
      field: panel.standbyCurrentMa === null ? 'standbyCurrentMa' : panel.alarmCurrentMa === null ? 'alarmCurrentMa' : 'batteryAh',
      clause: req.clause,
      evidence: req.evidence,
      message: `Record the panel's standby and alarm currents and the fitted battery's amp-hours, so Mullion can check it runs ${req.standbyHours} h on battery and then ${req.alarmMinutes} min in alarm (${req.label}).`,
      lifeSafety: fire,
    });
  } else {
    const calc = requiredStandbyAh(duty, panel.standbyCurrentMa, panel.alarmCurrentMa);
    if (panel.batteryAh < calc.requiredAh) {
      findings.push({
        code: 'standby_battery_short',
        severity: fire ? 'error' : 'warning',
        field: 'batteryAh',
        clause: req.clause,
        evidence: req.evidence,
        message: `The ${panel.batteryAh} Ah battery is too small: ${panel.standbyCurrentMa} mA for ${req.standbyHours} h and ${panel.alarmCurrentMa} mA for ${req.alarmMinutes} min need ${calc.neededAh} Ah, ${calc.requiredAh} Ah with 20% headroom. Fit a battery of at least ${calc.requiredAh} Ah or lower the standby load.`,
        lifeSafety: fire,
      });
    }
  }
  if (panel.batteryManufacturedOn === null) {
    findings.push({
      code: 'standby_battery_age_unknown',
      severity: fire ? 'warning' : 'info',
      field: 'batteryManufacturedOn',
      clause: `Sealed lead-acid batteries: replace about ${SEALED_LEAD_ACID_LIFE_YEARS} years after manufacture — NFPA 72 Chapter 14 (from memory); common practice`,
      evidence: 'memory',
      message: 'Record the date on the standby battery’s label: without it Mullion cannot tell when the battery is due.',
      lifeSafety: fire,
    });
  } else {
    const due = standbyBatteryDueOn(panel.batteryManufacturedOn);
    if (isOnOrBefore(due, today)) {
      findings.push({
        code: 'standby_battery_old',
        severity: fire ? 'error' : 'warning',
        field: 'batteryManufacturedOn',
        clause: `Sealed lead-acid batteries: replace about ${SEALED_LEAD_ACID_LIFE_YEARS} years after manufacture — NFPA 72 Chapter 14 (from memory); common practice`,
        evidence: 'memory',
        message: `The standby battery was made on ${panel.batteryManufacturedOn} and was due for replacement on ${due}. Replace it.`,
        lifeSafety: fire,
      });
    }
  }
  return findings;
}

/** A panel that reports fire or CO to the monitoring center over one path must learn of that path's failure within 5 min. */
function commPathFindings(panel: PanelPowerInput, zones: readonly PanelPowerZone[]): PanelPowerFinding[] {
  const reportsFire = zones.some(
    (z) =>
      z.status !== 'removed' &&
      z.reportsToMonitoring &&
      (z.zoneType === 'fire_24h' || z.zoneType === 'co_24h' || FIRE_DEVICE_TYPES.includes(z.deviceType) || CO_DEVICE_TYPES.includes(z.deviceType)),
  );
  if (!reportsFire || panel.commPath === 'combination') return [];
  if (panel.commPath === 'phone_line') {
    return [
      {
        code: 'fire_phone_line_only',
        severity: 'error',
        field: 'commPath',
        clause: `${SINGLE_PATH_CLAUSE}; a digital communicator needs a second path (NFPA 72 §26.6.4, from memory)`,
        evidence: 'public',
        message: 'This panel reports fire over a single phone line, which cannot tell the monitoring center when the line itself is cut. Add a cellular or IP path (a combination).',
        lifeSafety: true,
      },
    ];
  }
  if (panel.pathFailureReportMin === null) {
    return [
      {
        code: 'fire_single_path_unknown',
        severity: 'warning',
        field: 'pathFailureReportMin',
        clause: SINGLE_PATH_CLAUSE,
        evidence: 'public',
        message: `This panel reports fire over one path (${panel.commPath === 'ip' ? 'internet' : 'cellular'}). Record how soon the monitoring center learns that the path has failed: NFPA 72 allows at most ${SINGLE_PATH_FAILURE_REPORT_MAX_MIN} minutes.`,
        lifeSafety: true,
      },
    ];
  }
  if (panel.pathFailureReportMin > SINGLE_PATH_FAILURE_REPORT_MAX_MIN) {
    return [
      {
        code: 'fire_single_path_unsupervised',
        severity: 'error',
        field: 'pathFailureReportMin',
        clause: SINGLE_PATH_CLAUSE,
        evidence: 'public',
        message: `This panel reports fire over one path whose failure reaches the monitoring center after ${panel.pathFailureReportMin} minutes; NFPA 72 allows at most ${SINGLE_PATH_FAILURE_REPORT_MAX_MIN}. Shorten the supervision interval or add a second path.`,
        lifeSafety: true,
      },
    ];
  }
  return [];
}

/** Every standby-battery and communication-path finding for a panel on `today`. */
export function panelPowerFindings(panel: PanelPowerInput, zones: readonly PanelPowerZone[], today: string): PanelPowerFinding[] {
  return [...standbyFindings(panel, zones, today), ...commPathFindings(panel, zones)];
}
