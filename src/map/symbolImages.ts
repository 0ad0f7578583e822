import { rasterize, type RasterImage } from './raster';
import { digitLabelWidth, digitShapes } from './strokeDigits';
import { SYMBOL_SIZE, lineShapes, parseImageId, planeShapes } from './symbolCatalog';

/** Colour of dip and plunge labels. */
const LABEL_COLOR = [25, 30, 34] as const;
const LABEL_HEIGHT = 8;

/**
 * Draws the image for a Foldlens image id at a pixel ratio, or returns null for ids that are
 * not ours (so a host's own missing images are left to the host).
 * @example imageFor('fl-sym/bedding/inclined', 2) // 88 × 88 RGBA
 */
export function imageFor(id: string, pixelRatio: number): RasterImage | null {
  const parsed = parseImageId(id);
  if (!parsed) return null;
  if (parsed.type === 'label') {
    const width = digitLabelWidth(parsed.text, LABEL_HEIGHT) + 6;
    return rasterize(digitShapes(parsed.text, LABEL_HEIGHT, LABEL_COLOR, 1.4), Math.max(width, LABEL_HEIGHT + 6), pixelRatio, 1.6);
  }
  const shapes = parsed.type === 'plane' ? planeShapes(parsed.kind, parsed.variant) : lineShapes(parsed.kind, parsed.variant, parsed.sense);
  return rasterize(shapes, SYMBOL_SIZE, pixelRatio, 1.5);
}
