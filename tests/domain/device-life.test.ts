/**
 * Device life: battery arithmetic, end of life of smoke, heat and CO devices, ok / soon / due /
 * check. Each rule names its source beside the check (references.md row with PUBLIC or MEMORY, or
 * "common practice, no published source"). All zones and dates are invented.
 */
import { describe, expect, it } from 'vitest';
import { BATTERY_TYPES, DEVICE_TYPES, LIFE_SAFETY_DEVICE_TYPES, isLifeSafetyDevice } from '@domain/devices';
import {
  BATTERY_CAPACITY_MAH,
  DEFAULT_AVERAGE_CURRENT_UA,
  DEFAULT_UPKEEP_SETTINGS,
  FIXED_BATTERY_LIFE_YEARS,
  HOURS_PER_YEAR,
  LIFE_SAFETY_MIN_BATTERY_YEARS,
  MAX_COMPUTED_BATTERY_LIFE_YEARS,
  SMOKE_ALARM_MAX_YEARS,
  addDaysToDate,
  addYearsToDate,
  averageCurrentFor,
  batteryCapacityFor,
  batteryLifeYears,
  deviceLife,
  endOfLifeYearsFor,
  expectedBatteryYears,
  isOnOrBefore,
  isSealedBattery,
  lifeState,
  mergeUpkeepSettings,
  type DeviceLifeZone,
} from '@domain/device-life';

const settings = mergeUpkeepSettings({});

/**
 * Usable capacity: the forecast uses 80% of a cell's nominal capacity (DEFAULT_UPKEEP_SETTINGS,
 * common practice, no published source). Worked numbers below use these.
 */
const CR2032_USABLE_MAH = 225 * 0.8; // 180 mAh
const CR123A_USABLE_MAH = 1500 * 0.8; // 1200 mAh

function zone(overrides: Partial<DeviceLifeZone>): DeviceLifeZone {
  return {
    deviceType: 'door_contact',
    batteryType: null,
    installedOn: null,
    batteryChangedOn: null,
    manufacturedOn: null,
    status: 'active',
    ...overrides,
  };
}

describe('battery capacities', () => {
  it('holds the typical capacities of references.md section 6', () => {
    // CR2032 typical capacity 225 mAh — references.md 6.4 (PUBLIC)
    expect(BATTERY_CAPACITY_MAH.CR2032).toBe(225);
    // CR2450 typical capacity 620 mAh — references.md 6.7 (PUBLIC)
    expect(BATTERY_CAPACITY_MAH.CR2450).toBe(620);
    // CR123A nominal capacity 1500 mAh — references.md 6.11 (PUBLIC)
    expect(BATTERY_CAPACITY_MAH.CR123A).toBe(1500);
  });

  it('holds the rest from trade practice', () => {
    // common practice, no published source
    expect(BATTERY_CAPACITY_MAH).toMatchObject({ CR2: 800, 'AA lithium': 3000, 'AAA alkaline': 1100, '9V lithium': 1200 });
  });

  it('knows every battery type the zone form offers', () => {
    for (const type of BATTERY_TYPES) {
      const known = batteryCapacityFor(type) !== null || FIXED_BATTERY_LIFE_YEARS[type] !== undefined;
      expect(known, type).toBe(true);
    }
  });

  it('matches a typed battery type regardless of case and spacing, and not a made-up one', () => {
    expect(batteryCapacityFor(' cr2032 ')).toBe(225);
    expect(batteryCapacityFor('aa  Lithium')).toBe(3000);
    expect(batteryCapacityFor('CR9999')).toBeNull();
  });
});

describe('batteryLifeYears', () => {
  it('works out 225 mAh at 5 µA as about 5.1 years', () => {
    // CR2032 225 mAh — references.md 6.4 (PUBLIC); 225 000 µAh ÷ 5 µA = 45 000 h ÷ 8766 h/year ≈ 5.13 (COMPUTED)
    expect(batteryLifeYears(225, 5)).toBeCloseTo(5.13, 2);
    expect(batteryLifeYears(225, 5).toFixed(1)).toBe('5.1');
  });

  it('uses the Julian year of 8766 hours', () => {
    expect(HOURS_PER_YEAR).toBe(365.25 * 24);
    expect(batteryLifeYears(8.766, 1)).toBeCloseTo(1, 10);
  });

  it('halves when the current doubles', () => {
    expect(batteryLifeYears(1500, 60)).toBeCloseTo(batteryLifeYears(1500, 30) / 2, 10);
  });

  it('refuses a current of zero or less', () => {
    expect(() => batteryLifeYears(225, 0)).toThrow(RangeError);
    expect(() => batteryLifeYears(225, -5)).toThrow(RangeError);
  });
});

describe('usage model', () => {
  it('has an average current (or null) for every device type', () => {
    // common practice, no published source
    for (const type of DEVICE_TYPES) {
      const current = DEFAULT_AVERAGE_CURRENT_UA[type];
      expect(current === null || current > 0, type).toBe(true);
    }
    expect(Object.keys(DEFAULT_AVERAGE_CURRENT_UA).sort()).toEqual([...DEVICE_TYPES].sort());
  });

  it('gives a door contact on a CR2032 about 4.1 years, from 80% of the nominal capacity', () => {
    // CR2032 225 mAh — references.md 6.4 (PUBLIC); 5 µA and the 80% usable share — common practice, no published source
    // Changed on purpose: this was 5.13 years on the full 225 mAh. Now 225 × 0.8 = 180 mAh;
    // 180 000 µAh ÷ 5 µA = 36 000 h ÷ 8766 h/year = 4.107 years.
    expect(DEFAULT_AVERAGE_CURRENT_UA.door_contact).toBe(5);
    expect(DEFAULT_UPKEEP_SETTINGS.usableCapacityFraction).toBe(0.8);
    expect(expectedBatteryYears('door_contact', 'CR2032', settings)).toBeCloseTo(4.107, 3);
    expect(expectedBatteryYears('door_contact', 'CR2032', settings)).toBeCloseTo(batteryLifeYears(CR2032_USABLE_MAH, 5), 10);
  });

  it('scales with the firm’s usable share of the capacity', () => {
    // usable share — common practice, no published source; a firm setting. At 1.0 the old 5.13 years comes back.
    expect(expectedBatteryYears('door_contact', 'CR2032', mergeUpkeepSettings({ usableCapacityFraction: 1 }))).toBeCloseTo(5.133, 3);
    // at 0.5: 112.5 mAh ÷ 5 µA = 22 500 h ÷ 8766 = 2.567 years
    expect(expectedBatteryYears('door_contact', 'CR2032', mergeUpkeepSettings({ usableCapacityFraction: 0.5 }))).toBeCloseTo(2.567, 3);
  });

  it('lasts at least a year for every battery-powered device on a CR123A', () => {
    // NFPA 72-2016 §23.16.2 low-power radio: primary battery runs the transmitter ≥ 1 year — references.md 4.10 (PUBLIC)
    // The hungriest default, a combination alarm at 55 µA: 1200 mAh ÷ 55 µA = 21 818 h = 2.49 years.
    for (const type of DEVICE_TYPES) {
      const years = expectedBatteryYears(type, 'CR123A', settings);
      if (years !== null) expect(years, type).toBeGreaterThanOrEqual(1);
    }
    expect(expectedBatteryYears('smoke_co', 'CR123A', settings)).toBeCloseTo(2.489, 3);
  });

  it('takes the firm’s own current for a device type', () => {
    const firm = mergeUpkeepSettings({ averageCurrentMicroAmps: { door_contact: 10 } });
    expect(averageCurrentFor('door_contact', firm)).toBe(10);
    expect(averageCurrentFor('window_contact', firm)).toBe(5);
    // Changed on purpose (80% usable): 180 000 µAh ÷ 10 µA = 18 000 h ÷ 8766 = 2.053 years (was 2.57)
    expect(expectedBatteryYears('door_contact', 'CR2032', firm)).toBeCloseTo(2.053, 3);
  });

  it('forecasts nothing for keypads and sirens unless the firm sets a current', () => {
    // keypads and sirens run from the panel or mains — common practice, no published source
    expect(expectedBatteryYears('keypad', 'AA lithium', settings)).toBeNull();
    expect(expectedBatteryYears('siren', 'AA lithium', settings)).toBeNull();
    const firm = mergeUpkeepSettings({ averageCurrentMicroAmps: { keypad: 100 } });
    // Changed on purpose (80% usable): AA lithium 3000 mAh × 0.8 = 2400 mAh ÷ 100 µA = 24 000 h ÷ 8766 = 2.738 years
    expect(expectedBatteryYears('keypad', 'AA lithium', firm)).toBeCloseTo((3000 * 0.8 * 1000) / 100 / 8766, 6);
  });

  it('caps a computed life at 10 years (common practice, no published source)', () => {
    // CR123A 1200 usable mAh at 5 µA would be 27 years on paper
    expect(MAX_COMPUTED_BATTERY_LIFE_YEARS).toBe(10);
    expect(expectedBatteryYears('door_contact', 'CR123A', settings)).toBe(10);
  });

  it('gives a sealed 10-year battery 10 years as a battery type', () => {
    // NFPA 72-2002 §11.6.1 sealed battery: 10 years normal operation — references.md 4.8 (PUBLIC)
    expect(expectedBatteryYears('smoke', 'sealed 10-year', settings)).toBe(10);
    expect(expectedBatteryYears('water', ' Sealed 10-Year ', settings)).toBe(10);
    expect(isSealedBattery('sealed 10-year')).toBe(true);
    expect(isSealedBattery('CR123A')).toBe(false);
    expect(isSealedBattery(null)).toBe(false);
  });

  it('lets a firm override the years for a device type', () => {
    const firm = mergeUpkeepSettings({ batteryYearsOverride: { motion: 3 } });
    expect(expectedBatteryYears('motion', 'CR123A', firm)).toBe(3);
    expect(expectedBatteryYears('motion', 'some odd cell', firm)).toBe(3);
    expect(expectedBatteryYears('motion', 'CR123A', mergeUpkeepSettings({ batteryYearsOverride: { motion: 0 } }))).toBeNull();
  });

  it('has nothing to go on without a battery type or with an unknown one', () => {
    expect(expectedBatteryYears('door_contact', null, settings)).toBeNull();
    expect(expectedBatteryYears('door_contact', '  ', settings)).toBeNull();
    expect(expectedBatteryYears('door_contact', 'CR9999', settings)).toBeNull();
  });
});

describe('upkeep settings', () => {
  it('start with the NFPA 72 smoke period, the firm periods for detectors, heat and CO, 80% usable capacity and 90 days of notice', () => {
    // NFPA 72 (2007 §10.4.7; 2016/2019 §14.4.7.1): smoke alarm ≤ 10 years from date of manufacture — references.md 4.4 (PUBLIC)
    expect(DEFAULT_UPKEEP_SETTINGS.smokeEndOfLifeYears).toBe(10);
    expect(SMOKE_ALARM_MAX_YEARS).toBe(10);
    // System smoke detectors (UL 268) are outside the 10-year alarm rule — references.md 4.4 (PUBLIC); 10 years — common practice, no published source
    expect(DEFAULT_UPKEEP_SETTINGS.smokeDetectorEndOfLifeYears).toBe(10);
    // Heat: no fixed code period; 10 years — common practice, no published source
    expect(DEFAULT_UPKEEP_SETTINGS.heatEndOfLifeYears).toBe(10);
    // CO alarm replacement: no fixed code value, typically 5–10 years — references.md 4.18 (from memory)
    expect(DEFAULT_UPKEEP_SETTINGS.coEndOfLifeYears).toBe(7);
    // usable share of nominal capacity — common practice, no published source
    expect(DEFAULT_UPKEEP_SETTINGS.usableCapacityFraction).toBe(0.8);
    expect(DEFAULT_UPKEEP_SETTINGS.soonDays).toBe(90);
    expect(mergeUpkeepSettings(null)).toEqual(DEFAULT_UPKEEP_SETTINGS);
    expect(mergeUpkeepSettings(undefined)).toEqual(DEFAULT_UPKEEP_SETTINGS);
  });

  it('merge a firm’s partial settings over the defaults without changing the defaults', () => {
    const merged = mergeUpkeepSettings({ coEndOfLifeYears: 10, heatEndOfLifeYears: 15, averageCurrentMicroAmps: { motion: 25, co: undefined } });
    expect(merged).toEqual({
      averageCurrentMicroAmps: { motion: 25 },
      batteryYearsOverride: {},
      smokeEndOfLifeYears: 10,
      smokeDetectorEndOfLifeYears: 10,
      heatEndOfLifeYears: 15,
      coEndOfLifeYears: 10,
      usableCapacityFraction: 0.8,
      soonDays: 90,
    });
    merged.averageCurrentMicroAmps.water = 1;
    expect(DEFAULT_UPKEEP_SETTINGS.averageCurrentMicroAmps).toEqual({});
  });

  it('never let a firm keep household smoke alarms past 10 years, but let it set its own detector period', () => {
    // NFPA 72: smoke alarms not in service > 10 years from manufacture — references.md 4.4 (PUBLIC); the rule is for UL 217 alarms, not UL 268 detectors
    const firm = mergeUpkeepSettings({ smokeEndOfLifeYears: 12, smokeDetectorEndOfLifeYears: 15 });
    expect(firm.smokeEndOfLifeYears).toBe(10);
    expect(firm.smokeDetectorEndOfLifeYears).toBe(15);
    expect(mergeUpkeepSettings({ smokeEndOfLifeYears: 8 }).smokeEndOfLifeYears).toBe(8);
  });
});

describe('end-of-life periods by device type', () => {
  it('name each life-safety device type’s own period, and none for other devices', () => {
    const firm = mergeUpkeepSettings({ smokeEndOfLifeYears: 9, smokeDetectorEndOfLifeYears: 15, heatEndOfLifeYears: 12, coEndOfLifeYears: 6 });
    // NFPA 72 smoke alarm ≤ 10 years — references.md 4.4 (PUBLIC)
    expect(endOfLifeYearsFor('smoke', firm)).toBe(9);
    // system smoke detector: the firm's own period — common practice, no published source
    expect(endOfLifeYearsFor('smoke_detector', firm)).toBe(15);
    // heat: the firm's own period — common practice, no published source
    expect(endOfLifeYearsFor('heat', firm)).toBe(12);
    // CO: per the manufacturer, no fixed code value — references.md 4.18 (from memory)
    expect(endOfLifeYearsFor('co', firm)).toBe(6);
    // a combination alarm ends with the shorter of its smoke (4.4, PUBLIC) and CO (4.18, from memory) parts
    expect(endOfLifeYearsFor('smoke_co', firm)).toBe(6);
    expect(endOfLifeYearsFor('smoke_co', mergeUpkeepSettings({ smokeEndOfLifeYears: 9, coEndOfLifeYears: 10 }))).toBe(9);
    for (const type of DEVICE_TYPES) {
      expect(endOfLifeYearsFor(type, settings) !== null, type).toBe(isLifeSafetyDevice(type));
    }
  });
});

describe('calendar dates', () => {
  it('adds whole years on the calendar', () => {
    expect(addYearsToDate('2016-03-15', 10)).toBe('2026-03-15');
    expect(addYearsToDate('2023-12-31', 1)).toBe('2024-12-31');
  });

  it('turns 29 February into 28 February in a common year', () => {
    expect(addYearsToDate('2024-02-29', 1)).toBe('2025-02-28');
    expect(addYearsToDate('2024-02-29', 4)).toBe('2028-02-29');
  });

  it('adds the fraction of a year as 365.25-day years rounded to whole days', () => {
    expect(addYearsToDate('2024-01-01', 0.5)).toBe(addDaysToDate('2024-01-01', 183));
    // 5.1335 years: 5 calendar years, then 0.1335 × 365.25 = 48.8 → 49 days
    expect(addYearsToDate('2020-01-01', batteryLifeYears(225, 5))).toBe('2025-02-19');
  });

  it('adds days across months and years', () => {
    expect(addDaysToDate('2025-12-15', 90)).toBe('2026-03-15');
    expect(addDaysToDate('2024-02-28', 1)).toBe('2024-02-29');
    expect(addDaysToDate('2024-03-01', -1)).toBe('2024-02-29');
  });

  it('refuses a string that is not a calendar date', () => {
    expect(() => addDaysToDate('2025-02-30', 1)).toThrow(RangeError);
    expect(() => addYearsToDate('15/03/2016', 1)).toThrow(RangeError);
  });

  it('compares dates', () => {
    expect(isOnOrBefore('2025-01-09', '2025-01-10')).toBe(true);
    expect(isOnOrBefore('2025-01-10', '2025-01-10')).toBe(true);
    expect(isOnOrBefore('2025-01-11', '2025-01-10')).toBe(false);
  });
});

describe('lifeState', () => {
  it('is due on the day, soon within the notice days, ok after', () => {
    expect(lifeState(['2026-03-15'], '2026-03-15', 90)).toBe('due');
    expect(lifeState(['2026-03-15'], '2026-04-01', 90)).toBe('due');
    expect(lifeState(['2026-03-15'], '2025-12-15', 90)).toBe('soon');
    expect(lifeState(['2026-03-15'], '2025-12-14', 90)).toBe('ok');
    expect(lifeState([null, null], '2025-12-14', 90)).toBe('ok');
  });

  it('takes the most urgent of the dates', () => {
    expect(lifeState(['2030-01-01', '2025-01-02'], '2025-01-01', 90)).toBe('soon');
    expect(lifeState(['2030-01-01', '2024-12-31'], '2025-01-01', 90)).toBe('due');
  });
});

describe('deviceLife', () => {
  it('puts a smoke alarm made 2016-03-15 at end of life on 2026-03-15', () => {
    // NFPA 72: smoke alarm not in service > 10 years from date of manufacture — references.md 4.4 (PUBLIC)
    const smoke = zone({ deviceType: 'smoke', manufacturedOn: '2016-03-15', installedOn: '2016-09-01' });
    expect(deviceLife(smoke, settings, '2025-06-01')).toEqual({
      batteryDueOn: null,
      endOfLifeOn: '2026-03-15',
      endOfLifeBasis: 'manufactured',
      state: 'ok',
      batteryYears: null,
      batteryUnderOneYear: false,
    });
    // 90 days before 2026-03-15 is 2025-12-15
    expect(deviceLife(smoke, settings, '2025-12-14').state).toBe('ok');
    expect(deviceLife(smoke, settings, '2025-12-15').state).toBe('soon');
    expect(deviceLife(smoke, settings, '2026-03-15').state).toBe('due');
  });

  it('counts end of life from manufacture, not from install, when both are known', () => {
    // NFPA 72 (2007+): "date of manufacture" — references.md 4.4 (PUBLIC)
    const smoke = zone({ deviceType: 'smoke', manufacturedOn: '2014-01-10', installedOn: '2019-05-05' });
    const life = deviceLife(smoke, settings, '2025-01-01');
    expect(life.endOfLifeOn).toBe('2024-01-10');
    expect(life.endOfLifeBasis).toBe('manufactured');
    expect(life.state).toBe('due');
  });

  it('manufacture date known vs missing: ok from the label, check from the installation, due when even that has passed', () => {
    // NFPA 72: 10 years from the date of manufacture — references.md 4.4 (PUBLIC). Manufacture is on or
    // before installation, so installation + 10 years is the latest the end of life can be.
    const known = zone({ deviceType: 'smoke', manufacturedOn: '2019-11-01', installedOn: '2020-05-01' });
    const missing = zone({ deviceType: 'smoke', installedOn: '2020-05-01' });
    expect(deviceLife(known, settings, '2025-01-01')).toMatchObject({ endOfLifeOn: '2029-11-01', endOfLifeBasis: 'manufactured', state: 'ok' });
    // Changed on purpose: with no manufacture date there used to be no end of life and state 'ok'.
    expect(deviceLife(missing, settings, '2025-01-01')).toMatchObject({ endOfLifeOn: '2030-05-01', endOfLifeBasis: 'installed', state: 'check' });
    // installed 2014-02-01, manufacture unknown: even the latest end of life, 2024-02-01, has passed
    const old = zone({ deviceType: 'smoke', installedOn: '2014-02-01' });
    expect(deviceLife(old, settings, '2025-01-01')).toMatchObject({ endOfLifeOn: '2024-02-01', endOfLifeBasis: 'installed', state: 'due' });
    // installed 2015-03-01: the latest end of life, 2025-03-01, is within 90 days of 2025-01-15
    const near = zone({ deviceType: 'smoke', installedOn: '2015-03-01' });
    expect(deviceLife(near, settings, '2025-01-15')).toMatchObject({ endOfLifeOn: '2025-03-01', endOfLifeBasis: 'installed', state: 'soon' });
  });

  it('is never ok on an unknown date: a life-safety device with no dates at all is to be checked', () => {
    // NFPA 72: 10 years from manufacture — references.md 4.4 (PUBLIC); CO per manufacturer — references.md 4.18 (from memory)
    // Changed on purpose: this used to give no end of life and state 'ok'.
    for (const deviceType of LIFE_SAFETY_DEVICE_TYPES) {
      expect(deviceLife(zone({ deviceType }), settings, '2025-01-01'), deviceType).toEqual({
        batteryDueOn: null,
        endOfLifeOn: null,
        endOfLifeBasis: 'unknown',
        state: 'check',
        batteryYears: null,
        batteryUnderOneYear: false,
      });
    }
  });

  it('gives other devices no end of life, so a missing manufacture date asks for nothing', () => {
    expect(deviceLife(zone({ deviceType: 'motion', manufacturedOn: '2010-01-01' }), settings, '2025-01-01')).toEqual({
      batteryDueOn: null,
      endOfLifeOn: null,
      endOfLifeBasis: null,
      state: 'ok',
      batteryYears: null,
      batteryUnderOneYear: false,
    });
    expect(deviceLife(zone({ deviceType: 'motion' }), settings, '2025-01-01').state).toBe('ok');
  });

  it('lets a battery that is soon or due speak over the check of an unknown manufacture date', () => {
    // smoke at 40 µA on a CR123A: 1200 mAh ÷ 40 µA = 30 000 h ÷ 8766 = 3.42 years — common practice, no published source
    const smoke = zone({ deviceType: 'smoke', batteryType: 'CR123A', installedOn: '2022-01-01' });
    expect(deviceLife(smoke, settings, '2024-01-01').state).toBe('check');
    // battery due 2025-06-04 (2022-01-01 + 3 years + 0.4223 × 365.25 = 154 days)
    expect(deviceLife(smoke, settings, '2025-06-04')).toMatchObject({ batteryDueOn: '2025-06-04', state: 'due', endOfLifeBasis: 'installed' });
  });

  it('uses the heat period for heat alarms, the detector period for system smoke detectors, separately from smoke alarms', () => {
    // heat and system smoke detectors: firm periods — common practice, no published source; smoke alarm 10 years — references.md 4.4 (PUBLIC)
    const firm = mergeUpkeepSettings({ heatEndOfLifeYears: 12, smokeDetectorEndOfLifeYears: 15 });
    const made = '2016-03-15';
    expect(deviceLife(zone({ deviceType: 'heat', manufacturedOn: made }), settings, '2025-01-01').endOfLifeOn).toBe('2026-03-15');
    expect(deviceLife(zone({ deviceType: 'heat', manufacturedOn: made }), firm, '2025-01-01').endOfLifeOn).toBe('2028-03-15');
    expect(deviceLife(zone({ deviceType: 'smoke_detector', manufacturedOn: made }), firm, '2025-01-01').endOfLifeOn).toBe('2031-03-15');
    expect(deviceLife(zone({ deviceType: 'smoke', manufacturedOn: made }), firm, '2025-01-01').endOfLifeOn).toBe('2026-03-15');
  });

  it('puts a CO alarm at end of life by the firm setting', () => {
    // CO alarm replacement: no fixed code value — references.md 4.18 (from memory); default 7 years, firm setting
    const co = zone({ deviceType: 'co', manufacturedOn: '2020-06-01' });
    expect(deviceLife(co, settings, '2025-01-01').endOfLifeOn).toBe('2027-06-01');
    const tenYearFirm = mergeUpkeepSettings({ coEndOfLifeYears: 10 });
    expect(deviceLife(co, tenYearFirm, '2027-06-01')).toEqual({
      batteryDueOn: null,
      endOfLifeOn: '2030-06-01',
      endOfLifeBasis: 'manufactured',
      state: 'ok',
      batteryYears: null,
      batteryUnderOneYear: false,
    });
    expect(deviceLife(co, settings, '2027-06-01').state).toBe('due');
  });

  it('puts a combination smoke and CO alarm at the end of its shorter-lived part', () => {
    // smoke 10 years — references.md 4.4 (PUBLIC); CO 7 years — references.md 4.18 (from memory): 2020-06-01 + 7 = 2027-06-01
    const combo = zone({ deviceType: 'smoke_co', manufacturedOn: '2020-06-01' });
    expect(deviceLife(combo, settings, '2025-01-01').endOfLifeOn).toBe('2027-06-01');
  });

  it('counts the battery from its last change, else from install', () => {
    // CR2032 225 mAh — references.md 6.4 (PUBLIC); 80% usable and 5 µA — common practice, no published source
    // Changed on purpose: 180 mAh at 5 µA = 4.107 years (was 5.13): 2020-01-01 + 4 years = 2024-01-01,
    // + 0.1068 × 365.25 = 39 days → 2024-02-09 (was 2025-02-19).
    const installedOnly = zone({ batteryType: 'CR2032', installedOn: '2020-01-01' });
    expect(deviceLife(installedOnly, settings, '2023-06-01')).toEqual({
      batteryDueOn: '2024-02-09',
      endOfLifeOn: null,
      endOfLifeBasis: null,
      state: 'ok',
      batteryYears: batteryLifeYears(CR2032_USABLE_MAH, 5),
      batteryUnderOneYear: false,
    });
    const changed = { ...installedOnly, batteryChangedOn: '2023-06-01' };
    expect(deviceLife(changed, settings, '2024-01-01').batteryDueOn).toBe(addYearsToDate('2023-06-01', (CR2032_USABLE_MAH * 1000) / 5 / 8766));
  });

  it('marks a battery soon within 90 days and due on the day', () => {
    // battery due 2024-02-09 (above); 90 days before is 2023-11-11
    const contact = zone({ batteryType: 'CR2032', installedOn: '2020-01-01' });
    expect(deviceLife(contact, settings, '2023-11-11').state).toBe('soon');
    expect(deviceLife(contact, settings, '2023-11-10').state).toBe('ok');
    expect(deviceLife(contact, settings, '2024-02-09').state).toBe('due');
  });

  it('follows the firm’s notice days', () => {
    const contact = zone({ batteryType: 'CR2032', installedOn: '2020-01-01' });
    expect(deviceLife(contact, mergeUpkeepSettings({ soonDays: 30 }), '2023-11-11').state).toBe('ok');
    expect(deviceLife(contact, mergeUpkeepSettings({ soonDays: 30 }), '2024-01-10').state).toBe('soon');
  });

  it('gives no battery date for an unknown battery or without dates', () => {
    expect(deviceLife(zone({ batteryType: 'CR9999', installedOn: '2020-01-01' }), settings, '2025-01-01').batteryDueOn).toBeNull();
    expect(deviceLife(zone({ batteryType: 'CR2032' }), settings, '2025-01-01').batteryDueOn).toBeNull();
  });

  it('reports both dates for a battery-powered smoke alarm and takes the earlier for the state', () => {
    // NFPA 72 10 years from manufacture — references.md 4.4 (PUBLIC); CR123A 1500 mAh — references.md 6.11 (PUBLIC)
    const smoke = zone({
      deviceType: 'smoke',
      batteryType: 'CR123A',
      installedOn: '2022-01-01',
      manufacturedOn: '2021-06-01',
    });
    const life = deviceLife(smoke, settings, '2025-01-01');
    expect(life.endOfLifeOn).toBe('2031-06-01');
    // Changed on purpose (80% usable): 1200 mAh ÷ 40 µA = 3.42 years → 2025-06-04 (was 4.28 years from 1500 mAh)
    expect(life.batteryDueOn).toBe('2025-06-04');
    expect(life.batteryDueOn).toBe(addYearsToDate('2022-01-01', batteryLifeYears(CR123A_USABLE_MAH, 40)));
    expect(life.state).toBe('ok');
    expect(deviceLife(smoke, settings, '2025-03-06').state).toBe('soon');
    expect(deviceLife(smoke, settings, '2025-06-04').state).toBe('due');
  });

  it('sealed 10-year battery: no battery date in a smoke alarm, where the alarm’s end of life covers it; a date in a water sensor', () => {
    // NFPA 72-2002 §11.6.1: sealed battery runs the alarm ≥ 10 years — references.md 4.8 (PUBLIC); the alarm itself ends at 10 years from manufacture — references.md 4.4 (PUBLIC)
    const sealedSmoke = zone({ deviceType: 'smoke', batteryType: 'sealed 10-year', installedOn: '2020-01-01', manufacturedOn: '2019-07-01' });
    expect(deviceLife(sealedSmoke, settings, '2025-01-01')).toEqual({
      batteryDueOn: null,
      endOfLifeOn: '2029-07-01',
      endOfLifeBasis: 'manufactured',
      state: 'ok',
      batteryYears: null,
      batteryUnderOneYear: false,
    });
    const replaceable = deviceLife({ ...sealedSmoke, batteryType: 'CR123A' }, settings, '2025-01-01');
    expect(replaceable.batteryDueOn).not.toBeNull();
    const sealedWater = zone({ deviceType: 'water', batteryType: 'sealed 10-year', installedOn: '2020-01-01' });
    expect(deviceLife(sealedWater, settings, '2025-01-01')).toMatchObject({ batteryDueOn: '2030-01-01', batteryYears: 10, endOfLifeOn: null });
  });

  it('flags a battery forecast under 1 year for a life-safety device only', () => {
    // NFPA 72-2016 §23.16.2: a low-power radio fire device's battery runs it ≥ 1 year — references.md 4.10 (PUBLIC)
    // CR2032 at 40 µA: 180 mAh ÷ 40 µA = 4500 h ÷ 8766 = 0.51 years, for a smoke alarm and a glass-break detector alike.
    expect(LIFE_SAFETY_MIN_BATTERY_YEARS).toBe(1);
    const smoke = deviceLife(zone({ deviceType: 'smoke', batteryType: 'CR2032', installedOn: '2024-01-01', manufacturedOn: '2023-06-01' }), settings, '2024-03-01');
    const glass = deviceLife(zone({ deviceType: 'glass_break', batteryType: 'CR2032', installedOn: '2024-01-01' }), settings, '2024-03-01');
    expect(smoke.batteryYears).toBeCloseTo(0.513, 3);
    expect(glass.batteryYears).toBeCloseTo(0.513, 3);
    expect(smoke.batteryUnderOneYear).toBe(true);
    expect(glass.batteryUnderOneYear).toBe(false);
    // the same smoke alarm on a CR123A: 1200 mAh ÷ 40 µA = 3.42 years, not flagged
    expect(deviceLife(zone({ deviceType: 'smoke', batteryType: 'CR123A', installedOn: '2024-01-01' }), settings, '2024-03-01').batteryUnderOneYear).toBe(false);
    // a firm's 11-month override for CO alarms is flagged too; exactly 1 year is not
    expect(deviceLife(zone({ deviceType: 'co', batteryType: 'AA lithium' }), mergeUpkeepSettings({ batteryYearsOverride: { co: 11 / 12 } }), '2024-03-01').batteryUnderOneYear).toBe(true);
    expect(deviceLife(zone({ deviceType: 'co', batteryType: 'AA lithium' }), mergeUpkeepSettings({ batteryYearsOverride: { co: 1 } }), '2024-03-01').batteryUnderOneYear).toBe(false);
  });

  it('has nothing due on a removed zone', () => {
    const removed = zone({ deviceType: 'smoke', manufacturedOn: '2000-01-01', batteryType: 'CR2032', installedOn: '2000-01-01', status: 'removed' });
    expect(deviceLife(removed, settings, '2025-01-01')).toEqual({
      batteryDueOn: null,
      endOfLifeOn: null,
      endOfLifeBasis: null,
      state: 'ok',
      batteryYears: null,
      batteryUnderOneYear: false,
    });
  });

  it('still tracks a bypassed zone', () => {
    // NFPA 72: 10 years from manufacture — references.md 4.4 (PUBLIC)
    const bypassed = zone({ deviceType: 'smoke', manufacturedOn: '2000-01-01', status: 'bypassed' });
    expect(deviceLife(bypassed, settings, '2025-01-01').state).toBe('due');
  });
});
