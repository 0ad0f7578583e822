import { checkAxis, profileFrame } from '../downPlunge';
import { assertPlanes } from '../girdle';
import { toDegrees } from '../math';
import type { FoldSense, Line, Plane } from '../types';
import { planeNormal } from '../vectors';

/**
 * Fold closures on the map against the plunge. Where a contact trace turns back on the map, the
 * closure of the outcrop pattern points down the plunge for an antiform and up the plunge for a
 * synform, on gently sloping ground (common practice; e.g. the outcrop patterns of plunging
 * folds in any structural field manual). This module finds the closures of each trace, says
 * which way each points, reads the fold's sense at each from the field evidence nearby (hinge
 * readings that say antiform or synform, or the dips of the bedding on the two limbs) and
 * reports the closures where the two disagree.
 *
 * Geometry (derived). With the axis trend t and plunge p, a position P (east-north-up metres)
 * has s = P·(sin t, cos t, 0) along the trend on the map, u = P·(cos t, -sin t, 0) across it
 * (profile right), and height in the profile v = P·(sin p sin t, sin p cos t, cos p)
 * (downPlunge.ts), so that exactly
 *
 *   v = s·sin p + z·cos p.
 *
 * - A closure on the map is a turning point of s along the trace: s reaches a maximum (the
 *   closure points toward the trend, down the plunge) or a minimum (it points up the plunge).
 *   Turning points are kept only when s falls back by at least `depth` metres on both sides (a
 *   zig-zag filter), so that digitising wiggles are not read as closures.
 * - A fold closure is where the trace passes through a hinge: in the down-plunge profile the
 *   trace point crosses from one limb to the other, so v has an extremum there (standing at
 *   least depth/10 above or below the neighbouring turning points) while u keeps going (looked
 *   at `depth` metres away in the profile on either side, the trace lies on opposite sides of
 *   the hinge in u). An antiform hinge is a maximum of v, a synform hinge a minimum. Where the
 *   trace instead runs along one limb (a V where it crosses a valley, the "rule of Vs"), v has
 *   no such extremum or u turns back with it; such turns are reported as topographic and never
 *   judged.
 * - The map rule. On level ground (z constant) v is proportional to s, so an antiform (v
 *   maximum) closes where s is a maximum: down the plunge. The height term z·cos p changes that
 *   only where the ground falls toward the plunge direction more steeply than the axis plunges
 *   (the trace heights say so); there the map rule reverses, and the check says so instead of
 *   flagging. `traceSense` (the sense read down the axis with the heights) is what the
 *   closure's map direction implies on the ground as it is.
 * - Evidence. Hinge readings within `radius` of the hinge crossing that carry a sense vote
 *   directly. Otherwise bedding readings within `radius` vote by their limb dip: in the profile a
 *   plane with normal n has the slope -n_u/n_v; on an antiform the limbs fall away from the
 *   hinge (slope × (u - u_hinge) < 0), on a synform they rise away from it. Readings closer to
 *   the hinge than a tenth of the radius, or flatter than 5° or steeper than 85° in the profile,
 *   do not vote (their side or their sense is not clear; Foldlens convention). A sense needs
 *   `minVotes` votes of which `agreement` agree. Overturned limbs would vote the wrong way; the
 *   check assumes upright folds.
 *
 * Positions are east-north-up metres, one Float64Array of x, y, z triples per trace piece, in
 * order along the trace; the axis and the readings are referred to the same north as the
 * positions (domainCheck.ts turns positions to true north). A piece whose last vertex repeats
 * its first is taken as a closed ring.
 */

/** Options of {@link checkClosures} and {@link findClosures}. */
export interface ClosureOptions {
  /** Least fall of s on both sides of a turning point, metres (default 50). */
  readonly depth?: number;
  /** Map distance from the hinge crossing within which readings vote on the sense, metres (default 250). */
  readonly radius?: number;
  /** Fewest votes for a sense (default 3 for limb dips; 1 for hinge readings). */
  readonly minVotes?: number;
  /** Share of the votes that must agree (default 0.75). */
  readonly agreement?: number;
}

/**
 * Defaults of {@link ClosureOptions}: metres and shares.
 * @example checkClosures(pieces, axis, evidence, { radius: CLOSURE_DEFAULTS.radius * 2 })
 */
export const CLOSURE_DEFAULTS = Object.freeze({ depth: 50, radius: 250, minVotes: 3, agreement: 0.75 });

/** Limb readings flatter or steeper than these (degrees, in the profile) do not vote. */
const FLATTEST_VOTING_LIMB = 5;
const STEEPEST_VOTING_LIMB = 85;

/** A trace piece with the name of the surface (contact) it belongs to. */
export interface ClosurePiece {
  readonly surface?: string;
  readonly xyz: Float64Array;
}

/** A measured line at a map position; hinge readings may say which fold they belong to. */
export interface PlacedSensedLine extends Line {
  readonly x: number;
  readonly y: number;
  readonly sense?: FoldSense;
  readonly id?: string;
}

/** A measured plane at a map position. */
export interface PlacedVotingPlane extends Plane {
  readonly x: number;
  readonly y: number;
  readonly id?: string;
}

/** Field evidence of the fold's sense. */
export interface ClosureEvidence {
  readonly planes?: readonly PlacedVotingPlane[];
  readonly lines?: readonly PlacedSensedLine[];
}

/** One turning point of a trace, with its reading down the axis. */
export interface TraceTurn {
  readonly surface: string | null;
  readonly piece: number;
  /** Vertex of the turning point (the apex on the map). */
  readonly vertex: number;
  readonly position: readonly [number, number, number];
  /** Which way the closure points on the map, relative to the axis. */
  readonly points: 'down-plunge' | 'up-plunge';
  /** How far s falls back on the nearer side, metres. */
  readonly extent: number;
  /** 'fold': the trace crosses a hinge; 'topographic': it doubles back on one limb. */
  readonly kind: 'fold' | 'topographic';
  /** The hinge crossing (vertex and position); null for a topographic turn. */
  readonly hingeVertex: number | null;
  readonly hingePosition: readonly [number, number, number] | null;
  /** The sense read down the axis with the heights; null for a topographic turn. */
  readonly traceSense: 'antiform' | 'synform' | null;
  /** Whether the map rule (antiform closures point down the plunge) holds on the ground here; null for a topographic turn. */
  readonly ruleHolds: boolean | null;
}

/** Votes on the sense from one kind of evidence. */
export interface SenseVotes {
  readonly antiform: number;
  readonly synform: number;
  /** Ids (or "plane n"/"line n") of the readings that voted. */
  readonly ids: readonly string[];
  /** The sense the votes give; null when too few or split. */
  readonly sense: 'antiform' | 'synform' | null;
}

/** A fold closure judged against the evidence. */
export interface FoldClosure extends TraceTurn {
  readonly hinges: SenseVotes;
  readonly limbs: SenseVotes;
  /** The sense from the evidence: the hinge readings where they decide, else the limb dips. */
  readonly sense: 'antiform' | 'synform' | null;
  readonly senseFrom: 'hinges' | 'limb-dips' | null;
  /** The sense the evidence gives agrees with the closure's direction (`traceSense`); null when not judged. */
  readonly agrees: boolean | null;
  /** In words. */
  readonly reading: string;
}

/** Result of {@link checkClosures}; JSON-friendly. */
export interface ClosureCheck {
  readonly axis: Line;
  readonly depth: number;
  readonly radius: number;
  /** Every turning point, fold closures and topographic turns alike. */
  readonly closures: readonly FoldClosure[];
  readonly folds: number;
  readonly topographic: number;
  /** Fold closures with a sense from the evidence. */
  readonly judged: number;
  readonly disagreeing: number;
  /** Fold closures where the ground reverses the map rule. */
  readonly ruleReversed: number;
  readonly reading: string;
}

/**
 * The turning points of each trace piece relative to the axis trend, each classified as a fold
 * closure or a topographic turn (see the module comment). Throws a RangeError naming the piece
 * and vertex of a non-finite coordinate, or a bad axis or option.
 * @example
 * findClosures([{ surface: 'base of the limestone', xyz }], { trend: 75, plunge: 12 })
 * // [{ points: 'down-plunge', kind: 'fold', traceSense: 'antiform', ... }]
 */
export function findClosures(pieces: readonly ClosurePiece[], axis: Line, options: Pick<ClosureOptions, 'depth'> = {}): TraceTurn[] {
  checkAxis(axis, 'findClosures: axis');
  const depth = options.depth ?? CLOSURE_DEFAULTS.depth;
  if (!(depth > 0 && Number.isFinite(depth))) throw new RangeError(`findClosures: depth ${String(depth)} is not a positive distance in metres`);
  const { right, up } = profileFrame(axis);
  const t = (axis.trend * Math.PI) / 180;
  const [tx, ty] = [Math.sin(t), Math.cos(t)];
  const out: TraceTurn[] = [];
  pieces.forEach((piece, index) => {
    const xyz = piece.xyz;
    if (!(xyz instanceof Float64Array) || xyz.length % 3 !== 0) throw new RangeError(`findClosures: piece ${index} is not a Float64Array of east, north, up triples`);
    for (let i = 0; i < xyz.length; i++) {
      if (!Number.isFinite(xyz[i])) throw new RangeError(`findClosures: piece ${index}, vertex ${Math.floor(i / 3)} has a non-finite ${'enu'[i % 3]} (${xyz[i]}); leave vertices without a height out`);
    }
    let n = xyz.length / 3;
    if (n < 3) return;
    const closed = xyz[0] === xyz[3 * n - 3] && xyz[1] === xyz[3 * n - 2] && xyz[2] === xyz[3 * n - 1];
    if (closed) n -= 1;
    const s = new Float64Array(n);
    const u = new Float64Array(n);
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const [x, y, z] = [xyz[3 * i], xyz[3 * i + 1], xyz[3 * i + 2]];
      s[i] = x * tx + y * ty;
      u[i] = x * right[0] + y * right[1];
      v[i] = x * up[0] + y * up[1] + z * up[2];
    }
    // The order of vertices to scan: a ring starts (and ends) at its lowest s, which is then a turning point too.
    let order: number[];
    if (closed) {
      let m = 0;
      for (let i = 1; i < n; i++) if (s[i] < s[m]) m = i;
      order = Array.from({ length: n + 1 }, (_, k) => (m + k) % n);
    } else {
      order = Array.from({ length: n }, (_, k) => k);
    }
    const pivots = zigzag(order.map((i) => s[i]), depth);
    const turns: { at: number; arm: number[] }[] = [];
    for (let j = 1; j < pivots.length - 1; j++) turns.push({ at: pivots[j] - pivots[j - 1], arm: order.slice(pivots[j - 1], pivots[j + 1] + 1) });
    if (closed && pivots.length >= 3) {
      // The ring's start: its arm runs from the last turning point round to the first.
      const before = order.slice(pivots[pivots.length - 2]);
      turns.push({ at: before.length - 1, arm: [...before, ...order.slice(1, pivots[1] + 1)] });
    }
    for (const { at, arm } of turns) {
      const c = arm[at];
      const isMax = s[c] > s[arm[0]];
      let before = 0;
      let after = 0;
      for (let k = 0; k < arm.length; k++) {
        const fall = Math.abs(s[c] - s[arm[k]]);
        if (k < at) before = Math.max(before, fall);
        else after = Math.max(after, fall);
      }
      const extent = Math.min(before, after);
      const hinge = hingeOf(arm, u, v, depth);
      const position: [number, number, number] = [xyz[3 * c], xyz[3 * c + 1], xyz[3 * c + 2]];
      const points = isMax ? 'down-plunge' : 'up-plunge';
      if (!hinge) {
        out.push({ surface: piece.surface ?? null, piece: index, vertex: c, position, points, extent, kind: 'topographic', hingeVertex: null, hingePosition: null, traceSense: null, ruleHolds: null });
        continue;
      }
      const h = hinge.vertex;
      out.push({
        surface: piece.surface ?? null,
        piece: index,
        vertex: c,
        position,
        points,
        extent,
        kind: 'fold',
        hingeVertex: h,
        hingePosition: [xyz[3 * h], xyz[3 * h + 1], xyz[3 * h + 2]],
        traceSense: hinge.sense,
        ruleHolds: (hinge.sense === 'antiform') === isMax,
      });
    }
  });
  return out;
}

/**
 * Finds the closures of the traces (see {@link findClosures}), reads the fold's sense at each
 * from the hinge readings and limb dips within `radius`, and judges each fold closure. Throws a
 * RangeError naming a bad reading or option.
 * @example
 * const check = checkClosures(pieces, { trend: 75, plunge: 12 }, { planes, lines });
 * check.closures.filter((c) => c.agrees === false) // closures that point the wrong way
 */
export function checkClosures(pieces: readonly ClosurePiece[], axis: Line, evidence: ClosureEvidence, options: ClosureOptions = {}): ClosureCheck {
  const depth = options.depth ?? CLOSURE_DEFAULTS.depth;
  const radius = options.radius ?? CLOSURE_DEFAULTS.radius;
  const agreement = options.agreement ?? CLOSURE_DEFAULTS.agreement;
  if (!(radius > 0 && Number.isFinite(radius))) throw new RangeError(`checkClosures: radius ${String(radius)} is not a positive distance in metres`);
  if (!(agreement > 0.5 && agreement <= 1)) throw new RangeError(`checkClosures: agreement ${String(agreement)} (expected a share above 0.5, up to 1)`);
  if (options.minVotes !== undefined && !(Number.isInteger(options.minVotes) && options.minVotes >= 1)) throw new RangeError(`checkClosures: minVotes ${String(options.minVotes)} (expected a whole number of at least 1)`);
  const planes = evidence.planes ?? [];
  const lines = evidence.lines ?? [];
  assertPlanes(planes, 'closure evidence planes');
  planes.forEach((p, i) => checkPlaced(p, `planes[${i}]`));
  lines.forEach((l, i) => checkPlaced(l, `lines[${i}]`));
  const turns = findClosures(pieces, axis, { depth });
  const { right, up } = profileFrame(axis);
  // Poles in east-north-up (planeNormal is north-east-down) and their slope in the profile.
  const limb = planes.map((p, i) => {
    const n = planeNormal(p);
    const e = [n.y, n.x, -n.z];
    const nu = e[0] * right[0] + e[1] * right[1];
    const nv = e[0] * up[0] + e[1] * up[1] + e[2] * up[2];
    const dip = toDegrees(Math.atan2(Math.abs(nu), Math.abs(nv)));
    return { x: p.x, y: p.y, u: p.x * right[0] + p.y * right[1], slope: -nu / nv, dip, id: p.id ?? `plane ${i + 1}` };
  });
  const closures = turns.map((turn): FoldClosure => {
    if (turn.kind === 'topographic' || !turn.hingePosition) {
      const none: SenseVotes = { antiform: 0, synform: 0, ids: [], sense: null };
      return { ...turn, hinges: none, limbs: none, sense: null, senseFrom: null, agrees: null, reading: `${where(turn)}: the trace doubles back on one limb (a topographic turn, not a fold closure); not judged.` };
    }
    const [hx, hy] = turn.hingePosition;
    const near = (x: number, y: number): boolean => Math.hypot(x - hx, y - hy) <= radius;
    const hingeVotes = tally(
      lines.flatMap((l, i) => (near(l.x, l.y) && (l.sense === 'antiform' || l.sense === 'synform') ? [{ sense: l.sense, id: l.id ?? `line ${i + 1}` }] : [])),
      options.minVotes ?? 1,
      agreement,
    );
    const uh = hx * right[0] + hy * right[1];
    const limbVotes = tally(
      limb.flatMap((p) => {
        const d = p.u - uh;
        if (!near(p.x, p.y) || Math.abs(d) < radius / 10 || p.dip < FLATTEST_VOTING_LIMB || p.dip > STEEPEST_VOTING_LIMB) return [];
        return [{ sense: p.slope * d < 0 ? ('antiform' as const) : ('synform' as const), id: p.id }];
      }),
      options.minVotes ?? CLOSURE_DEFAULTS.minVotes,
      agreement,
    );
    const sense = hingeVotes.sense ?? limbVotes.sense;
    const senseFrom = hingeVotes.sense ? 'hinges' : limbVotes.sense ? 'limb-dips' : null;
    const agrees = sense === null ? null : sense === turn.traceSense;
    return { ...turn, hinges: hingeVotes, limbs: limbVotes, sense, senseFrom, agrees, reading: closureReading(turn, axis, sense, senseFrom, senseFrom === 'hinges' ? hingeVotes : limbVotes, agrees) };
  });
  const folds = closures.filter((c) => c.kind === 'fold').length;
  const judged = closures.filter((c) => c.agrees !== null).length;
  const disagreeing = closures.filter((c) => c.agrees === false).length;
  const ruleReversed = closures.filter((c) => c.ruleHolds === false).length;
  return {
    axis: { trend: axis.trend, plunge: axis.plunge },
    depth,
    radius,
    closures,
    folds,
    topographic: closures.length - folds,
    judged,
    disagreeing,
    ruleReversed,
    reading: checkReading(folds, closures.length - folds, judged, disagreeing, ruleReversed, radius),
  };
}

/**
 * Indices (into `s`) of the alternating turning points that s moves at least `depth` away from
 * and back, with the first and last index at the ends: a zig-zag filter (common practice in
 * reading turning points from noisy series).
 */
function zigzag(s: readonly number[], depth: number): number[] {
  const n = s.length;
  const pivots = [0];
  let dir = 0;
  let cand = 0;
  for (let i = 1; i < n; i++) {
    if (dir === 0) {
      if (s[i] >= s[0] + depth) {
        dir = 1;
        cand = i;
      } else if (s[i] <= s[0] - depth) {
        dir = -1;
        cand = i;
      }
    } else if (dir === 1) {
      if (s[i] > s[cand]) cand = i;
      else if (s[cand] - s[i] >= depth) {
        pivots.push(cand);
        dir = -1;
        cand = i;
      }
    } else if (s[i] < s[cand]) cand = i;
    else if (s[i] - s[cand] >= depth) {
      pivots.push(cand);
      dir = 1;
      cand = i;
    }
  }
  if (pivots[pivots.length - 1] !== n - 1) pivots.push(n - 1);
  return pivots;
}

/**
 * The hinge the trace crosses between the ends of `arm` (vertex indices): the interior extremum
 * of v that stands at least a tenth of `depth` above (or below) both ends, where the trace passes
 * from one side of the hinge to the other in u (looked at `depth` metres away in the profile on
 * either side, so that a trace which doubles back on one limb is not taken for a hinge).
 */
function hingeOf(arm: readonly number[], u: Float64Array, v: Float64Array, depth: number): { vertex: number; sense: 'antiform' | 'synform' } | null {
  const a = arm[0];
  const b = arm[arm.length - 1];
  let hi = -1;
  let lo = -1;
  for (let k = 1; k < arm.length - 1; k++) {
    if (hi < 0 || v[arm[k]] > v[arm[hi]]) hi = k;
    if (lo < 0 || v[arm[k]] < v[arm[lo]]) lo = k;
  }
  if (hi < 0) return null;
  const least = depth / 10;
  const crosses = (k: number): boolean => {
    const h = arm[k];
    const away = (step: number): number => {
      let j = k;
      while (j + step >= 0 && j + step < arm.length) {
        j += step;
        if (Math.hypot(u[arm[j]] - u[h], v[arm[j]] - v[h]) >= depth) break;
      }
      return u[arm[j]] - u[h];
    };
    return away(-1) * away(1) < 0;
  };
  const above = v[arm[hi]] - Math.max(v[a], v[b]);
  const below = Math.min(v[a], v[b]) - v[arm[lo]];
  const anti = above >= least && crosses(hi);
  const syn = below >= least && crosses(lo);
  // An S-bend of the trace may hold both; the one that stands out more is taken.
  if (anti && (!syn || above >= below)) return { vertex: arm[hi], sense: 'antiform' };
  if (syn) return { vertex: arm[lo], sense: 'synform' };
  return null;
}

function tally(votes: readonly { sense: 'antiform' | 'synform'; id: string }[], minVotes: number, agreement: number): SenseVotes {
  const antiform = votes.filter((v) => v.sense === 'antiform').length;
  const synform = votes.length - antiform;
  const total = votes.length;
  const sense = total < minVotes ? null : antiform / total >= agreement ? 'antiform' : synform / total >= agreement ? 'synform' : null;
  return { antiform, synform, ids: votes.map((v) => v.id), sense };
}

function checkPlaced(p: { x: number; y: number; id?: string }, label: string): void {
  if (!Number.isFinite(p.x) || !Number.isFinite(p.y)) throw new RangeError(`checkClosures: ${label}${p.id !== undefined ? ` (${p.id})` : ''}: position (${p.x}, ${p.y}) is not a pair of finite coordinates`);
}

const fmt = (l: Line): string => `${String(Math.round(l.trend) % 360).padStart(3, '0')}/${String(Math.round(l.plunge)).padStart(2, '0')}`;

function where(t: TraceTurn): string {
  const name = t.surface ? `${t.surface}, ` : '';
  return `Closure (${name}piece ${t.piece + 1}) at ${t.position[0].toFixed(0)} m E, ${t.position[1].toFixed(0)} m N`;
}

function closureReading(turn: TraceTurn, axis: Line, sense: FoldClosure['sense'], from: FoldClosure['senseFrom'], votes: SenseVotes, agrees: boolean | null): string {
  const ground = turn.ruleHolds === false ? ' (the ground here falls toward the plunge more steeply than the axis, so the map rule reverses)' : '';
  const head = `${where(turn)} points ${turn.points}${ground}: read down the axis ${fmt(axis)} it is ${turn.traceSense === 'antiform' ? 'an antiform' : 'a synform'} closure`;
  if (sense === null) return `${head}; no hinge reading or limb dips nearby say which, so it is not judged.`;
  const evidence = from === 'hinges' ? `the hinge reading${votes.ids.length === 1 ? '' : 's'} nearby (${votes.ids.join(', ')})` : `the limb dips nearby (${votes.antiform} antiform, ${votes.synform} synform votes)`;
  return agrees ? `${head}, and ${evidence} agree.` : `${head}, but ${evidence} say ${sense}: the axis may plunge the other way here, the hinge may be misread, or the trace may belong to another domain.`;
}

function checkReading(folds: number, topographic: number, judged: number, disagreeing: number, reversed: number, radius: number): string {
  if (folds === 0) return topographic > 0 ? `The traces turn back ${topographic} time${topographic === 1 ? '' : 's'} on the map, but only on one limb (topographic turns): no fold closure to judge.` : 'The traces have no closures on the map.';
  const parts = [`${folds} fold closure${folds === 1 ? '' : 's'} on the map${topographic > 0 ? ` (and ${topographic} topographic turn${topographic === 1 ? '' : 's'})` : ''}.`];
  if (judged === 0) parts.push(`No hinge reading or limb dips within ${radius} m say whether they are antiforms or synforms.`);
  else if (disagreeing === 0) parts.push(`All ${judged} with a known sense point the way the axis plunges.`);
  else parts.push(`${disagreeing} of ${judged} with a known sense point the wrong way for the axis.`);
  if (reversed > 0) parts.push(`At ${reversed} the ground falls toward the plunge more steeply than the axis, so there the map rule reverses (allowed for).`);
  return parts.join(' ');
}
