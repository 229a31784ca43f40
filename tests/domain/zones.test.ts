/** Zone rules: defaults by device type, next free number, clashes, serials elsewhere, change log. */
import { describe, expect, it } from 'vitest';
import { DEVICE_TYPES, LIFE_SAFETY_DEVICE_TYPES, LIFE_SAFETY_ZONE_TYPES, ZONE_TYPES } from '@domain/devices';
import { checkLifeSafetyZone } from '@domain/life-safety-zone';
import {
  ZONE_CHANGE_FIELDS,
  ZONE_DEFAULTS,
  marksPanelChanged,
  nextFreeZoneNumber,
  occupyingZones,
  serialElsewhereNote,
  serialsElsewhere,
  zoneChangeSet,
  zoneDefaultsFor,
  zoneProblems,
  zoneWarnings,
  type PanelRange,
  type ZoneLike,
} from '@domain/zones';

const panel: PanelRange = { zoneCapacity: 64, wirelessZoneFrom: 9, wirelessZoneTo: 16 };

function zone(overrides: Partial<ZoneLike> & Pick<ZoneLike, 'id' | 'number'>): ZoneLike {
  return { serial: '', input: 1, status: 'active', ...overrides };
}

describe('zone defaults by device type', () => {
  it('gives every device type a default with a known zone type', () => {
    for (const type of DEVICE_TYPES) {
      expect(ZONE_DEFAULTS[type], type).toBeDefined();
      expect(ZONE_TYPES, type).toContain(ZONE_DEFAULTS[type].zoneType);
    }
    expect(Object.keys(ZONE_DEFAULTS).sort()).toEqual([...DEVICE_TYPES].sort());
  });

  it('makes a window contact perimeter, reported, chime and supervised (product.md)', () => {
    expect(zoneDefaultsFor('window_contact')).toEqual({
      zoneType: 'perimeter',
      reportsToMonitoring: true,
      chime: true,
      supervised: true,
    });
  });

  it('makes the doors people use entry/exit, with chime (product.md)', () => {
    for (const type of ['door_contact', 'sliding_door_contact', 'garage_door_tilt'] as const) {
      expect(zoneDefaultsFor(type), type).toEqual({
        zoneType: 'entry_exit',
        reportsToMonitoring: true,
        chime: true,
        supervised: true,
      });
    }
  });

  it('makes motion an interior follower without chime (product.md)', () => {
    expect(zoneDefaultsFor('motion')).toEqual({
      zoneType: 'interior_follower',
      reportsToMonitoring: true,
      chime: false,
      supervised: true,
    });
  });

  it('makes glass-break perimeter', () => {
    expect(zoneDefaultsFor('glass_break').zoneType).toBe('perimeter');
  });

  it('makes life-safety and environmental devices always armed, reported, supervised and silent on chime', () => {
    const expected = {
      smoke: 'fire_24h',
      smoke_detector: 'fire_24h',
      // a combination alarm's first input; its CO input is enrolled as a second zone on co_24h
      smoke_co: 'fire_24h',
      heat: 'fire_24h',
      co: 'co_24h',
      water: 'water_24h',
      temperature: 'temperature_24h',
      panic_button: 'panic_audible',
    } as const;
    for (const [type, zoneType] of Object.entries(expected) as [keyof typeof expected, string][]) {
      expect(zoneDefaultsFor(type), type).toEqual({ zoneType, reportsToMonitoring: true, chime: false, supervised: true });
    }
  });

  it('enrols every life-safety device so that it passes the life-safety zone check', () => {
    // CP-01 §4.2.5.1 fire exempt from the abort window — references.md 1.14 (PUBLIC): the default is a life-safety zone,
    // reported and supervised, so a zone made from the defaults counts as protection at once.
    for (const type of LIFE_SAFETY_DEVICE_TYPES) {
      const defaults = zoneDefaultsFor(type);
      expect(LIFE_SAFETY_ZONE_TYPES, type).toContain(defaults.zoneType);
      const check = checkLifeSafetyZone({ id: type, description: type, deviceType: type, status: 'active', serial: 'S1', ...defaults });
      // a combination alarm enrolled once still lacks its CO zone; nothing else may be wrong
      expect(check.problems.map((p) => p.code), type).toEqual(type === 'smoke_co' ? ['combination_half_missing'] : []);
      expect(check.protects.length, type).toBeGreaterThan(0);
    }
    // and no other device type defaults to a life-safety zone
    for (const type of DEVICE_TYPES.filter((t) => !LIFE_SAFETY_DEVICE_TYPES.includes(t))) {
      expect(LIFE_SAFETY_ZONE_TYPES, type).not.toContain(zoneDefaultsFor(type).zoneType);
    }
  });

  it('makes keyfobs, keypads, sirens and other devices monitor only, not reported and without chime', () => {
    for (const type of ['keyfob', 'keypad', 'siren', 'other'] as const) {
      const defaults = zoneDefaultsFor(type);
      expect(defaults.zoneType, type).toBe('monitor_only');
      expect(defaults.reportsToMonitoring, type).toBe(false);
      expect(defaults.chime, type).toBe(false);
    }
  });

  it('supervises keypads and sirens but not keyfobs, which leave the premises (common practice, no published source)', () => {
    expect(zoneDefaultsFor('keypad').supervised).toBe(true);
    expect(zoneDefaultsFor('siren').supervised).toBe(true);
    expect(zoneDefaultsFor('keyfob').supervised).toBe(false);
  });

  it('returns a copy that can be edited without changing the table', () => {
    const defaults = zoneDefaultsFor('window_contact');
    defaults.chime = false;
    expect(ZONE_DEFAULTS.window_contact.chime).toBe(true);
  });
});

describe('occupyingZones', () => {
  it('leaves out removed zones and keeps active and bypassed ones', () => {
    const zones = [
      zone({ id: 'a', number: 9, status: 'active' }),
      zone({ id: 'b', number: 10, status: 'bypassed' }),
      zone({ id: 'c', number: 11, status: 'removed' }),
    ];
    expect(occupyingZones(zones).map((z) => z.id)).toEqual(['a', 'b']);
  });
});

describe('nextFreeZoneNumber', () => {
  it('starts at the bottom of the wireless range on an empty panel', () => {
    expect(nextFreeZoneNumber(panel, [])).toBe(9);
  });

  it('skips used numbers and finds the lowest gap', () => {
    const zones = [zone({ id: 'a', number: 9 }), zone({ id: 'b', number: 10 }), zone({ id: 'c', number: 12 })];
    expect(nextFreeZoneNumber(panel, zones)).toBe(11);
  });

  it('ignores zones outside the wireless range', () => {
    const zones = [zone({ id: 'h1', number: 1 }), zone({ id: 'h2', number: 2 })];
    expect(nextFreeZoneNumber(panel, zones)).toBe(9);
  });

  it('counts a bypassed zone as using its number', () => {
    expect(nextFreeZoneNumber(panel, [zone({ id: 'a', number: 9, status: 'bypassed' })])).toBe(10);
  });

  it('gives back the number of a removed zone', () => {
    const zones = [zone({ id: 'a', number: 9, status: 'removed' }), zone({ id: 'b', number: 10 })];
    expect(nextFreeZoneNumber(panel, zones)).toBe(9);
  });

  it('is null when every number in the range is used', () => {
    const zones = Array.from({ length: 8 }, (_, i) => zone({ id: `z${i}`, number: 9 + i }));
    expect(nextFreeZoneNumber(panel, zones)).toBeNull();
  });

  it('stops at the panel capacity even when the wireless range runs past it', () => {
    const small: PanelRange = { zoneCapacity: 10, wirelessZoneFrom: 9, wirelessZoneTo: 32 };
    expect(nextFreeZoneNumber(small, [zone({ id: 'a', number: 9 })])).toBe(10);
    expect(nextFreeZoneNumber(small, [zone({ id: 'a', number: 9 }), zone({ id: 'b', number: 10 })])).toBeNull();
  });

  it('is null for an empty range', () => {
    expect(nextFreeZoneNumber({ zoneCapacity: 64, wirelessZoneFrom: 20, wirelessZoneTo: 10 }, [])).toBeNull();
  });
});

describe('zoneProblems', () => {
  const frontDoor = zone({ id: 'z12', number: 12, serial: '0412877', input: 1, description: 'Front door' });

  it('finds nothing wrong with a free number and a new serial', () => {
    expect(zoneProblems({ number: 13, serial: '0412878', input: 1 }, panel, [frontDoor])).toEqual([]);
  });

  it('refuses a number already used and names the zone that has it', () => {
    expect(zoneProblems({ number: 12, serial: '', input: 1 }, panel, [frontDoor])).toEqual([
      {
        code: 'zone_number_taken',
        field: 'number',
        message: 'Zone 12 is already “Front door” on this panel. Choose another number or edit zone 12.',
        clashZoneId: 'z12',
      },
    ]);
  });

  it('words a number clash without a description', () => {
    const [problem] = zoneProblems({ number: 12, serial: '', input: 1 }, panel, [zone({ id: 'z12', number: 12 })]);
    expect(problem?.message).toBe('Zone 12 is already in use on this panel. Choose another number or edit zone 12.');
  });

  it('refuses the same serial and input with the message of design-language.md', () => {
    const problems = zoneProblems({ number: 13, serial: '0412877', input: 1 }, panel, [frontDoor]);
    expect(problems).toEqual([
      {
        code: 'serial_input_taken',
        field: 'serial',
        message: 'Serial 0412877 input 1 is already zone 12 on this panel. Choose another input or edit zone 12.',
        clashZoneId: 'z12',
      },
    ]);
  });

  it('accepts the same serial on another input (one transmitter, several contacts)', () => {
    expect(zoneProblems({ number: 13, serial: '0412877', input: 2 }, panel, [frontDoor])).toEqual([]);
  });

  it('keeps leading zeros: "0412877" and "412877" are different serials', () => {
    expect(zoneProblems({ number: 13, serial: '412877', input: 1 }, panel, [frontDoor])).toEqual([]);
    const other = zone({ id: 'z14', number: 14, serial: '412877', input: 1 });
    expect(zoneProblems({ number: 13, serial: '0412877', input: 1 }, panel, [other])).toEqual([]);
  });

  it('never treats an empty serial as a clash', () => {
    const noSerial = zone({ id: 'z14', number: 14, serial: '', input: 1 });
    expect(zoneProblems({ number: 13, serial: '', input: 1 }, panel, [noSerial])).toEqual([]);
  });

  it('lets a zone keep its own number and serial when it is edited', () => {
    expect(zoneProblems({ id: 'z12', number: 12, serial: '0412877', input: 1 }, panel, [frontDoor])).toEqual([]);
  });

  it('still refuses another zone’s number when a zone is edited', () => {
    const den = zone({ id: 'z13', number: 13, serial: '0500001', input: 1, description: 'Den window' });
    const problems = zoneProblems({ id: 'z13', number: 12, serial: '0500001', input: 1 }, panel, [frontDoor, den]);
    expect(problems.map((p) => [p.code, p.clashZoneId])).toEqual([['zone_number_taken', 'z12']]);
  });

  it('lets a removed zone’s number and serial be used again', () => {
    const removed = { ...frontDoor, status: 'removed' as const };
    expect(zoneProblems({ number: 12, serial: '0412877', input: 1 }, panel, [removed])).toEqual([]);
  });

  it('counts a bypassed zone as holding its number and serial', () => {
    const bypassed = { ...frontDoor, status: 'bypassed' as const };
    expect(zoneProblems({ number: 12, serial: '0412877', input: 1 }, panel, [bypassed]).map((p) => p.code)).toEqual([
      'zone_number_taken',
      'serial_input_taken',
    ]);
  });

  it('refuses a number beyond the panel capacity', () => {
    expect(zoneProblems({ number: 65, serial: '', input: 1 }, panel, [])).toEqual([
      {
        code: 'over_capacity',
        field: 'number',
        message: "Zone 65 is beyond this panel's 64 zones. Choose a number from 1 to 64.",
      },
    ]);
    expect(zoneProblems({ number: 64, serial: '', input: 1 }, panel, [])).toEqual([]);
  });

  it('refuses zone 0 and negative numbers', () => {
    for (const number of [0, -3]) {
      const [problem] = zoneProblems({ number, serial: '', input: 1 }, panel, []);
      expect(problem?.code, String(number)).toBe('over_capacity');
      expect(problem?.message).toBe('Zone numbers start at 1. Choose a number from 1 to 64.');
    }
  });

  it('does not refuse a number outside the wireless range: hardwired zones exist', () => {
    expect(zoneProblems({ number: 3, serial: '', input: 1 }, panel, [])).toEqual([]);
  });
});

describe('zoneWarnings', () => {
  it('notes a number outside the wireless range without blocking it', () => {
    expect(zoneWarnings({ number: 3, serial: '', input: 1 }, panel)).toEqual([
      {
        code: 'outside_wireless_range',
        field: 'number',
        message:
          "Zone 3 is outside this panel's wireless zones (9–16). That is fine for a hardwired zone; for a wireless device, choose a number in the range.",
      },
    ]);
  });

  it('is quiet inside the range, including both ends', () => {
    for (const number of [9, 12, 16]) expect(zoneWarnings({ number, serial: '', input: 1 }, panel), String(number)).toEqual([]);
  });

  it('leaves a number beyond capacity to zoneProblems', () => {
    expect(zoneWarnings({ number: 99, serial: '', input: 1 }, panel)).toEqual([]);
  });
});

describe('serialsElsewhere', () => {
  const elsewhere = [
    { serial: '0412877', panelLabel: 'Panel 1', siteName: '12 Elm Street', number: 4 },
    { serial: '412877', panelLabel: 'Panel 1', siteName: '40 Oak Avenue', number: 9 },
    { serial: '', panelLabel: 'Garage panel', siteName: '40 Oak Avenue', number: 2 },
  ];

  it('lists the places that use exactly the same serial', () => {
    expect(serialsElsewhere('0412877', elsewhere)).toEqual([elsewhere[0]]);
    expect(serialsElsewhere('412877', elsewhere)).toEqual([elsewhere[1]]);
  });

  it('finds nothing for a new serial or an empty one', () => {
    expect(serialsElsewhere('0999999', elsewhere)).toEqual([]);
    expect(serialsElsewhere('', elsewhere)).toEqual([]);
  });

  it('words a place as a flag', () => {
    expect(serialElsewhereNote(elsewhere[0]!)).toBe('Serial 0412877 is also zone 4 on Panel 1 at 12 Elm Street.');
  });
});

describe('zoneChangeSet', () => {
  const before = {
    number: 12,
    description: 'Front door',
    serial: '0412877',
    chime: true,
    installedOn: new Date('2024-05-01T00:00:00Z'),
    notes: null,
  };

  it('is empty when nothing changed, comparing dates by value', () => {
    const after = { ...before, installedOn: new Date('2024-05-01T00:00:00Z') };
    expect(zoneChangeSet(before, after, Object.keys(before))).toEqual({});
  });

  it('lists only the changed fields with old and new values', () => {
    const after = { ...before, description: 'Front door (hall)', chime: false, serial: '412877' };
    expect(zoneChangeSet(before, after, Object.keys(before))).toEqual({
      description: ['Front door', 'Front door (hall)'],
      serial: ['0412877', '412877'],
      chime: [true, false],
    });
  });

  it('sees a changed date and a number that became a string', () => {
    const after = { ...before, number: '12', installedOn: new Date('2024-05-02T00:00:00Z') };
    const changes = zoneChangeSet(before, after, Object.keys(before));
    expect(Object.keys(changes)).toEqual(['number', 'installedOn']);
  });

  it('treats missing and null alike and logs null', () => {
    expect(zoneChangeSet({ notes: null }, {}, ['notes'])).toEqual({});
    expect(zoneChangeSet({}, { notes: 'Behind the sofa' }, ['notes'])).toEqual({ notes: [null, 'Behind the sofa'] });
  });

  it('looks only at the fields it is given', () => {
    expect(zoneChangeSet(before, { ...before, chime: false }, ['description'])).toEqual({});
  });
});

describe('marksPanelChanged', () => {
  it('lists the programmed zone fields', () => {
    expect([...ZONE_CHANGE_FIELDS].sort()).toEqual(
      ['number', 'description', 'deviceType', 'zoneType', 'serial', 'input', 'reportsToMonitoring', 'chime', 'supervised', 'status'].sort(),
    );
  });

  it('is true for a change to any programmed field', () => {
    for (const field of ZONE_CHANGE_FIELDS) expect(marksPanelChanged({ [field]: [1, 2] }), field).toBe(true);
  });

  it('is false for record-keeping fields such as dates and battery type', () => {
    expect(marksPanelChanged({})).toBe(false);
    expect(marksPanelChanged({ batteryChangedOn: ['2023-01-01', '2025-01-01'], batteryType: ['CR2032', 'CR2450'] })).toBe(false);
  });

  it('works on a change set from zoneChangeSet', () => {
    const before = { serial: '0412877', batteryType: 'CR2032' };
    expect(marksPanelChanged(zoneChangeSet(before, { ...before, batteryType: 'CR2450' }, ['serial', 'batteryType']))).toBe(false);
    expect(marksPanelChanged(zoneChangeSet(before, { ...before, serial: '0412878' }, ['serial', 'batteryType']))).toBe(true);
  });
});
