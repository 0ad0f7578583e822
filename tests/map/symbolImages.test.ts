import { describe, expect, it } from 'vitest';
import { imageFor, mapImageBox, mapImageFor, mapImageOffset } from '../../src/map/symbolImages';
import { allSymbolImageIds, parseImageId } from '../../src/map/symbolCatalog';
import { shapeBounds, rasterizeBox } from '../../src/map/raster';
import { imageRects } from '../../src/map/symbolGlLayer';

const symbolIds = allSymbolImageIds();
const ids = [...symbolIds, 'fl-num/7', 'fl-num/45', 'fl-num/90'];

describe('map images cropped to what they paint', () => {
  it('allSymbolImageIds() lists every kind and variant once, each an id the catalog parses', () => {
    const all = allSymbolImageIds();
    expect(new Set(all).size).toBe(all.length);
    // 9 planar kinds x 4 variants, 5 linear kinds x 3 variants, hinges x 3 variants x 3 senses (common practice: the catalog's own counts).
    expect(all.length).toBe(9 * 4 + 5 * 3 + 3 * 3);
    for (const id of all) expect(parseImageId(id), id).not.toBeNull();
  });

  for (const ratio of [1, 2]) {
    // Symbols: the 44 px square and the box share their pixel grid, so the crop is exact. (Labels
    // are squares of fractional size, sampled on another grid; the next test covers them.)
    it(`mapImageFor(id, ${ratio}) is imageFor(id, ${ratio}) cropped to mapImageBox(id), and loses no painted pixel`, () => {
      for (const id of symbolIds) {
        const square = imageFor(id, ratio)!;
        const cropped = mapImageFor(id, ratio)!;
        const box = mapImageBox(id)!;
        const half = square.width / ratio / 2; // the square is centred on the station
        const x0 = (box.left + half) * ratio;
        const y0 = (half - box.top) * ratio;
        expect(cropped.width, id).toBe((box.right - box.left) * ratio);
        expect(cropped.height, id).toBe((box.top - box.bottom) * ratio);
        let inside = 0;
        for (let row = 0; row < cropped.height; row++) {
          for (let col = 0; col < cropped.width; col++) {
            const c = (row * cropped.width + col) * 4;
            const s = ((row + y0) * square.width + col + x0) * 4;
            for (let k = 0; k < 4; k++) if (cropped.data[c + k] !== square.data[s + k]) expect.fail(`${id}: pixel ${col},${row} differs from the square image`);
            inside += cropped.data[c + 3];
          }
        }
        let total = 0;
        for (let i = 3; i < square.data.length; i += 4) total += square.data[i];
        expect(inside, `${id}: painted alpha outside the box`).toBe(total);
      }
    });
  }

  it('mapImageFor(label id) paints as much as the square label image (within 2 %)', () => {
    for (const id of ['fl-num/7', 'fl-num/45', 'fl-num/90']) {
      const alpha = (img: { data: Uint8ClampedArray }) => img.data.filter((_, i) => i % 4 === 3).reduce((a, v) => a + v, 0);
      const a = alpha(mapImageFor(id, 2)!);
      const b = alpha(imageFor(id, 2)!);
      expect(Math.abs(a - b) / b, id).toBeLessThan(0.02);
    }
  });

  it('mapImageOffset(id) is the centre of the box, x right and y down, so icon-offset puts the station back at the pivot', () => {
    expect(mapImageOffset('fl-sym/bedding/inclined')).toEqual([0, -3.5]);
    for (const id of ids) {
      const b = mapImageBox(id)!;
      expect(mapImageOffset(id)).toEqual([(b.left + b.right) / 2 + 0, -(b.bottom + b.top) / 2 + 0]);
    }
    expect(mapImageOffset('not-ours')).toEqual([0, 0]);
    expect(mapImageBox('not-ours')).toBeNull();
  });

  it('the dip mark of an inclined bedding symbol lies on the box side the station looks at (north, up), the strike line through the station', () => {
    const box = mapImageBox('fl-sym/bedding/inclined')!;
    // Strike line ±13 px (width 2.2), dip mark 7 px up, halo 1.5 px, half a pixel of smoothing.
    expect(box).toEqual({ left: -17, bottom: -4, right: 17, top: 11 });
  });

  it('shapeBounds grows each shape by its width, the halo and half a pixel, to whole pixels (analytic: a disc of radius 4)', () => {
    expect(shapeBounds([{ type: 'disc', center: [0, 0], radius: 4, color: [0, 0, 0] }], 1)).toEqual({ left: -6, bottom: -6, right: 6, top: 6 });
    expect(shapeBounds([{ type: 'segment', a: [-3, 1], b: [5, 1], width: 2, color: [0, 0, 0] }], 0)).toEqual({ left: -5, bottom: -1, right: 7, top: 3 });
    const img = rasterizeBox([{ type: 'disc', center: [0, 0], radius: 4, color: [0, 0, 0] }], { left: -6, bottom: -6, right: 6, top: 6 }, 4, 0);
    let area = 0;
    for (let i = 3; i < img.data.length; i += 4) area += img.data[i] / 255 / 16;
    expect(Math.abs(area - Math.PI * 16) / (Math.PI * 16)).toBeLessThan(0.01); // pi r^2
  });
});

describe('imageRects', () => {
  it('imageRects(image, box) covers every painted pixel exactly once, in rectangles of whole rows', () => {
    for (const ratio of [1, 2, 3]) {
      for (const id of ids) {
        const image = mapImageFor(id, ratio)!;
        const rects = imageRects(image, mapImageBox(id)!);
        const cover = new Uint8Array(image.width * image.height);
        for (const r of rects) for (let row = r.row0; row < r.row1; row++) for (let col = r.col0; col < r.col1; col++) cover[row * image.width + col]++;
        for (let p = 0; p < cover.length; p++) {
          if (cover[p] > 1) expect.fail(`${id} at ${ratio}: pixel ${p} in two rectangles`);
          if (image.data[p * 4 + 3] > 0 && cover[p] === 0) expect.fail(`${id} at ${ratio}: painted pixel ${p} in no rectangle`);
        }
      }
    }
  });

  it('imageRects splits an inclined bedding symbol into its strike line and its dip mark, less than half its box', () => {
    const id = 'fl-sym/bedding/inclined';
    const box = mapImageBox(id)!;
    const rects = imageRects(mapImageFor(id, 1)!, box);
    expect(rects.length).toBe(2);
    const area = rects.reduce((a, r) => a + (r.right - r.left) * (r.top - r.bottom), 0);
    expect(area / ((box.right - box.left) * (box.top - box.bottom))).toBeLessThan(0.5);
    // CSS px corners follow the texel rows and columns.
    for (const r of rects) expect(r.left).toBe(box.left + r.col0);
  });
});
