/**
 * The panel's standby battery and its path to the monitoring center: the battery calculation
 * against the published hours, the sealed lead-acid age, and the single-path rule for fire. Each
 * check names its source (references.md row with PUBLIC or MEMORY, or "common practice, no
 * published source"). Panels, currents and dates are invented.
 */
import { describe, expect, it } from 'vitest';
import type { CommPath, DeviceType, ZoneStatus, ZoneType } from '@domain/devices';
import {
  PANEL_OCCUPANCIES,
  SEALED_LEAD_ACID_LIFE_YEARS,
  SINGLE_PATH_FAILURE_REPORT_MAX_MIN,
  STANDBY_REQUIREMENTS,
  STANDBY_SAFETY_MARGIN,
  carriesLifeSafety,
  panelPowerFindings,
  requiredStandbyAh,
  standbyBatteryDueOn,
  standbyDutyOf,
  type PanelPowerFinding,
  type PanelPowerInput,
  type PanelPowerZone,
} from '@domain/panel-power';
import { zoneDefaultsFor } from '@domain/zones';

/** A zone as the technician enrols it: zone type and reporting from its device type's defaults (zones.ts). */
function zone(deviceType: DeviceType, changes: { zoneType?: ZoneType; status?: ZoneStatus; reportsToMonitoring?: boolean } = {}): PanelPowerZone {
  const { zoneType, reportsToMonitoring } = zoneDefaultsFor(deviceType);
  return { deviceType, zoneType, reportsToMonitoring, status: 'active', ...changes };
}

const intrusionZones = [zone('door_contact'), zone('window_contact'), zone('motion')];
const fireZones = [...intrusionZones, zone('smoke'), zone('co')];

/** A household panel with a battery that is big enough and new enough, reporting over cellular + IP. */
function panel(changes: Partial<PanelPowerInput> = {}): PanelPowerInput {
  return {
    occupancy: 'household',
    commPath: 'combination',
    standbyCurrentMa: 120,
    alarmCurrentMa: 900,
    batteryAh: 7,
    batteryManufacturedOn: '2024-01-15',
    pathFailureReportMin: null,
    ...changes,
  };
}
const TODAY = '2025-06-01';
const codes = (findings: readonly PanelPowerFinding[]) => findings.map((f) => f.code);

describe('standby requirements', () => {
  it('give household fire 24 h standby then 4 min of alarm', () => {
    // NFPA 72 Ch. 29 household fire secondary power 24 h — references.md 4.19 (PUBLIC); 4 min alarm — references.md 4.19 (from memory)
    expect(STANDBY_REQUIREMENTS.household_fire).toMatchObject({ standbyHours: 24, alarmMinutes: 4, evidence: 'public' });
    expect(STANDBY_REQUIREMENTS.household_fire.clause).toContain('24 h standby');
    expect(STANDBY_REQUIREMENTS.household_fire.clause).toContain('4 min of alarm (the 4 min from memory)');
  });

  it('give commercial fire 24 h standby then 5 min of alarm, from memory', () => {
    // NFPA 72 §10.6.7.2.1 secondary power: 24 h + 5 min (from memory; no references.md row)
    expect(STANDBY_REQUIREMENTS.commercial_fire).toMatchObject({ standbyHours: 24, alarmMinutes: 5, evidence: 'memory' });
    expect(STANDBY_REQUIREMENTS.commercial_fire.clause).toContain('from memory');
  });

  it('give intrusion 4 h standby then 4 min of alarm, from memory', () => {
    // UL 1023 household burglar-alarm units: 4 h standby (from memory; no references.md row)
    expect(STANDBY_REQUIREMENTS.intrusion).toMatchObject({ standbyHours: 4, alarmMinutes: 4, evidence: 'memory' });
    expect(STANDBY_REQUIREMENTS.intrusion.clause).toContain('from memory');
  });

  it('add 20% headroom and replace sealed lead-acid batteries 5 years after manufacture', () => {
    // 20% margin — common practice, no published source
    expect(STANDBY_SAFETY_MARGIN).toBe(0.2);
    // sealed lead-acid 5 years — NFPA 72 Ch. 14 (from memory); common practice
    expect(SEALED_LEAD_ACID_LIFE_YEARS).toBe(5);
    expect(PANEL_OCCUPANCIES).toEqual(['household', 'commercial']);
  });
});

describe('requiredStandbyAh', () => {
  it('works the household fire example: 120 mA standby, 900 mA alarm → 3.528 Ah', () => {
    // NFPA 72 Ch. 29: 24 h standby — references.md 4.19 (PUBLIC); 4 min alarm (from memory); 20% margin — common practice, no published source
    // 120 mA × 24 h = 2880 mAh; 900 mA × 4 min ÷ 60 = 60 mAh; (2880 + 60) ÷ 1000 = 2.94 Ah; × 1.2 = 3.528 Ah
    expect(requiredStandbyAh('household_fire', 120, 900)).toEqual({
      duty: 'household_fire',
      standbyMah: 2880,
      alarmMah: 60,
      neededAh: 2.94,
      requiredAh: 3.528,
    });
  });

  it('works the same currents for commercial fire: 24 h + 5 min → 3.546 Ah', () => {
    // NFPA 72 §10.6.7.2.1 (from memory): 120 × 24 = 2880 mAh; 900 × 5 ÷ 60 = 75 mAh; 2.955 Ah; × 1.2 = 3.546 Ah
    expect(requiredStandbyAh('commercial_fire', 120, 900)).toEqual({
      duty: 'commercial_fire',
      standbyMah: 2880,
      alarmMah: 75,
      neededAh: 2.955,
      requiredAh: 3.546,
    });
  });

  it('works the same currents for intrusion: 4 h + 4 min → 0.648 Ah', () => {
    // UL 1023 (from memory): 120 × 4 = 480 mAh; 900 × 4 ÷ 60 = 60 mAh; 0.54 Ah; × 1.2 = 0.648 Ah
    expect(requiredStandbyAh('intrusion', 120, 900)).toEqual({ duty: 'intrusion', standbyMah: 480, alarmMah: 60, neededAh: 0.54, requiredAh: 0.648 });
  });

  it('takes another margin when asked, and refuses negative currents', () => {
    // margin — common practice, no published source: with none, required = needed
    expect(requiredStandbyAh('household_fire', 120, 900, 0).requiredAh).toBe(2.94);
    // 250 mA × 24 h = 6000 mAh; 1500 mA × 4 ÷ 60 = 100 mAh; 6.1 Ah × 1.25 = 7.625 Ah
    expect(requiredStandbyAh('household_fire', 250, 1500, 0.25).requiredAh).toBe(7.625);
    expect(() => requiredStandbyAh('household_fire', -1, 900)).toThrow(RangeError);
    expect(() => requiredStandbyAh('household_fire', 120, -900)).toThrow(RangeError);
    expect(() => requiredStandbyAh('household_fire', Number.NaN, 900)).toThrow(RangeError);
  });
});

describe('the duty a panel is sized for', () => {
  it('is fire when the panel carries a fire or CO device, by device type or zone type, else intrusion', () => {
    // NFPA 72 Ch. 29 household fire 24 h — references.md 4.19 (PUBLIC) applies once the panel carries fire
    expect(standbyDutyOf('household', intrusionZones)).toBe('intrusion');
    expect(standbyDutyOf('household', fireZones)).toBe('household_fire');
    expect(standbyDutyOf('commercial', fireZones)).toBe('commercial_fire');
    expect(standbyDutyOf('commercial', intrusionZones)).toBe('intrusion');
    // a smoke alarm wrongly on a perimeter zone still draws fire duty
    expect(carriesLifeSafety([zone('smoke', { zoneType: 'perimeter' })])).toBe(true);
    // a CO alarm alone
    expect(carriesLifeSafety([zone('co')])).toBe(true);
    // a fire zone with an unrecorded device ("other")
    expect(carriesLifeSafety([zone('other', { zoneType: 'fire_24h' })])).toBe(true);
    // removed zones are no longer programmed; bypassed ones are
    expect(carriesLifeSafety([zone('smoke', { status: 'removed' })])).toBe(false);
    expect(carriesLifeSafety([zone('smoke', { status: 'bypassed' })])).toBe(true);
  });
});

describe('standby battery findings', () => {
  it('4 Ah passes and 2.3 Ah fails the household fire example', () => {
    // NFPA 72 Ch. 29 24 h standby — references.md 4.19 (PUBLIC); required 3.528 Ah (worked above)
    expect(panelPowerFindings(panel({ batteryAh: 4 }), fireZones, TODAY)).toEqual([]);
    const findings = panelPowerFindings(panel({ batteryAh: 2.3 }), fireZones, TODAY);
    expect(codes(findings)).toEqual(['standby_battery_short']);
    expect(findings[0]).toMatchObject({ severity: 'error', field: 'batteryAh', evidence: 'public', lifeSafety: true });
    expect(findings[0]?.message).toBe(
      'The 2.3 Ah battery is too small: 120 mA for 24 h and 900 mA for 4 min need 2.94 Ah, 3.528 Ah with 20% headroom. Fit a battery of at least 3.528 Ah or lower the standby load.',
    );
  });

  it('passes a battery of exactly the required size and fails one just under', () => {
    // 3.528 Ah required — references.md 4.19 (PUBLIC) plus 20% (common practice, no published source)
    expect(codes(panelPowerFindings(panel({ batteryAh: 3.528 }), fireZones, TODAY))).toEqual([]);
    expect(codes(panelPowerFindings(panel({ batteryAh: 3.5 }), fireZones, TODAY))).toEqual(['standby_battery_short']);
  });

  it('sizes a commercial fire panel for 5 min of alarm, so 3.53 Ah passes a household panel and fails a commercial one', () => {
    // household 3.528 Ah (4.19, PUBLIC); commercial 3.546 Ah (NFPA 72 §10.6.7.2.1, from memory)
    expect(codes(panelPowerFindings(panel({ batteryAh: 3.53 }), fireZones, TODAY))).toEqual([]);
    const commercial = panelPowerFindings(panel({ batteryAh: 3.53, occupancy: 'commercial' }), fireZones, TODAY);
    expect(codes(commercial)).toEqual(['standby_battery_short']);
    expect(commercial[0]).toMatchObject({ severity: 'error', evidence: 'memory' });
    expect(commercial[0]?.message).toContain('900 mA for 5 min need 2.955 Ah, 3.546 Ah with 20% headroom');
  });

  it('on an intrusion-only panel, sizes for 4 h and only warns', () => {
    // UL 1023 4 h standby (from memory): 0.648 Ah required for 120/900 mA
    expect(codes(panelPowerFindings(panel({ batteryAh: 0.7 }), intrusionZones, TODAY))).toEqual([]);
    const small = panelPowerFindings(panel({ batteryAh: 0.6 }), intrusionZones, TODAY);
    expect(small).toEqual([expect.objectContaining({ code: 'standby_battery_short', severity: 'warning', lifeSafety: false })]);
  });

  it('asks for the currents and the battery size when any is missing, naming the first missing field', () => {
    // NFPA 72 Ch. 29 24 h — references.md 4.19 (PUBLIC)
    const noStandby = panelPowerFindings(panel({ standbyCurrentMa: null }), fireZones, TODAY);
    expect(noStandby).toEqual([expect.objectContaining({ code: 'standby_battery_unknown', severity: 'warning', field: 'standbyCurrentMa', lifeSafety: true })]);
    expect(noStandby[0]?.message).toContain('runs 24 h on battery and then 4 min in alarm (household fire)');
    expect(panelPowerFindings(panel({ alarmCurrentMa: null }), fireZones, TODAY)[0]?.field).toBe('alarmCurrentMa');
    expect(panelPowerFindings(panel({ batteryAh: null }), fireZones, TODAY)[0]?.field).toBe('batteryAh');
    expect(panelPowerFindings(panel({ batteryAh: null }), intrusionZones, TODAY)[0]).toMatchObject({ severity: 'info', lifeSafety: false });
  });
});

describe('standby battery age', () => {
  it('is due 5 years after the date on its label', () => {
    // sealed lead-acid 5 years — NFPA 72 Ch. 14 (from memory); common practice
    expect(standbyBatteryDueOn('2020-03-01')).toBe('2025-03-01');
    expect(standbyBatteryDueOn('2020-02-29')).toBe('2025-02-28');
  });

  it('is an error on a fire panel on the due day and nothing the day before', () => {
    // sealed lead-acid 5 years — from memory; common practice
    const made = panel({ batteryManufacturedOn: '2020-03-01' });
    expect(panelPowerFindings(made, fireZones, '2025-02-28')).toEqual([]);
    const due = panelPowerFindings(made, fireZones, '2025-03-01');
    expect(due).toEqual([expect.objectContaining({ code: 'standby_battery_old', severity: 'error', evidence: 'memory', field: 'batteryManufacturedOn' })]);
    expect(due[0]?.message).toBe('The standby battery was made on 2020-03-01 and was due for replacement on 2025-03-01. Replace it.');
    // an intrusion-only panel: a warning
    expect(panelPowerFindings(made, intrusionZones, '2025-03-01')[0]).toMatchObject({ code: 'standby_battery_old', severity: 'warning', lifeSafety: false });
  });

  it('asks for the label date when it is missing', () => {
    // from memory; common practice
    expect(panelPowerFindings(panel({ batteryManufacturedOn: null }), fireZones, TODAY)).toEqual([
      expect.objectContaining({ code: 'standby_battery_age_unknown', severity: 'warning', evidence: 'memory', lifeSafety: true }),
    ]);
    expect(panelPowerFindings(panel({ batteryManufacturedOn: null }), intrusionZones, TODAY)[0]?.severity).toBe('info');
  });
});

describe('single-path fire reporting (NFPA 72-2013)', () => {
  const pathFindings = (commPath: CommPath, pathFailureReportMin: number | null, zones: PanelPowerZone[] = fireZones) =>
    panelPowerFindings(panel({ commPath, pathFailureReportMin }), zones, TODAY);

  it('allows at most 5 minutes for a path failure to reach the monitoring center', () => {
    // NFPA 72-2013, one communications technology: failure annunciated within 5 min — references.md 3.13 (PUBLIC)
    expect(SINGLE_PATH_FAILURE_REPORT_MAX_MIN).toBe(5);
  });

  it('a phone line alone is an error', () => {
    // NFPA 72-2013 single path within 5 min — references.md 3.13 (PUBLIC); second path for a digital communicator §26.6.4 (from memory)
    const findings = pathFindings('phone_line', null);
    expect(findings).toEqual([expect.objectContaining({ code: 'fire_phone_line_only', severity: 'error', field: 'commPath', evidence: 'public', lifeSafety: true })]);
    expect(findings[0]?.clause).toContain('NFPA 72-2013 §26.6.3');
    expect(findings[0]?.clause).toContain('within 5 min');
    // even with a failure time recorded
    expect(codes(pathFindings('phone_line', 3))).toEqual(['fire_phone_line_only']);
  });

  it('cellular with no failure time recorded is a warning', () => {
    // NFPA 72-2013 single path within 5 min — references.md 3.13 (PUBLIC)
    const findings = pathFindings('cellular', null);
    expect(findings).toEqual([expect.objectContaining({ code: 'fire_single_path_unknown', severity: 'warning', field: 'pathFailureReportMin', evidence: 'public' })]);
    expect(findings[0]?.message).toContain('one path (cellular)');
    expect(pathFindings('ip', null)[0]?.message).toContain('one path (internet)');
  });

  it('cellular reporting its failure after 10 min is an error, after 5 or 3 min nothing', () => {
    // NFPA 72-2013 single path within 5 min — references.md 3.13 (PUBLIC)
    const late = pathFindings('cellular', 10);
    expect(late).toEqual([expect.objectContaining({ code: 'fire_single_path_unsupervised', severity: 'error', evidence: 'public' })]);
    expect(late[0]?.message).toContain('after 10 minutes; NFPA 72 allows at most 5');
    expect(codes(pathFindings('cellular', 6))).toEqual(['fire_single_path_unsupervised']);
    expect(pathFindings('cellular', 5)).toEqual([]);
    expect(pathFindings('cellular', 3)).toEqual([]);
    expect(pathFindings('ip', 3)).toEqual([]);
  });

  it('a combination of two paths needs nothing, whatever the failure time', () => {
    // NFPA 72-2013: the 5-minute rule is for one communications technology — references.md 3.13 (PUBLIC)
    expect(pathFindings('combination', null)).toEqual([]);
    expect(pathFindings('combination', 60)).toEqual([]);
  });

  it('an intrusion-only panel has no fire path rule', () => {
    // references.md 3.13 (PUBLIC) speaks of fire alarm communication; intrusion is not held to it
    expect(pathFindings('phone_line', null, intrusionZones)).toEqual([]);
    expect(pathFindings('cellular', null, intrusionZones)).toEqual([]);
    expect(pathFindings('cellular', 30, intrusionZones)).toEqual([]);
  });

  it('counts only fire and CO zones that report to the monitoring center, and CO alone is enough', () => {
    // references.md 3.13 (PUBLIC) for fire; CO held to the same by Mullion (from memory)
    expect(codes(pathFindings('phone_line', null, [...intrusionZones, zone('co')]))).toEqual(['fire_phone_line_only']);
    expect(pathFindings('phone_line', null, [...intrusionZones, zone('smoke', { reportsToMonitoring: false })])).toEqual([]);
    expect(pathFindings('phone_line', null, [...intrusionZones, zone('smoke', { status: 'removed' })])).toEqual([]);
  });
});

describe('all panel-power findings together', () => {
  it('come battery first, then the path, each carrying a clause', () => {
    const findings = panelPowerFindings(panel({ batteryAh: 2.3, batteryManufacturedOn: '2019-01-01', commPath: 'phone_line' }), fireZones, TODAY);
    expect(codes(findings)).toEqual(['standby_battery_short', 'standby_battery_old', 'fire_phone_line_only']);
    for (const f of findings) {
      expect(f.clause.length, f.code).toBeGreaterThan(20);
      expect(f.message, f.code).not.toMatch(/from memory/i);
      if (f.evidence === 'memory') expect(f.clause, f.code).toContain('from memory');
    }
  });
});
