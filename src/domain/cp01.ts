/**
 * ANSI/SIA CP-01 audit of a panel's false-alarm-reduction settings (2010+ edition, clause numbers
 * as references.md section 1 gives them). A value outside a range backed by public text is an
 * error; a rule known only from memory is a warning whose message says "(from memory)".
 */
import { CO_DEVICE_TYPES, FIRE_DEVICE_TYPES, ZONE_TYPE_LABELS, type DeviceType, type ZoneStatus, type ZoneType } from './devices';
import { lifeSafetyZoneTypesFor, sensesOf } from './life-safety-zone';

/** The false-alarm-reduction settings kept per panel. */
export interface PanelSettings {
  exitDelaySec: number;
  entryDelaySec: number;
  entryDelay2Sec: number;
  abortWindowSec: number;
  swingerLimit: number;
  cancelWindowMin: number;
  exitRestart: boolean;
  autoStay: boolean;
  crossZoning: boolean;
  crossZoneWindowSec: number;
  duress: boolean;
}

/** The settings a new panel starts with: CP-01 defaults (references.md rows in the comments). */
export const CP01_DEFAULTS: Readonly<PanelSettings> = {
  exitDelaySec: 60, // §4.2.2.1 — references.md 1.3 (MEMORY)
  entryDelaySec: 30, // §4.2.3.1 — references.md 1.10 (MEMORY)
  entryDelay2Sec: 30, // second entry delay: same default as the first
  abortWindowSec: 30, // §4.2.5.1 — references.md 1.12 (PUBLIC)
  swingerLimit: 2, // 2010+ — references.md 1.19 (PUBLIC)
  cancelWindowMin: 5, // references.md 1.17 (MEMORY)
  exitRestart: true, // §4.2.2.3 — references.md 1.6 (default enabled: MEMORY)
  autoStay: true, // §4.2.2.5 — references.md 1.8 (MEMORY)
  crossZoning: false, // references.md 1.21 (MEMORY)
  crossZoneWindowSec: 60, // our own default, not a value from the standard
  duress: false, // optional feature — references.md 1.22 (MEMORY)
};

/** An allowed range; max null means no upper bound. */
export interface Cp01Range {
  min: number;
  max: number | null;
  unit: 's' | 'min' | 'trips';
}

/** The CP-01 ranges the audit checks, for forms to show beside each field. */
export const CP01_RANGES = {
  exitDelaySec: { min: 45, max: 255, unit: 's' }, // 45: 1.1 PUBLIC; 255: 1.2 MEMORY
  entryDelaySec: { min: 30, max: 240, unit: 's' }, // 1.9 MEMORY
  entryDelay2Sec: { min: 30, max: 240, unit: 's' }, // 1.9 MEMORY
  abortWindowSec: { min: 0, max: 45, unit: 's' }, // 0: 1.13 PUBLIC (2010+); 45: 1.11 PUBLIC
  swingerLimit: { min: 1, max: 6, unit: 'trips' }, // 1.18 PUBLIC
  cancelWindowMin: { min: 5, max: null, unit: 'min' }, // 1.17 MEMORY
} as const satisfies Partial<Record<keyof PanelSettings, Cp01Range>>;

/** Entry delay plus abort window, at most (references.md 1.15, MEMORY). */
export const CP01_ENTRY_PLUS_ABORT_MAX_SEC = 60;

/** One thing the audit found about a panel's settings. */
export interface Cp01Finding {
  code: string;
  severity: 'error' | 'warning' | 'info';
  field: keyof PanelSettings | null;
  clause: string;
  evidence: 'public' | 'memory';
  message: string;
}

/**
 * The zones the audit looks at: their zone type and status, and the device type, so a smoke
 * alarm on a burglary zone is found even though the zone type says nothing of fire.
 */
export interface Cp01Zone {
  zoneType: ZoneType;
  status: ZoneStatus;
  deviceType?: DeviceType;
  number?: number;
  description?: string;
}

const FROM_MEMORY = '(from memory)';

/** Exit delay: below 45 s is an error (§4.2.2.1, public); above 255 s a warning (from memory). */
function exitDelayFindings(settings: PanelSettings): Cp01Finding[] {
  const { min, max } = CP01_RANGES.exitDelaySec;
  const value = settings.exitDelaySec;
  const clause = 'CP-01 §4.2.2.1 exit time';
  if (value < min) {
    return [
      {
        code: 'exit_delay_too_short',
        severity: 'error',
        field: 'exitDelaySec',
        clause,
        evidence: 'public',
        message: `Exit delay is ${value} s; CP-01 asks for at least ${min} s. Set it to ${min} s or more (${CP01_DEFAULTS.exitDelaySec} s is the usual default).`,
      },
    ];
  }
  if (value > max) {
    return [
      {
        code: 'exit_delay_too_long',
        severity: 'warning',
        field: 'exitDelaySec',
        clause,
        evidence: 'memory',
        message: `Exit delay is ${value} s; CP-01 allows up to ${max} s ${FROM_MEMORY}. Set it to ${max} s or less.`,
      },
    ];
  }
  return [];
}

/** One entry delay outside 30 s – 4 min: a warning (§4.2.3.1, from memory). */
function entryDelayFindings(settings: PanelSettings, field: 'entryDelaySec' | 'entryDelay2Sec'): Cp01Finding[] {
  const { min, max } = CP01_RANGES[field];
  const value = settings[field];
  if (value >= min && value <= max) return [];
  const name = field === 'entryDelaySec' ? 'Entry delay' : 'Second entry delay';
  const fix = value < min ? `Set it to ${min} s or more.` : `Set it to ${max} s or less.`;
  return [
    {
      code: value < min ? 'entry_delay_too_short' : 'entry_delay_too_long',
      severity: 'warning',
      field,
      clause: 'CP-01 §4.2.3.1 entry delay',
      evidence: 'memory',
      message: `${name} is ${value} s; CP-01 allows ${min} s to 4 minutes ${FROM_MEMORY}. ${fix}`,
    },
  ];
}

/** Abort window outside 0–45 s: an error (§4.2.5.1, public; 0 allowed since 2010). */
function abortWindowRangeFindings(settings: PanelSettings): Cp01Finding[] {
  const { min, max } = CP01_RANGES.abortWindowSec;
  const value = settings.abortWindowSec;
  if (value >= min && value <= max) return [];
  return [
    {
      code: 'abort_window_out_of_range',
      severity: 'error',
      field: 'abortWindowSec',
      clause: 'CP-01 §4.2.5.1 abort window',
      evidence: 'public',
      message: `Abort window is ${value} s; CP-01 allows ${min} to ${max} s. Set it within that range (${CP01_DEFAULTS.abortWindowSec} s is the default).`,
    },
  ];
}

/** An abort window of 0 s is allowed since 2010 but sends every burglary alarm at once: a note. */
function noAbortWindowFindings(settings: PanelSettings): Cp01Finding[] {
  if (settings.abortWindowSec !== 0) return [];
  return [
    {
      code: 'abort_window_off',
      severity: 'info',
      field: 'abortWindowSec',
      clause: 'CP-01-2010 §4.2.5.1 abort window',
      evidence: 'public',
      message: `There is no abort window, so a burglary alarm is sent the moment it happens. CP-01 allows this since 2010; the default is ${CP01_DEFAULTS.abortWindowSec} s.`,
    },
  ];
}

/** Zones still programmed on the panel (a bypassed zone is still programmed; a removed one is not). */
function programmed(zones: readonly Cp01Zone[]): Cp01Zone[] {
  return zones.filter((zone) => zone.status !== 'removed');
}

/** A fire zone by its zone type, or a fire device (smoke or heat) whatever its zone type. */
function isFire(zone: Cp01Zone): boolean {
  return zone.zoneType === 'fire_24h' || (zone.deviceType !== undefined && FIRE_DEVICE_TYPES.includes(zone.deviceType));
}

/** A CO zone by its zone type, or a CO device whatever its zone type. */
function isCo(zone: Cp01Zone): boolean {
  return zone.zoneType === 'co_24h' || (zone.deviceType !== undefined && CO_DEVICE_TYPES.includes(zone.deviceType));
}

/** "1 fire zone", "3 fire zones". */
function counted(n: number, what: string): string {
  return `${n} ${what}${n === 1 ? '' : 's'}`;
}

/**
 * An abort window on a panel with fire or CO devices: fire must report with no abort delay
 * (§4.2.5.1, public). CP-01 names fire; for CO Mullion asks the same (from memory).
 */
function fireZoneAbortFindings(settings: PanelSettings, zones: readonly Cp01Zone[]): Cp01Finding[] {
  const live = programmed(zones);
  const fire = live.filter(isFire).length;
  const co = live.filter((z) => isCo(z) && !isFire(z)).length;
  if (fire + co === 0 || settings.abortWindowSec <= 0) return [];
  const what = [fire > 0 ? counted(fire, 'fire zone') : '', co > 0 ? counted(co, 'CO zone') : ''].filter(Boolean).join(' and ');
  const coNote = co > 0 ? ` CP-01 names fire zones; Mullion holds CO zones to the same ${FROM_MEMORY}.` : '';
  return [
    {
      code: 'abort_window_on_fire_zones',
      severity: 'warning',
      field: 'abortWindowSec',
      clause: 'CP-01 §4.2.5.1 abort window (fire zones exempt)',
      evidence: fire > 0 ? 'public' : 'memory',
      message: `This panel has ${what} and a ${settings.abortWindowSec} s abort window. Check that they report at once: CP-01 exempts fire from any abort window.${coNote}`,
    },
  ];
}

/**
 * A smoke, heat or CO device on a zone type the panel treats as burglary or chime: the abort
 * window and swinger shutdown apply to it, which CP-01 forbids for fire (§4.2.5.1, public;
 * §4.3.2 swinger shutdown, from memory). One finding per zone, naming it and what to change.
 */
function lifeSafetyDeviceZoneFindings(settings: PanelSettings, zones: readonly Cp01Zone[]): Cp01Finding[] {
  const findings: Cp01Finding[] = [];
  for (const zone of programmed(zones)) {
    if (zone.deviceType === undefined || sensesOf(zone.deviceType).length === 0) continue;
    const allowed = lifeSafetyZoneTypesFor(zone.deviceType);
    if (allowed.includes(zone.zoneType)) continue;
    const name = zone.number !== undefined ? `Zone ${zone.number}${zone.description ? ` “${zone.description}”` : ''}` : 'A zone';
    const wanted = allowed.map((t) => ZONE_TYPE_LABELS[t]).join(' or ');
    const applies = zone.zoneType === 'monitor_only' ? 'it never raises an alarm at all' : `the ${settings.abortWindowSec} s abort window and swinger shutdown after ${settings.swingerLimit} trips apply to it`;
    findings.push({
      code: 'life_safety_device_on_wrong_zone',
      severity: 'error',
      field: null,
      clause: 'CP-01 §4.2.5.1 abort window and §4.3.2 swinger shutdown (fire exempt)',
      // CP-01's text names fire; holding a CO alarm to the same is from memory
      evidence: zone.deviceType === 'co' ? 'memory' : 'public',
      message: `${name} is a ${zone.deviceType === 'co' ? 'CO' : zone.deviceType === 'smoke_co' ? 'smoke and CO' : 'fire'} device on a “${ZONE_TYPE_LABELS[zone.zoneType]}” zone, so ${applies}. Set its zone type to ${wanted}. CP-01 exempts fire from swinger shutdown ${FROM_MEMORY}.`,
    });
  }
  return findings;
}

/** Swinger limit outside 1–6 trips: an error (2010+, public). */
function swingerLimitFindings(settings: PanelSettings): Cp01Finding[] {
  const { min, max } = CP01_RANGES.swingerLimit;
  const value = settings.swingerLimit;
  if (value >= min && value <= max) return [];
  return [
    {
      code: 'swinger_limit_out_of_range',
      severity: 'error',
      field: 'swingerLimit',
      clause: 'CP-01-2010 §4.3 swinger shutdown',
      evidence: 'public',
      message: `Swinger limit is ${value} trips; CP-01 allows ${min} to ${max}. Set it within that range (${CP01_DEFAULTS.swingerLimit} is the default).`,
    },
  ];
}

/** Cancel window under 5 minutes: a warning (from memory). */
function cancelWindowFindings(settings: PanelSettings): Cp01Finding[] {
  const { min } = CP01_RANGES.cancelWindowMin;
  const value = settings.cancelWindowMin;
  if (value >= min) return [];
  return [
    {
      code: 'cancel_window_too_short',
      severity: 'warning',
      field: 'cancelWindowMin',
      clause: 'CP-01 §4.2.5 cancel window',
      evidence: 'memory',
      message: `Cancel window is ${value} min; CP-01 asks for at least ${min} min ${FROM_MEMORY}. Set it to ${min} min or more.`,
    },
  ];
}

/** Exit-time restart turned off: a warning (§4.2.2.3, required and on by default from memory). */
function exitRestartFindings(settings: PanelSettings): Cp01Finding[] {
  if (settings.exitRestart) return [];
  return [
    {
      code: 'exit_restart_off',
      severity: 'warning',
      field: 'exitRestart',
      clause: 'CP-01 §4.2.2.3 exit time restart',
      evidence: 'memory',
      message: `Exit-time restart is off; CP-01 requires it ${FROM_MEMORY}. Turn it on.`,
    },
  ];
}

/** Auto-stay on unvacated premises turned off: a warning (§4.2.2.5, from memory). */
function autoStayFindings(settings: PanelSettings): Cp01Finding[] {
  if (settings.autoStay) return [];
  return [
    {
      code: 'auto_stay_off',
      severity: 'warning',
      field: 'autoStay',
      clause: 'CP-01 §4.2.2.5 unvacated premises',
      evidence: 'memory',
      message: `Auto-stay when nobody leaves is off; CP-01 requires it ${FROM_MEMORY}. Turn it on.`,
    },
  ];
}

/** The longer of the two entry delays and its field. */
function longestEntryDelay(settings: PanelSettings): { field: 'entryDelaySec' | 'entryDelay2Sec'; value: number } {
  return settings.entryDelay2Sec > settings.entryDelaySec
    ? { field: 'entryDelay2Sec', value: settings.entryDelay2Sec }
    : { field: 'entryDelaySec', value: settings.entryDelaySec };
}

/** Longest entry delay plus abort window over 60 s: a warning (UL limit referenced by CP-01, from memory). */
function entryPlusAbortFindings(settings: PanelSettings): Cp01Finding[] {
  const entry = longestEntryDelay(settings);
  const total = entry.value + settings.abortWindowSec;
  if (total <= CP01_ENTRY_PLUS_ABORT_MAX_SEC) return [];
  const name = entry.field === 'entryDelaySec' ? 'Entry delay' : 'Second entry delay';
  return [
    {
      code: 'entry_plus_abort_too_long',
      severity: 'warning',
      field: entry.field,
      clause: 'CP-01 note to §4.2.3.1 / §4.2.5.1 (UL)',
      evidence: 'memory',
      message: `${name} (${entry.value} s) plus abort window (${settings.abortWindowSec} s) is ${total} s; the limit is ${CP01_ENTRY_PLUS_ABORT_MAX_SEC} s ${FROM_MEMORY}. Shorten one of them.`,
    },
  ];
}

/** Cross zoning on with no window could never confirm an alarm: an error of our own. */
function crossZoneWindowFindings(settings: PanelSettings): Cp01Finding[] {
  if (!settings.crossZoning || settings.crossZoneWindowSec > 0) return [];
  return [
    {
      code: 'cross_zone_window',
      severity: 'error',
      field: 'crossZoneWindowSec',
      clause: 'Mullion check; CP-01 §4.3 cross zoning',
      evidence: 'memory',
      message: `Cross zoning is on with a ${settings.crossZoneWindowSec} s window, so two zones can never trip together. Set a window above 0 s (${CP01_DEFAULTS.crossZoneWindowSec} s is our default) or turn cross zoning off. Our own check; cross zoning in CP-01 is ${FROM_MEMORY}.`,
    },
  ];
}

/** Every CP-01 finding for a panel's settings and zones, in the order of the settings; empty when all is within the standard. */
export function auditPanelSettings(settings: PanelSettings, zones: readonly Cp01Zone[]): Cp01Finding[] {
  return [
    ...exitDelayFindings(settings),
    ...entryDelayFindings(settings, 'entryDelaySec'),
    ...entryDelayFindings(settings, 'entryDelay2Sec'),
    ...entryPlusAbortFindings(settings),
    ...abortWindowRangeFindings(settings),
    ...noAbortWindowFindings(settings),
    ...fireZoneAbortFindings(settings, zones),
    ...lifeSafetyDeviceZoneFindings(settings, zones),
    ...swingerLimitFindings(settings),
    ...cancelWindowFindings(settings),
    ...exitRestartFindings(settings),
    ...autoStayFindings(settings),
    ...crossZoneWindowFindings(settings),
  ];
}
