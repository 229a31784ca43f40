/**
 * Source: WCAG 2.2, definitions of relative luminance and contrast ratio (PUBLIC).
 * Contrast ratio = (L1 + 0.05) / (L2 + 0.05), L1 the lighter; it ranges from 1:1 to 21:1.
 * Level AA asks 4.5:1 for normal text.
 */
import { describe, expect, it } from 'vitest';
import { contrastRatio, isHexColour, readableAccent, relativeLuminance } from '@domain/colour';

const WHITE = '#ffffff';
const BLACK = '#000000';

describe('relativeLuminance', () => {
  it('is 0 for black and 1 for white', () => {
    expect(relativeLuminance(BLACK)).toBe(0);
    expect(relativeLuminance(WHITE)).toBeCloseTo(1, 10);
  });

  it('weighs green most and blue least', () => {
    expect(relativeLuminance('#00ff00')).toBeCloseTo(0.7152, 4);
    expect(relativeLuminance('#ff0000')).toBeCloseTo(0.2126, 4);
    expect(relativeLuminance('#0000ff')).toBeCloseTo(0.0722, 4);
  });

  it('refuses anything but #rrggbb', () => {
    expect(() => relativeLuminance('#fff')).toThrow(/#rrggbb/);
    expect(() => relativeLuminance('red')).toThrow(/#rrggbb/);
  });
});

describe('contrastRatio', () => {
  it('is 21:1 for black on white, either way round', () => {
    expect(contrastRatio(BLACK, WHITE)).toBeCloseTo(21, 10);
    expect(contrastRatio(WHITE, BLACK)).toBeCloseTo(21, 10);
  });

  it('is 1:1 for white on white', () => {
    expect(contrastRatio(WHITE, WHITE)).toBe(1);
  });

  it('is about 4.54:1 for #767676 on white', () => {
    // From memory: #767676 is the well-known lightest grey that passes AA on white.
    expect(contrastRatio('#767676', WHITE)).toBeCloseTo(4.54, 2);
    expect(contrastRatio('#767676', WHITE)).toBeGreaterThanOrEqual(4.5);
    // One step lighter no longer passes.
    expect(contrastRatio('#777777', WHITE)).toBeLessThan(4.5);
  });

  it('does not care about letter case', () => {
    expect(contrastRatio('#8F5C17', WHITE)).toBe(contrastRatio('#8f5c17', WHITE));
  });
});

describe('readableAccent', () => {
  it.each(['#ffcc00', '#8fbc8f', '#ffffff', '#777777', '#00ffff', '#ff69b4'])(
    'darkens %s until white text on it reaches 4.5:1',
    (light) => {
      expect(contrastRatio(light, WHITE)).toBeLessThan(4.5);
      const accent = readableAccent(light);
      expect(isHexColour(accent)).toBe(true);
      expect(contrastRatio(accent, WHITE)).toBeGreaterThanOrEqual(4.5);
    },
  );

  it('keeps the hue: every channel shrinks by the same factor', () => {
    const accent = readableAccent('#ffcc00');
    const [r, g, b] = [1, 3, 5].map((i) => parseInt(accent.slice(i, i + 2), 16)) as [number, number, number];
    expect(b).toBe(0);
    expect(g / r).toBeCloseTo(0xcc / 0xff, 1);
  });

  it('does not darken more than it must', () => {
    // Still clearly a colour, not near-black.
    expect(contrastRatio(readableAccent('#ffcc00'), WHITE)).toBeLessThan(5.5);
  });

  it.each(['#1f3a5f', '#8f5c17', '#767676', '#000000'])('leaves %s, already readable, unchanged', (dark) => {
    expect(contrastRatio(dark, WHITE)).toBeGreaterThanOrEqual(4.5);
    expect(readableAccent(dark)).toBe(dark);
  });

  it('honours a stricter minimum (AAA: 7:1)', () => {
    expect(readableAccent('#8f5c17')).toBe('#8f5c17');
    expect(contrastRatio(readableAccent('#8f5c17', 7), WHITE)).toBeGreaterThanOrEqual(7);
  });
});

describe('isHexColour', () => {
  it('accepts #rrggbb in either case', () => {
    expect(isHexColour('#8f5c17')).toBe(true);
    expect(isHexColour('#8F5C17')).toBe(true);
    expect(isHexColour('#000000')).toBe(true);
  });

  it('refuses short, long, hashless, named and non-hex values', () => {
    for (const value of ['#fff', '8f5c17', '#8f5c1', '#8f5c170', '#8f5c1g', 'red', '', ' #8f5c17', '#8f5c17 ']) {
      expect(isHexColour(value), JSON.stringify(value)).toBe(false);
    }
  });
});
