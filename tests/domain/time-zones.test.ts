import { afterEach, describe, expect, it, vi } from 'vitest';
import { isValidTimeZone, timeZoneOptions } from '@domain/time-zones';

afterEach(() => {
  vi.restoreAllMocks();
});

describe('isValidTimeZone', () => {
  it('accepts IANA zone names the runtime knows', () => {
    for (const tz of ['UTC', 'America/Chicago', 'America/New_York', 'America/Phoenix', 'Pacific/Honolulu', 'Europe/London']) {
      expect(isValidTimeZone(tz), tz).toBe(true);
    }
  });

  it('refuses empty, unknown, misspelt and over-long names', () => {
    for (const tz of ['', 'Mars/Olympus_Mons', 'America/Chicag', 'Chicago', 'not a zone', `America/${'x'.repeat(60)}`]) {
      expect(isValidTimeZone(tz), JSON.stringify(tz)).toBe(false);
    }
  });
});

describe('timeZoneOptions', () => {
  it('offers UTC once and the common US zones', () => {
    const zones = timeZoneOptions();
    expect(zones.filter((z) => z === 'UTC')).toHaveLength(1);
    expect(zones).toEqual(expect.arrayContaining(['America/New_York', 'America/Chicago', 'America/Denver', 'America/Los_Angeles']));
  });

  it('offers only zones that isValidTimeZone accepts, without duplicates', () => {
    const zones = timeZoneOptions();
    expect(new Set(zones).size).toBe(zones.length);
    expect(zones.filter((z) => !isValidTimeZone(z))).toEqual([]);
  });

  it('puts UTC first when the runtime list lacks it', () => {
    vi.spyOn(Intl, 'supportedValuesOf').mockReturnValue(['America/Chicago', 'Europe/London']);
    expect(timeZoneOptions()).toEqual(['UTC', 'America/Chicago', 'Europe/London']);
  });

  it('keeps the runtime list as it is when UTC is already in it', () => {
    vi.spyOn(Intl, 'supportedValuesOf').mockReturnValue(['America/Chicago', 'UTC']);
    expect(timeZoneOptions()).toEqual(['America/Chicago', 'UTC']);
  });

  it('falls back to UTC and the US zones when the runtime lists none', () => {
    vi.spyOn(Intl, 'supportedValuesOf').mockReturnValue([]);
    const zones = timeZoneOptions();
    expect(zones[0]).toBe('UTC');
    expect(zones).toEqual(expect.arrayContaining(['America/New_York', 'America/Chicago', 'Pacific/Honolulu']));
    expect(zones.filter((z) => !isValidTimeZone(z))).toEqual([]);
  });
});
