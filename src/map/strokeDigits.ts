import type { Rgb, Shape } from './raster';

/**
 * Digits drawn as strokes on a 4 × 6 grid (x right, y up), so dip and plunge labels can be
 * rasterised without a font or a glyph server. Curves are short polylines; the shapes are
 * plain and upright, tuned for legibility at 9-12 px.
 */
const DIGITS: Record<string, ReadonlyArray<ReadonlyArray<readonly [number, number]>>> = {
  '0': [[[1, 0], [3, 0], [4, 1], [4, 5], [3, 6], [1, 6], [0, 5], [0, 1], [1, 0]]],
  '1': [[[1, 5], [2, 6], [2, 0]], [[1, 0], [3, 0]]],
  '2': [[[0, 5], [1, 6], [3, 6], [4, 5], [4, 4], [0, 0], [4, 0]]],
  '3': [[[0, 5], [1, 6], [3, 6], [4, 5], [4, 4], [3, 3], [1.5, 3]], [[3, 3], [4, 2], [4, 1], [3, 0], [1, 0], [0, 1]]],
  '4': [[[3, 0], [3, 6], [0, 2], [4, 2]]],
  '5': [[[4, 6], [0, 6], [0, 3.4], [3, 3.4], [4, 2.4], [4, 1], [3, 0], [0, 0]]],
  '6': [[[3.5, 6], [1.5, 6], [0, 4.5], [0, 1], [1, 0], [3, 0], [4, 1], [4, 2.5], [3, 3.5], [0, 3.5]]],
  '7': [[[0, 6], [4, 6], [1.5, 0]]],
  '8': [[[1, 3], [0, 4], [0, 5], [1, 6], [3, 6], [4, 5], [4, 4], [3, 3], [1, 3], [0, 2], [0, 1], [1, 0], [3, 0], [4, 1], [4, 2], [3, 3]]],
  '9': [[[4, 2.5], [1, 2.5], [0, 3.5], [0, 5], [1, 6], [3, 6], [4, 5], [4, 1.5], [2.5, 0], [0.5, 0]]],
};

/** Width of one digit cell in grid units, including spacing. */
const ADVANCE = 5.4;

/**
 * Stroke shapes for a non-negative integer label, centred on the origin, `height` CSS px tall.
 * @example digitShapes('45', 9, [20, 30, 40]).length // number of strokes
 */
export function digitShapes(text: string, height: number, color: Rgb, strokeWidth = 1.5): Shape[] {
  if (!/^[0-9]+$/.test(text)) throw new RangeError(`digitShapes draws digits only, not "${text}"`);
  const unit = height / 6;
  const totalWidth = (text.length * ADVANCE - (ADVANCE - 4)) * unit;
  const shapes: Shape[] = [];
  [...text].forEach((ch, k) => {
    const ox = -totalWidth / 2 + k * ADVANCE * unit;
    for (const line of DIGITS[ch]) {
      for (let i = 1; i < line.length; i++) {
        const [x0, y0] = line[i - 1];
        const [x1, y1] = line[i];
        shapes.push({
          type: 'segment',
          a: [ox + x0 * unit, y0 * unit - height / 2],
          b: [ox + x1 * unit, y1 * unit - height / 2],
          width: strokeWidth,
          color,
        });
      }
    }
  });
  return shapes;
}

/** Width in CSS px that `digitShapes(text, height)` occupies. */
export function digitLabelWidth(text: string, height: number): number {
  return (text.length * ADVANCE - (ADVANCE - 4)) * (height / 6);
}
