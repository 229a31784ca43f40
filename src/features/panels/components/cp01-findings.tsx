import { AlertOctagon, AlertTriangle, CheckCircle2, Info } from 'lucide-react';
import type { Cp01Finding } from '@domain/cp01';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import { Card } from '@/components/ui/card';

const SEVERITY: Record<Cp01Finding['severity'], { word: string; tone: BadgeTone; icon: typeof Info }> = {
  error: { word: 'Error', tone: 'bad', icon: AlertOctagon },
  warning: { word: 'Warning', tone: 'warn', icon: AlertTriangle },
  info: { word: 'Note', tone: 'neutral', icon: Info },
};

const ORDER: Record<Cp01Finding['severity'], number> = { error: 0, warning: 1, info: 2 };

export function findingSummary(audit: readonly Cp01Finding[]): { text: string; tone: BadgeTone } {
  const errors = audit.filter((f) => f.severity === 'error').length;
  const warnings = audit.filter((f) => f.severity === 'warning').length;
  if (errors + warnings === 0) return { text: 'CP-01 ok', tone: 'ok' };
  const n = errors + warnings;
  return { text: `${n} CP-01 ${n === 1 ? 'finding' : 'findings'}`, tone: errors > 0 ? 'bad' : 'warn' };
}

/** What the CP-01 audit found on the panel's settings: severity word, message, clause, and whether the rule is from memory. */
export function Cp01Findings({ audit }: { audit: readonly Cp01Finding[] }) {
  const sorted = [...audit].sort((a, b) => ORDER[a.severity] - ORDER[b.severity]);
  return (
    <Card title="CP-01 findings">
      {sorted.length === 0 ? (
        <p className="flex items-start gap-2 text-sm">
          <CheckCircle2 className="mt-0.5 size-4 shrink-0 text-sage-600" aria-hidden="true" />
          <span>Every setting Mullion checks is within the CP-01 ranges.</span>
        </p>
      ) : (
        <ul className="space-y-3">
          {sorted.map((f) => {
            const s = SEVERITY[f.severity];
            return (
              <li key={f.code} className="space-y-1 border-b border-line pb-3 text-sm last:border-b-0 last:pb-0">
                <div className="flex flex-wrap items-center gap-1.5">
                  <Badge tone={s.tone}>
                    <s.icon className="size-3" aria-hidden="true" />
                    {s.word}
                  </Badge>
                  {f.evidence === 'memory' && (
                    <Badge tone="neutral" className="border-dashed">
                      From memory
                    </Badge>
                  )}
                </div>
                <p>{f.message}</p>
                <p className="text-xs text-slate-500">{f.clause}</p>
              </li>
            );
          })}
        </ul>
      )}
      <p className="mt-3 text-xs text-slate-500">
        “From memory” marks rules Mullion knows without a public text to cite: check them against your copy of the standard.
      </p>
    </Card>
  );
}
