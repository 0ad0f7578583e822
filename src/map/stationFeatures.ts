import type { Feature, FeatureCollection, Point } from 'geojson';
import type { Station } from '../core/station';
import { isUsable } from '../core/station';
import { isLineKind } from '../core/types';
import { labelImageId, symbolFor } from './symbolCatalog';

/** Properties carried by each station feature on the map (short names keep tiles small). */
export interface StationFeatureProperties {
  /** The station id as given by the data. */
  readonly sid: string;
  readonly kind: string;
  /** 'plane' | 'line' */
  readonly family: string;
  /** Symbol image id. */
  readonly img: string;
  /** Clockwise rotation from north, degrees. */
  readonly rot: number;
  /** Label image id, or '' when the symbol has no label. */
  readonly lbl: string;
}

/**
 * Map features for the drawable stations. The feature id is the station's index in the input
 * array, so feature-state (selection, hover) can address it and events can map back to the station.
 * Stations without position or attitude are left out here; they stay in the data table and report.
 * @example stationFeatures([{id: 'A1', row: 1, kind: 'bedding', lon: 10, lat: 45, plane: {dipDirection: 90, dip: 30}, source: {}, problems: []}])
 */
export function stationFeatures(stations: readonly Station[]): FeatureCollection<Point, StationFeatureProperties> {
  const features: Array<Feature<Point, StationFeatureProperties>> = [];
  stations.forEach((s, index) => {
    if (!isUsable(s) || s.lon === undefined || s.lat === undefined) return;
    const symbol = symbolFor(s);
    if (!symbol) return;
    features.push({
      type: 'Feature',
      id: index,
      geometry: { type: 'Point', coordinates: [s.lon, s.lat] },
      properties: {
        sid: s.id,
        kind: s.kind ?? '',
        family: s.kind && isLineKind(s.kind) ? 'line' : 'plane',
        img: symbol.image,
        rot: symbol.rotation,
        lbl: symbol.label === '' ? '' : labelImageId(symbol.label),
      },
    });
  });
  return { type: 'FeatureCollection', features };
}
