import { forwardRef, type InputHTMLAttributes, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';
import { cn } from '@/lib/cn';

const field =
  'block w-full rounded-md border bg-card px-3 text-base text-ink placeholder:text-slate-500 focus-visible:outline-2 focus-visible:outline-brass-600 disabled:bg-slate-100 sm:text-sm';

function border(invalid?: boolean): string {
  return invalid ? 'border-clay-600' : 'border-line-strong';
}

export const Input = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement> & { invalid?: boolean }>(function Input(
  { className, invalid, ...rest },
  ref,
) {
  return <input ref={ref} className={cn(field, 'h-10', border(invalid), className)} aria-invalid={invalid || undefined} {...rest} />;
});

export const Select = forwardRef<HTMLSelectElement, SelectHTMLAttributes<HTMLSelectElement> & { invalid?: boolean }>(function Select(
  { className, invalid, children, ...rest },
  ref,
) {
  return (
    <select ref={ref} className={cn(field, 'h-10 pr-8', border(invalid), className)} aria-invalid={invalid || undefined} {...rest}>
      {children}
    </select>
  );
});

export const Textarea = forwardRef<HTMLTextAreaElement, TextareaHTMLAttributes<HTMLTextAreaElement> & { invalid?: boolean }>(function Textarea(
  { className, invalid, ...rest },
  ref,
) {
  return <textarea ref={ref} className={cn(field, 'min-h-24 py-2', border(invalid), className)} aria-invalid={invalid || undefined} {...rest} />;
});
