import type { FoldlensProject, ProjectSectionLine, ProjectTrace } from './projectFile';

/**
 * The lines drawn on the map and kept with the project (the `traces` and `sectionLine` of
 * io/projectFile.ts): reading them from a project, putting them in one, and naming new traces.
 * A project without them leaves the fields out (files written before they were kept have
 * neither), so an empty list and no list read the same.
 */

/** The drawn lines of a project, with none given as an empty list and null. */
export interface DrawnLines {
  readonly traces: readonly ProjectTrace[];
  readonly sectionLine: ProjectSectionLine | null;
}

/**
 * The project's drawn lines (none when the file has no such fields).
 * @example drawnLinesOf(emptyProject()) // { traces: [], sectionLine: null }
 */
export function drawnLinesOf(project: Pick<FoldlensProject, 'traces' | 'sectionLine'>): DrawnLines {
  return { traces: project.traces ?? [], sectionLine: project.sectionLine ?? null };
}

/**
 * The project with these drawn lines in place of its own: a field is left out when there is
 * nothing to keep in it. The project given is not changed.
 * @example withDrawnLines(project, { traces: [], sectionLine: { line: [[15, 24.6], [15.02, 24.61]], swath: 500 } }).sectionLine?.swath // 500
 */
export function withDrawnLines<P extends FoldlensProject>(project: P, lines: DrawnLines): P {
  const { traces: _traces, sectionLine: _section, ...rest } = project;
  return {
    ...rest,
    ...(lines.traces.length > 0 && { traces: lines.traces.map(copyTrace) }),
    ...(lines.sectionLine && { sectionLine: { line: copyLine(lines.sectionLine.line), swath: lines.sectionLine.swath } }),
  } as P;
}

/**
 * The next default trace name: "Drawn trace 1", "Drawn trace 2", ... skipping names in use.
 * @example nextTraceName([{ name: 'Drawn trace 1' }]) // 'Drawn trace 2'
 */
export function nextTraceName(existing: readonly Pick<ProjectTrace, 'name'>[]): string {
  const used = new Set(existing.map((t) => t.name));
  for (let k = 1; ; k++) if (!used.has(`Drawn trace ${k}`)) return `Drawn trace ${k}`;
}

/**
 * A new trace id: `trace-<time>-<random>`.
 * @example newTraceId(0, () => 0) // 'trace-0-0000'
 */
export function newTraceId(now = Date.now(), random = Math.random): string {
  return `trace-${now.toString(36)}-${Math.floor(random() * 36 ** 4).toString(36).padStart(4, '0')}`;
}

function copyTrace(t: ProjectTrace): ProjectTrace {
  return { id: t.id, name: t.name, line: copyLine(t.line) };
}

function copyLine(line: ProjectTrace['line']): Array<readonly [number, number]> {
  return line.map((p) => [p[0], p[1]] as const);
}
