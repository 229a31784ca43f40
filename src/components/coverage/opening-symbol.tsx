/**
 * Our own plan symbols for openings (design-language.md, "The coverage symbols"):
 * a door is a rectangle (the leaf) with a quarter arc (its swing), a window a rectangle with a
 * double line, a sliding door two offset rectangles, a garage door a wide rectangle with
 * horizontal panel lines, a skylight a square with a diagonal.
 *
 * State is always shape + word + colour: a protected opening is a filled sage symbol with a
 * check, one without a sensor a clay outline with an open ring, one not in use a grey dashed
 * outline. The symbol is decoration (aria-hidden); the word beside it says the state.
 */
import type { OpeningKind } from '@domain/premises';
import { cn } from '@/lib/cn';

export type OpeningState = 'protected' | 'none' | 'not_used';

export const OPENING_STATE_WORDS: Record<OpeningState, string> = {
  protected: 'Protected',
  none: 'No sensor',
  not_used: 'Not used',
};

const SAGE = '#2f6b4c';
const CLAY = '#a93f27';
const GREY = '#5d6b73';
const WHITE = '#ffffff';

interface Paint {
  /** outline colour */
  stroke: string;
  /** body fill */
  fill: string;
  /** lines drawn over the body (white on a filled body) */
  inner: string;
  dash: string | undefined;
}

function paintFor(state: OpeningState): Paint {
  if (state === 'protected') return { stroke: SAGE, fill: SAGE, inner: WHITE, dash: undefined };
  if (state === 'none') return { stroke: CLAY, fill: WHITE, inner: CLAY, dash: undefined };
  return { stroke: GREY, fill: 'none', inner: GREY, dash: '3 2' };
}

function Body({ kind, p }: { kind: OpeningKind; p: Paint }) {
  const line = { stroke: p.stroke, strokeWidth: 1.6, strokeDasharray: p.dash, strokeLinejoin: 'round' as const };
  const inner = { stroke: p.inner, strokeWidth: 1.3, strokeDasharray: p.dash };
  switch (kind) {
    case 'door':
      return (
        <>
          {/* the wall line the door sits in, the open leaf, and its quarter swing */}
          <line x1="9" y1="33" x2="29" y2="33" {...line} />
          <rect x="3" y="9" width="6" height="24" fill={p.fill} {...line} />
          <path d="M9 9 A24 24 0 0 1 33 33" fill="none" {...line} strokeWidth={1.4} />
        </>
      );
    case 'window':
      return (
        <>
          <rect x="2" y="16" width="28" height="11" fill={p.fill} {...line} />
          <line x1="2" y1="20.2" x2="30" y2="20.2" {...inner} />
          <line x1="2" y1="22.8" x2="30" y2="22.8" {...inner} />
        </>
      );
    case 'sliding_door':
      return (
        <>
          <rect x="2" y="15" width="17" height="7" fill={p.fill} {...line} />
          <rect x="13" y="22" width="17" height="7" fill={p.fill} {...line} />
          <line x1="2" y1="33" x2="30" y2="33" {...line} strokeWidth={1.2} />
        </>
      );
    case 'garage_door':
      return (
        <>
          <rect x="2" y="12" width="28" height="22" fill={p.fill} {...line} />
          <line x1="2" y1="17.5" x2="30" y2="17.5" {...inner} />
          <line x1="2" y1="23" x2="30" y2="23" {...inner} />
          <line x1="2" y1="28.5" x2="30" y2="28.5" {...inner} />
        </>
      );
    case 'skylight':
      return (
        <>
          <rect x="4" y="11" width="22" height="22" fill={p.fill} {...line} />
          <line x1="4" y1="33" x2="26" y2="11" {...inner} strokeWidth={1.5} />
        </>
      );
  }
}

function Mark({ state }: { state: OpeningState }) {
  if (state === 'protected')
    return <path d="M29.5 8.5 l3.5 3.5 l6 -7.5" fill="none" stroke={SAGE} strokeWidth="2.6" strokeLinecap="round" strokeLinejoin="round" />;
  if (state === 'none') return <circle cx="34" cy="8" r="4.2" fill="none" stroke={CLAY} strokeWidth="2.2" />;
  return <line x1="30" y1="8" x2="38" y2="8" stroke={GREY} strokeWidth="2" strokeLinecap="round" />;
}

/** The plan symbol of an opening in a coverage state; always put its word beside it. */
export function OpeningSymbol({ kind, state, className }: { kind: OpeningKind; state: OpeningState; className?: string }) {
  return (
    <svg viewBox="0 0 40 40" className={cn('size-8 shrink-0', className)} aria-hidden="true" focusable="false" data-kind={kind} data-state={state}>
      <Body kind={kind} p={paintFor(state)} />
      <Mark state={state} />
    </svg>
  );
}

/** The state word, coloured, with the protecting zone's description: "Protected — Den window". */
export function OpeningStateWords({
  state,
  zoneDescription,
  className,
}: {
  state: OpeningState;
  zoneDescription?: string | null;
  className?: string;
}) {
  const tone = state === 'protected' ? 'text-sage-600' : state === 'none' ? 'text-clay-600' : 'text-slate-500';
  return (
    <span className={className}>
      <span className={cn('font-medium', tone)}>{OPENING_STATE_WORDS[state]}</span>
      {state === 'protected' && zoneDescription ? <span className="text-ink"> — {zoneDescription}</span> : null}
    </span>
  );
}
