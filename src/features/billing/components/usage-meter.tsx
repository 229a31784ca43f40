import { useId } from 'react';
import { cn } from '@/lib/cn';

const count = new Intl.NumberFormat('en-US');

/** Words for how close usage is to its limit (null while comfortably below 80 %). */
export function usageWords(used: number, max: number): { tone: 'near' | 'limit'; words: string } | null {
  if (used > max) return { tone: 'limit', words: `Over the limit by ${count.format(used - max)}` };
  if (used === max) return { tone: 'limit', words: 'At the limit' };
  if (max > 0 && used / max >= 0.8) return { tone: 'near', words: 'Nearly at the limit' };
  return null;
}

/**
 * "Active sites 42 of 400" with a bar. The words carry the state ("Nearly at the limit" from
 * 80 %, "At the limit"); the bar's colour (ochre, clay) only repeats them.
 */
export function UsageMeter({ label, used, max }: { label: string; used: number; max: number }) {
  const id = useId();
  const share = max > 0 ? Math.min(1, used / max) : 1;
  const state = usageWords(used, max);
  const text = `${label} ${count.format(used)} of ${count.format(max)}`;
  return (
    <div>
      <p className="flex flex-wrap items-baseline justify-between gap-x-3 text-sm">
        <span id={`${id}-label`} className="tabular-nums">
          {text}
        </span>
        {state && (
          <span id={`${id}-state`} className={cn('text-xs font-medium', state.tone === 'limit' ? 'text-clay-600' : 'text-ochre-600')}>
            {state.words}
          </span>
        )}
      </p>
      <div
        role="progressbar"
        aria-labelledby={`${id}-label`}
        aria-describedby={state ? `${id}-state` : undefined}
        aria-valuemin={0}
        aria-valuemax={max}
        aria-valuenow={Math.min(used, max)}
        aria-valuetext={`${count.format(used)} of ${count.format(max)}${state ? ` (${state.words.toLowerCase()})` : ''}`}
        className="mt-1.5 h-2 overflow-hidden rounded-full bg-slate-100"
      >
        <div
          className={cn('h-full rounded-full', state?.tone === 'limit' ? 'bg-clay-600' : state?.tone === 'near' ? 'bg-ochre-600' : 'bg-slate-500')}
          style={{ width: `${share * 100}%` }}
        />
      </div>
    </div>
  );
}
