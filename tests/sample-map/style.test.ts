/**
 * style.json needs no network, and index.ts turns it into a complete style with inline data.
 * Layer GeoJSON is checked against RFC 7946 (WGS 84 lon/lat, outer rings counter-clockwise,
 * checked with turf.booleanClockwise).
 */
import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import * as turf from '@turf/turf';
import type { FeatureCollection, Position } from 'geojson';
import truth from '../../sample-maps/korvane/truth.json';
import { bounds, buildStyle, contacts, faults, geology, places, style, topo } from '../../sample-maps/korvane/index';

const dir = new URL('../../sample-maps/korvane/', import.meta.url);
const template = JSON.parse(readFileSync(new URL('style.json', dir), 'utf8'));

/** Every position in a geometry, however nested. */
function positions(value: unknown): Position[] {
  if (Array.isArray(value) && typeof value[0] === 'number') return [value as Position];
  return Array.isArray(value) ? value.flatMap(positions) : [];
}

describe('style.json and index.ts', () => {
  it('style.json is a version 8 style with no glyphs, sprite, tiles or text layers, whose sources name files beside it', () => {
    expect(template.version).toBe(8);
    expect(template.glyphs).toBeUndefined();
    expect(template.sprite).toBeUndefined();
    expect(template.metadata['foldlens:synthetic']).toBe(true);
    for (const layer of template.layers) {
      expect(['background', 'fill', 'line', 'circle']).toContain(layer.type);
      if (layer.type !== 'background') expect(template.sources[layer.source], layer.id).toBeDefined();
    }
    for (const [id, source] of Object.entries<{ type: string; data: string }>(template.sources)) {
      expect(source.type, id).toBe('geojson');
      expect(existsSync(new URL(source.data, dir)), source.data).toBe(true);
    }
    expect(JSON.stringify(template)).not.toMatch(/https?:/);
  });

  it('buildStyle() inlines the parsed GeoJSON files as source data and returns a new object each call', () => {
    const built = buildStyle();
    for (const [id, source] of Object.entries<{ data: string }>(template.sources)) {
      const file = JSON.parse(readFileSync(new URL(source.data, dir), 'utf8'));
      expect((built.sources[id] as { data: unknown }).data, id).toEqual(file);
    }
    expect(buildStyle()).not.toBe(built);
    expect(buildStyle()).toEqual(style);
    expect(built.layers).toEqual(template.layers);
  });

  it('the geology fill colours of style.json are the unit colours of truth.stratigraphy', () => {
    const fill = template.layers.find((l: { id: string }) => l.id === 'korvane-geology-fill');
    const match = fill.paint['fill-color'] as unknown[];
    for (const unit of truth.stratigraphy.units) expect(match[match.indexOf(unit.code) + 1], unit.code).toBe(unit.colour);
  });

  const layers: Record<string, FeatureCollection> = { geology, contacts, topo, faults, places };
  for (const [name, fc] of Object.entries(layers)) {
    it(`every position of ${name} lies inside bounds with at most 6 decimals, and the collection says it is synthetic`, () => {
      const extra = fc as unknown as { synthetic: boolean; description: string };
      expect(extra.synthetic).toBe(true);
      expect(extra.description).toMatch(/SYNTHETIC/);
      expect(fc.features.length).toBeGreaterThan(0);
      const eps = 1e-6;
      for (const f of fc.features) {
        for (const [lon, lat] of positions((f.geometry as { coordinates: unknown }).coordinates)) {
          expect(lon >= bounds[0] - eps && lon <= bounds[2] + eps && lat >= bounds[1] - eps && lat <= bounds[3] + eps, `${lon},${lat}`).toBe(true);
          expect(Math.abs(lon * 1e6 - Math.round(lon * 1e6))).toBeLessThan(1e-6);
          expect(Math.abs(lat * 1e6 - Math.round(lat * 1e6))).toBeLessThan(1e-6);
        }
      }
    });
  }

  it('turf.booleanClockwise is false for every outer ring of geology and true for every hole (RFC 7946 section 3.1.6)', () => {
    for (const f of geology.features) {
      if (f.geometry.type !== 'MultiPolygon') expect.fail('geology features are MultiPolygons');
      for (const polygon of f.geometry.coordinates) {
        polygon.forEach((ring, k) => expect(turf.booleanClockwise(ring), `${f.properties?.unit} ring ${k}`).toBe(k > 0));
      }
    }
  });

  it('the file sizes of the sample map add up to less than 3 MB', () => {
    const files = ['dem.tif', 'style.json', 'truth.json', 'stations.csv', 'stations.json', 'stations-quadrant.csv', 'README.md', ...Object.values<{ data: string }>(template.sources).map((s) => s.data)];
    const total = files.reduce((a, f) => a + readFileSync(new URL(f, dir)).byteLength, 0);
    expect(total).toBeLessThan(3 * 1024 * 1024);
  });
});
