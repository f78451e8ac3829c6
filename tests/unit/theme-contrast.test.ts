/**
 * Every text/ground pair the theme declares is legible, in both themes.
 * Contrast ratio and relative luminance as defined by WCAG 2.1 (W3C Recommendation, 2018):
 * §1.4.3 Contrast (Minimum) asks 4.5:1 for text; §1.4.11 Non-text Contrast asks 3:1 for the
 * edges of controls and marks. Relative luminance: the sRGB formula in WCAG 2.1's definitions
 * (linearise each channel: c ≤ 0.03928 → c/12.92, else ((c+0.055)/1.055)^2.4; L = 0.2126 R +
 * 0.7152 G + 0.0722 B); ratio = (L1 + 0.05) / (L2 + 0.05), lighter over darker.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { NON_TEXT_PAIRS, PALETTES, TEXT_PAIRS, type ColourScheme } from '@/components/ui/palette';

function luminance(hex: string): number {
  const n = Number.parseInt(hex.slice(1), 16);
  const [r, g, b] = [n >> 16, (n >> 8) & 255, n & 255].map((v) => {
    const c = v / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

export function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

describe('the contrast formula', () => {
  // worked values of the WCAG 2.1 definition: black on white is 21:1, a colour on itself 1:1
  for (const [a, b, want] of [
    ['#000000', '#FFFFFF', 21], // WCAG 2.1, definition of contrast ratio: range 1 to 21
    ['#FFFFFF', '#FFFFFF', 1], // same colour
    ['#767676', '#FFFFFF', 4.54], // the lightest grey that passes AA on white [CP], from memory
    ['#B35C2E', '#F7F5F0', 4.29], // the old copper button, as measured by axe-core in the browser
    ['#7B8593', '#F7F5F0', 3.43], // the old grey hint, as measured by axe-core in the browser
  ] as const) {
    // axe-core shows two decimals cut, not rounded: allow a hundredth either way
    it(`${a} on ${b} is ${want}:1`, () => assert.ok(Math.abs(contrastRatio(a, b) - want) < 0.011, contrastRatio(a, b).toFixed(3)));
  }
});

for (const scheme of ['light', 'dark'] as ColourScheme[]) {
  const palette = PALETTES[scheme];
  describe(`the ${scheme} theme`, () => {
    for (const [text, ground] of TEXT_PAIRS) {
      it(`${text} text on ${ground} reaches 4.5:1 (WCAG 2.1 §1.4.3)`, () => {
        const ratio = contrastRatio(palette[text], palette[ground]);
        assert.ok(ratio >= 4.5, `${text} ${palette[text]} on ${ground} ${palette[ground]}: ${ratio.toFixed(2)}:1`);
      });
    }
    for (const [part, ground] of NON_TEXT_PAIRS) {
      it(`${part} edge on ${ground} reaches 3:1 (WCAG 2.1 §1.4.11)`, () => {
        const ratio = contrastRatio(palette[part], palette[ground]);
        assert.ok(ratio >= 3, `${part} ${palette[part]} on ${ground} ${palette[ground]}: ${ratio.toFixed(2)}:1`);
      });
    }
  });
}
