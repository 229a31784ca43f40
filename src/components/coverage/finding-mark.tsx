import { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import { cn } from '@/lib/cn';

/** The small triangle that marks a life-safety finding (our own drawing, beside its words). */
export function TriangleMark({ className, tone = 'clay' }: { className?: string; tone?: 'clay' | 'ochre' | 'slate' }) {
  const colour = tone === 'clay' ? '#a93f27' : tone === 'ochre' ? '#876209' : '#5d6b73';
  return (
    <svg viewBox="0 0 16 16" className={cn('size-4 shrink-0', className)} aria-hidden="true" focusable="false">
      <path d="M8 1.6 L15 14.2 H1 Z" fill={colour} stroke={colour} strokeWidth="1.2" strokeLinejoin="round" />
      <rect x="7.2" y="5.6" width="1.6" height="4.6" rx="0.5" fill="#ffffff" />
      <circle cx="8" cy="12" r="0.95" fill="#ffffff" />
    </svg>
  );
}

/** The life-safety caution (product.md), word for word, from its one constant. */
export function LifeSafetyCaution({ className }: { className?: string }) {
  return (
    <p className={cn('flex items-start gap-2 rounded-md border border-line bg-paper px-3 py-2 text-xs text-slate-500', className)}>
      <TriangleMark className="mt-px size-3.5" tone="slate" />
      <span>{LIFE_SAFETY_CAUTION}</span>
    </p>
  );
}
