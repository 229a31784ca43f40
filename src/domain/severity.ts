/**
 * One severity scale for every finding Mullion reports (coverage, CP-01, the life-safety zone
 * check, the standby battery, the communication path): the JSON keys stay `error`, `warning` and
 * `info` (api-resources.md); the words and colours below are the product's own and the same on
 * every screen, e-mail and PDF.
 */
export const SEVERITIES = ['error', 'warning', 'info'] as const;
export type Severity = (typeof SEVERITIES)[number];

export interface SeverityLevel {
  /** the word shown beside the finding */
  word: string;
  /** what the word asks of the reader, for legends and screen readers */
  meaning: string;
  /** the design-language colour: clay (must change), ochre (look at it), slate (for the record) */
  colour: 'clay' | 'ochre' | 'slate';
}

export const SEVERITY_LEVELS: Readonly<Record<Severity, SeverityLevel>> = {
  error: { word: 'Fix', meaning: 'Something that must change', colour: 'clay' },
  warning: { word: 'Check', meaning: 'Something to look at or confirm', colour: 'ochre' },
  info: { word: 'Note', meaning: 'For the record', colour: 'slate' },
};

/** Most severe first. */
export const SEVERITY_ORDER: Readonly<Record<Severity, number>> = { error: 0, warning: 1, info: 2 };

/** The word for a severity, e.g. "Fix". */
export function severityWord(severity: Severity): string {
  return SEVERITY_LEVELS[severity].word;
}

/** Sorts findings most severe first, keeping the order within a level. */
export function bySeverity<T extends { severity: Severity }>(findings: readonly T[]): T[] {
  return [...findings].sort((a, b) => SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity]);
}

/**
 * Where a rule comes from: a public text (`public`), memory without a public text (`memory`, shown to
 * staff only, never to households), or trade practice with no published source (`practice`).
 */
export type Evidence = 'public' | 'memory' | 'practice';
