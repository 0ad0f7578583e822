/**
 * Foldlens: fold axes, equal-area nets and down-plunge profiles on any MapLibre GL JS map.
 *
 * @example
 * import { Map, setWorkerUrl } from 'maplibre-gl';
 * import maplibreWorkerUrl from 'maplibre-gl/dist/maplibre-gl-worker.mjs?url'; // Vite's way to a file's URL
 * import { attachFoldlens } from 'foldlens';
 * import 'foldlens/styles/foldlens.css';
 * setWorkerUrl(maplibreWorkerUrl);
 * const map = new Map({ container: 'map', style: myStyle });
 * const foldlens = attachFoldlens(map);
 * map.on('load', () => foldlens.setStations(stations));
 */
export * from './core/index';
// configureMapLibre (src/map/maplibreSetup.ts) stays out of the package: its `?url` import works only in
// a Vite production build and breaks Vite's dependency pre-bundling and other bundlers. MapLibre is the
// host's peer dependency, so the host sets its worker URL (README, "Embedding Foldlens in your map").
export { Foldlens, attachFoldlens, type SelectionChangeDetail, type AxisComputedDetail, type DomainSavedDetail, type FoldlensOptions } from './map/foldlens';
export { FoldlensOverlay, defaultOverlayOptions, type FoldlensOverlayOptions, type StationEventDetail } from './map/foldlensOverlay';
export { SelectionDrawer, type SelectionToolName, type ShapeEventDetail } from './map/selectionDrawer';
export { symbolFor, KIND_COLORS, KIND_LABELS, type SymbolChoice } from './map/symbolCatalog';
export { legendEntries, type LegendEntry } from './map/legendEntries';
export { stationFeatures } from './map/stationFeatures';
export { AnalysisClient } from './worker/analysisClient';
export { runAnalysisJob, type AnalysisJob, type AnalysisJobResult } from './worker/analysisJob';
export { readCsv, decodeText, CsvError, type CsvTable, type CsvRow } from './io/csvTable';
export { detectColumns, parseColumnMapping, type ColumnMapping, type ColumnDetection } from './io/columns';
export { readStations, readStation, type StationReadOptions } from './io/readStations';
export { readGeoJsonStations } from './io/readGeoJson';
export { stationsToCsv, stationsToGeoJson } from './io/writeStations';
export { FoldlensLegend } from './components/foldlens-legend';
export { FoldlensStationCard } from './components/foldlens-station-card';
export { FoldlensToolbar } from './components/foldlens-toolbar';
export { FoldlensNet } from './components/foldlens-net';
export { FoldlensDomains } from './components/foldlens-domains';
export { FoldlensSelections } from './components/foldlens-selections';
export { namedSelection, resolveSelection, selectionAppliesTo } from './io/namedSelection';
export { FoldlensProfile } from './components/foldlens-profile';
export { FoldlensAxisPicker } from './components/foldlens-axis-picker';
export { resolveAxisChoice, AXIS_SOURCES, type AxisChoice, type AxisChoiceInput, type AxisSource } from './components/profile/axisChoice';
export { SectionLineDrawer, defaultSectionLineDrawerOptions, type SectionLineDrawerOptions, type SectionLineEventDetail } from './map/sectionLineDrawer';
export { swathOutline } from './map/sectionSwath';
export { FoldlensImport } from './components/foldlens-import';
export { FoldlensTable } from './components/foldlens-table';
export { DomainLayer, type DomainRingDetail } from './map/domainLayer';
export { buildProfileData } from './map/profileData';
export { readDem } from './io/dem';
export { parseProject, projectToJson, emptyProject, ProjectFileError, type FoldlensProject } from './io/projectFile';
export { openProjectStore, Autosave } from './io/projectStore';
export { checkDomain } from './core/consistency/domainCheck';
export { localAxisField } from './core/consistency/localAxisField';
export { partitionAxisField } from './core/consistency/domainBoundaries';
export { buildConsistencyReport } from './core/consistency/report';
export { consistencyReportHtml } from './core/consistency/reportHtml';
export { checkClosures, findClosures } from './core/consistency/closures';
export { FoldlensConsistency } from './components/foldlens-consistency';
export { AxisFieldLayer, axisFieldFeatures } from './map/axisFieldLayer';
export { ConsistencyFlagsLayer, flagFeatures } from './map/consistencyFlagsLayer';
