/**
 * The one severity scale on every screen (src/domain/severity.ts): the same word, colour and mark
 * for a finding's level wherever it is shown — coverage, panel checks, the portal.
 */
import { AlertOctagon, AlertTriangle, Info } from 'lucide-react';
import { SEVERITY_LEVELS, type Severity } from '@domain/severity';
import { Badge, type BadgeTone } from './badge';

const TONE: Record<Severity, BadgeTone> = { error: 'bad', warning: 'warn', info: 'neutral' };
const ICON = { error: AlertOctagon, warning: AlertTriangle, info: Info } as const;

/** The badge tone of a severity: clay, ochre or slate. */
export function severityTone(severity: Severity): BadgeTone {
  return TONE[severity] ?? 'neutral';
}

/** "Fix", "Check" or "Note" with its mark and colour; the meaning is read out to screen readers. */
export function SeverityBadge({ severity, className }: { severity: Severity; className?: string }) {
  const level = SEVERITY_LEVELS[severity] ?? SEVERITY_LEVELS.info;
  const Icon = ICON[severity] ?? Info;
  return (
    <Badge tone={severityTone(severity)} className={className}>
      <Icon className="size-3" aria-hidden="true" />
      {level.word}
      <span className="sr-only">: {level.meaning.toLowerCase()}</span>
    </Badge>
  );
}
