import type { Station } from '../core/station';
import type { ProjectSelection, SelectionShape } from './projectFile';

/**
 * Named selections kept with the project (the `selections` of io/projectFile.ts): making the
 * record from what is selected now, and finding its stations again among the stations shown.
 *
 * A selection of a dataset names its stations by index (rows do not move: a fixed row keeps its
 * place); a selection of stations that belong to no dataset (the demo's built-in sample) names
 * them by id, since that is all that lasts across a reload. The outline is kept as drawn, so the
 * selection shows as it was made.
 */

/** What {@link namedSelection} needs. */
export interface NamedSelectionInput {
  readonly id: string;
  readonly name: string;
  /** The stations shown. */
  readonly stations: readonly Station[];
  /** Selected positions in `stations`. */
  readonly indices: ArrayLike<number>;
  /** Id of the dataset `stations` come from; absent for stations of no dataset. */
  readonly dataset?: string;
  /** The outline the selection was drawn with, if one shape made it. */
  readonly shape?: SelectionShape | null;
  /** When, ISO 8601 (default now). */
  readonly savedAt?: string;
}

/**
 * The project record of the current selection.
 * @example
 * namedSelection({ id: 'sel-1', name: 'West limb', stations, indices: [0, 4], dataset: 'ds-1' })
 * // { id: 'sel-1', name: 'West limb', dataset: 'ds-1', indices: [0, 4], savedAt: '...' }
 */
export function namedSelection(input: NamedSelectionInput): ProjectSelection {
  const indices = Array.from(input.indices);
  for (const i of indices) {
    if (!Number.isInteger(i) || i < 0 || i >= input.stations.length) throw new RangeError(`station index ${i} is outside the ${input.stations.length} stations shown`);
  }
  const shape = input.shape ? { ...(input.shape.tool && { tool: input.shape.tool }), ring: input.shape.ring.map((p) => [p[0], p[1]] as const) } : undefined;
  return {
    id: input.id,
    name: input.name,
    ...(input.dataset !== undefined ? { dataset: input.dataset, indices } : { stationIds: indices.map((i) => input.stations[i].id) }),
    ...(shape && { shape }),
    savedAt: input.savedAt ?? new Date().toISOString(),
  };
}

/**
 * Whether a saved selection belongs to the stations shown: the same dataset, or both none.
 * @example selectionAppliesTo({ id: 's', name: 'A', stationIds: ['KR-1'] }, undefined) // true
 */
export function selectionAppliesTo(selection: ProjectSelection, dataset: string | undefined): boolean {
  return selection.dataset === dataset;
}

/** Where a saved selection's stations are now. */
export interface ResolvedSelection {
  /** Positions in the stations shown, ascending; null when only the outline was kept (select within it). */
  readonly indices: number[] | null;
  /** Stations the selection named that are not among those shown (none, normally). */
  readonly missing: number;
}

/**
 * Finds a saved selection's stations among `stations` (which must be what it
 * {@link selectionAppliesTo}): by index, else by station id (every station with that id), else
 * not at all (`indices: null`: the caller selects within `selection.shape`).
 * @example resolveSelection({ id: 's', name: 'A', stationIds: ['B', 'Z'] }, [{ id: 'A' }, { id: 'B' }] as Station[])
 * // { indices: [1], missing: 1 }
 */
export function resolveSelection(selection: ProjectSelection, stations: readonly Pick<Station, 'id'>[]): ResolvedSelection {
  if (selection.indices) {
    const indices = [...new Set(selection.indices.filter((i) => i >= 0 && i < stations.length))].sort((a, b) => a - b);
    return { indices, missing: selection.indices.length - indices.length };
  }
  if (selection.stationIds) {
    const wanted = new Set(selection.stationIds);
    const found = new Set<string>();
    const indices: number[] = [];
    stations.forEach((s, i) => {
      if (!wanted.has(s.id)) return;
      indices.push(i);
      found.add(s.id);
    });
    return { indices, missing: wanted.size - found.size };
  }
  return { indices: null, missing: 0 };
}

/**
 * A new selection id: `sel-<time>-<random>`.
 * @example newSelectionId(0, () => 0) // 'sel-0-0000'
 */
export function newSelectionId(now = Date.now(), random = Math.random): string {
  return `sel-${now.toString(36)}-${Math.floor(random() * 36 ** 4).toString(36).padStart(4, '0')}`;
}

/**
 * The next default name: "Selection 1", "Selection 2", ... skipping names in use.
 * @example nextSelectionName([{ name: 'Selection 1' }]) // 'Selection 2'
 */
export function nextSelectionName(existing: readonly Pick<ProjectSelection, 'name'>[]): string {
  const used = new Set(existing.map((s) => s.name));
  for (let k = 1; ; k++) if (!used.has(`Selection ${k}`)) return `Selection ${k}`;
}
