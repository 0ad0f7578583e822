/**
 * Which fold axis a profile or section is drawn with, and where it comes from, as plain data:
 * the selection's pi axis, a saved domain's pi axis, the mean of the measured hinges in the
 * selection, or an axis typed as trend and plunge. The axis picker (`<foldlens-axis-picker>`)
 * shows what this returns; hosts may call it directly.
 */
import type { HingeMean } from '../../core/hingeMean';
import type { FieldProblem } from '../../core/numberField';
import { readTypedAxis } from '../../core/typedAxis';
import type { Line } from '../../core/types';

/** Where the axis comes from. */
export type AxisSource = 'selection' | 'domain' | 'hinges' | 'typed';

/**
 * Every source, in the order offered.
 * @example AXIS_SOURCES.includes('hinges') // true
 */
export const AXIS_SOURCES: readonly AxisSource[] = Object.freeze(['selection', 'domain', 'hinges', 'typed'] as AxisSource[]);

/** The selection's fold analysis as far as the picker needs it. */
export interface SelectionAxis {
  /** The pi axis; null when the analysis could not define one. */
  readonly axis: Line | null;
  /** Bedding readings analysed. */
  readonly n: number;
  /** Bootstrap 95% cone half-angle, degrees, when known. */
  readonly cone95: number | null;
  /** True while the analysis of a new selection is still running. */
  readonly pending?: boolean;
}

/** A saved domain as far as the picker needs it (data text: shown as text only). */
export interface DomainAxis {
  readonly id: string;
  readonly name: string;
  readonly axis: Line | null;
  readonly cone95: number | null;
}

/** Everything the choice depends on. */
export interface AxisChoiceInput {
  readonly source: AxisSource;
  /** The current selection's analysis; null when nothing is selected. */
  readonly selection: SelectionAxis | null;
  readonly domains: readonly DomainAxis[];
  /** Id of the domain chosen ('' for none). */
  readonly domainId: string;
  /** Hinge mean of the selection; null when nothing is selected. */
  readonly hinges: HingeMean | null;
  readonly trendText: string;
  readonly plungeText: string;
}

/** The axis chosen, or why there is none. */
export interface AxisChoice {
  readonly source: AxisSource;
  /** Degrees, referred to true north; null when the source gives none (see `problem`). */
  readonly axis: Line | null;
  /** Where the axis comes from, for titles and exports: "π axis of the selection (n 80, cone ±2.1°)". */
  readonly from: string;
  /** Why there is no axis, as a sentence; null when there is one. */
  readonly problem: string | null;
  /** The typed fields' problems (typed source only), one per wrong field. */
  readonly fieldProblems: readonly FieldProblem[];
}

/**
 * Resolves the axis of the chosen source.
 * @example resolveAxisChoice({ source: 'typed', trendText: '075', plungeText: '12', selection: null, domains: [], domainId: '', hinges: null }).axis
 * // {trend: 75, plunge: 12}
 */
export function resolveAxisChoice(input: AxisChoiceInput): AxisChoice {
  const none = (from: string, problem: string, fieldProblems: readonly FieldProblem[] = []): AxisChoice => ({ source: input.source, axis: null, from, problem, fieldProblems });
  const some = (axis: Line, from: string): AxisChoice => ({ source: input.source, axis, from, problem: null, fieldProblems: [] });
  switch (input.source) {
    case 'selection': {
      const s = input.selection;
      const from = 'π axis of the selection';
      if (!s) return none(from, 'Nothing is selected: draw around stations with the Lasso, Polygon or Box, or take the axis from elsewhere.');
      if (s.pending) return none(from, 'The analysis of the selection is still running.');
      if (!s.axis) return none(from, 'The selection has no defined fold axis (too few bedding readings, or all nearly parallel).');
      return some(s.axis, `${from} (n ${s.n}${s.cone95 !== null && Number.isFinite(s.cone95) ? `, cone ±${s.cone95.toFixed(1)}°` : ''})`);
    }
    case 'domain': {
      if (input.domains.length === 0) return none('π axis of a domain', 'No domain is saved yet: save a selection as a domain first.');
      const d = input.domains.find((x) => x.id === input.domainId);
      if (!d) return none('π axis of a domain', 'Choose a domain.');
      const from = `π axis of domain “${d.name}”`;
      if (!d.axis) return none(from, `Domain “${d.name}” has no defined fold axis.`);
      return some(d.axis, `${from}${d.cone95 !== null && Number.isFinite(d.cone95) ? ` (cone ±${d.cone95.toFixed(1)}°)` : ''}`);
    }
    case 'hinges': {
      const h = input.hinges;
      const from = 'mean of the measured hinges in the selection';
      if (!h) return none(from, 'Nothing is selected: the hinge mean is taken over the selected stations.');
      if (!h.axis) return none(from, `No hinge mean: ${h.reason ?? 'it is undefined'}.`);
      const spread = h.alpha95 !== null && Number.isFinite(h.alpha95) ? `, α95 ${h.alpha95.toFixed(1)}°` : '';
      return some(h.axis, `Fisher mean of ${h.n} measured hinge${h.n === 1 ? '' : 's'} in the selection${spread}`);
    }
    case 'typed': {
      const t = readTypedAxis(input.trendText, input.plungeText);
      if (!t.axis) return none('typed axis', t.problems.map((p) => p.message).join(' '), t.problems);
      return some(t.axis, 'typed by the user');
    }
  }
}
