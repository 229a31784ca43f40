/**
 * What Mullion found on a panel: the CP-01 audit of its settings and of the zone types of its
 * fire and CO devices, and its power and path (standby battery, communication path). One severity
 * scale (Fix, Check, Note); rules known only from memory carry a dashed "From memory" mark.
 */
import { CheckCircle2 } from 'lucide-react';
import { bySeverity } from '@domain/severity';
import { LifeSafetyCaution, TriangleMark } from '@/components/coverage/finding-mark';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import { Card } from '@/components/ui/card';
import { SeverityBadge } from '@/components/ui/severity-badge';
import type { ApiPanelFinding } from '@/types/api';

/** The note that explains the "From memory" mark. */
export const FROM_MEMORY_NOTE = '“From memory” marks rules Mullion knows without a public text to cite: check them against your copy of the standard.';

/** One badge for a panel row: "Checks ok", "2 to fix" or "1 to check". */
export function findingSummary(audit: readonly ApiPanelFinding[]): { text: string; tone: BadgeTone } {
  const errors = audit.filter((f) => f.severity === 'error').length;
  const warnings = audit.filter((f) => f.severity === 'warning').length;
  if (errors > 0) return { text: `${errors} to fix`, tone: 'bad' };
  if (warnings > 0) return { text: `${warnings} to check`, tone: 'warn' };
  return { text: 'Checks ok', tone: 'ok' };
}

const TOPICS: { topic: ApiPanelFinding['topic']; title: string; none: string }[] = [
  { topic: 'cp01', title: 'Alarm reduction (CP-01)', none: 'Every setting Mullion checks is within the CP-01 ranges.' },
  { topic: 'power', title: 'Power and path', none: 'Nothing found on the standby battery or the path to the monitoring center.' },
];

function FindingItem({ finding }: { finding: ApiPanelFinding }) {
  return (
    <li className="space-y-1 border-b border-line pb-3 text-sm last:border-b-0 last:pb-0">
      <div className="flex flex-wrap items-center gap-1.5">
        {finding.lifeSafety && (
          <TriangleMark tone={finding.severity === 'error' ? 'clay' : finding.severity === 'warning' ? 'ochre' : 'slate'} className="size-3.5" />
        )}
        <SeverityBadge severity={finding.severity} />
        {finding.evidence === 'memory' && (
          <Badge tone="neutral" className="border-dashed">
            From memory
          </Badge>
        )}
        {finding.lifeSafety && <span className="text-xs text-slate-500">Life safety</span>}
      </div>
      <p>{finding.message}</p>
      <p className="text-xs text-slate-500">{finding.clause}</p>
    </li>
  );
}

/** Every finding on the panel, CP-01 first, then power and path, most severe first within each. */
/** `showCaution` is false where the page already shows the caution once (one caution per screen). */
export function PanelChecks({ audit, showCaution = true }: { audit: readonly ApiPanelFinding[]; showCaution?: boolean }) {
  const lifeSafety = audit.some((f) => f.lifeSafety);
  return (
    <Card title="Panel checks">
      <div className="space-y-4">
        {TOPICS.map(({ topic, title, none }) => {
          const findings = bySeverity(audit.filter((f) => f.topic === topic));
          return (
            <section key={topic} aria-label={title} className="space-y-2">
              <h3 className="text-sm font-semibold text-ink">{title}</h3>
              {findings.length === 0 ? (
                <p className="flex items-start gap-2 text-sm">
                  <CheckCircle2 className="mt-0.5 size-4 shrink-0 text-sage-600" aria-hidden="true" />
                  <span>{none}</span>
                </p>
              ) : (
                <ul className="space-y-3">
                  {findings.map((f, i) => (
                    <FindingItem key={`${f.code}-${f.field ?? ''}-${i}`} finding={f} />
                  ))}
                </ul>
              )}
            </section>
          );
        })}
        {audit.some((f) => f.evidence === 'memory') && <p className="text-xs text-slate-500">{FROM_MEMORY_NOTE}</p>}
        {lifeSafety && showCaution && <LifeSafetyCaution />}
      </div>
    </Card>
  );
}
