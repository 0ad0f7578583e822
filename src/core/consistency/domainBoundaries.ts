import { acosClamped, toDegrees } from '../math';
import { pointInRing } from '../polygon';
import type { Line } from '../types';
import { vectorToLine } from '../vectors';
import type { FieldGrid, LocalAxisField } from './localAxisField';

/**
 * Suggested structural domains from a local axis field (localAxisField.ts): where the local fold
 * axis turns fastest, and a partition of the grid into regions of one axis.
 *
 * - Gradient: at each node, the largest angle between its axis and a 4-neighbour's, divided by
 *   their distance (degrees per unit of distance): a map of where the axis changes fastest.
 * - Partition by region growing (Adams & Bischof 1994, "Seeded region growing", IEEE PAMI 16,
 *   641-647; from memory), with axes in place of grey levels: seeds are taken in order of
 *   increasing gradient (the calmest nodes first), and a 4-neighbour joins a region while its
 *   axis lies within `angle` of the region's mean axis. Comparing with the running mean rather
 *   than with the neighbour alone stops a region from creeping round a slowly turning (conical)
 *   fold. Regions smaller than `minNodes` are merged into the adjacent region whose mean axis is
 *   closest (common practice in segmentation, to clear speckle).
 * - Boundaries: the cell edges between nodes of different regions, chained into polylines; and
 *   each region's outline as rings of cell corners (outer rings counter-clockwise, holes
 *   clockwise), which a map can offer as domain polygons.
 *
 * Nodes sit at cell centres (localAxisField.ts), so a boundary lies half a cell from the nodes on
 * either side; with k-nearest windows, nodes within about one window radius of a sharp boundary
 * mix both sides, which sets how closely a boundary can be placed.
 */

/** Options of {@link partitionAxisField}. */
export interface PartitionOptions {
  /** Largest angle (degrees) between a node's axis and its region's mean axis (default 10). */
  readonly angle?: number;
  /** Regions with fewer nodes are merged into a neighbour (default 1% of the nodes with an axis, at least 4). */
  readonly minNodes?: number;
}

/**
 * Defaults of {@link PartitionOptions}.
 * @example partitionAxisField(field, { angle: PARTITION_DEFAULTS.angle })
 */
export const PARTITION_DEFAULTS = Object.freeze({ angle: 10, minNodesShare: 0.01, minNodesFloor: 4 });

/** One region of one axis. */
export interface AxisRegion {
  readonly label: number;
  readonly nodes: number;
  /** Mean of the member nodes' axes (lower hemisphere). */
  readonly axis: Line;
  /** Largest angle (degrees) between a member's axis and the mean. */
  readonly spread: number;
  /** Area covered by the member cells, in squared units of the coordinates. */
  readonly area: number;
}

/** A boundary between two regions, as a polyline of cell corners [x0, y0, x1, y1, ...]. */
export interface RegionBoundary {
  /** The two regions' labels, smaller first. */
  readonly between: readonly [number, number];
  /** Angle (degrees) between the two regions' mean axes. */
  readonly axisChange: number;
  readonly points: readonly number[];
}

/** A region's outline: one outer ring (counter-clockwise) and its holes (clockwise), each [x0, y0, ...] closed. */
export interface RegionPolygon {
  readonly label: number;
  readonly outer: readonly number[];
  readonly holes: readonly (readonly number[])[];
}

/** The partition of the grid into regions of one axis. */
export interface AxisPartition {
  /** Region label per node; -1 where the node has no axis. */
  readonly labels: Int32Array;
  readonly regions: readonly AxisRegion[];
  readonly boundaries: readonly RegionBoundary[];
  readonly polygons: readonly RegionPolygon[];
  readonly angle: number;
  readonly minNodes: number;
}

/**
 * Rate of turning of the local axis at each node: max over 4-neighbours of angle / distance
 * (degrees per unit distance); NaN where the node or all its neighbours lack an axis.
 * @example axisGradient(field)[node] * 1000 // degrees per kilometre for metre coordinates
 */
export function axisGradient(field: LocalAxisField): Float64Array {
  const { nx, ny, dx, dy } = field.grid;
  const out = new Float64Array(nx * ny).fill(Number.NaN);
  for (let node = 0; node < nx * ny; node++) {
    if (!hasAxis(field, node)) continue;
    const col = node % nx;
    const row = (node - col) / nx;
    let best = Number.NaN;
    const visit = (other: number, distance: number): void => {
      if (!hasAxis(field, other)) return;
      const g = angleBetweenNodes(field, node, other) / distance;
      if (!(g <= best)) best = g;
    };
    if (col > 0) visit(node - 1, dx);
    if (col < nx - 1) visit(node + 1, dx);
    if (row > 0) visit(node - nx, dy);
    if (row < ny - 1) visit(node + nx, dy);
    out[node] = best;
  }
  return out;
}

/**
 * Partitions the field into regions of one axis (see the module comment). Throws a RangeError
 * for a bad angle or region size.
 * @example
 * const p = partitionAxisField(localAxisField(xy, poles, { k: 40 }), { angle: 10 });
 * p.regions.map((r) => r.axis) // one mean axis per suggested domain
 */
export function partitionAxisField(field: LocalAxisField, options: PartitionOptions = {}): AxisPartition {
  const angle = options.angle ?? PARTITION_DEFAULTS.angle;
  if (!(angle > 0 && angle < 90)) throw new RangeError(`partitionAxisField: angle ${String(angle)} (expected degrees between 0 and 90)`);
  const { nx, ny } = field.grid;
  const nodes = nx * ny;
  let defined = 0;
  for (let i = 0; i < nodes; i++) if (hasAxis(field, i)) defined++;
  const minNodes = options.minNodes ?? Math.max(PARTITION_DEFAULTS.minNodesFloor, Math.round(PARTITION_DEFAULTS.minNodesShare * defined));
  if (!(Number.isInteger(minNodes) && minNodes >= 1)) throw new RangeError(`partitionAxisField: minNodes ${String(minNodes)} (expected a whole number of at least 1)`);
  const cosLimit = Math.cos((angle * Math.PI) / 180);

  // Seeds in order of increasing gradient: calm interiors first.
  const gradient = axisGradient(field);
  const order = Array.from({ length: nodes }, (_, i) => i)
    .filter((i) => hasAxis(field, i))
    .sort((a, b) => (gradient[a] || 0) - (gradient[b] || 0) || a - b);

  const labels = new Int32Array(nodes).fill(-1);
  const sums: number[][] = []; // per region: sign-aligned sum of member axes
  const queue = new Int32Array(nodes);
  const ax = field.axis;
  for (const seed of order) {
    if (labels[seed] !== -1) continue;
    const label = sums.length;
    const sum = [ax[3 * seed], ax[3 * seed + 1], ax[3 * seed + 2]];
    sums.push(sum);
    labels[seed] = label;
    let head = 0;
    let tail = 0;
    queue[tail++] = seed;
    while (head < tail) {
      const node = queue[head++];
      const col = node % nx;
      const row = (node - col) / nx;
      const neighbours = [col > 0 ? node - 1 : -1, col < nx - 1 ? node + 1 : -1, row > 0 ? node - nx : -1, row < ny - 1 ? node + nx : -1];
      for (const other of neighbours) {
        if (other < 0 || labels[other] !== -1 || !hasAxis(field, other)) continue;
        const len = Math.hypot(sum[0], sum[1], sum[2]);
        const d = (ax[3 * other] * sum[0] + ax[3 * other + 1] * sum[1] + ax[3 * other + 2] * sum[2]) / len;
        if (Math.abs(d) < cosLimit) continue;
        // Axes have no sense: add each in the sense that agrees with the running sum.
        const s = d < 0 ? -1 : 1;
        sum[0] += s * ax[3 * other];
        sum[1] += s * ax[3 * other + 1];
        sum[2] += s * ax[3 * other + 2];
        labels[other] = label;
        queue[tail++] = other;
      }
    }
  }

  mergeSmallRegions(field, labels, sums.length, minNodes);
  const compact = relabel(labels);
  const regions = describeRegions(field, labels, compact);
  return {
    labels,
    regions,
    boundaries: regionBoundaries(field.grid, labels, regions),
    polygons: regionPolygons(field.grid, labels, compact),
    angle,
    minNodes,
  };
}

function hasAxis(field: LocalAxisField, node: number): boolean {
  return Number.isFinite(field.axis[3 * node]);
}

function angleBetweenNodes(field: LocalAxisField, a: number, b: number): number {
  const v = field.axis;
  return toDegrees(acosClamped(Math.abs(v[3 * a] * v[3 * b] + v[3 * a + 1] * v[3 * b + 1] + v[3 * a + 2] * v[3 * b + 2])));
}

/** Mean axis (principal direction, sign-aligned sum) of the given nodes. */
function meanAxis(field: LocalAxisField, members: readonly number[]): { x: number; y: number; z: number } {
  const v = field.axis;
  const first = members[0];
  let sx = 0, sy = 0, sz = 0;
  for (const m of members) {
    const s = v[3 * m] * v[3 * first] + v[3 * m + 1] * v[3 * first + 1] + v[3 * m + 2] * v[3 * first + 2] < 0 ? -1 : 1;
    sx += s * v[3 * m];
    sy += s * v[3 * m + 1];
    sz += s * v[3 * m + 2];
  }
  const len = Math.hypot(sx, sy, sz);
  return { x: sx / len, y: sy / len, z: sz / len };
}

/** Merges regions under minNodes into the adjacent region with the closest mean axis, smallest first. */
function mergeSmallRegions(field: LocalAxisField, labels: Int32Array, count: number, minNodes: number): void {
  const { nx, ny } = field.grid;
  for (let pass = 0; pass < count; pass++) {
    const members = membersOf(labels, count);
    const small = members
      .map((m, label) => ({ label, size: m.length }))
      .filter((r) => r.size > 0 && r.size < minNodes)
      .sort((a, b) => a.size - b.size || a.label - b.label);
    let merged = false;
    for (const { label } of small) {
      const own = membersOf(labels, count)[label];
      if (own.length === 0 || own.length >= minNodes) continue;
      const mine = meanAxis(field, own);
      const adjacent = new Set<number>();
      for (const node of own) {
        const col = node % nx;
        const row = (node - col) / nx;
        for (const other of [col > 0 ? node - 1 : -1, col < nx - 1 ? node + 1 : -1, row > 0 ? node - nx : -1, row < ny - 1 ? node + nx : -1]) {
          if (other >= 0 && labels[other] >= 0 && labels[other] !== label) adjacent.add(labels[other]);
        }
      }
      let target = -1;
      let bestCos = -1;
      const all = membersOf(labels, count);
      for (const a of adjacent) {
        const m = meanAxis(field, all[a]);
        const c = Math.abs(m.x * mine.x + m.y * mine.y + m.z * mine.z);
        // Prefer regions that are already big enough, then the closest axis.
        const score = (all[a].length >= minNodes ? 2 : 0) + c;
        if (score > bestCos) {
          bestCos = score;
          target = a;
        }
      }
      if (target < 0) continue;
      for (const node of own) labels[node] = target;
      merged = true;
    }
    if (!merged) break;
  }
}

function membersOf(labels: Int32Array, count: number): number[][] {
  const out: number[][] = Array.from({ length: count }, () => []);
  for (let i = 0; i < labels.length; i++) if (labels[i] >= 0) out[labels[i]].push(i);
  return out;
}

/** Renumbers labels 0, 1, ... in order of first appearance (south-west first); returns the count. */
function relabel(labels: Int32Array): number {
  const map = new Map<number, number>();
  for (let i = 0; i < labels.length; i++) {
    const l = labels[i];
    if (l < 0) continue;
    if (!map.has(l)) map.set(l, map.size);
    labels[i] = map.get(l)!;
  }
  return map.size;
}

function describeRegions(field: LocalAxisField, labels: Int32Array, count: number): AxisRegion[] {
  const { dx, dy } = field.grid;
  return membersOf(labels, count).map((members, label) => {
    const mean = meanAxis(field, members);
    let minCos = 1;
    for (const m of members) {
      const c = Math.abs(field.axis[3 * m] * mean.x + field.axis[3 * m + 1] * mean.y + field.axis[3 * m + 2] * mean.z);
      if (c < minCos) minCos = c;
    }
    return { label, nodes: members.length, axis: vectorToLine(mean), spread: toDegrees(acosClamped(minCos)), area: members.length * dx * dy };
  });
}

/** Corner (i, j) of the grid, i = 0..nx, j = 0..ny, as one integer key. */
const cornerKey = (grid: FieldGrid, i: number, j: number): number => j * (grid.nx + 1) + i;
const cornerXY = (grid: FieldGrid, key: number): [number, number] => {
  const i = key % (grid.nx + 1);
  const j = (key - i) / (grid.nx + 1);
  return [grid.minX + i * grid.dx, grid.minY + j * grid.dy];
};

/** Cell edges between differently labelled nodes, chained into polylines per pair of regions. */
function regionBoundaries(grid: FieldGrid, labels: Int32Array, regions: readonly AxisRegion[]): RegionBoundary[] {
  const { nx, ny } = grid;
  const byPair = new Map<string, Array<[number, number]>>();
  const add = (a: number, b: number, c0: number, c1: number): void => {
    const key = `${Math.min(a, b)}|${Math.max(a, b)}`;
    let list = byPair.get(key);
    if (!list) byPair.set(key, (list = []));
    list.push([c0, c1]);
  };
  for (let row = 0; row < ny; row++) {
    for (let col = 0; col < nx; col++) {
      const node = row * nx + col;
      const a = labels[node];
      if (a < 0) continue;
      if (col < nx - 1) {
        const b = labels[node + 1];
        // Shared edge: the vertical line x = col + 1 from row to row + 1.
        if (b >= 0 && b !== a) add(a, b, cornerKey(grid, col + 1, row), cornerKey(grid, col + 1, row + 1));
      }
      if (row < ny - 1) {
        const b = labels[node + nx];
        if (b >= 0 && b !== a) add(a, b, cornerKey(grid, col, row + 1), cornerKey(grid, col + 1, row + 1));
      }
    }
  }
  const out: RegionBoundary[] = [];
  for (const [key, segments] of [...byPair.entries()].sort((p, q) => (p[0] < q[0] ? -1 : 1))) {
    const [a, b] = key.split('|').map(Number) as [number, number];
    const ra = lineVector(regions[a].axis);
    const rb = lineVector(regions[b].axis);
    const axisChange = toDegrees(acosClamped(Math.abs(ra[0] * rb[0] + ra[1] * rb[1] + ra[2] * rb[2])));
    for (const chain of chainSegments(segments)) {
      out.push({ between: [a, b], axisChange, points: chain.flatMap((c) => cornerXY(grid, c)) });
    }
  }
  return out;
}

function lineVector(l: Line): [number, number, number] {
  const t = (l.trend * Math.PI) / 180;
  const p = (l.plunge * Math.PI) / 180;
  return [Math.cos(p) * Math.cos(t), Math.cos(p) * Math.sin(t), Math.sin(p)];
}

/** Undirected segments (pairs of corner keys) chained into maximal polylines; breaks at junctions. */
function chainSegments(segments: ReadonlyArray<readonly [number, number]>): number[][] {
  const at = new Map<number, number[]>();
  segments.forEach(([p, q], s) => {
    for (const c of [p, q]) {
      let l = at.get(c);
      if (!l) at.set(c, (l = []));
      l.push(s);
    }
  });
  const used = new Uint8Array(segments.length);
  const chains: number[][] = [];
  const walk = (start: number, first: number): number[] => {
    const chain = [start];
    let corner = start;
    let s = first;
    while (s >= 0 && !used[s]) {
      used[s] = 1;
      const [p, q] = segments[s];
      corner = p === corner ? q : p;
      chain.push(corner);
      const next = at.get(corner)!;
      // Continue only through corners where exactly two segments meet.
      s = next.length === 2 ? (next[0] === s ? next[1] : next[0]) : -1;
    }
    return chain;
  };
  // Open chains start at ends and junctions; what is left are closed loops.
  for (const [corner, list] of [...at.entries()].sort((p, q) => p[0] - q[0])) {
    if (list.length === 2) continue;
    for (const s of list) if (!used[s]) chains.push(walk(corner, s));
  }
  for (let s = 0; s < segments.length; s++) if (!used[s]) chains.push(walk(segments[s][0], s));
  return chains;
}

/** Each region's outline as closed rings of cell corners, holes assigned to the outer ring around them. */
function regionPolygons(grid: FieldGrid, labels: Int32Array, count: number): RegionPolygon[] {
  const { nx, ny } = grid;
  const label = (col: number, row: number): number => (col < 0 || row < 0 || col >= nx || row >= ny ? -2 : labels[row * nx + col]);
  const out: RegionPolygon[] = [];
  for (let r = 0; r < count; r++) {
    // Directed edges with the region on the left (counter-clockwise round the region), from corner to corner.
    const from = new Map<number, number[]>();
    const edges: Array<[number, number]> = [];
    const addEdge = (p: number, q: number): void => {
      edges.push([p, q]);
      let l = from.get(p);
      if (!l) from.set(p, (l = []));
      l.push(edges.length - 1);
    };
    for (let row = 0; row < ny; row++) {
      for (let col = 0; col < nx; col++) {
        if (labels[row * nx + col] !== r) continue;
        if (label(col, row - 1) !== r) addEdge(cornerKey(grid, col, row), cornerKey(grid, col + 1, row)); // south side, eastward
        if (label(col + 1, row) !== r) addEdge(cornerKey(grid, col + 1, row), cornerKey(grid, col + 1, row + 1)); // east side, northward
        if (label(col, row + 1) !== r) addEdge(cornerKey(grid, col + 1, row + 1), cornerKey(grid, col, row + 1)); // north side, westward
        if (label(col - 1, row) !== r) addEdge(cornerKey(grid, col, row + 1), cornerKey(grid, col, row)); // west side, southward
      }
    }
    const used = new Uint8Array(edges.length);
    const rings: number[][] = [];
    for (let e0 = 0; e0 < edges.length; e0++) {
      if (used[e0]) continue;
      const ring: number[] = [edges[e0][0]];
      let e = e0;
      while (!used[e]) {
        used[e] = 1;
        const [p, q] = edges[e];
        ring.push(q);
        if (q === ring[0]) break;
        const options = (from.get(q) ?? []).filter((c) => !used[c]);
        if (options.length === 0) break;
        // At a corner where the region touches itself diagonally, turn left, so that regions
        // joined only at a corner (not 4-connected) get separate rings.
        e = options.length === 1 ? options[0] : leftmost(grid, p, q, options.map((c) => edges[c][1]), options);
      }
      rings.push(ring.flatMap((c) => cornerXY(grid, c)));
    }
    const outers = rings.filter((ring) => signedArea(ring) > 0);
    const holes = rings.filter((ring) => signedArea(ring) < 0);
    const polygons = outers.map((outer) => ({ label: r, outer, holes: [] as number[][] }));
    for (const hole of holes) {
      const owner = polygons.find((p) => pointInRing(hole[0] + 1e-9 * grid.dx, hole[1] + 1e-9 * grid.dy, p.outer) || pointInRing(hole[0], hole[1], p.outer));
      (owner ?? polygons[0])?.holes.push(hole);
    }
    out.push(...polygons);
  }
  return out;
}

/** Of the candidate next corners, the one reached by the sharpest left turn at q (coming from p). */
function leftmost(grid: FieldGrid, p: number, q: number, nexts: readonly number[], options: readonly number[]): number {
  const [px, py] = cornerXY(grid, p);
  const [qx, qy] = cornerXY(grid, q);
  const inX = qx - px;
  const inY = qy - py;
  let best = options[0];
  let bestTurn = -Infinity;
  nexts.forEach((c, i) => {
    const [cx, cy] = cornerXY(grid, c);
    const outX = cx - qx;
    const outY = cy - qy;
    // Cross product > 0 is a left turn; rank left, then straight, then right.
    const turn = Math.atan2(inX * outY - inY * outX, inX * outX + inY * outY);
    if (turn > bestTurn) {
      bestTurn = turn;
      best = options[i];
    }
  });
  return best;
}

/** Shoelace area of a closed flat ring (positive counter-clockwise). */
function signedArea(ring: readonly number[]): number {
  let a = 0;
  for (let i = 0; i + 3 < ring.length; i += 2) a += ring[i] * ring[i + 3] - ring[i + 2] * ring[i + 1];
  return a / 2;
}
