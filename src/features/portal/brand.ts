/**
 * The firm's colours in its portal (design-language.md: "In the portal the firm's accent colour
 * replaces brass for buttons and the header"). The server sends the accent already darkened
 * until white text on it meets WCAG AA; overriding the brass theme variables on the portal's
 * root element restyles every button, link and focus ring beneath it.
 */
import type { CSSProperties } from 'react';

export const MULLION_BRASS = '#8f5c17';

export function brandStyle(accentReadable: string | null | undefined): CSSProperties {
  const accent = accentReadable && /^#[0-9a-f]{6}$/i.test(accentReadable) ? accentReadable : MULLION_BRASS;
  return {
    '--color-brass-600': accent,
    '--color-brass-700': `color-mix(in srgb, ${accent} 82%, black)`,
    '--color-brass-50': `color-mix(in srgb, ${accent} 9%, white)`,
  } as CSSProperties;
}

/** "tel:" address of a phone number as people write it. */
export function telHref(phone: string): string {
  return `tel:${phone.replace(/[^0-9+]/g, '')}`;
}
