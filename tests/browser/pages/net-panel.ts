// Test-only page: <foldlens-net> alone, fed with synthetic data whose answer is known. A
// cylindrical fold is built about a chosen axis: its poles lie on the great circle at right
// angles to the axis (the girdle), in two limbs, with a little scatter; its hinge lines lie
// near the axis. The page acts as the host: it runs the analysis, computes the density and
// recomputes it when the panel asks for another net or method.
import '../../../src/components/foldlens-net';
import type { FoldlensNet, NetOptionsDetail } from '../../../src/components/foldlens-net';
import type { NetLine } from '../../../src/components/net/netScene';
import { analyzeFoldPoles } from '../../../src/core/foldAnalysis';
import { describeFold } from '../../../src/core/foldDescription';
import { kambGrid } from '../../../src/core/kamb';
import { exponentialGrid } from '../../../src/core/exponentialDensity';
import type { DensityGrid } from '../../../src/core/density';
import type { NetKind } from '../../../src/core/netProjection';
import { createRandom } from '../../../src/core/random';
import type { Line, Plane, Vec3 } from '../../../src/core/types';
import { cross, lineToVector, normalize, normalToPlane, toLowerHemisphere } from '../../../src/core/vectors';

/** The axis of the synthetic fold (trend/plunge). */
export const TRUE_AXIS: Line = { trend: 40, plunge: 25 };

/** Poles of a cylindrical fold about `axis`: two limbs at ±limbAngle from the girdle's middle, scatter in degrees. */
function cylindricalFold(axis: Line, n: number, seed: number, limbAngle = 50, spread = 12, scatter = 2): Float64Array {
  const rng = createRandom(seed);
  const gauss = (): number => Math.sqrt(-2 * Math.log(1 - rng.next())) * Math.cos(2 * Math.PI * rng.next());
  const a = lineToVector(axis);
  const u = normalize(cross(a, { x: 0, y: 0, z: 1 })); // horizontal, at right angles to the axis
  const w = cross(a, u); // in the axis' vertical plane, at right angles to it
  const out = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    const phi = ((i % 2 === 0 ? limbAngle : -limbAngle) + spread * gauss()) * (Math.PI / 180);
    const off = scatter * gauss() * (Math.PI / 180); // out of the girdle, toward the axis
    const p: Vec3 = toLowerHemisphere(normalize({
      x: Math.cos(phi) * w.x + Math.sin(phi) * u.x + off * a.x,
      y: Math.cos(phi) * w.y + Math.sin(phi) * u.y + off * a.y,
      z: Math.cos(phi) * w.z + Math.sin(phi) * u.z + off * a.z,
    }));
    out[3 * i] = p.x;
    out[3 * i + 1] = p.y;
    out[3 * i + 2] = p.z;
  }
  return out;
}

function hingeLines(axis: Line, n: number, seed: number, firstId: number): NetLine[] {
  const rng = createRandom(seed);
  return Array.from({ length: n }, (_, i) => ({
    trend: axis.trend + (rng.next() - 0.5) * 12,
    plunge: Math.min(90, Math.max(0, axis.plunge + (rng.next() - 0.5) * 8)),
    id: firstId + i,
  }));
}

function planesOf(poles: Float64Array): Plane[] {
  const out: Plane[] = [];
  for (let i = 0; i < poles.length; i += 3) out.push(normalToPlane({ x: poles[i], y: poles[i + 1], z: poles[i + 2] }));
  return out;
}

function polesOfPlanes(planes: readonly Plane[]): Float64Array {
  const out = new Float64Array(planes.length * 3);
  planes.forEach((p, i) => {
    const v = lineToVector({ trend: (p.dipDirection + 180) % 360, plunge: 90 - p.dip });
    out[3 * i] = v.x;
    out[3 * i + 1] = v.y;
    out[3 * i + 2] = v.z;
  });
  return out;
}

const el = document.createElement('foldlens-net') as FoldlensNet;
document.body.append(el);
const events: { type: string; detail: unknown }[] = [];
for (const type of ['foldlens-net-hover', 'foldlens-net-pick', 'foldlens-net-options']) {
  document.addEventListener(type, (e) => events.push({ type, detail: (e as CustomEvent).detail }));
}

let current: Float64Array = new Float64Array(0);
function density(poles: Float64Array, method: string, net: NetKind): DensityGrid | null {
  if (poles.length === 0 || method === 'off') return null;
  return method === 'exponential' ? exponentialGrid(poles, { net }) : kambGrid(poles, { net });
}
document.addEventListener('foldlens-net-options', (e) => {
  const d = (e as CustomEvent<NetOptionsDetail>).detail;
  el.density = density(current, d.contours, d.net);
});

const SELECTION = 'North ridge, Tarn Hollow — station <img src=x onerror=alert(1)>';

/** Loads a case into the panel and waits until it is drawn; returns what a test needs. */
async function load(name: 'fold' | 'pooled' | 'two' | 'parallel' | 'big' | 'empty') {
  let poles: Float64Array;
  let lines: NetLine[] = [];
  if (name === 'fold') {
    poles = cylindricalFold(TRUE_AXIS, 240, 7);
    lines = hingeLines(TRUE_AXIS, 8, 11, 1000);
  } else if (name === 'pooled') {
    // Two folds pooled, axes 040/25 and 065/25 (22.6° apart): the poles share no one girdle.
    poles = new Float64Array([...cylindricalFold(TRUE_AXIS, 240, 7), ...cylindricalFold({ trend: 65, plunge: 25 }, 240, 8)]);
  } else if (name === 'two') {
    poles = polesOfPlanes([{ dipDirection: 120, dip: 40 }, { dipDirection: 240, dip: 40 }]);
  } else if (name === 'parallel') {
    poles = polesOfPlanes(Array.from({ length: 5 }, () => ({ dipDirection: 75, dip: 35 })));
  } else if (name === 'big') {
    poles = cylindricalFold(TRUE_AXIS, 100_000, 3);
  } else {
    poles = new Float64Array(0);
  }
  current = poles;
  const n = poles.length / 3;
  const poleIds = Int32Array.from({ length: n }, (_, i) => 10 * i + 3); // station indices differ from pole numbers
  const analysis = analyzeFoldPoles(poles, { lines: lines.length ? lines : undefined, bootstrap: n > 5000 ? 0 : 300 });
  const planes = planesOf(poles);
  const description = n >= 2 && n <= 5000 ? describeFold(planes) : null;
  const grid = density(poles, el.contourMethod, el.net);
  // Time from setting the properties to the frame after the panel has drawn them.
  const t0 = performance.now();
  Object.assign(el, { poles, poleIds, planes, lines, analysis, description, density: grid, selectionLabel: SELECTION, highlight: -1 });
  await el.updateComplete;
  const drawn = performance.now();
  await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
  const painted = performance.now();
  return { n, axis: analysis.axis, poleIds: Array.from(poleIds.slice(0, 2000)), lineIds: lines.map((l) => l.id), updateMs: drawn - t0, paintMs: painted - t0 };
}

Object.assign(window, { netPanel: { el, events, load, TRUE_AXIS, SELECTION } });
document.body.setAttribute('data-ready', 'true');
