import type { Station } from '../core/station';
import { isUsable } from '../core/station';
import { isLineKind, isPlaneKind } from '../core/types';
import { KIND_LABELS, LINE_VARIANT_LABELS, PLANE_VARIANT_LABELS, lineVariant, planeVariant, symbolFor } from './symbolCatalog';

/** One row of the legend: a symbol image actually used by the data, and how many stations use it. */
export interface LegendEntry {
  readonly kind: string;
  readonly image: string;
  readonly title: string;
  readonly detail: string;
  readonly count: number;
}

/**
 * The legend rows for the symbols the stations actually use, grouped by kind in a stable order
 * (planes before lines, then by first appearance).
 * @example legendEntries(stations).map((e) => e.title) // ['Bedding', 'Bedding', 'Fold hinge']
 */
export function legendEntries(stations: readonly Station[]): LegendEntry[] {
  const byImage = new Map<string, { kind: string; detail: string; count: number; order: number }>();
  let order = 0;
  for (const s of stations) {
    if (!isUsable(s) || !s.kind) continue;
    const symbol = symbolFor(s);
    if (!symbol) continue;
    const entry = byImage.get(symbol.image);
    if (entry) {
      entry.count++;
      continue;
    }
    let detail = '';
    if (isPlaneKind(s.kind) && s.plane) detail = PLANE_VARIANT_LABELS[planeVariant(s.plane)];
    else if (isLineKind(s.kind) && s.line) {
      detail = LINE_VARIANT_LABELS[lineVariant(s.line)];
      if (s.kind === 'hinge' && s.line.sense && s.line.sense !== 'unknown') detail = `${s.line.sense}, ${detail}`;
    }
    byImage.set(symbol.image, { kind: s.kind, detail, count: 1, order: order++ });
  }
  return [...byImage.entries()]
    .sort(([, a], [, b]) => Number(isLineKind(a.kind)) - Number(isLineKind(b.kind)) || a.order - b.order)
    .map(([image, e]) => ({ kind: e.kind, image, title: KIND_LABELS[e.kind as keyof typeof KIND_LABELS] ?? e.kind, detail: e.detail, count: e.count }));
}
