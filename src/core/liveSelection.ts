import Flatbush from 'flatbush';
import { boundsOf, pointInRing, ringGrowthFlips } from './polygon';
import type { TensorSums } from './orientationTensor';

/** How a new shape combines with the selection that existed before the gesture. */
export type SelectionCombine = 'replace' | 'add' | 'subtract';

/**
 * Point selection that stays live while a lasso is drawn. Points are planar (e.g. Web Mercator
 * x, y of the stations); each point may carry a unit pole vector (planes) whose orientation
 * tensor sums are kept in step with the selection, so the girdle fit of the current selection
 * costs O(1) after each move.
 *
 * Freehand lasso: adding vertex c to a ring a..b flips exactly the points inside triangle abc
 * under the even-odd rule, so a move tests only the points in that triangle's bounding box
 * (found with a flatbush R-tree) instead of every point against every edge.
 * Polygons and rectangles whose vertices all move are evaluated in full within their bounds.
 * @example
 * const live = new LiveSelection(xy, poles); // xy: projected x, y pairs
 * live.begin('replace');
 * for (const [x, y] of pointerPath) live.addLassoVertex(x, y);
 * const fit = fitGirdleFromSums(live.tensorSums());
 */
export class LiveSelection {
  readonly size: number;
  private readonly xy: Float64Array;
  private readonly poles: Float64Array | null;
  private readonly index: Flatbush;
  /** Membership of the shape being drawn. */
  private readonly inShape: Uint8Array;
  /** Final membership (shape combined with the base). */
  private readonly selectedFlags: Uint8Array;
  private base: Uint8Array;
  private combine: SelectionCombine = 'replace';
  private ring: number[] = [];
  private count = 0;
  // Mutable tensor sums of the selected poles: xx, xy, xz, yy, yz, zz, n.
  private readonly sums = new Float64Array(7);

  /**
   * @param xy - n*2 planar coordinates.
   * @param poles - n*3 unit vectors, NaN for points that are not planes (they are selected but add no pole).
   */
  constructor(xy: Float64Array, poles: Float64Array | null = null) {
    this.size = xy.length >> 1;
    if (poles && poles.length !== this.size * 3) throw new RangeError(`poles has ${poles.length / 3} vectors for ${this.size} points`);
    this.xy = xy;
    this.poles = poles;
    this.index = new Flatbush(Math.max(1, this.size));
    for (let i = 0; i < this.size; i++) this.index.add(xy[2 * i], xy[2 * i + 1]);
    if (this.size === 0) this.index.add(0, 0);
    this.index.finish();
    this.inShape = new Uint8Array(this.size);
    this.selectedFlags = new Uint8Array(this.size);
    this.base = new Uint8Array(this.size);
  }

  /** Starts a gesture: the current selection becomes the base the shape combines with. */
  begin(combine: SelectionCombine): void {
    this.combine = combine;
    this.base = this.selectedFlags.slice();
    this.inShape.fill(0);
    this.ring = [];
    if (combine === 'replace') this.setAll(this.inShape);
  }

  /** Appends a vertex to the freehand ring and updates the selection incrementally. */
  addLassoVertex(x: number, y: number): void {
    const r = this.ring;
    r.push(x, y);
    const m = r.length >> 1;
    if (m < 3) return;
    const ax = r[0], ay = r[1], bx = r[r.length - 4], by = r[r.length - 3];
    const minX = Math.min(ax, bx, x), maxX = Math.max(ax, bx, x);
    const minY = Math.min(ay, by, y), maxY = Math.max(ay, by, y);
    const hits = this.index.search(minX, minY, maxX, maxY);
    for (const i of hits) {
      if (i >= this.size) continue;
      if (ringGrowthFlips(this.xy[2 * i], this.xy[2 * i + 1], ax, ay, bx, by, x, y)) {
        this.inShape[i] ^= 1;
        this.refresh(i);
      }
    }
  }

  /** Sets the whole shape at once (polygon or rectangle tools, or an edited outline). */
  setShape(ring: ArrayLike<number>): void {
    this.ring = Array.from(ring);
    const next = new Uint8Array(this.size);
    if (ring.length >= 6) {
      const [minX, minY, maxX, maxY] = boundsOf(ring);
      for (const i of this.index.search(minX, minY, maxX, maxY)) {
        if (i < this.size && pointInRing(this.xy[2 * i], this.xy[2 * i + 1], ring)) next[i] = 1;
      }
    }
    for (let i = 0; i < this.size; i++) {
      if (next[i] !== this.inShape[i]) {
        this.inShape[i] = next[i];
        this.refresh(i);
      }
    }
  }

  /** The ring drawn so far (flat x, y). */
  get shape(): readonly number[] {
    return this.ring;
  }

  /** Replaces the selection outright (select by kind, clear, undo), outside any gesture. */
  setSelected(flags: Uint8Array): void {
    if (flags.length !== this.size) throw new RangeError(`expected ${this.size} flags, got ${flags.length}`);
    this.setAll(flags);
    this.base = flags.slice();
    this.inShape.fill(0);
    this.combine = 'add';
  }

  /** Abandons the gesture: the selection goes back to what it was at {@link begin}. */
  cancel(): void {
    this.setSelected(this.base.slice());
  }

  /** Clears the selection. */
  clear(): void {
    this.setSelected(new Uint8Array(this.size));
  }

  /** Membership flags (1 = selected); a live view, copy it to keep it. */
  get flags(): Uint8Array {
    return this.selectedFlags;
  }

  /** Number of selected points. */
  get selectedCount(): number {
    return this.count;
  }

  /** Indices of the selected points, ascending. */
  selectedIndices(): Int32Array {
    const out = new Int32Array(this.count);
    let k = 0;
    for (let i = 0; i < this.size; i++) if (this.selectedFlags[i]) out[k++] = i;
    return out;
  }

  /** Orientation tensor sums of the selected poles. */
  tensorSums(): TensorSums {
    const s = this.sums;
    return { xx: s[0], xy: s[1], xz: s[2], yy: s[3], yz: s[4], zz: s[5], n: Math.round(s[6]) };
  }

  /** Recomputes the sums exactly from the flags, removing any drift from many small updates. */
  resync(): void {
    this.sums.fill(0);
    for (let i = 0; i < this.size; i++) if (this.selectedFlags[i]) this.accumulate(i, 1);
  }

  private combined(i: number): number {
    const shape = this.inShape[i];
    switch (this.combine) {
      case 'replace':
        return shape;
      case 'add':
        return this.base[i] | shape;
      case 'subtract':
        return this.base[i] & (shape ^ 1);
    }
  }

  private refresh(i: number): void {
    const next = this.combined(i);
    if (next === this.selectedFlags[i]) return;
    this.selectedFlags[i] = next;
    this.count += next ? 1 : -1;
    this.accumulate(i, next ? 1 : -1);
  }

  private setAll(flags: Uint8Array): void {
    for (let i = 0; i < this.size; i++) {
      if (flags[i] !== this.selectedFlags[i]) {
        this.selectedFlags[i] = flags[i];
        this.count += flags[i] ? 1 : -1;
      }
    }
    this.resync();
  }

  private accumulate(i: number, sign: 1 | -1): void {
    const p = this.poles;
    if (!p) return;
    const x = p[3 * i], y = p[3 * i + 1], z = p[3 * i + 2];
    if (Number.isNaN(x)) return;
    const s = this.sums;
    s[0] += sign * x * x;
    s[1] += sign * x * y;
    s[2] += sign * x * z;
    s[3] += sign * y * y;
    s[4] += sign * y * z;
    s[5] += sign * z * z;
    s[6] += sign;
  }
}
