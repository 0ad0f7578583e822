/**
 * Demo wiring of the "Profiles and sections" block: the axis picker, the choice of map lines to
 * project, the down-plunge profile of the selection or of a domain, and the vertical section
 * along a line drawn on the map with its swath. Every number comes from buildProfileData
 * (src/map/profileData.ts); this file only connects the page's controls to it.
 *
 * The sample map's contacts, faults and terrain model belong to the sample district: they are
 * offered only while the sample's stations are shown ({@link ProfileTools.useSampleMap}), never
 * projected under the user's own data. The section line and the traces are kept with the
 * project (`linesEdited`, {@link ProfileTools.restoreLines}).
 */
import { length as turfLength, lineString } from '@turf/turf';
import type { FeatureCollection } from 'geojson';
import type { Map as MapLibreMap } from 'maplibre-gl';
import type { Domain } from '../core/domain';
import type { FoldAnalysis } from '../core/foldAnalysis';
import { hingeMeanAxis } from '../core/hingeMean';
import { readNumberField } from '../core/numberField';
import type { LonLatPair } from '../core/sectionLineDraft';
import type { Station } from '../core/station';
import type { Line } from '../core/types';
import type { Dem } from '../io/demSampler';
import type { DrawnLines } from '../io/drawnLines';
import { MAX_SECTION_SWATH } from '../io/projectFile';
import '../components/foldlens-axis-picker';
import type { FoldlensProfile } from '../components/foldlens-profile';
import type { AxisChoice } from '../components/profile/axisChoice';
import { axisText, metresText } from '../components/profile/profileText';
import type { Foldlens, SelectionChangeDetail } from '../map/foldlens';
import { buildProfileData, DEFAULT_SWATH } from '../map/profileData';
import { SectionLineDrawer } from '../map/sectionLineDrawer';
import { setUpTraceTools } from './traceControls';

/** What the block needs from the page. */
export interface ProfileToolsDeps {
  readonly map: MapLibreMap;
  readonly foldlens: Foldlens;
  readonly profile: FoldlensProfile;
  readonly profileBox: HTMLDialogElement;
  /** The stations shown now. */
  readonly stations: () => readonly Station[];
  /** The sample map's line layers that may be projected (only while the sample is shown). */
  readonly contacts: FeatureCollection;
  readonly faults: FeatureCollection;
  /** The sample map's terrain model (loaded once, on first use; only while the sample is shown). */
  readonly dem: () => Promise<Dem>;
  /** Puts the selection tools back to panning (the section line takes the pointer). */
  readonly panTool: () => void;
  /** The user drew, replaced or cleared a trace or the section line, or changed its swath: keep them with the project. */
  readonly linesEdited: (lines: DrawnLines) => void;
}

/** What the page asks of the block. */
export interface ProfileTools {
  /** Whether a section line or a trace is being drawn (map clicks belong to it). */
  readonly drawingSection: boolean;
  /** The selection's full analysis arrived (`indices` as given to the analysis). */
  selectionAnalysed(indices: Int32Array, analysis: FoldAnalysis | null): void;
  /** Saved domains changed. */
  setDomains(domains: readonly Domain[]): void;
  /**
   * Whether the stations shown are the sample map's. With other data the sample's contacts,
   * faults and terrain model are not used: their boxes are unticked and disabled with the reason
   * beside them; with the sample again they are offered as they were.
   */
  useSampleMap(sampleShown: boolean): void;
  /** Puts a project's traces and section line on the map in place of those there (nothing is saved). */
  restoreLines(lines: DrawnLines): void;
}

/** Largest swath half-width accepted, metres (the project file's limit). */
const MAX_SWATH = MAX_SECTION_SWATH;

type View =
  | { readonly kind: 'area'; readonly ring: ReadonlyArray<readonly [number, number]>; readonly what: string }
  | { readonly kind: 'section'; readonly line: readonly LonLatPair[] };

const byId = <T extends HTMLElement>(id: string): T => {
  const el = document.getElementById(id);
  if (!el) throw new Error(`the demo page has no #${id}`);
  return el as T;
};

/**
 * Connects the block's controls (index.html, "Profiles and sections") to the map and the
 * profile panel.
 * @example const tools = setUpProfileTools({ map, foldlens, profile, profileBox, stations: () => stations, contacts, faults, dem, panTool, linesEdited: (lines) => save(lines) });
 */
export function setUpProfileTools(deps: ProfileToolsDeps): ProfileTools {
  const { map, foldlens, profile, profileBox } = deps;
  const picker = byId<HTMLElementTagNameMap['foldlens-axis-picker']>('axis-picker');
  const status = byId<HTMLElement>('profile-status');
  const profileButton = byId<HTMLButtonElement>('profile-button');
  const domainButton = byId<HTMLButtonElement>('profile-domain-button');
  const useContacts = byId<HTMLInputElement>('profile-contacts');
  const useFaults = byId<HTMLInputElement>('profile-faults');
  const sampleLinesNote = byId<HTMLElement>('profile-lines-note');
  const swathInput = byId<HTMLInputElement>('section-swath');
  const swathProblem = byId<HTMLElement>('section-swath-problem');
  const drawButton = byId<HTMLButtonElement>('section-draw');
  const drawingButtons = ['section-centre', 'section-undo', 'section-finish', 'section-cancel'].map((id) => byId<HTMLButtonElement>(id));
  const [centreButton, undoButton, finishButton, cancelButton] = drawingButtons;
  const openButton = byId<HTMLButtonElement>('section-open');
  const clearButton = byId<HTMLButtonElement>('section-clear');

  let domains: readonly Domain[] = [];
  let selection: Int32Array = new Int32Array(0);
  let view: View | null = null;
  let swath = DEFAULT_SWATH;
  swathInput.value = String(DEFAULT_SWATH);
  let sampleShown = true;
  // Whether each sample layer was ticked when other data came in, to offer it the same way again.
  const tickedOnSample = new Map<HTMLInputElement, boolean>();

  const drawer = new SectionLineDrawer(map, { swath });

  const say = (text: string, problem = false): void => {
    status.textContent = text; // text only
    status.classList.toggle('fl-app__status--problem', problem);
  };

  // ---- Building and showing a view -------------------------------------------------------------

  async function show(next: View): Promise<void> {
    const choice: AxisChoice = picker.choice;
    if (!choice.axis) {
      say(`Choose a fold axis first. ${choice.problem ?? ''}`.trim(), true);
      return;
    }
    const axis: Line = choice.axis;
    const what = next.kind === 'area' ? next.what : `Section ${metresText(turfLength(lineString(next.line.map((p) => [p[0], p[1]])), { units: 'kilometers' }) * 1000)}, ${next.line.length} points`;
    const label = `${what} — axis ${axisText(axis)}: ${choice.from}`;
    try {
      // The sample's lines and terrain only under the sample's own stations (see useSampleMap).
      const withContacts = sampleShown && useContacts.checked;
      const withFaults = sampleShown && useFaults.checked;
      const data = buildProfileData({
        stations: deps.stations(),
        contacts: { type: 'FeatureCollection', features: [...(withContacts ? deps.contacts.features : []), ...traces.features()] },
        ...(withFaults && { faults: deps.faults }),
        dem: sampleShown ? await deps.dem() : null,
        axis,
        ...(next.kind === 'area' ? { ring: next.ring } : { section: { line: next.line, swath } }),
        label,
      });
      view = next;
      profile.data = data;
      profile.label = label;
      profileBox.setAttribute('aria-label', next.kind === 'area' ? 'Down-plunge profile' : 'Vertical section');
      profileBox.show(); // not modal: the map stays live for hover linking and for drawing the next line
      const drawn = traces.features().length;
      const layers = [withContacts && 'contacts', withFaults && 'faults', drawn > 0 && `${drawn} drawn trace${drawn === 1 ? '' : 's'}`].filter(Boolean).join(' and ') || 'no map lines';
      const terrain = sampleShown ? '' : ' No terrain model: heights come from your data only (the sample map\'s terrain is not used).';
      say(`${next.kind === 'area' ? 'Profile' : 'Section'} drawn with axis ${axisText(axis)}; ${layers} projected.${terrain}`);
    } catch (e) {
      say(`The ${next.kind === 'area' ? 'profile' : 'section'} could not be drawn: ${e instanceof Error ? e.message : String(e)}`, true);
    }
  }

  /** Draws the view shown again after an option changed (axis, lines, swath). */
  function redraw(): void {
    if (view && profileBox.open) void show(view);
  }

  // ---- Axis, line layers, swath ----------------------------------------------------------------

  /** The lines as the project keeps them. */
  function drawnLines(): DrawnLines {
    return { traces: traces.records(), sectionLine: drawer.line ? { line: drawer.line.map((p) => [p[0], p[1]] as const), swath } : null };
  }
  const edited = (): void => deps.linesEdited(drawnLines());

  const traces = setUpTraceTools({
    map,
    say,
    beforeDraw: () => {
      drawer.cancel();
      deps.panTool();
      profileBox.close(); // the whole map is needed to draw on
    },
    changed: redraw,
    edited,
  });

  function updateDomainButton(): void {
    const d = picker.source === 'domain' ? domains.find((x) => x.id === picker.domainId) : undefined;
    domainButton.hidden = !d;
    if (d) domainButton.textContent = `Down-plunge profile of domain “${d.name}”`;
  }

  picker.addEventListener('foldlens-axis-change', () => {
    updateDomainButton();
    redraw();
  });
  useContacts.addEventListener('change', redraw);
  useFaults.addEventListener('change', redraw);
  swathInput.addEventListener('change', () => {
    const read = readNumberField(swathInput.value, { field: 'Swath half-width', min: 0, minExclusive: true, max: MAX_SWATH, expected: `metres, more than 0 and at most ${MAX_SWATH}` });
    swathInput.setAttribute('aria-invalid', String(!read.ok));
    swathProblem.hidden = read.ok;
    swathProblem.textContent = read.ok ? '' : read.problem.message;
    if (!read.ok) return;
    swath = read.value;
    drawer.setSwath(swath);
    if (drawer.line) edited();
    if (view?.kind === 'section') redraw();
  });

  // ---- Down-plunge profile of the selection or a domain ---------------------------------------

  profileButton.addEventListener('click', () => {
    const ring = foldlens.shape;
    if (!ring) {
      say('Draw a selection first (Lasso, Polygon or Box): its outline is the area projected.', true);
      return;
    }
    void show({ kind: 'area', ring, what: `Selection of ${selection.length} stations` });
  });
  domainButton.addEventListener('click', () => {
    const d = domains.find((x) => x.id === picker.domainId);
    if (d) void show({ kind: 'area', ring: d.ring, what: `Domain “${d.name}”` });
  });

  foldlens.addEventListener('selectionchange', (e) => {
    const d = (e as CustomEvent<SelectionChangeDetail>).detail;
    profileButton.disabled = d.shape === null;
    if (!d.final) return;
    selection = d.indices;
    if (d.indices.length === 0) {
      picker.selection = null;
      picker.hinges = null;
      return;
    }
    picker.selection = { axis: null, n: 0, cone95: null, pending: true };
    picker.hinges = hingeMeanAxis(deps.stations(), d.indices);
  });

  // ---- Section line ----------------------------------------------------------------------------

  function drawingUi(drawing: boolean): void {
    drawButton.setAttribute('aria-pressed', String(drawing));
    drawButton.textContent = drawing ? 'Drawing section line…' : drawer.line ? 'Draw a new section line' : 'Draw section line';
    for (const b of drawingButtons) b.hidden = !drawing;
    openButton.disabled = drawing || !drawer.line;
    clearButton.disabled = drawing || !drawer.line;
    undoButton.disabled = drawer.vertices.length === 0;
    finishButton.disabled = drawer.vertices.length < 2;
  }

  drawButton.addEventListener('click', () => {
    if (drawer.drawing) {
      drawer.cancel();
      return;
    }
    traces.cancel();
    deps.panTool();
    profileBox.close(); // the whole map is needed to draw on
    drawer.start();
  });
  centreButton.addEventListener('click', () => {
    const c = map.getCenter();
    drawer.addVertex([c.lng, c.lat]);
  });
  undoButton.addEventListener('click', () => drawer.undoVertex());
  finishButton.addEventListener('click', () => drawer.finish());
  cancelButton.addEventListener('click', () => drawer.cancel());
  openButton.addEventListener('click', () => {
    if (drawer.line) void show({ kind: 'section', line: drawer.line });
  });
  clearButton.addEventListener('click', () => {
    drawer.setLine(null);
    if (view?.kind === 'section') {
      view = null;
      profileBox.close();
    }
    drawingUi(false);
    say('Section line cleared.');
    edited();
  });

  drawer.addEventListener('sectionstart', () => {
    drawingUi(true);
    say('Click (or tap) the map where the section starts, then at each bend. Double-click, tap the last point again or press Enter to finish; Backspace takes the last point back; Escape cancels.');
  });
  drawer.addEventListener('sectionchange', () => {
    drawingUi(true);
    const n = drawer.vertices.length;
    say(n === 0 ? 'No point yet: click where the section starts.' : `${n} point${n === 1 ? '' : 's'}. ${n === 1 ? 'Click where the section ends (or bends).' : 'Double-click, tap the last point again or press Enter to finish.'}`);
  });
  drawer.addEventListener('sectioncancel', () => {
    drawingUi(false);
    say(drawer.line ? 'Drawing cancelled; the previous section line is kept.' : 'Drawing cancelled.');
  });
  drawer.addEventListener('sectionproblem', (e) => say((e as CustomEvent<{ message: string }>).detail.message, true));
  drawer.addEventListener('sectionend', (e) => {
    drawingUi(false);
    edited();
    void show({ kind: 'section', line: (e as CustomEvent<{ vertices: readonly LonLatPair[] }>).detail.vertices });
  });

  // Picking a selection tool ends the section drawing: one tool owns the pointer at a time.
  document.addEventListener('foldlens-tool', (e) => {
    if ((e as CustomEvent<{ tool: string }>).detail.tool !== 'pan') drawer.cancel();
  });

  drawingUi(false);
  return {
    get drawingSection() {
      return drawer.drawing || traces.drawing;
    },
    selectionAnalysed(indices: Int32Array, analysis: FoldAnalysis | null): void {
      if (indices !== selection && !(indices.length === selection.length && indices.every((v, i) => v === selection[i]))) return;
      picker.selection = { axis: analysis?.axis ?? null, n: analysis?.n ?? 0, cone95: analysis?.cone95 ?? null };
    },
    setDomains(next: readonly Domain[]): void {
      domains = next;
      picker.domains = next.map((d) => ({ id: d.id, name: d.name, axis: d.analysis?.axis ?? null, cone95: d.analysis?.cone95 ?? null }));
      if (!next.some((d) => d.id === picker.domainId)) picker.domainId = next[0]?.id ?? '';
      updateDomainButton();
    },
    useSampleMap(shown: boolean): void {
      if (shown === sampleShown) return;
      sampleShown = shown;
      for (const box of [useContacts, useFaults]) {
        if (!shown) tickedOnSample.set(box, box.checked);
        box.checked = shown ? (tickedOnSample.get(box) ?? true) : false;
        box.disabled = !shown;
        if (shown) box.removeAttribute('aria-describedby');
        else box.setAttribute('aria-describedby', sampleLinesNote.id);
      }
      sampleLinesNote.hidden = shown;
      if (view && profileBox.open) redraw();
      else say(''); // what the status said of the last drawing is not true of these stations
    },
    restoreLines(lines: DrawnLines): void {
      drawer.cancel();
      traces.restore(lines.traces);
      if (lines.sectionLine) {
        swath = lines.sectionLine.swath;
        swathInput.value = String(swath);
        swathInput.setAttribute('aria-invalid', 'false');
        swathProblem.hidden = true;
        drawer.setSwath(swath);
      }
      drawer.setLine(lines.sectionLine?.line ?? null);
      // An open section of the line replaced is no longer what the map shows.
      if (view?.kind === 'section') {
        view = null;
        profileBox.close();
      } else redraw();
      drawingUi(false);
    },
  };
}
