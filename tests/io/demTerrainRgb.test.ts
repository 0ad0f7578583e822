import { describe, expect, it } from 'vitest';
import proj4 from 'proj4';
import { sampleDem } from '../../src/io/demSampler';
import { decodeTerrainRgb, demFromTerrainTile, terrainRgbFactors, WEB_MERCATOR_HALF_WORLD } from '../../src/io/terrainRgb';
import { expectClose } from '../helpers/tolerance';

const px = (...rgba: number[]): Uint8Array => new Uint8Array(rgba);

describe('decodeTerrainRgb(rgba, encoding)', () => {
  const rows = [
    // Mapbox Terrain-RGB v1 reference: h = -10000 + (R·65536 + G·256 + B)·0.1 (derived values).
    { rgba: [1, 134, 160, 255], encoding: 'mapbox' as const, expected: 0, note: '0x0186A0 = 100000 -> sea level' },
    { rgba: [0, 0, 0, 255], encoding: 'mapbox' as const, expected: -10000, note: 'lowest code' },
    { rgba: [1, 146, 212, 255], encoding: 'mapbox' as const, expected: 312.4, note: '(65536 + 37376 + 212)·0.1 - 10000' },
    { rgba: [255, 255, 255, 255], encoding: 'mapbox' as const, expected: 1667721.5, note: '16777215·0.1 - 10000' },
    // Tilezen joerd "terrarium": h = (R·256 + G + B/256) - 32768 (derived values).
    { rgba: [128, 0, 0, 255], encoding: 'terrarium' as const, expected: 0, note: '128·256 = 32768 -> sea level' },
    { rgba: [131, 52, 128, 255], encoding: 'terrarium' as const, expected: 820.5, note: '33536 + 52 + 0.5 - 32768' },
    { rgba: [255, 255, 255, 255], encoding: 'terrarium' as const, expected: 32767.99609375, note: 'highest code' },
    { rgba: [0, 0, 0, 255], encoding: 'terrarium' as const, expected: -32768, note: 'lowest code' },
  ];
  for (const row of rows) {
    it(`decodeTerrainRgb(${row.rgba.slice(0, 3).join(', ')}, ${row.encoding}) is ${row.expected} m (${row.note})`, () => {
      expectClose(decodeTerrainRgb(px(...row.rgba), row.encoding)[0], row.expected, 1e-6, 'height');
    });
  }

  it('decodeTerrainRgb uses the factors MapLibre GL JS unpacks with (maplibre-gl 6 DEMData) and the style spec formula for custom encodings', () => {
    expect(terrainRgbFactors('terrarium')).toEqual({ redFactor: 256, greenFactor: 1, blueFactor: 1 / 256, baseShift: 32768 });
    const m = terrainRgbFactors('mapbox');
    expectClose(m.redFactor, 6553.6, 1e-9, 'red');
    expectClose(m.greenFactor, 25.6, 1e-12, 'green');
    expect([m.blueFactor, m.baseShift]).toEqual([0.1, 10000]);
    // Custom: R·redFactor + G·greenFactor + B·blueFactor - baseShift (MapLibre style specification, raster-dem).
    const custom = { redFactor: 2, greenFactor: 3, blueFactor: 5, baseShift: 100 };
    expect(decodeTerrainRgb(px(10, 20, 30, 255), custom)[0]).toBe(2 * 10 + 3 * 20 + 5 * 30 - 100);
  });

  it('decodeTerrainRgb gives NaN for a transparent pixel (no data), never a height', () => {
    const h = decodeTerrainRgb(px(1, 134, 160, 0, 1, 134, 160, 255), 'mapbox');
    expect(Number.isNaN(h[0])).toBe(true);
    expect(h[1]).toBe(0);
  });

  it('decodeTerrainRgb rejects a byte count that is not whole pixels and an unknown encoding', () => {
    expect(() => decodeTerrainRgb(new Uint8Array(6), 'mapbox')).toThrow(/6 bytes is not a whole number of RGBA pixels/);
    expect(() => decodeTerrainRgb(new Uint8Array(4), 'srtm' as never)).toThrow(/expected "mapbox", "terrarium" or custom factors/);
    expect(() => terrainRgbFactors({ redFactor: 1, greenFactor: Number.NaN, blueFactor: 1, baseShift: 0 })).toThrow(/greenFactor NaN/);
  });
});

describe('demFromTerrainTile(rgba, width, height, tile, encoding)', () => {
  it('demFromTerrainTile places tile cells in EPSG:3857 metres: proj4 puts lon 90°E at the centre of the eastern cells of tile 0/0/0', () => {
    // Tile 0/0/0 as 2 x 2 pixels: heights 100 (NW), 200 (NE), 300 (SW), 400 (SE) in terrarium.
    const enc = (h: number): number[] => [Math.floor((h + 32768) / 256), (h + 32768) % 256, 0, 255];
    const rgba = new Uint8Array([...enc(100), ...enc(200), ...enc(300), ...enc(400)]);
    const dem = demFromTerrainTile(rgba, 2, 2, { z: 0, x: 0, y: 0 }, 'terrarium');
    expect(dem.epsg).toBe(3857);
    // EPSG:3857 half-width π·6378137 m (common practice); proj4 is the outside reference for it.
    const [east] = proj4('EPSG:4326', 'EPSG:3857', [180, 0]);
    expectClose(WEB_MERCATOR_HALF_WORLD, east, 1e-6, 'half world');
    // The NE cell's centre is at (half/2, half/2): lon 90°E and the latitude proj4 gives back for y = half/2.
    const [, lat] = proj4('EPSG:3857', 'EPSG:4326', [0, WEB_MERCATOR_HALF_WORLD / 2]);
    const [x, y] = proj4('EPSG:4326', 'EPSG:3857', [90, lat]);
    expect(sampleDem(dem, x, y)).toBeCloseTo(200, 9);
    expect(sampleDem(dem, -x, -y)).toBeCloseTo(300, 9);
    // The centre of the world is the middle of the four cells.
    expect(sampleDem(dem, 0, 0)).toBeCloseTo(250, 9);
  });

  it('demFromTerrainTile rejects a tile address outside its zoom level and a wrong byte count', () => {
    expect(() => demFromTerrainTile(new Uint8Array(16), 2, 2, { z: 1, x: 2, y: 0 }, 'mapbox')).toThrow(/from 0 to 1 at zoom 1/);
    expect(() => demFromTerrainTile(new Uint8Array(12), 2, 2, { z: 1, x: 0, y: 0 }, 'mapbox')).toThrow(/12 bytes for 2 x 2 RGBA pixels; expected 16/);
  });
});
