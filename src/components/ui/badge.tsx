import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';

export type BadgeTone = 'neutral' | 'ok' | 'warn' | 'bad' | 'brass';

const tones: Record<BadgeTone, string> = {
  neutral: 'bg-slate-100 text-ink border-line',
  ok: 'bg-sage-50 text-sage-600 border-sage-600/30',
  warn: 'bg-ochre-50 text-ochre-600 border-ochre-600/30',
  bad: 'bg-clay-50 text-clay-600 border-clay-600/30',
  brass: 'bg-brass-50 text-brass-700 border-brass-600/30',
};

/** A small state label: always a word, never colour alone. */
export function Badge({ tone = 'neutral', children, className }: { tone?: BadgeTone; children: ReactNode; className?: string }) {
  return (
    <span className={cn('inline-flex items-center gap-1 rounded-md border px-2 py-0.5 text-xs font-medium whitespace-nowrap', tones[tone], className)}>
      {children}
    </span>
  );
}
