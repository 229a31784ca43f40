/** CP-01 audit of a panel's false-alarm-reduction settings, each check beside its references.md row. */
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

const burglaryZones: Cp01Zone[] = [
  { zoneType: 'entry_exit', status: 'active' },
  { zoneType: 'perimeter', status: 'active' },
];

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
    expect(finding).toEqual({
      code: 'abort_window_on_fire_zones',
      severity: 'warning',
      field: 'abortWindowSec',
      clause: 'CP-01 §4.2.5.1 abort window (fire zones exempt)',
      evidence: 'public',
      message: 'This panel has 2 fire zones and a 30 s abort window. Check that fire zones report at once: CP-01 exempts them from any abort window.',
    });
  });

  it('says nothing about fire zones when they are removed or the abort window is 0', () => {
    expect(codes(audit({}, [{ zoneType: 'fire_24h', status: 'removed' }]))).toEqual([]);
    expect(codes(audit({ abortWindowSec: 0 }, [{ zoneType: 'fire_24h', status: 'active' }]))).toEqual(['abort_window_off']);
  });

  it('counts only fire zones, not CO or burglary zones', () => {
    expect(audit({}, [{ zoneType: 'co_24h', status: 'active' }])).toEqual([]);
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
  const findings = audit(worst, [{ zoneType: 'fire_24h', status: 'active' }]);

  it('lists every problem once, in the order of the settings', () => {
    expect(codes(findings)).toEqual([
      'exit_delay_too_short',
      'entry_delay_too_short',
      'entry_delay_too_long',
      'entry_plus_abort_too_long',
      'abort_window_out_of_range',
      'abort_window_on_fire_zones',
      'swinger_limit_out_of_range',
      'cancel_window_too_short',
      'exit_restart_off',
      'auto_stay_off',
      'cross_zone_window',
    ]);
  });

  it('says "(from memory)" in every finding from memory and nowhere else', () => {
    for (const finding of findings) {
      expect(finding.message.includes('(from memory)'), finding.code).toBe(finding.evidence === 'memory');
    }
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
