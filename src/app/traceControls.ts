/**
 * Demo wiring of "traces drawn on the map": lines a geologist sketches on the map (a contact
 * or form line seen in the field but not in the map's data) to be projected with the
 * stations into the down-plunge profile or a section. Each trace is drawn with its own
 * SectionLineDrawer (no swath), stays on the map, and is handed to buildProfileData as
 * contact linework under its name ("Drawn trace k"), so the profile's legend lists it as its own
 * layer. The traces are kept with the project (io/drawnLines.ts) and put back on the map on load.
 */
import type { Feature, LineString } from 'geojson';
import type { Map as MapLibreMap } from 'maplibre-gl';
import type { LonLatPair } from '../core/sectionLineDraft';
import { newTraceId, nextTraceName } from '../io/drawnLines';
import type { ProjectTrace } from '../io/projectFile';
import { SectionLineDrawer } from '../map/sectionLineDrawer';

/** What the trace controls need from the page. */
export interface TraceToolsDeps {
  readonly map: MapLibreMap;
  /** Says what is happening, in the block's status line. */
  readonly say: (text: string, problem?: boolean) => void;
  /** Called before drawing starts (return the pointer to panning, close the profile). */
  readonly beforeDraw: () => void;
  /** The set of traces changed (redraw an open profile). */
  readonly changed: () => void;
  /** A trace was kept or the traces cleared by the user (save them with the project). */
  readonly edited: () => void;
}

/** The drawn traces, for the profile. */
export interface TraceTools {
  /** Whether a trace is being drawn (map clicks belong to it). */
  readonly drawing: boolean;
  /** The finished traces as linework features, when the "Traces drawn on the map" box is ticked. */
  features(): Array<Feature<LineString, { name: string }>>;
  /** Stops a trace being drawn (another tool takes the pointer). */
  cancel(): void;
  /** Every finished trace, whether or not the box is ticked, as the project keeps them. */
  records(): ProjectTrace[];
  /** Puts these traces on the map in place of those there (a project was loaded); fires neither `changed` nor `edited`. */
  restore(traces: readonly ProjectTrace[]): void;
}

/** Dark green: apart from the section's blue, the selection's orange and the domains' violet. */
const TRACE_COLOUR = '#2b7a3b';

const byId = <T extends HTMLElement>(id: string): T => {
  const el = document.getElementById(id);
  if (!el) throw new Error(`the demo page has no #${id}`);
  return el as T;
};

/**
 * Connects the "Trace a line" controls (index.html) to the map.
 * @example const traces = setUpTraceTools({ map, say, beforeDraw: () => panTool(), changed: redraw, edited: save });
 */
export function setUpTraceTools(deps: TraceToolsDeps): TraceTools {
  const use = byId<HTMLInputElement>('profile-traces');
  const count = byId<HTMLElement>('trace-count');
  const drawButton = byId<HTMLButtonElement>('trace-draw');
  const centreButton = byId<HTMLButtonElement>('trace-centre');
  const finishButton = byId<HTMLButtonElement>('trace-finish');
  const cancelButton = byId<HTMLButtonElement>('trace-cancel');
  const clearButton = byId<HTMLButtonElement>('trace-clear');
  const finished: Array<{ drawer: SectionLineDrawer; id: string; name: string; line: readonly LonLatPair[] }> = [];
  let current: SectionLineDrawer | null = null;
  let made = 0;

  /** A drawer of its own for each trace, so each keeps its line on the map. */
  function newDrawer(): SectionLineDrawer {
    made += 1;
    return new SectionLineDrawer(deps.map, { idPrefix: `foldlens-trace-${made}`, color: TRACE_COLOUR, swath: 0 });
  }

  function ui(): void {
    const drawing = current !== null;
    drawButton.setAttribute('aria-pressed', String(drawing));
    drawButton.textContent = drawing ? 'Tracing…' : 'Trace a line on the map';
    for (const b of [centreButton, finishButton, cancelButton]) b.hidden = !drawing;
    finishButton.disabled = !current || current.vertices.length < 2;
    clearButton.disabled = drawing || finished.length === 0;
    count.textContent = String(finished.length);
  }

  function start(): void {
    deps.beforeDraw();
    const drawer = newDrawer();
    current = drawer;
    drawer.addEventListener('sectionchange', () => {
      ui();
      const n = drawer.vertices.length;
      deps.say(`Trace: ${n} point${n === 1 ? '' : 's'}. ${n < 2 ? 'Click the next point.' : 'Double-click, tap the last point again or press Enter to finish.'}`);
    });
    drawer.addEventListener('sectioncancel', () => {
      drawer.remove();
      current = null;
      ui();
      deps.say('Trace cancelled.');
    });
    drawer.addEventListener('sectionproblem', (e) => deps.say((e as CustomEvent<{ message: string }>).detail.message, true));
    drawer.addEventListener('sectionend', (e) => {
      const name = nextTraceName(finished);
      finished.push({ drawer, id: newTraceId(), name, line: (e as CustomEvent<{ vertices: readonly LonLatPair[] }>).detail.vertices });
      current = null;
      ui();
      deps.say(`${name} kept; it is projected with the map lines while "Traces drawn on the map" is ticked.`);
      deps.edited();
      deps.changed();
    });
    drawer.start();
    ui();
    deps.say('Click (or tap) along the line to trace; double-click, tap the last point again or press Enter to finish. Escape cancels.');
  }

  drawButton.addEventListener('click', () => (current ? current.cancel() : start()));
  centreButton.addEventListener('click', () => {
    const c = deps.map.getCenter();
    current?.addVertex([c.lng, c.lat]);
  });
  finishButton.addEventListener('click', () => current?.finish());
  cancelButton.addEventListener('click', () => current?.cancel());
  clearButton.addEventListener('click', () => {
    for (const t of finished) t.drawer.remove();
    finished.length = 0;
    ui();
    deps.say('Traces cleared.');
    deps.edited();
    deps.changed();
  });
  use.addEventListener('change', deps.changed);
  // Picking a selection tool ends the tracing: one tool owns the pointer at a time.
  document.addEventListener('foldlens-tool', (e) => {
    if ((e as CustomEvent<{ tool: string }>).detail.tool !== 'pan') current?.cancel();
  });

  ui();
  return {
    get drawing() {
      return current !== null;
    },
    cancel() {
      current?.cancel();
    },
    features() {
      if (!use.checked) return [];
      return finished.map((t) => ({
        type: 'Feature',
        properties: { name: t.name },
        geometry: { type: 'LineString', coordinates: t.line.map((p) => [p[0], p[1]]) },
      }));
    },
    records() {
      return finished.map((t) => ({ id: t.id, name: t.name, line: t.line.map((p) => [p[0], p[1]] as const) }));
    },
    restore(traces) {
      current?.cancel();
      for (const t of finished) t.drawer.remove();
      finished.length = 0;
      for (const t of traces) {
        const drawer = newDrawer();
        drawer.setLine(t.line);
        // The project file was checked (two different positions at least), so the drawer keeps the line.
        if (drawer.line) finished.push({ drawer, id: t.id, name: t.name, line: drawer.line });
        else drawer.remove();
      }
      ui();
    },
  };
}
