/**
 * Device life (product.md, "Upkeep"): when a zone's battery is due, when a smoke, heat or CO
 * device reaches end of life, and whether that is ok, soon, due, or to be checked because a date
 * is missing. An unknown date is never "ok": without the manufacture date on its label a
 * life-safety device is judged by the latest end of life its installation allows, and says so.
 * Dates are 'YYYY-MM-DD' calendar dates (UTC arithmetic, no time zones); the caller passes
 * today's date in the firm's zone.
 */
import { LIFE_SAFETY_DEVICE_TYPES, type DeviceType, type ZoneStatus } from './devices';

// ---------------------------------------------------------------------------------------------
// Batteries
// ---------------------------------------------------------------------------------------------

/**
 * Typical capacity by battery type (the keys of BATTERY_TYPES in devices.ts). The three coin and
 * photo cells come from references.md section 6; the rest are common practice, no published source.
 */
export const BATTERY_CAPACITY_MAH: Readonly<Record<string, number>> = {
  CR2032: 225, // references.md 6.4 (PUBLIC): typical capacity 225 mAh
  CR2450: 620, // references.md 6.7 (PUBLIC): typical capacity 620 mAh
  CR123A: 1500, // references.md 6.11 (PUBLIC): 1400–1550 mAh, 1500 nominal
  CR2: 800, // common practice, no published source
  'AA lithium': 3000, // common practice, no published source
  'AAA alkaline': 1100, // common practice, no published source
  '9V lithium': 1200, // common practice, no published source
};

/**
 * Battery types whose life is fixed rather than worked out from capacity: a sealed 10-year smoke
 * alarm battery runs the alarm for at least 10 years (NFPA 72-2002 §11.6.1, references.md 4.8, PUBLIC).
 * In a life-safety device the sealed battery is never changed: it lasts the alarm's life, so such a
 * device has no battery date, only its end of life.
 */
export const FIXED_BATTERY_LIFE_YEARS: Readonly<Record<string, number>> = {
  'sealed 10-year': 10,
};

/**
 * The longest battery life we forecast from capacity: lithium cells lose charge on the shelf, so a
 * big cell on a frugal device is still changed within 10 years. Common practice, no published source.
 */
export const MAX_COMPUTED_BATTERY_LIFE_YEARS = 10;

/** Hours in a Julian year (365.25 days × 24 h), the year used for battery life. */
export const HOURS_PER_YEAR = 8766;

/**
 * Average current drawn by each device type, in microamps: our usage model. The years in the
 * comments are at the nominal capacity; forecasts use the usable share (0.8 by default), so a
 * door contact on a CR2032 is forecast about 4.1 years, not 5.1. The model covers supervision check-ins and
 * typical daily activations. Common practice, no published source; a firm can override each value.
 * Null where we do not forecast a battery by default: keypads and sirens are usually powered from
 * the panel or mains with a rechargeable backup, and "other" devices have no known usage.
 */
export const DEFAULT_AVERAGE_CURRENT_UA: Readonly<Record<DeviceType, number | null>> = {
  door_contact: 5, // CR2032 → about 5.1 years
  window_contact: 5,
  sliding_door_contact: 5,
  garage_door_tilt: 8, // a tilt sensor's switch and longer radio path: CR2032 → about 3.2 years
  motion: 30, // passive infrared sensor always on: CR123A → about 5.7 years
  glass_break: 40, // microphone always listening: CR123A → about 4.3 years
  smoke: 40, // wireless transmitter plus the sensing chamber: CR123A → about 4.3 years
  smoke_detector: 40,
  smoke_co: 55, // two sensors and one transmitter
  heat: 30,
  co: 40,
  water: 15, // CR2450 → about 4.7 years
  temperature: 15,
  panic_button: 4, // sleeps until pressed, plus check-ins: CR2032 → about 6.4 years
  keyfob: 5, // CR2032 → about 5.1 years
  keypad: null,
  siren: null,
  other: null,
};

/** Battery life in years from capacity (mAh) and average current (µA): hours = mAh × 1000 ÷ µA, years = hours ÷ 8766. */
export function batteryLifeYears(capacityMah: number, averageCurrentMicroAmps: number): number {
  if (!(averageCurrentMicroAmps > 0)) throw new RangeError('Average current must be above 0 µA.');
  const hours = (capacityMah * 1000) / averageCurrentMicroAmps;
  return hours / HOURS_PER_YEAR;
}

/** A battery type as typed ("cr2032 ", "aa  Lithium") matched to a known key; null when unknown. */
function knownBatteryKey(batteryType: string, table: Readonly<Record<string, number>>): string | null {
  const wanted = batteryType.trim().replace(/\s+/g, ' ').toLowerCase();
  return Object.keys(table).find((key) => key.toLowerCase() === wanted) ?? null;
}

/** Typical capacity of a battery type in mAh (case and spacing ignored); null for an unknown type. */
export function batteryCapacityFor(batteryType: string): number | null {
  const key = knownBatteryKey(batteryType, BATTERY_CAPACITY_MAH);
  return key === null ? null : (BATTERY_CAPACITY_MAH[key] ?? null);
}

// ---------------------------------------------------------------------------------------------
// Firm settings
// ---------------------------------------------------------------------------------------------

/** A firm's upkeep settings: overrides of the usage model and the end-of-life periods. */
export interface UpkeepSettings {
  averageCurrentMicroAmps: Partial<Record<DeviceType, number>>;
  batteryYearsOverride: Partial<Record<DeviceType, number>>;
  /** household smoke alarms (UL 217), years from manufacture */
  smokeEndOfLifeYears: number;
  /** system smoke detectors (UL 268), years from manufacture: the firm's own period */
  smokeDetectorEndOfLifeYears: number;
  /** heat alarms and detectors, years from manufacture: the firm's own period */
  heatEndOfLifeYears: number;
  /** CO alarms (UL 2034), years from manufacture */
  coEndOfLifeYears: number;
  /** the share of a battery's nominal capacity a device can really use (0.5–1) */
  usableCapacityFraction: number;
  soonDays: number;
}

/** The most NFPA 72 allows for a household smoke alarm: 10 years from manufacture (references.md 4.4, PUBLIC). */
export const SMOKE_ALARM_MAX_YEARS = 10;

/** Settings a firm starts with. */
export const DEFAULT_UPKEEP_SETTINGS: Readonly<UpkeepSettings> = {
  averageCurrentMicroAmps: {}, // empty: DEFAULT_AVERAGE_CURRENT_UA applies
  batteryYearsOverride: {},
  // NFPA 72 (2007 §10.4.7; 2016/2019 §14.4.7.1): a household smoke alarm (UL 217) stays in service
  // no more than 10 years from the date of manufacture (references.md 4.4, PUBLIC).
  smokeEndOfLifeYears: SMOKE_ALARM_MAX_YEARS,
  // The 10-year rule speaks of smoke alarms, not system smoke detectors (UL 268), which NFPA 72
  // keeps in service by sensitivity testing. Replacing them at 10 years is common practice, no
  // published source; the firm sets its own period.
  smokeDetectorEndOfLifeYears: 10,
  // Heat alarms and detectors: no fixed code period; 10 years is common practice, no published
  // source, and a firm setting.
  heatEndOfLifeYears: 10,
  // CO alarms: per the manufacturer, typically 5–10 years; no fixed code value
  // (references.md 4.18, MEMORY). 7 years is our default and a firm setting.
  coEndOfLifeYears: 7,
  // A device stops working before its cell is empty (cut-off voltage, cold, self-discharge, the
  // current peaks of each radio transmission), so the forecast uses 80% of the nominal capacity:
  // common practice, no published source; a firm setting.
  usableCapacityFraction: 0.8,
  soonDays: 90,
};

/** Copies the defined entries of a per-device-type map over a base map. */
function mergeByDeviceType(
  base: Partial<Record<DeviceType, number>>,
  changes: Partial<Record<DeviceType, number>> | undefined,
): Partial<Record<DeviceType, number>> {
  const merged = { ...base };
  for (const [type, value] of Object.entries(changes ?? {}) as [DeviceType, number | undefined][]) {
    if (value !== undefined) merged[type] = value;
  }
  return merged;
}

/** A firm's saved (partial) settings over the defaults; undefined values keep the default. */
export function mergeUpkeepSettings(partial: Partial<UpkeepSettings> | null | undefined): UpkeepSettings {
  const given = partial ?? {};
  return {
    averageCurrentMicroAmps: mergeByDeviceType(DEFAULT_UPKEEP_SETTINGS.averageCurrentMicroAmps, given.averageCurrentMicroAmps),
    batteryYearsOverride: mergeByDeviceType(DEFAULT_UPKEEP_SETTINGS.batteryYearsOverride, given.batteryYearsOverride),
    smokeEndOfLifeYears: Math.min(given.smokeEndOfLifeYears ?? DEFAULT_UPKEEP_SETTINGS.smokeEndOfLifeYears, SMOKE_ALARM_MAX_YEARS),
    smokeDetectorEndOfLifeYears: given.smokeDetectorEndOfLifeYears ?? DEFAULT_UPKEEP_SETTINGS.smokeDetectorEndOfLifeYears,
    heatEndOfLifeYears: given.heatEndOfLifeYears ?? DEFAULT_UPKEEP_SETTINGS.heatEndOfLifeYears,
    coEndOfLifeYears: given.coEndOfLifeYears ?? DEFAULT_UPKEEP_SETTINGS.coEndOfLifeYears,
    usableCapacityFraction: given.usableCapacityFraction ?? DEFAULT_UPKEEP_SETTINGS.usableCapacityFraction,
    soonDays: given.soonDays ?? DEFAULT_UPKEEP_SETTINGS.soonDays,
  };
}

/** The average current for a device type: the firm's value, else our usage model; null when neither. */
export function averageCurrentFor(deviceType: DeviceType, settings: UpkeepSettings): number | null {
  return settings.averageCurrentMicroAmps[deviceType] ?? DEFAULT_AVERAGE_CURRENT_UA[deviceType];
}

/** True for a battery that is never changed (a sealed 10-year battery). */
export function isSealedBattery(batteryType: string | null): boolean {
  return batteryType !== null && knownBatteryKey(batteryType, FIXED_BATTERY_LIFE_YEARS) !== null;
}

/**
 * Expected battery life in years for a device type and battery type: a fixed-life battery's own
 * life, else the firm's override for the device type, else the usable capacity (nominal × the
 * firm's usable fraction) ÷ average current (at most MAX_COMPUTED_BATTERY_LIFE_YEARS). Null when
 * there is no battery type or nothing to go on.
 */
export function expectedBatteryYears(deviceType: DeviceType, batteryType: string | null, settings: UpkeepSettings): number | null {
  if (batteryType === null || batteryType.trim() === '') return null;
  const fixed = knownBatteryKey(batteryType, FIXED_BATTERY_LIFE_YEARS);
  if (fixed !== null) return FIXED_BATTERY_LIFE_YEARS[fixed] ?? null;
  const override = settings.batteryYearsOverride[deviceType];
  if (override !== undefined) return override > 0 ? override : null;
  const capacity = batteryCapacityFor(batteryType);
  const current = averageCurrentFor(deviceType, settings);
  if (capacity === null || current === null || !(current > 0)) return null;
  return Math.min(batteryLifeYears(capacity * settings.usableCapacityFraction, current), MAX_COMPUTED_BATTERY_LIFE_YEARS);
}

// ---------------------------------------------------------------------------------------------
// Calendar dates ('YYYY-MM-DD', UTC)
// ---------------------------------------------------------------------------------------------

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const MS_PER_DAY = 86_400_000;
const DAYS_PER_YEAR = 365.25;

/** A 'YYYY-MM-DD' string as a UTC midnight Date; throws RangeError for anything else or an impossible date. */
function parseIsoDate(date: string): Date {
  const match = ISO_DATE.exec(date);
  const parsed = match ? new Date(Date.UTC(Number(match[1]), Number(match[2]) - 1, Number(match[3]))) : null;
  if (!parsed || formatIsoDate(parsed) !== date) throw new RangeError(`Not a calendar date (YYYY-MM-DD): ${date}`);
  return parsed;
}

/** A UTC Date as 'YYYY-MM-DD'. */
function formatIsoDate(date: Date): string {
  return date.toISOString().slice(0, 10);
}

/** Whole days days after (or before, if negative) a 'YYYY-MM-DD' date. */
export function addDaysToDate(date: string, days: number): string {
  return formatIsoDate(new Date(parseIsoDate(date).getTime() + Math.round(days) * MS_PER_DAY));
}

/** The same day and month `years` later; 29 February becomes 28 February in a common year. */
function addWholeYears(date: string, years: number): string {
  const start = parseIsoDate(date);
  const year = start.getUTCFullYear() + years;
  const month = start.getUTCMonth();
  const lastDayOfMonth = new Date(Date.UTC(year, month + 1, 0)).getUTCDate();
  return formatIsoDate(new Date(Date.UTC(year, month, Math.min(start.getUTCDate(), lastDayOfMonth))));
}

/** A date plus fractional years: whole years on the calendar, the fraction as 365.25-day years rounded to whole days. */
export function addYearsToDate(date: string, years: number): string {
  const whole = Math.floor(years);
  const fractionDays = Math.round((years - whole) * DAYS_PER_YEAR);
  return addDaysToDate(addWholeYears(date, whole), fractionDays);
}

/** True when date a is on or before date b (both 'YYYY-MM-DD', which sort as text). */
export function isOnOrBefore(a: string, b: string): boolean {
  return a <= b;
}

// ---------------------------------------------------------------------------------------------
// A zone's device life
// ---------------------------------------------------------------------------------------------

/** What device life needs to know about a zone. */
export interface DeviceLifeZone {
  deviceType: DeviceType;
  batteryType: string | null;
  installedOn: string | null;
  batteryChangedOn: string | null;
  manufacturedOn: string | null;
  status: ZoneStatus;
}

/**
 * `ok`, `soon` (within the notice days), `due` (today or past), or `check`: a life-safety
 * device whose end of life cannot be known because the manufacture date is missing. Never `ok`
 * on an unknown date.
 */
export type DeviceLifeState = 'ok' | 'soon' | 'due' | 'check';

/**
 * Where the end-of-life date comes from: the manufacture date on the label (`manufactured`), the
 * installation date as the latest it can be (`installed`: manufacture is on or before
 * installation), or nothing (`unknown`). Null for devices without an end of life.
 */
export type EndOfLifeBasis = 'manufactured' | 'installed' | 'unknown' | null;

/** When a zone's battery is due, when the device reaches end of life, and the state of the earlier. */
export interface DeviceLife {
  batteryDueOn: string | null;
  endOfLifeOn: string | null;
  endOfLifeBasis: EndOfLifeBasis;
  state: DeviceLifeState;
  /** the forecast battery life in years, when there is one */
  batteryYears: number | null;
  /** a life-safety device whose battery forecast is under 1 year (NFPA 72 §23.16.2) */
  batteryUnderOneYear: boolean;
}

/** The least battery life a wireless life-safety device may have: 1 year (NFPA 72-2016 §23.16.2 — references.md 4.10, PUBLIC). */
export const LIFE_SAFETY_MIN_BATTERY_YEARS = 1;

/**
 * Years from manufacture to end of life for a device type, each named for what it is; null for
 * devices without one. A combination smoke and CO alarm ends with the shorter of its two parts.
 */
export function endOfLifeYearsFor(deviceType: DeviceType, settings: UpkeepSettings): number | null {
  switch (deviceType) {
    case 'smoke':
      return Math.min(settings.smokeEndOfLifeYears, SMOKE_ALARM_MAX_YEARS);
    case 'smoke_detector':
      return settings.smokeDetectorEndOfLifeYears;
    case 'heat':
      return settings.heatEndOfLifeYears;
    case 'co':
      return settings.coEndOfLifeYears;
    case 'smoke_co':
      return Math.min(settings.smokeEndOfLifeYears, SMOKE_ALARM_MAX_YEARS, settings.coEndOfLifeYears);
    default:
      return null;
  }
}

/** End of life and where it comes from: manufacture + period; else installation + period (the latest it can be); else unknown. */
function endOfLifeOf(zone: DeviceLifeZone, settings: UpkeepSettings): { on: string | null; basis: EndOfLifeBasis } {
  const years = endOfLifeYearsFor(zone.deviceType, settings);
  if (years === null) return { on: null, basis: null };
  if (zone.manufacturedOn !== null) return { on: addYearsToDate(zone.manufacturedOn, years), basis: 'manufactured' };
  if (zone.installedOn !== null) return { on: addYearsToDate(zone.installedOn, years), basis: 'installed' };
  return { on: null, basis: 'unknown' };
}

/** 'due' when a date is today or past, 'soon' when one falls within soonDays, else 'ok'. */
export function lifeState(dates: readonly (string | null)[], today: string, soonDays: number): 'ok' | 'soon' | 'due' {
  const known = dates.filter((date): date is string => date !== null);
  if (known.some((date) => isOnOrBefore(date, today))) return 'due';
  const horizon = addDaysToDate(today, soonDays);
  if (known.some((date) => isOnOrBefore(date, horizon))) return 'soon';
  return 'ok';
}

/**
 * A zone's battery due date, end-of-life date and state on `today`; a removed zone is 'ok' with no
 * dates. A sealed battery in a life-safety device gets no battery date: the alarm's end of life
 * covers it. Without the manufacture date, a life-safety device is `due` when even the latest end
 * of life (installation + period) has passed, `soon` when it is near, and otherwise `check`.
 */
export function deviceLife(zone: DeviceLifeZone, settings: UpkeepSettings, today: string): DeviceLife {
  if (zone.status === 'removed') return { batteryDueOn: null, endOfLifeOn: null, endOfLifeBasis: null, state: 'ok', batteryYears: null, batteryUnderOneYear: false };
  const lifeSafety = LIFE_SAFETY_DEVICE_TYPES.includes(zone.deviceType);
  const sealedForLife = lifeSafety && isSealedBattery(zone.batteryType);
  const years = sealedForLife ? null : expectedBatteryYears(zone.deviceType, zone.batteryType, settings);
  const since = zone.batteryChangedOn ?? zone.installedOn;
  const battery = since === null || years === null ? null : addYearsToDate(since, years);
  const endOfLife = endOfLifeOf(zone, settings);
  let state: DeviceLifeState = lifeState([battery, endOfLife.on], today, settings.soonDays);
  if (state === 'ok' && (endOfLife.basis === 'installed' || endOfLife.basis === 'unknown')) state = 'check';
  return {
    batteryDueOn: battery,
    endOfLifeOn: endOfLife.on,
    endOfLifeBasis: endOfLife.basis,
    state,
    batteryYears: years,
    batteryUnderOneYear: lifeSafety && years !== null && years < LIFE_SAFETY_MIN_BATTERY_YEARS,
  };
}
