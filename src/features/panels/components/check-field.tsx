import { forwardRef, useId, type InputHTMLAttributes, type ReactNode } from 'react';
import { cn } from '@/lib/cn';

interface CheckFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'type'> {
  label: string;
  hint?: ReactNode;
}

/** A labelled on/off switch (a checkbox) with an optional hint under its label. */
export const CheckField = forwardRef<HTMLInputElement, CheckFieldProps>(function CheckField({ label, hint, className, ...rest }, ref) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  return (
    <div className={cn('flex items-start gap-2.5', className)}>
      <input ref={ref} id={id} type="checkbox" aria-describedby={hintId} className="mt-0.5 size-4 shrink-0 accent-brass-600" {...rest} />
      <div className="min-w-0">
        <label htmlFor={id} className="block text-sm font-medium text-ink">
          {label}
        </label>
        {hint && (
          <p id={hintId} className="text-xs text-slate-500">
            {hint}
          </p>
        )}
      </div>
    </div>
  );
});
