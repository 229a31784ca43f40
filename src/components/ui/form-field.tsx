import { cloneElement, isValidElement, useId, type ReactElement, type ReactNode } from 'react';

interface FormFieldProps {
  label: string;
  error?: string | undefined;
  hint?: ReactNode;
  children: ReactElement<{ id?: string; 'aria-describedby'?: string; invalid?: boolean }>;
  className?: string;
}

/** A labelled input with its hint and error text wired up for screen readers. */
export function FormField({ label, error, hint, children, className }: FormFieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(' ') || undefined;
  const control = isValidElement(children) ? cloneElement(children, { id, 'aria-describedby': describedBy, invalid: !!error }) : children;
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block text-sm font-medium text-ink">
        {label}
      </label>
      {control}
      {hint && !error && (
        <p id={hintId} className="mt-1 text-xs text-slate-500">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} className="mt-1 text-xs font-medium text-clay-600" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}

/** A message for the whole form (server errors that name no field). */
export function FormError({ message }: { message?: string | null | undefined }) {
  if (!message) return null;
  return (
    <div role="alert" className="rounded-md border border-clay-600 bg-clay-50 px-3 py-2 text-sm text-clay-600">
      {message}
    </div>
  );
}
