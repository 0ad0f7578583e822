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

/** A rectangle in CSS px around a symbol's anchor, y up (north): left, bottom, right, top. */
export interface RasterBox {
  readonly left: number;
  readonly bottom: number;
  readonly right: number;
  readonly top: number;
}

/**
 * The smallest box of whole CSS px that holds every painted pixel of the shapes once each is
 * grown by `grow` px (the halo), including the half pixel of edge smoothing.
 * @example shapeBounds([{type: 'disc', center: [0, 0], radius: 4, color: [0, 0, 0]}], 1) // {left: -6, bottom: -6, right: 6, top: 6}
 */
export function shapeBounds(shapes: readonly Shape[], grow: number): RasterBox {
  let left = Infinity;
  let bottom = Infinity;
  let right = -Infinity;
  let top = -Infinity;
  const add = (x: number, y: number, r: number) => {
    left = Math.min(left, x - r);
    right = Math.max(right, x + r);
    bottom = Math.min(bottom, y - r);
    top = Math.max(top, y + r);
  };
  // Half a CSS px of smoothing covers every pixel ratio from 1 (smoothing is half a device pixel).
  const g = grow + 0.5;
  for (const s of shapes) {
    switch (s.type) {
      case 'segment':
        add(s.a[0], s.a[1], s.width / 2 + g);
        add(s.b[0], s.b[1], s.width / 2 + g);
        break;
      case 'polygon':
        for (const [x, y] of s.points) add(x, y, g);
        break;
      case 'ring':
        add(s.center[0], s.center[1], s.radius + s.width / 2 + g);
        break;
      case 'disc':
        add(s.center[0], s.center[1], s.radius + g);
        break;
    }
  }
  if (!Number.isFinite(left)) return { left: 0, bottom: 0, right: 0, top: 0 };
  return { left: Math.floor(left), bottom: Math.floor(bottom), right: Math.ceil(right), top: Math.ceil(top) };
}

/**
 * Draws shapes (first a white halo of `halo` px under all of them, then the shapes in order)
 * into a square image of `size` CSS px at `pixelRatio`, centred on the anchor.
 * @example rasterize([{type: 'disc', center: [0, 0], radius: 4, color: [0, 0, 0]}], 12, 2, 1)
 */
export function rasterize(shapes: readonly Shape[], size: number, pixelRatio: number, halo: number): RasterImage {
  const half = size / 2;
  return rasterizeBox(shapes, { left: -half, bottom: -half, right: half, top: half }, pixelRatio, halo);
}

/**
 * Draws shapes like {@link rasterize}, into the image of a box around the anchor (a box from
 * {@link shapeBounds} leaves out the empty margin, which a GPU would otherwise fill for nothing).
 * @example rasterizeBox(shapes, shapeBounds(shapes, 1.5), 2, 1.5)
 */
export function rasterizeBox(shapes: readonly Shape[], box: RasterBox, pixelRatio: number, halo: number): RasterImage {
  const w = Math.max(1, Math.ceil((box.right - box.left) * pixelRatio));
  const h = Math.max(1, Math.ceil((box.top - box.bottom) * pixelRatio));
  const data = new Uint8ClampedArray(w * h * 4);
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
    const y = box.top - (row + 0.5) / pixelRatio; // y up
    for (let col = 0; col < w; col++) {
      const x = box.left + (col + 0.5) / pixelRatio;
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
