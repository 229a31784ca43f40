import { cn } from '@/lib/cn';

const count = new Intl.NumberFormat('en-US');

/**
 * "Sites 42 of 400" with a simple bar. The words carry the state ("At the limit", "Over the
 * limit by 3"); the bar's colour only repeats them.
 */
export function UsageBar({ label, used, max }: { label: string; used: number; max: number }) {
  const share = max > 0 ? Math.min(1, used / max) : 1;
  const over = used - max;
  const state = over > 0 ? `Over the limit by ${count.format(over)}` : over === 0 ? 'At the limit' : null;
  return (
    <div>
      <p className="flex flex-wrap items-baseline justify-between gap-x-3 text-sm">
        <span className="tabular-nums">
          {label} {count.format(used)} of {count.format(max)}
        </span>
        {state && <span className={cn('text-xs font-medium', over > 0 ? 'text-clay-600' : 'text-ochre-600')}>{state}</span>}
      </p>
      <div className="mt-1.5 h-2 overflow-hidden rounded-full bg-slate-100" aria-hidden="true">
        <div
          className={cn('h-full rounded-full', over > 0 ? 'bg-clay-600' : over === 0 ? 'bg-ochre-600' : 'bg-ink')}
          style={{ width: `${share * 100}%` }}
        />
      </div>
    </div>
  );
}
