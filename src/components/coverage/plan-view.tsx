/**
 * A floor-plan image with zone pins. Pins are stored as fractions of the image's width and
 * height, so the plan renders right at any size: the pins sit in a box that is exactly the
 * image's box.
 */
import { forwardRef, type HTMLAttributes, type ReactNode } from 'react';
import { cn } from '@/lib/cn';

export interface PlanPin {
  zoneId: string;
  number: number;
  description: string;
  /** the panel's label, when a site has several panels */
  panelLabel?: string | undefined;
  x: number;
  y: number;
}

/** A fraction as a CSS percentage, to a hundredth of a percent. */
export function percent(fraction: number): string {
  return `${Math.round(fraction * 10000) / 100}%`;
}

export function pinLabel(pin: Pick<PlanPin, 'number' | 'description' | 'panelLabel'>): string {
  return `Zone ${pin.number}${pin.panelLabel ? ` (${pin.panelLabel})` : ''}: ${pin.description}`;
}

/** Where a tooltip goes so that it stays inside the plan near its edges. */
function tooltipPlace(x: number, y: number): string {
  const horizontal = x < 0.25 ? 'left-0' : x > 0.75 ? 'right-0' : 'left-1/2 -translate-x-1/2';
  const vertical = y < 0.2 ? 'top-full mt-1.5' : 'bottom-full mb-1.5';
  return `${horizontal} ${vertical}`;
}

export const PIN_CLASS =
  'group absolute z-10 flex size-7 -translate-x-1/2 -translate-y-1/2 items-center justify-center rounded-full border-2 border-white text-xs font-semibold tabular-nums shadow-[0_1px_3px_rgb(29_42_48/0.45)] focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-brass-600';

/** The pin's words on hover and focus (the pin itself carries them as its accessible name). */
export function PinTooltip({ pin }: { pin: PlanPin }) {
  return (
    <span
      aria-hidden="true"
      className={cn(
        'pointer-events-none absolute hidden w-max max-w-48 rounded-md bg-ink px-2 py-1 text-left text-xs font-normal whitespace-normal text-paper group-hover:block group-focus:block',
        tooltipPlace(pin.x, pin.y),
      )}
    >
      <span className="font-semibold">Zone {pin.number}</span>
      {pin.panelLabel ? <span className="text-paper/75"> · {pin.panelLabel}</span> : null}
      <span className="block">{pin.description}</span>
    </span>
  );
}

interface PlanFrameProps extends HTMLAttributes<HTMLDivElement> {
  src: string;
  alt: string;
  children?: ReactNode;
  imageRef?: React.Ref<HTMLImageElement>;
}

/** The image in a box that shrink-wraps it; children (pins) are placed in that box. */
export const PlanFrame = forwardRef<HTMLDivElement, PlanFrameProps>(function PlanFrame({ src, alt, children, imageRef, className, ...rest }, ref) {
  return (
    <div ref={ref} className={cn('relative mx-auto w-fit max-w-full select-none', className)} {...rest}>
      <img
        ref={imageRef}
        src={src}
        alt={alt}
        draggable={false}
        className="block h-auto max-h-[75vh] w-auto max-w-full rounded-md border border-line bg-card"
      />
      {children}
    </div>
  );
});

/** A plan with its pins, read only: each pin shows its zone number, and its description on hover or focus. */
export function PlanView({ src, alt, pins, className }: { src: string; alt: string; pins: PlanPin[]; className?: string }) {
  return (
    <PlanFrame src={src} alt={alt} className={className}>
      {pins.map((pin) => (
        <span
          key={pin.zoneId}
          role="img"
          tabIndex={0}
          aria-label={pinLabel(pin)}
          className={cn(PIN_CLASS, 'cursor-default bg-ink text-paper')}
          style={{ left: percent(pin.x), top: percent(pin.y) }}
        >
          <span aria-hidden="true">{pin.number}</span>
          <PinTooltip pin={pin} />
        </span>
      ))}
    </PlanFrame>
  );
}

/** The address of a floor's plan image; the image id keeps a replaced image from coming from the cache. */
export function planImageSrc(floor: { id: string; planImageId: string | null; planImageUrl?: string | null }): string | null {
  if (!floor.planImageId && !floor.planImageUrl) return null;
  const url = floor.planImageUrl ?? `/api/floors/${floor.id}/plan`;
  if (!floor.planImageId || url.includes(floor.planImageId)) return url;
  return `${url}${url.includes('?') ? '&' : '?'}v=${encodeURIComponent(floor.planImageId)}`;
}
