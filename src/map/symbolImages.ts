import { rasterize, rasterizeBox, shapeBounds, type RasterBox, type RasterImage, type Shape } from './raster';
import { digitLabelWidth, digitShapes } from './strokeDigits';
import { SYMBOL_SIZE, lineShapes, parseImageId, planeShapes } from './symbolCatalog';

/** Colour of dip and plunge labels. */
const LABEL_COLOR = [25, 30, 34] as const;
const LABEL_HEIGHT = 8;
/** Halo width around symbols and labels, CSS px. */
const SYMBOL_HALO = 1.5;
const LABEL_HALO = 1.6;

/** The shapes of a Foldlens image id with their halo and square size, or null for ids that are not ours. */
function drawingOf(id: string): { shapes: Shape[]; size: number; halo: number } | null {
  const parsed = parseImageId(id);
  if (!parsed) return null;
  if (parsed.type === 'label') {
    const width = digitLabelWidth(parsed.text, LABEL_HEIGHT) + 6;
    return { shapes: digitShapes(parsed.text, LABEL_HEIGHT, LABEL_COLOR, 1.4), size: Math.max(width, LABEL_HEIGHT + 6), halo: LABEL_HALO };
  }
  const shapes = parsed.type === 'plane' ? planeShapes(parsed.kind, parsed.variant) : lineShapes(parsed.kind, parsed.variant, parsed.sense);
  return { shapes, size: SYMBOL_SIZE, halo: SYMBOL_HALO };
}

/**
 * Draws the image for a Foldlens image id at a pixel ratio, square and centred on the station
 * (for the legend and the symbol sheet), or returns null for ids that are not ours (so a
 * host's own missing images are left to the host). The map uses {@link mapImageFor}.
 * @example imageFor('fl-sym/bedding/inclined', 2) // 88 × 88 RGBA
 */
export function imageFor(id: string, pixelRatio: number): RasterImage | null {
  const d = drawingOf(id);
  return d ? rasterize(d.shapes, d.size, pixelRatio, d.halo) : null;
}

/**
 * The box, in CSS px around the station (y up), that the map image of an id covers: just
 * the painted pixels and their halo. A 44 px square costs the GPU 44² pixels per symbol
 * however little of it is painted; the box of a dip symbol is about a fifth of that.
 * Null for ids that are not ours.
 * @example mapImageBox('fl-sym/bedding/inclined') // {left: -16, bottom: -4, right: 16, top: 10}
 */
export function mapImageBox(id: string): RasterBox | null {
  const d = drawingOf(id);
  return d ? shapeBounds(d.shapes, d.halo) : null;
}

/**
 * Where the centre of an id's map image lies from the station, in CSS px, x right and y down,
 * for `icon-offset` (which turns with `icon-rotate` and scales with `icon-size`, so the station
 * stays the pivot of the turned symbol). [0, 0] for ids that are not ours.
 * @example mapImageOffset('fl-sym/bedding/inclined') // [0, -3]
 */
export function mapImageOffset(id: string): [number, number] {
  const box = mapImageBox(id);
  if (!box) return [0, 0];
  // + 0 turns -0 into 0, so offsets compare and print plainly.
  return [(box.left + box.right) / 2 + 0, -(box.bottom + box.top) / 2 + 0];
}

/**
 * The map image of an id: the same drawing as {@link imageFor}, cropped to {@link mapImageBox}.
 * @example mapImageFor('fl-sym/bedding/inclined', 2) // 64 × 28 RGBA
 */
export function mapImageFor(id: string, pixelRatio: number): RasterImage | null {
  const d = drawingOf(id);
  return d ? rasterizeBox(d.shapes, shapeBounds(d.shapes, d.halo), pixelRatio, d.halo) : null;
}
