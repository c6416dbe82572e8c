import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

/**
 * Checks Bifolio's palette (src/styles/index.css) against WCAG 2.2 contrast minimums.
 * Formulas: W3C, "Web Content Accessibility Guidelines (WCAG) 2.2", definitions of
 * "relative luminance" and "contrast ratio"; thresholds from success criteria 1.4.3
 * (text, 4.5:1) and 1.4.11 (non-text UI components and focus indicators, 3:1).
 */
const css = readFileSync(fileURLToPath(new URL('../../src/styles/index.css', import.meta.url)), 'utf8');

function block(selector: string): Record<string, string> {
  const start = css.indexOf(`${selector} {`);
  if (start < 0) throw new Error(`No ${selector} block in index.css`);
  const body = css.slice(start, css.indexOf('}', start));
  const vars: Record<string, string> = {};
  for (const m of body.matchAll(/--bf-([a-z-]+):\s*(#[0-9a-f]{6});/gi)) vars[m[1]] = m[2];
  return vars;
}

function luminance(hex: string): number {
  const channel = (i: number) => {
    const c = parseInt(hex.slice(1 + 2 * i, 3 + 2 * i), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * channel(0) + 0.7152 * channel(1) + 0.0722 * channel(2);
}

function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

const TEXT_PAIRS: Array<[string, string]> = [
  ['ink', 'paper'],
  ['ink', 'surface'],
  ['ink', 'sunken'],
  ['ink-muted', 'paper'],
  ['ink-muted', 'surface'],
  ['ink-muted', 'sunken'],
  ['accent', 'paper'],
  ['accent', 'surface'],
  ['accent', 'sunken'],
  ['accent', 'accent-soft'],
  ['on-accent', 'accent'],
  ['on-accent', 'accent-hover'],
  ['ink', 'accent-soft'],
  ['stable', 'surface'],
  ['stable', 'stable-soft'],
  ['unstable', 'surface'],
  ['unstable', 'unstable-soft'],
  ['warning', 'surface'],
  ['warning', 'warning-soft'],
  ['success', 'surface'],
  ['success', 'success-soft'],
];
const NON_TEXT_PAIRS: Array<[string, string]> = [
  ['focus', 'paper'],
  ['focus', 'surface'],
  ['rule-strong', 'surface'],
  ['rule-strong', 'paper'],
];

describe('palette contrast', () => {
  it('matches the published worked values for black and white', () => {
    // WCAG 2.2 definition: black on white is 21:1, and a colour against itself is 1:1.
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 6);
    expect(contrast('#777777', '#777777')).toBeCloseTo(1, 6);
    // #767676 on white is the well-known lightest grey that passes 4.5:1 (4.54:1) — common practice.
    expect(contrast('#767676', '#ffffff')).toBeGreaterThan(4.5);
    expect(contrast('#777777', '#ffffff')).toBeLessThan(4.5);
  });

  describe.each([
    ['light', ':root'],
    ['dark', "[data-theme='dark']"],
  ])('%s theme', (_name, selector) => {
    const vars = block(selector);
    it.each(TEXT_PAIRS)('%s on %s reaches 4.5:1 (text, SC 1.4.3)', (fg, bg) => {
      expect(vars[fg], fg).toBeDefined();
      expect(vars[bg], bg).toBeDefined();
      expect(contrast(vars[fg], vars[bg])).toBeGreaterThanOrEqual(4.5);
    });
    it.each(NON_TEXT_PAIRS)('%s against %s reaches 3:1 (non-text, SC 1.4.11)', (fg, bg) => {
      expect(contrast(vars[fg], vars[bg])).toBeGreaterThanOrEqual(3);
    });
  });
});
