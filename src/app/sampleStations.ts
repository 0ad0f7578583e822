import sampleCsv from '../../sample-maps/korvane/stations.csv?raw';
import { readCsv } from '../io/csvTable';
import { detectColumns } from '../io/columns';
import { readStations } from '../io/readStations';
import type { Station } from '../core/station';

/**
 * The embedded sample's stations, read through the same CSV path a user's file takes, so the
 * demo shows the importer's real behaviour, planted bad rows included.
 */
export function loadSampleStations(): Station[] {
  const table = readCsv(sampleCsv);
  const { mapping } = detectColumns(table.headers);
  return readStations(table, mapping);
}
