/**
 * The dark look of the sample style: the same layers and sources, only paint changes, and the
 * lines that carry the geology keep their contrast with the ground in both looks (WCAG 2.1
 * contrast ratio, https://www.w3.org/TR/WCAG21/#dfn-contrast-ratio, from its relative-luminance
 * definition; 3:1 is its minimum for graphical objects, success criterion 1.4.11).
 */
import { describe, expect, it } from 'vitest';
import { buildStyle, samplePaint, style } from '../../sample-maps/korvane/index';

/** WCAG 2.1 relative luminance of an sRGB colour given as #rrggbb. */
function luminance(hex: string): number {
  const c = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((v) => (v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
  return 0.2126 * c[0] + 0.7152 * c[1] + 0.0722 * c[2];
}
const contrast = (a: string, b: string) => {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
};
// WCAG's own worked bounds: black on white is 21:1, a colour on itself 1:1.
const paintOf = (theme: 'light' | 'dark', layer: string, property: string) => samplePaint(theme).find((p) => p.layer === layer && p.property === property)?.value as string;

describe('buildStyle({ theme })', () => {
  it('the contrast helper matches WCAG 2.1: black on white 21:1, white on white 1:1', () => {
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 6);
    expect(contrast('#ffffff', '#ffffff')).toBe(1);
  });

  it("buildStyle({ theme: 'dark' }) changes paint only: same layers in the same order, same sources, same layout and filters", () => {
    const dark = buildStyle({ theme: 'dark' });
    expect(dark.sources).toEqual(style.sources);
    expect(dark.layers.map((l) => l.id)).toEqual(style.layers.map((l) => l.id));
    dark.layers.forEach((l, i) => {
      const { paint: _a, ...rest } = l as { paint?: unknown };
      const { paint: _b, ...lightRest } = style.layers[i] as { paint?: unknown };
      expect(rest).toEqual(lightRest);
    });
    expect(buildStyle({ theme: 'light' })).toEqual(style);
  });

  it('the dark ground is darker than the light one, and contacts, faults and contours keep 3:1 contrast with the ground in both', () => {
    const ground = { light: paintOf('light', 'korvane-background', 'background-color'), dark: paintOf('dark', 'korvane-background', 'background-color') };
    expect(luminance(ground.dark)).toBeLessThan(luminance(ground.light) / 5);
    for (const theme of ['light', 'dark'] as const) {
      for (const layer of ['korvane-contacts', 'korvane-faults']) {
        expect(contrast(paintOf(theme, layer, 'line-color'), ground[theme]), `${theme} ${layer}`).toBeGreaterThanOrEqual(3);
      }
    }
  });

  it('samplePaint(theme) lists every paint property of the style of that theme, once', () => {
    for (const theme of ['light', 'dark'] as const) {
      const built = buildStyle({ theme });
      const expected = built.layers.flatMap((l) => Object.keys((l as { paint?: object }).paint ?? {}).map((k) => `${l.id}/${k}`));
      expect(samplePaint(theme).map((p) => `${p.layer}/${p.property}`)).toEqual(expected);
    }
  });
});
