/**
 * Device life (product.md, "Upkeep"): when a zone's battery is due, when a smoke or CO alarm
 * reaches end of life, and whether that is ok, soon or due. Dates are 'YYYY-MM-DD' calendar
 * dates (UTC arithmetic, no time zones); the caller passes today's date in the firm's zone.
 */
import { type DeviceType, type ZoneStatus } from './devices';

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
 * Average current drawn by each device type, in microamps: our usage model (supervision check-ins,
 * typical daily activations). Common practice, no published source; a firm can override each value.
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
  smokeEndOfLifeYears: number;
  coEndOfLifeYears: number;
  soonDays: number;
}

/** Settings a firm starts with. */
export const DEFAULT_UPKEEP_SETTINGS: Readonly<UpkeepSettings> = {
  averageCurrentMicroAmps: {}, // empty: DEFAULT_AVERAGE_CURRENT_UA applies
  batteryYearsOverride: {},
  // NFPA 72: a smoke alarm stays in service no more than 10 years from date of manufacture
  // (references.md 4.4, PUBLIC).
  smokeEndOfLifeYears: 10,
  // CO alarms: per the manufacturer, typically 5–10 years; no fixed code value
  // (references.md 4.18, MEMORY). 7 years is our default and a firm setting.
  coEndOfLifeYears: 7,
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
    smokeEndOfLifeYears: given.smokeEndOfLifeYears ?? DEFAULT_UPKEEP_SETTINGS.smokeEndOfLifeYears,
    coEndOfLifeYears: given.coEndOfLifeYears ?? DEFAULT_UPKEEP_SETTINGS.coEndOfLifeYears,
    soonDays: given.soonDays ?? DEFAULT_UPKEEP_SETTINGS.soonDays,
  };
}

/** The average current for a device type: the firm's value, else our usage model; null when neither. */
export function averageCurrentFor(deviceType: DeviceType, settings: UpkeepSettings): number | null {
  return settings.averageCurrentMicroAmps[deviceType] ?? DEFAULT_AVERAGE_CURRENT_UA[deviceType];
}

/**
 * Expected battery life in years for a device type and battery type: a fixed-life battery's own
 * life, else the firm's override for the device type, else capacity ÷ average current (at most
 * MAX_COMPUTED_BATTERY_LIFE_YEARS). Null when there is no battery type or nothing to go on.
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
  return Math.min(batteryLifeYears(capacity, current), MAX_COMPUTED_BATTERY_LIFE_YEARS);
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

export type DeviceLifeState = 'ok' | 'soon' | 'due';

/** When a zone's battery is due, when the device reaches end of life, and the state of the earlier. */
export interface DeviceLife {
  batteryDueOn: string | null;
  endOfLifeOn: string | null;
  state: DeviceLifeState;
}

/** Battery due: last change (or install) plus the expected battery life; null when either is unknown. */
function batteryDueOn(zone: DeviceLifeZone, settings: UpkeepSettings): string | null {
  const since = zone.batteryChangedOn ?? zone.installedOn;
  const years = expectedBatteryYears(zone.deviceType, zone.batteryType, settings);
  return since === null || years === null ? null : addYearsToDate(since, years);
}

/**
 * Years from manufacture to end of life for a device type; null for devices without one. Heat
 * alarms follow the smoke alarm period as firm practice (they are replaced with the smoke alarms
 * beside them); NFPA 72 row 4.4 itself speaks of smoke alarms only.
 */
function endOfLifeYears(deviceType: DeviceType, settings: UpkeepSettings): number | null {
  if (deviceType === 'smoke' || deviceType === 'heat') return settings.smokeEndOfLifeYears;
  if (deviceType === 'co') return settings.coEndOfLifeYears;
  return null;
}

/** End of life: date of manufacture plus the device type's period; null without a manufacture date. */
function endOfLifeOn(zone: DeviceLifeZone, settings: UpkeepSettings): string | null {
  const years = endOfLifeYears(zone.deviceType, settings);
  return zone.manufacturedOn === null || years === null ? null : addYearsToDate(zone.manufacturedOn, years);
}

/** 'due' when a date is today or past, 'soon' when one falls within soonDays, else 'ok'. */
export function lifeState(dates: readonly (string | null)[], today: string, soonDays: number): DeviceLifeState {
  const known = dates.filter((date): date is string => date !== null);
  if (known.some((date) => isOnOrBefore(date, today))) return 'due';
  const horizon = addDaysToDate(today, soonDays);
  if (known.some((date) => isOnOrBefore(date, horizon))) return 'soon';
  return 'ok';
}

/** A zone's battery due date, end-of-life date and state on `today`; a removed zone is 'ok' with no dates. */
export function deviceLife(zone: DeviceLifeZone, settings: UpkeepSettings, today: string): DeviceLife {
  if (zone.status === 'removed') return { batteryDueOn: null, endOfLifeOn: null, state: 'ok' };
  const battery = batteryDueOn(zone, settings);
  const endOfLife = endOfLifeOn(zone, settings);
  return { batteryDueOn: battery, endOfLifeOn: endOfLife, state: lifeState([battery, endOfLife], today, settings.soonDays) };
}
