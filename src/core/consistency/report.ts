import { angleBetweenLines } from '../geometry';
import type { Line } from '../types';
import type { AxisPartition } from './domainBoundaries';
import type { ConsistencyFlag, DomainCheck } from './domainCheck';
import { fieldNodes, type FieldGrid, type FieldNode, type LocalAxisField } from './localAxisField';

/**
 * The per-project consistency report: every domain's checks (domainCheck.ts), the angle between
 * each pair of domain axes, the local axis field with its suggested domains (localAxisField.ts,
 * domainBoundaries.ts), all flags in one list, method notes with their sources, and the caution.
 * Plain JSON-friendly data (no NaN, no typed arrays); reportHtml.ts prints it.
 */

/**
 * Said with every report.
 * @example report.caution === CONSISTENCY_CAUTION
 */
export const CONSISTENCY_CAUTION = 'Results are aids to interpretation; check in the field and defer to local codes and licensed professional practice.';

/**
 * How each number was made, with its source, in the order the report shows them.
 * @example CONSISTENCY_METHODS.map((m) => m.topic)
 */
export const CONSISTENCY_METHODS: readonly { readonly topic: string; readonly text: string }[] = [
  {
    topic: 'Fold axis',
    text: 'The pi axis: the least eigenvector of the orientation tensor of the poles (Ramsay 1967; Woodcock 1977), with a 95% bootstrap cone (Efron 1979; Fisher, Lewis & Embleton 1987).',
  },
  {
    topic: 'Measured lines',
    text: 'Each hinge or intersection lineation is compared with the axis (acute angle) and flagged above a threshold (default 15°, a Foldlens convention). Their Fisher (1953) mean as axes is judged against the axis cone (angle ≤ cone95) and the axis against the lines\u2019 alpha95.',
  },
  {
    topic: 'Poles against the girdle',
    text: 'Distance of each pole from the best-fit great circle, asin|p·a|. Flagged above max(3.5·σ̂, 5°), σ̂ = 1.4826 × median distance (robust scale, Hampel 1974; Rousseeuw & Croux 1993), after one refit without the flagged poles; or above a user angle.',
  },
  {
    topic: 'Cylindricity',
    text: 'S2/(S2+S3): the share of the poles\u2019 spread about their mean that lies along the girdle (1 = on one great circle, 0.5 = no preferred great circle), and the RMS distance from the girdle asin(√S3); both derived from the eigenvalues S1 ≥ S2 ≥ S3. With Woodcock (1977) K, C and Vollmer (1990) P, G, R.',
  },
  {
    topic: 'Map pattern',
    text: 'Contact traces with heights are projected down the axis (Mackin 1950); the scatter of each surface about one smooth profile curve (local quadratic with tricube weights, after Cleveland 1979) is compared at the axis and at axes tilted 3° and 6°, and minimised over axes within 30° of the pi axis (coarse-to-fine search) for an axis from the map alone. The traces constrain the axis only where pieces of one surface at different depths overlap in the profile; the contrast (scatter 6° away over the least) says whether they do.',
  },
  {
    topic: 'Predicted attitudes',
    text: 'At each trace vertex the layer should contain both the axis and the 3D tangent of the trace (from the heights), so its attitude is the plane through the two; measured planes within 150 m are compared with it.',
  },
  {
    topic: 'Fold closures',
    text: 'Closures are the turning points of each contact trace along the axis trend (a zig-zag filter: the trace must fall back 50 m on both sides). On gently sloping ground antiform closures point down the plunge and synform closures up it (common practice); read down the axis with the trace heights (v = s sin p + z cos p), each closure is an antiform or a synform, or a topographic turn where the trace runs along one limb. Hinge readings that say antiform or synform within 250 m, else the limb dips of the bedding there, give the fold\u2019s sense; closures whose sense disagrees are flagged. Where the ground falls toward the plunge more steeply than the axis, the map rule reverses and is allowed for. Overturned limbs would mislead the limb dips.',
  },
  {
    topic: 'Local axis field',
    text: 'The pi axis of the k nearest planes (kd-tree search, Friedman, Bentley & Finkel 1977) at each node of a grid, with a first-order 95% cone from the window\u2019s own moments; suggested domains by seeded region growing (Adams & Bischof 1994) on the axes, with a boundary where neighbouring regions meet.',
  },
];

/** How two domains' axes compare. */
export interface DomainPair {
  readonly a: string;
  readonly b: string;
  /** Angle between the axes, degrees; null when either is undefined. */
  readonly angle: number | null;
  /** Whether the angle is within the sum of the two 95% cones; null without both cones. */
  readonly conesOverlap: boolean | null;
}

/** A point in the report's map coordinates: frame metres, and longitude/latitude when the caller can convert. */
export interface ReportNode extends FieldNode {
  /** Suggested domain (region label of the partition); null where the node has no axis. */
  readonly region: number | null;
  readonly lon?: number;
  readonly lat?: number;
}

/** The local axis field as the report carries it. */
export interface FieldReport {
  /** What x and y are, in words (e.g. "metres east and north of E 500000, N 2723000 in EPSG:32633"). */
  readonly coordinates: string;
  readonly grid: FieldGrid;
  readonly window: LocalAxisField['window'];
  readonly minCount: number;
  readonly reference: Line | null;
  readonly nodes: readonly ReportNode[];
  readonly nodesWithAxis: number;
  /** Largest angle between a local axis and the reference, degrees; null without any. */
  readonly maxAngleToReference: number | null;
  readonly partition: {
    readonly angle: number;
    readonly minNodes: number;
    readonly regions: AxisPartition['regions'];
    readonly boundaries: ReadonlyArray<AxisPartition['boundaries'][number] & { readonly lonLat?: readonly number[] }>;
    readonly polygons: ReadonlyArray<AxisPartition['polygons'][number] & { readonly outerLonLat?: readonly number[]; readonly holesLonLat?: readonly (readonly number[])[] }>;
  };
}

/** The whole report. */
export interface ConsistencyReport {
  readonly title: string;
  /** When it was made, as the caller gives it (e.g. an ISO date). */
  readonly generated: string;
  readonly caution: string;
  /** Free-form facts about the input (files, counts), as the caller gives them. */
  readonly input: Readonly<Record<string, string | number | boolean | null>>;
  readonly domains: readonly DomainCheck[];
  readonly pairs: readonly DomainPair[];
  readonly field: FieldReport | null;
  /** Every flag of every domain, with the domain's id. */
  readonly flags: readonly (ConsistencyFlag & { readonly domain: string })[];
  readonly methods: typeof CONSISTENCY_METHODS;
  readonly notes: readonly string[];
}

/** What {@link buildConsistencyReport} takes. */
export interface ConsistencyReportInput {
  readonly title?: string;
  readonly generated: string;
  readonly input?: Readonly<Record<string, string | number | boolean | null>>;
  readonly domains: readonly DomainCheck[];
  readonly field?: {
    readonly field: LocalAxisField;
    readonly partition: AxisPartition;
    readonly coordinates: string;
    /** Frame x, y to longitude, latitude, for GIS-ready boundaries. */
    readonly toLonLat?: (x: number, y: number) => readonly [number, number];
  };
  readonly notes?: readonly string[];
}

/**
 * Assembles the report.
 * @example
 * const report = buildConsistencyReport({ generated: '2025-06-01', domains: [checkDomain(west), checkDomain(east)] });
 * JSON.stringify(report) // plain data
 */
export function buildConsistencyReport(input: ConsistencyReportInput): ConsistencyReport {
  const pairs: DomainPair[] = [];
  input.domains.forEach((a, i) =>
    input.domains.slice(i + 1).forEach((b) => {
      const angle = a.axis && b.axis ? angleBetweenLines(a.axis, b.axis) : null;
      const conesOverlap = angle === null || a.cone95 === null || b.cone95 === null ? null : angle <= a.cone95 + b.cone95;
      pairs.push({ a: a.id, b: b.id, angle, conesOverlap });
    }),
  );
  return {
    title: input.title ?? 'Fold consistency report',
    generated: input.generated,
    caution: CONSISTENCY_CAUTION,
    input: input.input ?? {},
    domains: input.domains,
    pairs,
    field: input.field ? fieldReport(input.field) : null,
    flags: input.domains.flatMap((d) => d.flags.map((f) => ({ ...f, domain: d.id }))),
    methods: CONSISTENCY_METHODS,
    notes: input.notes ?? [],
  };
}

function fieldReport(f: NonNullable<ConsistencyReportInput['field']>): FieldReport {
  const { field, partition, toLonLat } = f;
  const nodes = fieldNodes(field).map((n): ReportNode => {
    const region = partition.labels[n.index] >= 0 ? partition.labels[n.index] : null;
    if (!toLonLat) return { ...n, region };
    const [lon, lat] = toLonLat(n.x, n.y);
    return { ...n, region, lon, lat };
  });
  const withAxis = nodes.filter((n) => n.axis !== null);
  const angles = withAxis.map((n) => n.angleToReference).filter((a): a is number => a !== null);
  const convert = (flat: readonly number[]): number[] => {
    const out: number[] = [];
    for (let i = 0; i < flat.length; i += 2) out.push(...toLonLat!(flat[i], flat[i + 1]));
    return out;
  };
  return {
    coordinates: f.coordinates,
    grid: field.grid,
    window: field.window,
    minCount: field.minCount,
    reference: field.reference,
    nodes,
    nodesWithAxis: withAxis.length,
    maxAngleToReference: angles.length > 0 ? Math.max(...angles) : null,
    partition: {
      angle: partition.angle,
      minNodes: partition.minNodes,
      regions: partition.regions,
      boundaries: partition.boundaries.map((b) => (toLonLat ? { ...b, lonLat: convert(b.points) } : b)),
      polygons: partition.polygons.map((p) => (toLonLat ? { ...p, outerLonLat: convert(p.outer), holesLonLat: p.holes.map(convert) } : p)),
    },
  };
}
