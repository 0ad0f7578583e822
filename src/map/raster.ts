/**
 * A tiny anti-aliased rasteriser for map symbols. Shapes are given in CSS pixels with the
 * origin at the symbol's anchor and y pointing up (north), and are drawn into an RGBA buffer
 * at any pixel ratio, so symbols stay sharp on every screen without canvas or fonts.
 * Coverage comes from the signed distance to each shape (0.5 px smoothing), which keeps edges
 * crisp and lets halos be drawn as the same shapes, only wider.
 */

export type Rgb = readonly [number, number, number];

export type Shape =
  | { readonly type: 'segment'; readonly a: readonly [number, number]; readonly b: readonly [number, number]; readonly width: number; readonly color: Rgb }
  | { readonly type: 'polygon'; readonly points: ReadonlyArray<readonly [number, number]>; readonly color: Rgb }
  | { readonly type: 'ring'; readonly center: readonly [number, number]; readonly radius: number; readonly width: number; readonly color: Rgb }
  | { readonly type: 'disc'; readonly center: readonly [number, number]; readonly radius: number; readonly color: Rgb };

/** Image in the form MapLibre's `addImage` accepts, plus the pixel ratio it was drawn at. */
export interface RasterImage {
  readonly width: number;
  readonly height: number;
  readonly data: Uint8ClampedArray;
  readonly pixelRatio: number;
}

export const HALO: Rgb = [255, 255, 255];

function distanceToSegment(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const len2 = dx * dx + dy * dy;
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / len2));
  return Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
}

/** Signed distance to a simple polygon: negative inside (even-odd rule). */
function signedDistanceToPolygon(px: number, py: number, pts: ReadonlyArray<readonly [number, number]>): number {
  let d = Infinity;
  let inside = false;
  for (let i = 0, j = pts.length - 1; i < pts.length; j = i++) {
    const [xi, yi] = pts[i];
    const [xj, yj] = pts[j];
    d = Math.min(d, distanceToSegment(px, py, xi, yi, xj, yj));
    if (yi > py !== yj > py && px < ((xj - xi) * (py - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside ? -d : d;
}

/** Signed distance (CSS px) from a point to the painted area of a shape, grown by `grow` px. */
function signedDistance(shape: Shape, x: number, y: number, grow: number): number {
  switch (shape.type) {
    case 'segment':
      return distanceToSegment(x, y, shape.a[0], shape.a[1], shape.b[0], shape.b[1]) - shape.width / 2 - grow;
    case 'polygon':
      return signedDistanceToPolygon(x, y, shape.points) - grow;
    case 'ring':
      return Math.abs(Math.hypot(x - shape.center[0], y - shape.center[1]) - shape.radius) - shape.width / 2 - grow;
    case 'disc':
      return Math.hypot(x - shape.center[0], y - shape.center[1]) - shape.radius - grow;
  }
}

/**
 * Draws shapes (first a white halo of `halo` px under all of them, then the shapes in order)
 * into a square image of `size` CSS px at `pixelRatio`.
 * @example rasterize([{type: 'disc', center: [0, 0], radius: 4, color: [0, 0, 0]}], 12, 2, 1)
 */
export function rasterize(shapes: readonly Shape[], size: number, pixelRatio: number, halo: number): RasterImage {
  const w = Math.ceil(size * pixelRatio);
  const h = w;
  const data = new Uint8ClampedArray(w * h * 4);
  const half = size / 2;
  // Work in straight-alpha floats, composite "over" shape by shape.
  const r = new Float32Array(w * h);
  const g = new Float32Array(w * h);
  const b = new Float32Array(w * h);
  const a = new Float32Array(w * h);
  const layers: Array<{ shape: Shape; grow: number; color: Rgb }> = [];
  if (halo > 0) for (const s of shapes) layers.push({ shape: s, grow: halo, color: HALO });
  for (const s of shapes) layers.push({ shape: s, grow: 0, color: s.color });
  const aa = 0.5 / pixelRatio; // half a device pixel of smoothing
  for (let row = 0; row < h; row++) {
    const y = half - (row + 0.5) / pixelRatio; // y up
    for (let col = 0; col < w; col++) {
      const x = (col + 0.5) / pixelRatio - half;
      const i = row * w + col;
      for (const { shape, grow, color } of layers) {
        const d = signedDistance(shape, x, y, grow);
        const cover = d <= -aa ? 1 : d >= aa ? 0 : (aa - d) / (2 * aa);
        if (cover === 0) continue;
        const outA = cover + a[i] * (1 - cover);
        r[i] = (color[0] * cover + r[i] * a[i] * (1 - cover)) / outA;
        g[i] = (color[1] * cover + g[i] * a[i] * (1 - cover)) / outA;
        b[i] = (color[2] * cover + b[i] * a[i] * (1 - cover)) / outA;
        a[i] = outA;
      }
      data[i * 4] = r[i];
      data[i * 4 + 1] = g[i];
      data[i * 4 + 2] = b[i];
      data[i * 4 + 3] = a[i] * 255;
    }
  }
  return { width: w, height: h, data, pixelRatio };
}
