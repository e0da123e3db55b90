import { describe, expect, it } from 'vitest';
// Vitest turns imported CSS into an empty module, so the test reads the stylesheet from disk; it never ships.
import { readFileSync } from 'node:fs';

const css = readFileSync(new URL('../index.css', import.meta.url), 'utf8');

// Contrast ratio and relative luminance as defined by WCAG 2.1 (SC 1.4.3, "relative luminance") [STD].
const channel = (c: number) => {
  const s = c / 255;
  return s <= 0.03928 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
};
const luminance = (hex: string) => {
  const n = Number.parseInt(hex.slice(1), 16);
  return 0.2126 * channel((n >> 16) & 255) + 0.7152 * channel((n >> 8) & 255) + 0.0722 * channel(n & 255);
};
const contrast = (a: string, b: string) => {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number];
  return (hi + 0.05) / (lo + 0.05);
};

const tokens = Object.fromEntries([...css.matchAll(/--color-([\w-]+):\s*(#[0-9a-f]{6});/gi)].map((m) => [m[1], m[2]]));
const token = (name: string) => {
  const value = tokens[name];
  if (!value) throw new Error(`No --color-${name} token in index.css`);
  return value;
};

describe('contrast formula', () => {
  it('matches known ratios', () => {
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 5); // WCAG maximum ratio 21:1 [STD]
    expect(contrast('#767676', '#ffffff')).toBeCloseTo(4.54, 2); // the lightest grey passing AA on white, widely published [3P]
  });
});

// Every text/background pair the components use must reach WCAG AA for normal text, 4.5:1 (SC 1.4.3) [STD].
const TEXT_PAIRS: Array<[string, string]> = [
  ['ink-900', 'white'],
  ['ink-800', 'ink-50'],
  ['ink-700', 'ink-100'],
  ['ink-600', 'white'],
  ['ink-600', 'ink-50'],
  ['ink-500', 'white'],
  ['accent-700', 'white'],
  ['accent-700', 'ink-50'],
  ['accent-800', 'accent-50'],
  ['accent-900', 'accent-50'],
  ['white', 'accent-600'],
  ['white', 'bad'],
  ['ok', 'ok-soft'],
  ['warn', 'warn-soft'],
  ['bad', 'bad-soft'],
  ['bad', 'white'],
];

describe('palette', () => {
  it.each(TEXT_PAIRS)('%s on %s reaches 4.5:1', (fg, bg) => {
    expect(contrast(token(fg), token(bg))).toBeGreaterThanOrEqual(4.5);
  });
});
