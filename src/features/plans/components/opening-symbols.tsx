/**
 * Our plan symbols for openings (design-language.md): a door is a rectangle with a quarter
 * arc, a window a rectangle with a double line. State is shape + word + colour.
 */
export function DoorSymbol({ state }: { state: 'protected' | 'none' }) {
  const stroke = state === 'protected' ? '#2f6b4c' : '#a93f27';
  return (
    <svg viewBox="0 0 40 40" className="size-10" aria-hidden="true">
      <rect x="4" y="30" width="22" height="4" fill={state === 'protected' ? stroke : 'none'} stroke={stroke} strokeWidth="1.5" />
      <path d="M4 30 A22 22 0 0 1 26 8" fill="none" stroke={stroke} strokeWidth="1.5" strokeDasharray={state === 'protected' ? undefined : '3 2'} />
      <line x1="4" y1="30" x2="4" y2="8" stroke={stroke} strokeWidth="1.5" />
      {state === 'protected' ? (
        <path d="M27 18 l4 4 l7 -8" fill="none" stroke={stroke} strokeWidth="2.5" strokeLinecap="round" />
      ) : (
        <circle cx="32" cy="16" r="5" fill="none" stroke={stroke} strokeWidth="2" />
      )}
    </svg>
  );
}

export function WindowSymbol({ state }: { state: 'protected' | 'none' }) {
  const stroke = state === 'protected' ? '#2f6b4c' : '#a93f27';
  return (
    <svg viewBox="0 0 40 40" className="size-10" aria-hidden="true">
      <rect x="3" y="16" width="26" height="8" fill={state === 'protected' ? '#e8f1ec' : 'none'} stroke={stroke} strokeWidth="1.5" />
      <line x1="3" y1="19" x2="29" y2="19" stroke={stroke} strokeWidth="1.2" />
      <line x1="3" y1="21" x2="29" y2="21" stroke={stroke} strokeWidth="1.2" />
      {state === 'protected' ? (
        <path d="M29 10 l4 4 l6 -7" fill="none" stroke={stroke} strokeWidth="2.5" strokeLinecap="round" />
      ) : (
        <circle cx="34" cy="10" r="5" fill="none" stroke={stroke} strokeWidth="2" />
      )}
    </svg>
  );
}
