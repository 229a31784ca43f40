/** One severity scale for every finding: keys, words, colours and ordering. */
import { describe, expect, it } from 'vitest';
import { SEVERITIES, SEVERITY_LEVELS, SEVERITY_ORDER, bySeverity, severityWord, type Severity } from '@domain/severity';

describe('severities', () => {
  it('keep the JSON keys error, warning and info, most severe first', () => {
    expect(SEVERITIES).toEqual(['error', 'warning', 'info']);
    expect(SEVERITIES.map((s) => SEVERITY_ORDER[s])).toEqual([0, 1, 2]);
  });

  it('show the product’s words and colours', () => {
    expect(SEVERITIES.map(severityWord)).toEqual(['Fix', 'Check', 'Note']);
    expect(SEVERITIES.map((s) => SEVERITY_LEVELS[s].colour)).toEqual(['clay', 'ochre', 'slate']);
    for (const s of SEVERITIES) expect(SEVERITY_LEVELS[s].meaning.length, s).toBeGreaterThan(5);
    expect(new Set(SEVERITIES.map(severityWord)).size).toBe(3);
  });
});

describe('bySeverity', () => {
  const f = (severity: Severity, id: string) => ({ severity, id });

  it('puts errors first, then warnings, then notes, keeping the order within a level', () => {
    const findings = [f('info', 'a'), f('warning', 'b'), f('error', 'c'), f('info', 'd'), f('error', 'e'), f('warning', 'g')];
    expect(bySeverity(findings).map((x) => x.id)).toEqual(['c', 'e', 'b', 'g', 'a', 'd']);
  });

  it('returns a new array and leaves the one given alone', () => {
    const findings = [f('info', 'a'), f('error', 'b')];
    const sorted = bySeverity(findings);
    expect(sorted).not.toBe(findings);
    expect(findings.map((x) => x.id)).toEqual(['a', 'b']);
    expect(bySeverity([])).toEqual([]);
  });
});
