import 'maplibre-gl/dist/maplibre-gl.css';
import { Map as MapLibreMap, NavigationControl, ScaleControl, getWorkerUrl } from 'maplibre-gl';
import { configureMapLibre } from '../map/maplibreSetup';
import { attachFoldlens, type SelectionChangeDetail } from '../map/foldlens';
import type { StationEventDetail } from '../map/foldlensOverlay';
import { AnalysisClient } from '../worker/analysisClient';
import { analyzeFoldPoles } from '../core/foldAnalysis';
import { describeProblem, isUsable, type Station } from '../core/station';
import { foldInputFromStations } from '../core/foldInput';
import { lineToVector, poleOf } from '../core/vectors';
import { projectLine } from '../core/netProjection';
import { KIND_LABELS } from '../map/symbolCatalog';
import { buildStyle, samplePaint, bounds, truth, contacts, faults, demUrl } from '../../sample-maps/korvane/index';
import '../components/foldlens-profile';
import type { FoldlensProfile } from '../components/foldlens-profile';
import { setUpProfileTools } from './profileControls';
import { setUpConsistency } from './consistencyControls';
import { readDem } from '../io/dem';
import type { Dem } from '../io/demSampler';
import { loadSampleStations } from './sampleStations';
import { setUpOffline } from './offline';
import '../components/foldlens-import';
import '../components/foldlens-table';
import { reportOf } from '../components/import/importReport';
import { emptyProject, withDataset, type FoldlensProject, type ProjectDataset } from '../io/projectFile';
import { Autosave, openProjectStore } from '../io/projectStore';
import '../components/foldlens-toolbar';
import '../components/foldlens-legend';
import '../components/foldlens-station-card';
import '../components/foldlens-net';
import type { FoldlensNet } from '../components/foldlens-net';
import '../components/foldlens-domains';
import { simplify, polygon as turfPolygon } from '@turf/turf';
import { DomainLayer, type DomainRingDetail } from '../map/domainLayer';
import { newDomainId, nextDomainName, type Domain } from '../core/domain';
import '../components/foldlens-selections';
import type { ProjectSelection, SelectionShape } from '../io/projectFile';
import { namedSelection, newSelectionId, nextSelectionName, resolveSelection, selectionAppliesTo } from '../io/namedSelection';
import { drawnLinesOf, withDrawnLines } from '../io/drawnLines';
import type { ShapeEventDetail } from '../map/selectionDrawer';

configureMapLibre();
const saveForOffline = setUpOffline(document.querySelector('#offline-status') as HTMLElement, () => [getWorkerUrl(), analysis.workerScriptUrl ?? '', consistency.workerScriptUrl() ?? '']);

const $ = <T extends Element>(selector: string) => document.querySelector(selector) as T;
const toolbar = $<HTMLElementTagNameMap['foldlens-toolbar']>('#toolbar');
const net = $<FoldlensNet>('#net');
const card = $<HTMLElementTagNameMap['foldlens-station-card']>('#card');
const legend = $<HTMLElementTagNameMap['foldlens-legend']>('#legend');
const hint = $<HTMLElement>('#hint');
const domainsPanel = $<HTMLElementTagNameMap['foldlens-domains']>('#domains');

// The map's look follows the panels': dark when the page is (data-theme, or else the system's choice).
const pageTheme = document.documentElement.dataset.theme;
const darkPage = pageTheme === 'dark' || (pageTheme !== 'light' && matchMedia('(prefers-color-scheme: dark)').matches);
const map = new MapLibreMap({
  container: 'map',
  style: buildStyle({ theme: darkPage ? 'dark' : 'light' }),
  bounds,
  fitBoundsOptions: { padding: 30 },
  attributionControl: false,
  maxPitch: 60,
});
map.addControl(new NavigationControl({ visualizePitch: true }), 'top-left');
map.addControl(new ScaleControl({ unit: 'metric' }), 'bottom-left');

const foldlens = attachFoldlens(map, { analysis: false, tooltip: true }); // the demo runs its own analysis, with density, for the net panel
const domainLayer = new DomainLayer(map);
let domains: Domain[] = [];
const analysis = new AnalysisClient();
let stations: Station[] = [];
let contourMethod: 'kamb' | 'exponential' | 'off' = 'kamb';
let netKind: 'equal-area' | 'equal-angle' = 'equal-area';
let lastSelection: Int32Array = new Int32Array(0);

function showProblems(all: readonly Station[]): void {
  const bad = all.filter((s) => s.problems.length > 0);
  $<HTMLElement>('#problems-summary').textContent = bad.length
    ? `${bad.length} row${bad.length === 1 ? '' : 's'} could not be used (kept, not drawn; rows count data rows, the header is row 0)`
    : 'Every row was read';
  const list = $<HTMLOListElement>('#problems-list');
  list.replaceChildren(
    ...bad.flatMap((s) =>
      s.problems.map((p) => {
        const li = document.createElement('li');
        li.textContent = describeProblem(p); // text only: data never becomes HTML
        return li;
      }),
    ),
  );
}

function polesOf(planes: readonly { dipDirection: number; dip: number }[]): Float64Array {
  const out = new Float64Array(planes.length * 3);
  planes.forEach((p, k) => {
    const v = lineToVector(poleOf(p));
    out.set([v.x, v.y, v.z], 3 * k);
  });
  return out;
}

async function analyseSelection(indices: Int32Array, final: boolean): Promise<void> {
  lastSelection = indices;
  const { planes, lines, planeIds: poleIds } = foldInputFromStations(stations, indices);
  const poles = polesOf(planes);
  net.poles = poles;
  net.poleIds = poleIds;
  net.planes = planes;
  net.lines = lines;
  const others = indices.length - planes.length - lines.length;
  net.selectionLabel = indices.length
    ? `${indices.length} stations selected: ${planes.length} bedding analysed, ${lines.length} ${lines.length === 1 ? 'hinge or lineation' : 'hinges and lineations'} compared${others ? `, ${others} other (cleavage, joints…) not used` : ''}`
    : 'No selection';
  hint.hidden = indices.length > 0;
  if (indices.length === 0) {
    net.analysis = null;
    net.density = null;
    net.description = null;
    document.body.dataset.analysisReady = String(Date.now());
    return;
  }
  if (!final) {
    // While drawing: the quick fit without bootstrap or density, straight from the poles; the last
    // selection's contours and fold description would be wrong for this one, so they go.
    net.analysis = analyzeFoldPoles(poles, { bootstrap: 0, lines });
    net.density = null;
    net.description = null;
    return;
  }
  const result = await analysis.run({ planes, lines, bootstrap: 500, seed: 1, density: contourMethod, net: netKind });
  if (!result || indices !== lastSelection) return; // a newer selection has taken over
  net.analysis = result.analysis;
  net.density = result.density;
  net.description = result.description;
  profileTools.selectionAnalysed(indices, result.analysis);
  document.body.dataset.analysisReady = String(Date.now());
}

foldlens.addEventListener('selectionchange', (e) => {
  const d = (e as CustomEvent<SelectionChangeDetail>).detail;
  toolbar.selectedCount = d.indices.length;
  domainsPanel.canSave = d.shape !== null && d.indices.length > 0;
  void analyseSelection(d.indices, d.final);
});
/** Shows a station's details, with where it plots on the net as it is drawn now. */
function inspect(station: Station | null): void {
  card.station = station;
  if (station) card.scrollIntoView({ block: 'nearest' });
  const line = station?.plane ? poleOf(station.plane) : station?.line;
  card.netPosition = line ? projectLine(line, netKind) : null;
}

foldlens.addEventListener('stationclick', (e) => {
  if (profileTools.drawingSection) return; // a click on a station while drawing a section line is a vertex
  inspect((e as CustomEvent<StationEventDetail>).detail.station);
});
foldlens.addEventListener('stationhover', (e) => {
  net.highlight = (e as CustomEvent<StationEventDetail>).detail.index;
});
net.addEventListener('foldlens-net-hover', (e) => foldlens.overlay.setHighlight((e as CustomEvent<{ index: number }>).detail.index));
net.addEventListener('foldlens-net-pick', (e) => {
  const i = (e as CustomEvent<{ index: number }>).detail.index;
  if (i >= 0) inspect(stations[i]);
});
net.addEventListener('foldlens-net-options', (e) => {
  const d = (e as CustomEvent<{ net: typeof netKind; contours: typeof contourMethod }>).detail;
  if (d.net === netKind && d.contours === contourMethod) return;
  netKind = d.net;
  contourMethod = d.contours;
  void analyseSelection(lastSelection, true);
});
card.addEventListener('foldlens-close', () => inspect(null));

const themeButton = $<HTMLButtonElement>('#theme');
themeButton.addEventListener('click', () => {
  const dark = document.documentElement.dataset.theme !== 'dark';
  document.documentElement.dataset.theme = dark ? 'dark' : 'light';
  themeButton.setAttribute('aria-pressed', String(dark));
  // The sample map follows: its own layers repainted (setStyle would drop Foldlens's layers).
  const repaint = () => {
    for (const p of samplePaint(dark ? 'dark' : 'light')) map.setPaintProperty(p.layer, p.property, p.value);
  };
  if (map.isStyleLoaded()) repaint();
  else map.once('idle', repaint);
});
legend.addEventListener('foldlens-kind-filter', (e) => foldlens.overlay.setVisibleKinds((e as CustomEvent<{ visibleKinds: string[] | null }>).detail.visibleKinds));
toolbar.addEventListener('foldlens-tool', (e) => {
  const tool = (e as CustomEvent<{ tool: 'pan' | 'lasso' | 'polygon' | 'rectangle' }>).detail.tool;
  foldlens.setTool(tool === 'pan' ? null : tool);
});
toolbar.addEventListener('foldlens-combine', (e) => foldlens.setCombine((e as CustomEvent<{ combine: 'replace' | 'add' | 'subtract' }>).detail.combine));
toolbar.addEventListener('foldlens-clear', () => foldlens.clearSelection());
toolbar.addEventListener('foldlens-select-kind', (e) => foldlens.selectKinds([(e as CustomEvent<{ kind: string }>).detail.kind]));

// ---- Structural domains -------------------------------------------------------------------

/** Shows the domains and saves them with the project; resolves when the save has committed. */
function setDomains(next: Domain[], save = true): Promise<void> {
  domains = next;
  domainLayer.setDomains(domains);
  profileTools.setDomains(domains);
  domainsPanel.domains = domains;
  if (!save) return Promise.resolve();
  project = { ...project, domains: domains as unknown as FoldlensProject['domains'] };
  autosave.schedule(project);
  return autosave.flush();
}

/** A lasso ring has a vertex every few pixels; keep its shape with far fewer vertices for editing. */
function simplifiedRing(ring: ReadonlyArray<readonly [number, number]>): Array<[number, number]> {
  const closed = [...ring.map((p) => [p[0], p[1]]), [ring[0][0], ring[0][1]]];
  if (closed.length <= 8) return ring.map((p) => [p[0], p[1]]);
  const xs = ring.map((p) => p[0]);
  const ys = ring.map((p) => p[1]);
  const diagonal = Math.hypot(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys));
  const out = simplify(turfPolygon([closed]), { tolerance: diagonal * 0.004, highQuality: true }).geometry.coordinates[0];
  return out.slice(0, -1).map((p) => [p[0], p[1]] as [number, number]);
}

/** Analyses the stations inside a ring exactly as the panel does, for a domain record. */
async function domainFromRing(id: string, name: string, ring: Array<[number, number]>): Promise<Domain> {
  foldlens.selectWithin(ring);
  const indices = foldlens.selectedIndices();
  const { planes, lines } = foldInputFromStations(stations, indices);
  const result = await analysis.run({ planes, lines, bootstrap: 500, seed: 1, density: 'off', net: netKind });
  return { id, name, ring, analysis: result?.analysis ?? null, stationIds: Array.from(indices, (i) => stations[i].id), updated: new Date().toISOString() };
}

domainsPanel.addEventListener('foldlens-domain-save', async (e) => {
  const shape = foldlens.shape;
  if (!shape) return;
  const name = (e as CustomEvent<{ name: string }>).detail.name || nextDomainName(domains);
  const domain = await domainFromRing(newDomainId(), name, simplifiedRing(shape));
  await setDomains([...domains, domain]);
  document.body.dataset.domainsSaved = String(domains.length);
});
domainsPanel.addEventListener('foldlens-domain-show', (e) => {
  const d = domains.find((x) => x.id === (e as CustomEvent<{ id: string }>).detail.id);
  if (d) foldlens.selectWithin(d.ring);
});
domainsPanel.addEventListener('foldlens-domain-edit', (e) => {
  const id = (e as CustomEvent<{ id: string | null }>).detail.id;
  domainLayer.edit(id);
  domainsPanel.editingId = id;
  // Vertices are dragged with the pointer, so the drawing tools step aside while editing.
  if (id) {
    foldlens.setTool(null);
    toolbar.tool = 'pan';
  }
  const d = domains.find((x) => x.id === id);
  if (d) foldlens.selectWithin(d.ring);
});
domainsPanel.addEventListener('foldlens-domain-rename', (e) => {
  const { id, name } = (e as CustomEvent<{ id: string; name: string }>).detail;
  setDomains(domains.map((d) => (d.id === id ? { ...d, name, updated: new Date().toISOString() } : d)));
});
domainsPanel.addEventListener('foldlens-domain-delete', (e) => {
  const id = (e as CustomEvent<{ id: string }>).detail.id;
  domainsPanel.deleted = domains.find((d) => d.id === id) ?? null;
  if (domainLayer.editingId === id) domainsPanel.editingId = null;
  setDomains(domains.filter((d) => d.id !== id));
});
domainsPanel.addEventListener('foldlens-domain-undo', () => {
  const d = domainsPanel.deleted;
  if (d) setDomains([...domains, d]);
  domainsPanel.deleted = null;
});
domainLayer.addEventListener('domainringchange', (e) => foldlens.selectWithin((e as CustomEvent<DomainRingDetail>).detail.ring));
domainLayer.addEventListener('domainringend', async (e) => {
  const { id, ring } = (e as CustomEvent<DomainRingDetail>).detail;
  const old = domains.find((d) => d.id === id);
  if (!old) return;
  const updated = await domainFromRing(id, old.name, ring);
  setDomains(domains.map((d) => (d.id === id ? updated : d)));
});
domainLayer.addEventListener('domainclick', (e) => {
  if (foldlens.drawer.currentTool || profileTools.drawingSection) return; // clicks while drawing belong to the drawing
  const d = domains.find((x) => x.id === (e as CustomEvent<{ id: string }>).detail.id);
  if (d) foldlens.selectWithin(d.ring);
});

// ---- Named selections, saved with the project ------------------------------------------------

const selectionsPanel = $<HTMLElementTagNameMap['foldlens-selections']>('#selections');
// The tool of the shape being drawn, and of the current selection's outline (a new outline object
// means a new shape; a cancelled gesture keeps the old one).
let drawingTool: SelectionShape['tool'];
let outlineTool: SelectionShape['tool'];
let lastOutline: SelectionChangeDetail['shape'] = null;
foldlens.drawer.addEventListener('shapestart', (e) => (drawingTool = (e as CustomEvent<ShapeEventDetail>).detail.tool));
foldlens.addEventListener('selectionchange', (e) => {
  const d = (e as CustomEvent<SelectionChangeDetail>).detail;
  selectionsPanel.canSave = d.indices.length > 0;
  if (!d.final) return;
  if (d.shape !== lastOutline) outlineTool = d.shape ? drawingTool : undefined;
  lastOutline = d.shape;
  drawingTool = undefined;
});

/** Lists the saved selections that belong to the stations shown. */
function showSelections(): void {
  selectionsPanel.selections = project.selections.filter((s) => selectionAppliesTo(s, project.datasets.at(-1)?.id));
}

/** Keeps the selections with the project; resolves when the save has committed. */
function setSelections(next: readonly ProjectSelection[]): Promise<void> {
  project = { ...project, selections: next };
  showSelections();
  autosave.schedule(project);
  return autosave.flush();
}

selectionsPanel.addEventListener('foldlens-selection-save', async (e) => {
  const indices = foldlens.selectedIndices();
  if (indices.length === 0) return;
  const shape = foldlens.shape;
  const name = (e as CustomEvent<{ name: string }>).detail.name || nextSelectionName(project.selections);
  const record = namedSelection({ id: newSelectionId(), name, stations, indices, dataset: project.datasets.at(-1)?.id, shape: shape && { tool: outlineTool, ring: shape } });
  await setSelections([...project.selections, record]);
  selectionsPanel.status = `Saved “${name}”: ${indices.length} station${indices.length === 1 ? '' : 's'}.`;
  document.body.dataset.selectionsSaved = String(project.selections.length);
});
selectionsPanel.addEventListener('foldlens-selection-apply', (e) => {
  const s = project.selections.find((x) => x.id === (e as CustomEvent<{ id: string }>).detail.id);
  if (!s) return;
  const { indices, missing } = resolveSelection(s, stations);
  drawingTool = s.shape?.tool;
  if (indices) foldlens.selectIndices(indices, s.shape?.ring ?? null);
  else if (s.shape) foldlens.selectWithin(s.shape.ring);
  const n = foldlens.selectedIndices().length;
  const gone = missing ? `; ${missing} of its stations ${missing === 1 ? 'is' : 'are'} no longer in the data` : '';
  selectionsPanel.status = `Applied “${s.name}”: ${n} station${n === 1 ? '' : 's'} selected${gone}.`;
});
selectionsPanel.addEventListener('foldlens-selection-delete', (e) => {
  const id = (e as CustomEvent<{ id: string }>).detail.id;
  const s = project.selections.find((x) => x.id === id);
  if (s) selectionsPanel.status = `Deleted “${s.name}”.`;
  void setSelections(project.selections.filter((x) => x.id !== id)).then(() => (document.body.dataset.selectionsSaved = String(project.selections.length)));
});

// ---- The user's own data: import, table, autosaved project ------------------------------------

const importEl = $<HTMLElementTagNameMap['foldlens-import']>('#import');
const table = $<HTMLElementTagNameMap['foldlens-table']>('#table');
const store = openProjectStore();
// The save state is on <body> for tests and scripts that wait for the project to be stored.
const autosave = new Autosave(store, { onState: (state) => (document.body.dataset.saveState = state) });
let project: FoldlensProject = emptyProject('Field data');

/** Whether the stations shown are the sample map's own (so its contacts, faults and terrain lie under them). */
let sampleShown = true;

/** Puts a set of stations on the map and in every panel. */
function showStations(next: Station[], label: string): void {
  stations = next;
  foldlens.setStations(stations);
  legend.stations = stations;
  inspect(null);
  const kinds = [...new Set(stations.filter(isUsable).map((s) => s.kind!))];
  toolbar.kinds = kinds.map((kind) => ({ kind, label: KIND_LABELS[kind] ?? kind }));
  showProblems(stations);
  $<HTMLElement>('#dataset-label').textContent = label;
}

function showProject(p: FoldlensProject): void {
  project = p;
  const d: ProjectDataset | null = p.datasets.at(-1) ?? null;
  table.data = d;
  importEl.current = d && reportOf(d);
  if (d) {
    showStations([...d.stations], `${d.name} — ${d.stations.length} rows (your data, saved in this browser)`);
    sampleShown = false;
    profileTools.useSampleMap(false); // the sample's contacts, faults and terrain are not under these stations
  }
  showSelections();
}

function showSample(): void {
  table.data = null;
  showStations(loadSampleStations(), `${truth.district} — synthetic demo data`);
  sampleShown = true;
  profileTools.useSampleMap(true);
  showSelections();
}

importEl.addEventListener('foldlens-import', (e) => {
  // A new file replaces the data; the domains (map areas) and the lines drawn on the map stay.
  showProject(withDataset(withDrawnLines({ ...emptyProject(project.name), domains: project.domains }, drawnLinesOf(project)), (e as CustomEvent<{ dataset: ProjectDataset }>).detail.dataset));
  autosave.schedule(project);
});
importEl.addEventListener('foldlens-project-open', (e) => {
  showProject((e as CustomEvent<{ project: FoldlensProject }>).detail.project);
  profileTools.restoreLines(drawnLinesOf(project));
  void setDomains(project.domains as unknown as Domain[]);
});
$<HTMLButtonElement>('#back-to-sample').addEventListener('click', async () => {
  await store.clear();
  project = emptyProject('Field data');
  showSample();
  profileTools.restoreLines(drawnLinesOf(project));
  void setDomains([], false);
});
table.addEventListener('foldlens-row-select', (e) => {
  const s = stations[(e as CustomEvent<{ index: number }>).detail.index];
  if (!s) return;
  inspect(s);
  if (s.lon !== undefined && s.lat !== undefined) map.flyTo({ center: [s.lon, s.lat], zoom: Math.max(map.getZoom(), 15) });
});
table.addEventListener('foldlens-row-edit', (e) => {
  const dataset = (e as CustomEvent<{ dataset: ProjectDataset }>).detail.dataset;
  project = withDataset(project, dataset);
  importEl.current = reportOf(dataset);
  autosave.schedule(project);
});
table.addEventListener('foldlens-row-fixed', (e) => {
  showStations([...(e as CustomEvent<{ dataset: ProjectDataset }>).detail.dataset.stations], $<HTMLElement>('#dataset-label').textContent ?? '');
});
foldlens.addEventListener('stationclick', (e) => (table.selectedIndex = (e as CustomEvent<StationEventDetail>).detail.index));
foldlens.addEventListener('stationhover', (e) => (table.highlight = (e as CustomEvent<StationEventDetail>).detail.index));
addEventListener('pagehide', () => void autosave.flush());

map.on('load', async () => {
  const saved = await store.load().catch(() => null);
  if (saved && saved.project.datasets.length > 0) showProject(saved.project);
  else showSample();
  if (saved) project = saved.project;
  showSelections();
  profileTools.restoreLines(drawnLinesOf(project));
  // Domains saved with the project (opaque in the file format; written only by this viewer).
  void setDomains((saved?.project.domains ?? []) as unknown as Domain[], false);
  map.once('idle', () => {
    document.body.setAttribute('data-map-ready', 'true');
    saveForOffline();
  });
});

Object.assign(window, { foldlensDemo: { map, foldlens, get stations() { return stations; } } });

// ---- Profiles and sections: axis picker, map lines, down-plunge profiles, section lines ----------

const profileBox = $<HTMLDialogElement>('#profile-box');
const profile = $<FoldlensProfile>('#profile');
$<HTMLButtonElement>('#profile-close').addEventListener('click', () => profileBox.close());
let demLoad: Promise<Dem> | null = null;
const sampleDem = (): Promise<Dem> => (demLoad ??= fetch(demUrl).then((r) => r.arrayBuffer()).then((b) => readDem(b, { source: 'dem.tif' })));
const profileTools = setUpProfileTools({
  map,
  foldlens,
  profile,
  profileBox,
  stations: () => stations,
  contacts,
  faults,
  dem: sampleDem,
  panTool: () => {
    foldlens.setTool(null);
    toolbar.tool = 'pan';
  },
  linesEdited: (lines) => {
    project = withDrawnLines(project, lines);
    autosave.schedule(project);
  },
});
foldlens.addEventListener('stationhover', (e) => (profile.highlight = (e as CustomEvent<StationEventDetail>).detail.index));
profile.addEventListener('foldlens-profile-hover', (e) => foldlens.overlay.setHighlight((e as CustomEvent<{ index: number }>).detail.index));
profile.addEventListener('foldlens-profile-pick', (e) => {
  const i = (e as CustomEvent<{ index: number }>).detail.index;
  if (i >= 0) inspect(stations[i]);
});

// ---- Consistency: local fold axis field, suggested domains, flags and the report ------------------

const consistency = setUpConsistency({
  map,
  panel: $<HTMLElementTagNameMap['foldlens-consistency']>('#consistency'),
  stations: () => stations,
  domains: () => domains,
  saveDomains: async (areas) => {
    const made: Domain[] = [];
    for (const a of areas) made.push(await domainFromRing(newDomainId(), a.name, a.ring));
    await setDomains([...domains, ...made]);
    document.body.dataset.domainsSaved = String(domains.length);
  },
  contacts,
  dem: sampleDem,
  mapLinesApply: () => sampleShown,
  datasetLabel: () => $<HTMLElement>('#dataset-label').textContent ?? '',
});
