import { useState } from 'react';
import { Input } from './input';

/**
 * Dollars on screen, integer cents in the value: "49.50" ↔ 4950. Empty means null.
 */
export function MoneyInput({
  value,
  onChange,
  onBlur,
  id,
  invalid,
  'aria-describedby': describedBy,
}: {
  value: number | null | undefined;
  onChange: (cents: number | null) => void;
  onBlur?: () => void;
  id?: string;
  invalid?: boolean;
  'aria-describedby'?: string;
}) {
  const toText = (cents: number | null | undefined) => (cents === null || cents === undefined ? '' : (cents / 100).toFixed(2));
  // What the person is typing, while they type; otherwise the value itself.
  const [draft, setDraft] = useState<string | null>(null);
  const text = draft ?? toText(value);
  return (
    <div className="relative">
      <span className="pointer-events-none absolute top-1/2 left-3 -translate-y-1/2 text-sm text-slate-500">$</span>
      <Input
        id={id}
        invalid={invalid}
        aria-describedby={describedBy}
        inputMode="decimal"
        className="pl-7 tabular-nums"
        value={text}
        onChange={(e) => {
          const next = e.target.value.replace(/[^0-9.]/g, '');
          setDraft(next);
          if (next.trim() === '') onChange(null);
          else if (!Number.isNaN(Number(next))) onChange(Math.round(Number(next) * 100));
        }}
        onBlur={() => {
          setDraft(null);
          onBlur?.();
        }}
      />
    </div>
  );
}
