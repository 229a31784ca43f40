import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';

/**
 * One headline number with its label above and an optional line of context below. Render inside
 * a `<dl>`; `big` makes the number the page's main figure.
 */
export function Stat({ label, value, hint, big = false }: { label: string; value: ReactNode; hint?: ReactNode; big?: boolean }) {
  return (
    <div className="rounded-md border border-line bg-card px-4 py-3">
      <dt className="text-sm text-slate-500">{label}</dt>
      <dd className={cn('mt-1 font-semibold text-ink tabular-nums', big ? 'text-2xl' : 'text-lg')}>{value}</dd>
      {hint && <dd className="mt-0.5 text-xs text-slate-500">{hint}</dd>}
    </div>
  );
}
