/**
 * What the symbol benchmark's page and driver exchange, shared by both sides.
 */

/** Zoom of the benchmark map: from 15 on, every station symbol is drawn, overlapping or not. */
export const ZOOM = 15;

/** Foldlens symbols (the overlay with its default layers) or one plain circle layer. */
export type RenderKind = 'symbols' | 'circles';

/** One render measured in the page. */
export interface PageRender {
  readonly kind: RenderKind;
  readonly n: number;
  /** From handing the stations to the map to its 'idle' event and the GPU's finishing that frame, ms. */
  readonly firstRenderMs: number;
  /** From handing the stations to the map to its 'idle' event, ms (the GPU may still be drawing). */
  readonly idleMs: number;
  /** The part of firstRenderMs spent on the page's main thread before the map takes over (features, images, setData), ms. */
  readonly handOverMs: number;
  /** Times between successive frames while panning, ms (empty when this render did not pan). */
  readonly frameMs: readonly number[];
  /** Distinct features the layer drew in the view after the first render (-1: not counted). */
  readonly drawn: number;
  /** Time spent counting the drawn features, ms (0 when not counted). */
  readonly countMs: number;
}

/** What the driver prints as the last line of its standard output. */
export interface DriverReport {
  readonly n: number;
  readonly viewport: { readonly width: number; readonly height: number };
  readonly renders: readonly PageRender[];
  /** Repetitions asked for; fewer ran when the next would have passed the deadline. */
  readonly repetitions: number;
  /** What went wrong in the browser (page errors, a failed driver); empty when nothing did. */
  readonly problems: readonly string[];
}
