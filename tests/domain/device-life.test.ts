/** Device life: battery arithmetic, end of life of smoke and CO alarms, ok / soon / due. */
import { describe, expect, it } from 'vitest';
import { BATTERY_TYPES, DEVICE_TYPES } from '@domain/devices';
import {
  BATTERY_CAPACITY_MAH,
  DEFAULT_AVERAGE_CURRENT_UA,
  DEFAULT_UPKEEP_SETTINGS,
  FIXED_BATTERY_LIFE_YEARS,
  HOURS_PER_YEAR,
  MAX_COMPUTED_BATTERY_LIFE_YEARS,
  addDaysToDate,
  addYearsToDate,
  averageCurrentFor,
  batteryCapacityFor,
  batteryLifeYears,
  deviceLife,
  expectedBatteryYears,
  isOnOrBefore,
  lifeState,
  mergeUpkeepSettings,
  type DeviceLifeZone,
} from '@domain/device-life';

const settings = mergeUpkeepSettings({});

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

  it('gives a door contact on a CR2032 about 5.1 years', () => {
    // common practice, no published source (5 µA); CR2032 225 mAh — references.md 6.4 (PUBLIC)
    expect(DEFAULT_AVERAGE_CURRENT_UA.door_contact).toBe(5);
    expect(expectedBatteryYears('door_contact', 'CR2032', settings)).toBeCloseTo(5.13, 2);
  });

  it('lasts at least a year for every battery-powered device on a CR123A', () => {
    // NFPA 72 low-power radio: primary battery runs the transmitter ≥ 1 year — references.md 4.10 (PUBLIC)
    for (const type of DEVICE_TYPES) {
      const years = expectedBatteryYears(type, 'CR123A', settings);
      if (years !== null) expect(years, type).toBeGreaterThanOrEqual(1);
    }
  });

  it('takes the firm’s own current for a device type', () => {
    const firm = mergeUpkeepSettings({ averageCurrentMicroAmps: { door_contact: 10 } });
    expect(averageCurrentFor('door_contact', firm)).toBe(10);
    expect(averageCurrentFor('window_contact', firm)).toBe(5);
    expect(expectedBatteryYears('door_contact', 'CR2032', firm)).toBeCloseTo(2.57, 2);
  });

  it('forecasts nothing for keypads and sirens unless the firm sets a current', () => {
    expect(expectedBatteryYears('keypad', 'AA lithium', settings)).toBeNull();
    const firm = mergeUpkeepSettings({ averageCurrentMicroAmps: { keypad: 100 } });
    expect(expectedBatteryYears('keypad', 'AA lithium', firm)).toBeCloseTo(3000_000 / 100 / 8766, 6);
  });

  it('caps a computed life at 10 years (common practice, no published source)', () => {
    // CR123A 1500 mAh at 5 µA would be 34 years on paper
    expect(MAX_COMPUTED_BATTERY_LIFE_YEARS).toBe(10);
    expect(expectedBatteryYears('door_contact', 'CR123A', settings)).toBe(10);
  });

  it('gives a sealed 10-year battery 10 years', () => {
    // NFPA 72-2002 §11.6.1 sealed battery: 10 years normal operation — references.md 4.8 (PUBLIC)
    expect(expectedBatteryYears('smoke', 'sealed 10-year', settings)).toBe(10);
  });

  it('lets a firm override the years for a device type', () => {
    const firm = mergeUpkeepSettings({ batteryYearsOverride: { motion: 3 } });
    expect(expectedBatteryYears('motion', 'CR123A', firm)).toBe(3);
    expect(expectedBatteryYears('motion', 'some odd cell', firm)).toBe(3);
  });

  it('has nothing to go on without a battery type or with an unknown one', () => {
    expect(expectedBatteryYears('door_contact', null, settings)).toBeNull();
    expect(expectedBatteryYears('door_contact', '  ', settings)).toBeNull();
    expect(expectedBatteryYears('door_contact', 'CR9999', settings)).toBeNull();
  });
});

describe('upkeep settings', () => {
  it('start with the NFPA 72 smoke period, our CO period and 90 days of notice', () => {
    // NFPA 72: smoke alarm ≤ 10 years from date of manufacture — references.md 4.4 (PUBLIC)
    expect(DEFAULT_UPKEEP_SETTINGS.smokeEndOfLifeYears).toBe(10);
    // CO alarm replacement: no fixed code value, typically 5–10 years — references.md 4.18 (from memory)
    expect(DEFAULT_UPKEEP_SETTINGS.coEndOfLifeYears).toBe(7);
    expect(DEFAULT_UPKEEP_SETTINGS.soonDays).toBe(90);
    expect(mergeUpkeepSettings(null)).toEqual(DEFAULT_UPKEEP_SETTINGS);
    expect(mergeUpkeepSettings(undefined)).toEqual(DEFAULT_UPKEEP_SETTINGS);
  });

  it('merge a firm’s partial settings over the defaults without changing the defaults', () => {
    const merged = mergeUpkeepSettings({ coEndOfLifeYears: 10, averageCurrentMicroAmps: { motion: 25, co: undefined } });
    expect(merged).toEqual({
      averageCurrentMicroAmps: { motion: 25 },
      batteryYearsOverride: {},
      smokeEndOfLifeYears: 10,
      coEndOfLifeYears: 10,
      soonDays: 90,
    });
    merged.averageCurrentMicroAmps.water = 1;
    expect(DEFAULT_UPKEEP_SETTINGS.averageCurrentMicroAmps).toEqual({});
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
      state: 'ok',
    });
    expect(deviceLife(smoke, settings, '2025-12-15').state).toBe('soon');
    expect(deviceLife(smoke, settings, '2026-03-15').state).toBe('due');
  });

  it('counts end of life from manufacture, not from install', () => {
    // NFPA 72 (2007+): "date of manufacture" — references.md 4.4 (PUBLIC)
    const smoke = zone({ deviceType: 'smoke', manufacturedOn: '2014-01-10', installedOn: '2019-05-05' });
    expect(deviceLife(smoke, settings, '2025-01-01').endOfLifeOn).toBe('2024-01-10');
  });

  it('treats a heat alarm like a smoke alarm (firm practice; common practice, no published source)', () => {
    const heat = zone({ deviceType: 'heat', manufacturedOn: '2016-03-15' });
    expect(deviceLife(heat, settings, '2025-01-01').endOfLifeOn).toBe('2026-03-15');
  });

  it('puts a CO alarm at end of life by the firm setting', () => {
    // CO alarm replacement: no fixed code value — references.md 4.18 (from memory); default 7 years, firm setting
    const co = zone({ deviceType: 'co', manufacturedOn: '2020-06-01' });
    expect(deviceLife(co, settings, '2025-01-01').endOfLifeOn).toBe('2027-06-01');
    const tenYearFirm = mergeUpkeepSettings({ coEndOfLifeYears: 10 });
    expect(deviceLife(co, tenYearFirm, '2027-06-01')).toEqual({
      batteryDueOn: null,
      endOfLifeOn: '2030-06-01',
      state: 'ok',
    });
    expect(deviceLife(co, settings, '2027-06-01').state).toBe('due');
  });

  it('gives no end of life without a manufacture date, or for other devices', () => {
    expect(deviceLife(zone({ deviceType: 'smoke' }), settings, '2025-01-01').endOfLifeOn).toBeNull();
    expect(deviceLife(zone({ deviceType: 'motion', manufacturedOn: '2010-01-01' }), settings, '2025-01-01')).toEqual({
      batteryDueOn: null,
      endOfLifeOn: null,
      state: 'ok',
    });
  });

  it('counts the battery from its last change, else from install', () => {
    // 225 mAh at 5 µA ≈ 5.1 years — references.md 6.4 (PUBLIC); 5 µA common practice, no published source
    const installedOnly = zone({ batteryType: 'CR2032', installedOn: '2020-01-01' });
    expect(deviceLife(installedOnly, settings, '2024-01-01')).toEqual({
      batteryDueOn: '2025-02-19',
      endOfLifeOn: null,
      state: 'ok',
    });
    const changed = { ...installedOnly, batteryChangedOn: '2023-06-01' };
    expect(deviceLife(changed, settings, '2024-01-01').batteryDueOn).toBe(addYearsToDate('2023-06-01', 225 / 5 / 8.766));
  });

  it('marks a battery soon within 90 days and due on the day', () => {
    const contact = zone({ batteryType: 'CR2032', installedOn: '2020-01-01' });
    expect(deviceLife(contact, settings, '2024-11-21').state).toBe('soon');
    expect(deviceLife(contact, settings, '2024-11-20').state).toBe('ok');
    expect(deviceLife(contact, settings, '2025-02-19').state).toBe('due');
  });

  it('follows the firm’s notice days', () => {
    const contact = zone({ batteryType: 'CR2032', installedOn: '2020-01-01' });
    expect(deviceLife(contact, mergeUpkeepSettings({ soonDays: 30 }), '2024-11-21').state).toBe('ok');
  });

  it('gives no battery date for an unknown battery or without dates', () => {
    expect(deviceLife(zone({ batteryType: 'CR9999', installedOn: '2020-01-01' }), settings, '2025-01-01').batteryDueOn).toBeNull();
    expect(deviceLife(zone({ batteryType: 'CR2032' }), settings, '2025-01-01').batteryDueOn).toBeNull();
  });

  it('reports both dates for a battery-powered smoke alarm and takes the earlier for the state', () => {
    const smoke = zone({
      deviceType: 'smoke',
      batteryType: 'CR123A',
      installedOn: '2022-01-01',
      manufacturedOn: '2021-06-01',
    });
    const life = deviceLife(smoke, settings, '2025-01-01');
    expect(life.endOfLifeOn).toBe('2031-06-01');
    expect(life.batteryDueOn).toBe(addYearsToDate('2022-01-01', batteryLifeYears(1500, 40)));
    expect(life.state).toBe('ok');
    expect(deviceLife(smoke, settings, '2026-05-01').state).toBe('due');
  });

  it('has nothing due on a removed zone', () => {
    const removed = zone({ deviceType: 'smoke', manufacturedOn: '2000-01-01', batteryType: 'CR2032', installedOn: '2000-01-01', status: 'removed' });
    expect(deviceLife(removed, settings, '2025-01-01')).toEqual({ batteryDueOn: null, endOfLifeOn: null, state: 'ok' });
  });

  it('still tracks a bypassed zone', () => {
    const bypassed = zone({ deviceType: 'smoke', manufacturedOn: '2000-01-01', status: 'bypassed' });
    expect(deviceLife(bypassed, settings, '2025-01-01').state).toBe('due');
  });
});
