/**
 * CP-01 audit of a panel's false-alarm-reduction settings, each check beside its references.md row.
 * Zones are invented and built from their device type's defaults (zones.ts) unless a test changes them.
 */
import { describe, expect, it } from 'vitest';
import {
  CP01_DEFAULTS,
  CP01_ENTRY_PLUS_ABORT_MAX_SEC,
  CP01_RANGES,
  auditPanelSettings,
  type Cp01Finding,
  type Cp01Zone,
  type PanelSettings,
} from '@domain/cp01';
import type { DeviceType, ZoneStatus, ZoneType } from '@domain/devices';
import { zoneDefaultsFor } from '@domain/zones';

/** A zone as the technician enrols it: the zone type from its device type's defaults (zones.ts), unless given. */
function deviceZone(deviceType: DeviceType, number: number, description: string, changes: { zoneType?: ZoneType; status?: ZoneStatus } = {}): Cp01Zone {
  return { deviceType, number, description, zoneType: zoneDefaultsFor(deviceType).zoneType, status: 'active', ...changes };
}

const burglaryZones: Cp01Zone[] = [deviceZone('door_contact', 1, 'Front door'), deviceZone('window_contact', 2, 'Kitchen window')];

function audit(changes: Partial<PanelSettings>, zones: Cp01Zone[] = burglaryZones): Cp01Finding[] {
  return auditPanelSettings({ ...CP01_DEFAULTS, ...changes }, zones);
}

function codes(findings: Cp01Finding[]): string[] {
  return findings.map((f) => f.code);
}

function only(findings: Cp01Finding[]): Cp01Finding {
  expect(findings).toHaveLength(1);
  return findings[0]!;
}

describe('CP01_DEFAULTS', () => {
  it('holds the CP-01 defaults', () => {
    // ANSI/SIA CP-01 §4.2.2.1 exit time default 60 s — references.md 1.3 (from memory)
    expect(CP01_DEFAULTS.exitDelaySec).toBe(60);
    // ANSI/SIA CP-01 §4.2.3.1 entry delay default 30 s — references.md 1.10 (from memory)
    expect(CP01_DEFAULTS.entryDelaySec).toBe(30);
    expect(CP01_DEFAULTS.entryDelay2Sec).toBe(30);
    // ANSI/SIA CP-01 §4.2.5.1 abort window default 30 s — references.md 1.12 (PUBLIC)
    expect(CP01_DEFAULTS.abortWindowSec).toBe(30);
    // ANSI/SIA CP-01-2010 swinger shutdown default 2 — references.md 1.19 (PUBLIC)
    expect(CP01_DEFAULTS.swingerLimit).toBe(2);
    // ANSI/SIA CP-01 cancel window 5 min — references.md 1.17 (from memory)
    expect(CP01_DEFAULTS.cancelWindowMin).toBe(5);
    // ANSI/SIA CP-01 §4.2.2.3 exit time restart on by default — references.md 1.6 (from memory)
    expect(CP01_DEFAULTS.exitRestart).toBe(true);
    // ANSI/SIA CP-01 §4.2.2.5 auto-stay on by default — references.md 1.8 (from memory)
    expect(CP01_DEFAULTS.autoStay).toBe(true);
    // ANSI/SIA CP-01 cross zoning default off — references.md 1.21 (from memory)
    expect(CP01_DEFAULTS.crossZoning).toBe(false);
    // Our own default window, not a value from the standard.
    expect(CP01_DEFAULTS.crossZoneWindowSec).toBe(60);
    expect(CP01_DEFAULTS.duress).toBe(false);
  });

  it('passes its own audit, with fire zones on the panel too', () => {
    expect(auditPanelSettings(CP01_DEFAULTS, burglaryZones)).toEqual([]);
    expect(codes(auditPanelSettings(CP01_DEFAULTS, [...burglaryZones, { zoneType: 'fire_24h', status: 'active' }]))).toEqual([
      'abort_window_on_fire_zones',
    ]);
  });

  it('has exactly the settings of the panel form', () => {
    expect(Object.keys(CP01_DEFAULTS).sort()).toEqual(
      [
        'exitDelaySec',
        'entryDelaySec',
        'entryDelay2Sec',
        'abortWindowSec',
        'swingerLimit',
        'cancelWindowMin',
        'exitRestart',
        'autoStay',
        'crossZoning',
        'crossZoneWindowSec',
        'duress',
      ].sort(),
    );
  });
});

describe('CP01_RANGES', () => {
  it('gives forms the ranges the audit checks', () => {
    // ANSI/SIA CP-01 §4.2.2.1 exit time 45 s (PUBLIC, 1.1) to 255 s (from memory, 1.2)
    expect(CP01_RANGES.exitDelaySec).toEqual({ min: 45, max: 255, unit: 's' });
    // ANSI/SIA CP-01 §4.2.3.1 entry delay 30 s–4 min — references.md 1.9 (from memory)
    expect(CP01_RANGES.entryDelaySec).toEqual({ min: 30, max: 240, unit: 's' });
    expect(CP01_RANGES.entryDelay2Sec).toEqual({ min: 30, max: 240, unit: 's' });
    // ANSI/SIA CP-01-2010 abort window 0 s (PUBLIC, 1.13) to 45 s (PUBLIC, 1.11)
    expect(CP01_RANGES.abortWindowSec).toEqual({ min: 0, max: 45, unit: 's' });
    // ANSI/SIA CP-01-2010 swinger shutdown 1–6 — references.md 1.18 (PUBLIC)
    expect(CP01_RANGES.swingerLimit).toEqual({ min: 1, max: 6, unit: 'trips' });
    // ANSI/SIA CP-01 cancel window ≥ 5 min — references.md 1.17 (from memory)
    expect(CP01_RANGES.cancelWindowMin).toEqual({ min: 5, max: null, unit: 'min' });
    // Entry delay + abort window ≤ 60 s — references.md 1.15 (from memory)
    expect(CP01_ENTRY_PLUS_ABORT_MAX_SEC).toBe(60);
  });
});

describe('exit delay', () => {
  it('refuses less than 45 s as an error from public text', () => {
    // ANSI/SIA CP-01 §4.2.2.1 exit time minimum 45 s — references.md 1.1 (PUBLIC)
    const finding = only(audit({ exitDelaySec: 44 }));
    expect(finding).toEqual({
      code: 'exit_delay_too_short',
      severity: 'error',
      field: 'exitDelaySec',
      clause: 'CP-01 §4.2.2.1 exit time',
      evidence: 'public',
      message: 'Exit delay is 44 s; CP-01 asks for at least 45 s. Set it to 45 s or more (60 s is the usual default).',
    });
    expect(audit({ exitDelaySec: 45 })).toEqual([]);
  });

  it('warns above 255 s, from memory', () => {
    // ANSI/SIA CP-01-2010 §4.2.2.1 exit time maximum 255 s — references.md 1.2 (from memory)
    const finding = only(audit({ exitDelaySec: 256 }));
    expect(finding).toMatchObject({ code: 'exit_delay_too_long', severity: 'warning', evidence: 'memory' });
    expect(finding.message).toBe('Exit delay is 256 s; CP-01 allows up to 255 s (from memory). Set it to 255 s or less.');
    expect(audit({ exitDelaySec: 255 })).toEqual([]);
  });
});

describe('entry delays', () => {
  it('warns below 30 s and above 4 minutes, from memory, for each entry delay', () => {
    // ANSI/SIA CP-01 §4.2.3.1 entry delay 30 s–4 min — references.md 1.9 (from memory)
    const short = only(audit({ entryDelaySec: 20 }));
    expect(short).toMatchObject({
      code: 'entry_delay_too_short',
      severity: 'warning',
      field: 'entryDelaySec',
      clause: 'CP-01 §4.2.3.1 entry delay',
      evidence: 'memory',
    });
    expect(short.message).toBe('Entry delay is 20 s; CP-01 allows 30 s to 4 minutes (from memory). Set it to 30 s or more.');

    const long = audit({ entryDelay2Sec: 241, abortWindowSec: 0 }).find((f) => f.code === 'entry_delay_too_long');
    expect(long).toMatchObject({ severity: 'warning', field: 'entryDelay2Sec', evidence: 'memory' });
    expect(long?.message).toBe('Second entry delay is 241 s; CP-01 allows 30 s to 4 minutes (from memory). Set it to 240 s or less.');
  });

  it('accepts both ends of the range', () => {
    expect(codes(audit({ entryDelaySec: 30, entryDelay2Sec: 30 }))).toEqual([]);
    expect(codes(audit({ entryDelaySec: 240, abortWindowSec: 0 }))).not.toContain('entry_delay_too_long');
  });
});

describe('entry delay plus abort window', () => {
  it('warns at 45 s entry + 30 s abort = 75 s, from memory', () => {
    // Entry delay + abort window ≤ 60 s (UL, referenced by CP-01) — references.md 1.15 (from memory)
    const finding = only(audit({ entryDelaySec: 45, abortWindowSec: 30 }));
    expect(finding).toMatchObject({
      code: 'entry_plus_abort_too_long',
      severity: 'warning',
      field: 'entryDelaySec',
      evidence: 'memory',
    });
    expect(finding.message).toBe('Entry delay (45 s) plus abort window (30 s) is 75 s; the limit is 60 s (from memory). Shorten one of them.');
  });

  it('accepts exactly 60 s', () => {
    // Entry delay + abort window ≤ 60 s — references.md 1.15 (from memory)
    expect(audit({ entryDelaySec: 30, abortWindowSec: 30 })).toEqual([]);
  });

  it('uses the longer of the two entry delays and names it', () => {
    const finding = only(audit({ entryDelaySec: 30, entryDelay2Sec: 40, abortWindowSec: 30 }));
    expect(finding.field).toBe('entryDelay2Sec');
    expect(finding.message).toContain('Second entry delay (40 s) plus abort window (30 s) is 70 s');
  });
});

describe('abort window', () => {
  it('refuses more than 45 s as an error from public text', () => {
    // ANSI/SIA CP-01 §4.2.5.1 abort window maximum 45 s — references.md 1.11 (PUBLIC)
    const findings = audit({ abortWindowSec: 46, entryDelaySec: 30 });
    const range = findings.find((f) => f.code === 'abort_window_out_of_range');
    expect(range).toEqual({
      code: 'abort_window_out_of_range',
      severity: 'error',
      field: 'abortWindowSec',
      clause: 'CP-01 §4.2.5.1 abort window',
      evidence: 'public',
      message: 'Abort window is 46 s; CP-01 allows 0 to 45 s. Set it within that range (30 s is the default).',
    });
  });

  it('refuses a negative abort window', () => {
    // ANSI/SIA CP-01-2010 abort window lower bound 0 s — references.md 1.13 (PUBLIC)
    expect(codes(audit({ abortWindowSec: -1 }))).toContain('abort_window_out_of_range');
  });

  it('allows no abort window since 2010, with a note', () => {
    // ANSI/SIA CP-01-2010 abort window may be 0 — references.md 1.13 (PUBLIC)
    const finding = only(audit({ abortWindowSec: 0 }));
    expect(finding).toMatchObject({ code: 'abort_window_off', severity: 'info', evidence: 'public' });
  });

  it('warns when the panel has fire zones and an abort window', () => {
    // ANSI/SIA CP-01 §4.2.5.1: fire zones exempt from any abort window — references.md 1.14 (PUBLIC)
    const zones: Cp01Zone[] = [...burglaryZones, { zoneType: 'fire_24h', status: 'active' }, { zoneType: 'fire_24h', status: 'bypassed' }];
    const finding = only(audit({}, zones));
    // Changed on purpose: the message now says "Check that they report at once" and covers CO as well.
    expect(finding).toEqual({
      code: 'abort_window_on_fire_zones',
      severity: 'warning',
      field: 'abortWindowSec',
      clause: 'CP-01 §4.2.5.1 abort window (fire zones exempt)',
      evidence: 'public',
      message: 'This panel has 2 fire zones and a 30 s abort window. Check that they report at once: CP-01 exempts fire from any abort window.',
    });
  });

  it('says nothing about fire zones when they are removed or the abort window is 0', () => {
    // ANSI/SIA CP-01-2010 abort window 0 allowed — references.md 1.13 (PUBLIC)
    expect(codes(audit({}, [{ zoneType: 'fire_24h', status: 'removed' }]))).toEqual([]);
    expect(codes(audit({ abortWindowSec: 0 }, [{ zoneType: 'fire_24h', status: 'active' }]))).toEqual(['abort_window_off']);
  });

  it('counts fire devices by device type too, whatever zone type they are on', () => {
    // ANSI/SIA CP-01 §4.2.5.1: fire exempt from any abort window — references.md 1.14 (PUBLIC)
    const zones = [...burglaryZones, deviceZone('smoke', 9, 'Hall smoke'), deviceZone('heat', 10, 'Kitchen heat', { zoneType: 'perimeter' })];
    const finding = audit({}, zones).find((f) => f.code === 'abort_window_on_fire_zones');
    expect(finding?.message).toContain('This panel has 2 fire zones and a 30 s abort window.');
    expect(finding?.evidence).toBe('public');
    // a combination alarm counts once, as fire
    const combo = audit({}, [deviceZone('smoke_co', 11, 'Landing smoke/CO'), deviceZone('smoke_co', 12, 'Landing smoke/CO', { zoneType: 'co_24h' })]);
    expect(only(combo).message).toContain('This panel has 2 fire zones and a 30 s abort window.');
  });

  it('holds CO zones to the same, from memory, and never burglary zones', () => {
    // CP-01 §4.2.5.1 names fire — references.md 1.14 (PUBLIC); Mullion holds CO to the same rule (from memory)
    // Changed on purpose: a CO-only panel used to get no finding here.
    const finding = only(audit({}, [{ zoneType: 'co_24h', status: 'active' }, deviceZone('co', 12, 'Hall CO')]));
    expect(finding).toMatchObject({ code: 'abort_window_on_fire_zones', severity: 'warning', evidence: 'memory' });
    expect(finding.message).toBe(
      'This panel has 2 CO zones and a 30 s abort window. Check that they report at once: CP-01 exempts fire from any abort window. CP-01 names fire zones; Mullion holds CO zones to the same (from memory).',
    );
    const both = only(audit({}, [deviceZone('smoke', 9, 'Hall smoke'), deviceZone('co', 12, 'Hall CO')]));
    expect(both.evidence).toBe('public');
    expect(both.message).toContain('1 fire zone and 1 CO zone');
    expect(audit({}, burglaryZones)).toEqual([]);
  });
});

describe('life-safety devices on the wrong zone type', () => {
  it('a smoke alarm on a perimeter zone is an error, on a fire zone it is not', () => {
    // ANSI/SIA CP-01 §4.2.5.1 fire exempt from the abort window — references.md 1.14 (PUBLIC); §4.3.2 swinger shutdown not on fire — references.md 1.20 (from memory)
    const onFire = audit({ abortWindowSec: 0 }, [...burglaryZones, deviceZone('smoke', 9, 'Hall smoke')]);
    const onPerimeter = audit({ abortWindowSec: 0 }, [...burglaryZones, deviceZone('smoke', 9, 'Hall smoke', { zoneType: 'perimeter' })]);
    expect(codes(onFire)).toEqual(['abort_window_off']);
    expect(codes(onPerimeter)).toEqual(['abort_window_off', 'life_safety_device_on_wrong_zone']);
    const finding = onPerimeter.find((f) => f.code === 'life_safety_device_on_wrong_zone')!;
    expect(finding).toMatchObject({ severity: 'error', evidence: 'public', field: null });
    expect(finding.clause).toContain('§4.2.5.1');
    expect(finding.message).toMatch(/^Zone 9 “Hall smoke” is a fire device on a “Perimeter \(instant\)” zone, so /);
    expect(finding.message).toContain('Set its zone type to Fire, always armed.');
  });

  it('names the abort window and swinger limit the panel would apply', () => {
    // ANSI/SIA CP-01 §4.2.5.1 — references.md 1.14 (PUBLIC); swinger limit 1–6 — references.md 1.18 (PUBLIC); fire exempt from swinger shutdown — references.md 1.20 (from memory)
    const finding = only(audit({ abortWindowSec: 15, swingerLimit: 3 }, [deviceZone('heat', 4, 'Kitchen heat', { zoneType: 'interior_instant' })]).filter((f) => f.code === 'life_safety_device_on_wrong_zone'));
    expect(finding.message).toContain('the 15 s abort window and swinger shutdown after 3 trips apply to it');
    expect(finding.message).toContain('(from memory)');
  });

  it('on a chime-only zone says it never raises an alarm', () => {
    // A chime-only zone never reports; fire must report at once — CP-01 §4.2.5.1, references.md 1.14 (PUBLIC)
    const finding = audit({}, [deviceZone('smoke_detector', 5, 'Corridor detector', { zoneType: 'monitor_only' })]).find((f) => f.code === 'life_safety_device_on_wrong_zone');
    expect(finding?.message).toContain('so it never raises an alarm at all');
  });

  it('wants a CO zone for a CO alarm, either zone type for a combination alarm, and a fire zone for heat', () => {
    // CO held to the fire exemptions of CP-01 §4.2.5.1 — references.md 1.14 (from memory for CO)
    const co = audit({}, [deviceZone('co', 6, 'Hall CO', { zoneType: 'fire_24h' })]).find((f) => f.code === 'life_safety_device_on_wrong_zone');
    expect(co?.message).toContain('is a CO device on a “Fire, always armed” zone');
    expect(co?.message).toContain('Set its zone type to CO, always armed.');
    const combo = audit({}, [deviceZone('smoke_co', 7, 'Landing smoke/CO', { zoneType: 'entry_exit' })]).find((f) => f.code === 'life_safety_device_on_wrong_zone');
    expect(combo?.message).toContain('Set its zone type to Fire, always armed or CO, always armed.');
    expect(codes(audit({}, [deviceZone('smoke_co', 7, 'Landing smoke/CO', { zoneType: 'co_24h' })]))).not.toContain('life_safety_device_on_wrong_zone');
    expect(codes(audit({}, [deviceZone('heat', 8, 'Loft heat', { zoneType: 'co_24h' })]))).toContain('life_safety_device_on_wrong_zone');
  });

  it('looks at bypassed zones (still programmed) but not removed ones, and not at other devices', () => {
    const wrong = { zoneType: 'perimeter' as const };
    expect(codes(audit({}, [deviceZone('smoke', 9, 'Hall smoke', { ...wrong, status: 'bypassed' })]))).toContain('life_safety_device_on_wrong_zone');
    expect(codes(audit({}, [deviceZone('smoke', 9, 'Hall smoke', { ...wrong, status: 'removed' })]))).toEqual([]);
    expect(codes(audit({}, [deviceZone('motion', 3, 'Hall motion', wrong), deviceZone('water', 4, 'Basement water', wrong)]))).toEqual([]);
    // a zone with no device type recorded is judged by its zone type alone
    expect(codes(audit({}, [{ zoneType: 'perimeter', status: 'active' }]))).toEqual([]);
  });

  it('names a zone without a number as "A zone"', () => {
    const finding = audit({}, [{ deviceType: 'smoke', zoneType: 'perimeter', status: 'active' }]).find((f) => f.code === 'life_safety_device_on_wrong_zone');
    expect(finding?.message).toMatch(/^A zone is a fire device/);
  });
});

describe('swinger limit', () => {
  it('refuses 0 and 7 trips as errors from public text, accepts 1 and 6', () => {
    // ANSI/SIA CP-01-2010 swinger shutdown 1–6 trips — references.md 1.18 (PUBLIC)
    for (const swingerLimit of [0, 7]) {
      const finding = only(audit({ swingerLimit }));
      expect(finding, String(swingerLimit)).toMatchObject({
        code: 'swinger_limit_out_of_range',
        severity: 'error',
        field: 'swingerLimit',
        evidence: 'public',
      });
    }
    expect(only(audit({ swingerLimit: 7 })).message).toBe(
      'Swinger limit is 7 trips; CP-01 allows 1 to 6. Set it within that range (2 is the default).',
    );
    expect(audit({ swingerLimit: 1 })).toEqual([]);
    expect(audit({ swingerLimit: 6 })).toEqual([]);
  });
});

describe('cancel window', () => {
  it('warns under 5 minutes, from memory', () => {
    // ANSI/SIA CP-01 cancel window ≥ 5 min — references.md 1.17 (from memory)
    const finding = only(audit({ cancelWindowMin: 4 }));
    expect(finding).toMatchObject({ code: 'cancel_window_too_short', severity: 'warning', evidence: 'memory' });
    expect(finding.message).toBe('Cancel window is 4 min; CP-01 asks for at least 5 min (from memory). Set it to 5 min or more.');
    expect(audit({ cancelWindowMin: 5 })).toEqual([]);
    expect(audit({ cancelWindowMin: 30 })).toEqual([]);
  });
});

describe('exit-time restart and auto-stay', () => {
  it('warns when exit-time restart is off, from memory', () => {
    // ANSI/SIA CP-01 §4.2.2.3 exit time restart required, on by default — references.md 1.6 (from memory)
    const finding = only(audit({ exitRestart: false }));
    expect(finding).toMatchObject({
      code: 'exit_restart_off',
      severity: 'warning',
      field: 'exitRestart',
      clause: 'CP-01 §4.2.2.3 exit time restart',
      evidence: 'memory',
    });
    expect(finding.message).toBe('Exit-time restart is off; CP-01 requires it (from memory). Turn it on.');
  });

  it('warns when auto-stay is off, from memory', () => {
    // ANSI/SIA CP-01 §4.2.2.5 auto-stay on unvacated premises, on by default — references.md 1.8 (from memory)
    const finding = only(audit({ autoStay: false }));
    expect(finding).toMatchObject({ code: 'auto_stay_off', severity: 'warning', field: 'autoStay', evidence: 'memory' });
    expect(finding.message).toContain('(from memory)');
  });
});

describe('cross zoning', () => {
  it('refuses cross zoning with no window (our own check)', () => {
    const finding = only(audit({ crossZoning: true, crossZoneWindowSec: 0 }));
    expect(finding).toMatchObject({ code: 'cross_zone_window', severity: 'error', field: 'crossZoneWindowSec' });
  });

  it('accepts cross zoning with a window, and any window when it is off', () => {
    expect(audit({ crossZoning: true, crossZoneWindowSec: 1 })).toEqual([]);
    expect(audit({ crossZoning: false, crossZoneWindowSec: 0 })).toEqual([]);
  });
});

describe('findings as a whole', () => {
  const worst: Partial<PanelSettings> = {
    exitDelaySec: 20,
    entryDelaySec: 10,
    entryDelay2Sec: 300,
    abortWindowSec: 90,
    swingerLimit: 0,
    cancelWindowMin: 1,
    exitRestart: false,
    autoStay: false,
    crossZoning: true,
    crossZoneWindowSec: 0,
  };
  const findings = audit(worst, [{ zoneType: 'fire_24h', status: 'active' }, deviceZone('smoke', 9, 'Hall smoke', { zoneType: 'perimeter' })]);

  it('lists every problem once, in the order of the settings', () => {
    expect(codes(findings)).toEqual([
      'exit_delay_too_short',
      'entry_delay_too_short',
      'entry_delay_too_long',
      'entry_plus_abort_too_long',
      'abort_window_out_of_range',
      'abort_window_on_fire_zones',
      'life_safety_device_on_wrong_zone',
      'swinger_limit_out_of_range',
      'cancel_window_too_short',
      'exit_restart_off',
      'auto_stay_off',
      'cross_zone_window',
    ]);
  });

  it('says "(from memory)" in every finding from memory, and elsewhere only beside the part that is', () => {
    for (const finding of findings) {
      if (finding.evidence === 'memory') expect(finding.message, finding.code).toContain('(from memory)');
    }
    // The wrong-zone finding rests on public text (abort window, references.md 1.14) but also names the
    // swinger exemption, which is from memory (references.md 1.20): the mark stands beside that part only.
    const mixed = findings.filter((f) => f.evidence === 'public' && f.message.includes('(from memory)'));
    expect(mixed.map((f) => f.code)).toEqual(['life_safety_device_on_wrong_zone']);
    expect(mixed[0]?.message).toMatch(/CP-01 exempts fire from swinger shutdown \(from memory\)\.$/);
  });

  it('makes only public-text ranges errors, apart from our own cross-zone check', () => {
    for (const finding of findings.filter((f) => f.severity === 'error' && f.code !== 'cross_zone_window')) {
      expect(finding.evidence, finding.code).toBe('public');
    }
    for (const finding of findings.filter((f) => f.evidence === 'memory' && f.code !== 'cross_zone_window')) {
      expect(finding.severity, finding.code).toBe('warning');
    }
  });

  it('writes every message in sentence case, ending with a full stop, and names a clause', () => {
    for (const finding of findings) {
      expect(finding.message, finding.code).toMatch(/^[A-Z][^A-Z]/);
      expect(finding.message, finding.code).toMatch(/\.$/);
      expect(finding.clause, finding.code).toMatch(/CP-01/);
    }
  });
});
