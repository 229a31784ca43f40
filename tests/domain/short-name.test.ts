import { describe, expect, it } from 'vitest';
import { SHORT_NAME_PATTERN, shortNameFrom, uniqueShortName } from '@domain/short-name';
import { LIMITS } from '@domain/limits';

describe('shortNameFrom', () => {
  it('turns a firm name into lowercase words joined by hyphens', () => {
    expect(shortNameFrom('Lanternfield Alarm Co.')).toBe('lanternfield-alarm-co');
  });

  it('strips accents', () => {
    expect(shortNameFrom('Sécurité Énergie Brûlé')).toBe('securite-energie-brule');
    expect(shortNameFrom('Señor Alarmas')).toBe('senor-alarmas');
  });

  it('writes & as "and"', () => {
    expect(shortNameFrom('Smith & Sons Security')).toBe('smith-and-sons-security');
    expect(shortNameFrom('A&B Alarms')).toBe('a-and-b-alarms');
  });

  it('collapses runs of punctuation and spaces and trims hyphens at both ends', () => {
    expect(shortNameFrom('  --Bolt!!  Lock -- & Key  ')).toBe('bolt-lock-and-key');
    expect(shortNameFrom('24/7 Alarm, Inc.')).toBe('24-7-alarm-inc');
  });

  it('pads a name that is too short', () => {
    expect(shortNameFrom('AB')).toBe('ab-alarms');
    expect(shortNameFrom('Q')).toBe('q-alarms');
    expect(shortNameFrom('!!!')).toBe('firm-alarms');
    expect(shortNameFrom('')).toBe('firm-alarms');
  });

  it('keeps a name exactly at the minimum length as it is', () => {
    expect(shortNameFrom('ABC')).toBe('abc');
  });

  it('respects the maximum length and does not end on a hyphen after cutting', () => {
    const long = shortNameFrom('Lanternfield Alarm and Fire Protection Company of the Upper Valley');
    expect(long.length).toBeLessThanOrEqual(LIMITS.shortNameMax);
    expect(long).toBe('lanternfield-alarm-and-fire-protection-c');

    // The cut lands just after a hyphen: the hyphen goes.
    const cutAtHyphen = shortNameFrom(`${'a'.repeat(LIMITS.shortNameMax - 1)} bbbb`);
    expect(cutAtHyphen).toBe('a'.repeat(LIMITS.shortNameMax - 1));
  });

  it('always yields a short name the firm settings accept', () => {
    const names = [
      'Lanternfield Alarm Co.',
      'AB',
      '!!!',
      'Ünïcödé Sécurité & Fils',
      'x'.repeat(200),
      `${'word '.repeat(20)}`,
      '東京 セキュリティ',
    ];
    for (const name of names) {
      const short = shortNameFrom(name);
      expect(short, name).toMatch(SHORT_NAME_PATTERN);
      expect(short.length, name).toBeGreaterThanOrEqual(LIMITS.shortNameMin);
      expect(short.length, name).toBeLessThanOrEqual(LIMITS.shortNameMax);
    }
  });
});

describe('uniqueShortName', () => {
  it('keeps the base when it is free', () => {
    expect(uniqueShortName('lanternfield-alarm-co', () => false)).toBe('lanternfield-alarm-co');
  });

  it('appends -2, then -3, until a name is free', () => {
    const taken = new Set(['lanternfield-alarm-co']);
    expect(uniqueShortName('lanternfield-alarm-co', (c) => taken.has(c))).toBe('lanternfield-alarm-co-2');
    taken.add('lanternfield-alarm-co-2');
    expect(uniqueShortName('lanternfield-alarm-co', (c) => taken.has(c))).toBe('lanternfield-alarm-co-3');
  });

  it('asks about each candidate in order', () => {
    const asked: string[] = [];
    uniqueShortName('bolt', (c) => {
      asked.push(c);
      return asked.length < 4;
    });
    expect(asked).toEqual(['bolt', 'bolt-2', 'bolt-3', 'bolt-4']);
  });

  it('shortens a long base so the suffix still fits the maximum length', () => {
    const base = 'a'.repeat(LIMITS.shortNameMax);
    const name = uniqueShortName(base, (c) => c === base);
    expect(name).toBe(`${'a'.repeat(LIMITS.shortNameMax - 2)}-2`);
    expect(name.length).toBe(LIMITS.shortNameMax);
    expect(name).toMatch(SHORT_NAME_PATTERN);
  });

  it('drops a hyphen the shortening leaves at the end', () => {
    const base = `${'a'.repeat(LIMITS.shortNameMax - 3)}-bb`;
    expect(base).toHaveLength(LIMITS.shortNameMax);
    const name = uniqueShortName(base, (c) => c === base);
    expect(name).toBe(`${'a'.repeat(LIMITS.shortNameMax - 3)}-2`);
    expect(name).toMatch(SHORT_NAME_PATTERN);
  });

  it('gives up when every candidate is taken', () => {
    expect(() => uniqueShortName('bolt', () => true)).toThrow('No free short name');
  });
});
