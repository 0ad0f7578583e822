/**
 * The one place that configures MapLibre for bundlers. MapLibre 6 has no default export and,
 * under vite, loads its worker from a URL that must be set before the first map is created.
 * For the demo, the test pages and the benchmarks only: the npm package does not export it (a
 * `?url` import inside a dependency breaks the host's Vite dev server), and its README shows the
 * host doing the same with MapLibre's own `setWorkerUrl`.
 */
import { setWorkerUrl } from 'maplibre-gl';
import workerUrl from 'maplibre-gl/dist/maplibre-gl-worker.mjs?url';

let configured = false;

/**
 * Points MapLibre at its worker bundle; safe to call more than once.
 * @example
 * import { configureMapLibre } from '../map/maplibreSetup';
 * configureMapLibre(); // before the first new Map(...)
 */
export function configureMapLibre(): void {
  if (configured) return;
  setWorkerUrl(workerUrl);
  configured = true;
}
