/**
 * Colour contrast per WCAG 2.2: relative luminance (§ "relative luminance") and
 * contrast ratio (L1 + 0.05) / (L2 + 0.05). Used to keep a firm's accent colour readable
 * as a button background with white text (AA: 4.5:1 for normal text).
 */
const HEX = /^#([0-9a-f]{6})$/i;

export function isHexColour(value: string): boolean {
  return HEX.test(value);
}

function channel(c: number): number {
  const s = c / 255;
  return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
}

function rgb(hex: string): [number, number, number] {
  const m = HEX.exec(hex);
  if (!m?.[1]) throw new Error(`Not a #rrggbb colour: ${hex}`);
  const n = parseInt(m[1], 16);
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
}

export function relativeLuminance(hex: string): number {
  const [r, g, b] = rgb(hex);
  return 0.2126 * channel(r) + 0.7152 * channel(g) + 0.0722 * channel(b);
}

export function contrastRatio(a: string, b: string): number {
  const la = relativeLuminance(a);
  const lb = relativeLuminance(b);
  const [hi, lo] = la > lb ? [la, lb] : [lb, la];
  return (hi + 0.05) / (lo + 0.05);
}

function toHex(r: number, g: number, b: number): string {
  return '#' + [r, g, b].map((c) => Math.round(c).toString(16).padStart(2, '0')).join('');
}

/** Darkens a colour step by step until white text on it reaches `min` contrast. */
export function readableAccent(hex: string, min = 4.5): string {
  let [r, g, b] = rgb(hex);
  let current = toHex(r, g, b);
  for (let i = 0; i < 100 && contrastRatio(current, '#ffffff') < min; i++) {
    r *= 0.95;
    g *= 0.95;
    b *= 0.95;
    current = toHex(r, g, b);
  }
  return current;
}
