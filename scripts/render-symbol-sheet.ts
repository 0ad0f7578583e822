/** Writes docs/symbols.png: every Foldlens symbol on a light background, for review by eye. */
import { writeFileSync } from 'node:fs';
import { PLANE_KINDS, LINE_KINDS } from '../src/core/types';
import { imageFor } from '../src/map/symbolImages';
import { planeImageId, lineImageId } from '../src/map/symbolCatalog';
import { encodePng } from './png';

const ratio = 2;
const cell = 44 * ratio;
const rows: string[][] = [
  ...PLANE_KINDS.map((k) => (['inclined', 'horizontal', 'vertical', 'overturned'] as const).map((v) => planeImageId(k, v))),
  ...LINE_KINDS.map((k) => (['plunging', 'horizontal', 'vertical'] as const).map((v) => lineImageId(k, v))),
  [lineImageId('hinge', 'plunging', 'antiform'), lineImageId('hinge', 'plunging', 'synform'), 'fl-num/45', 'fl-num/7', 'fl-num/90'],
];
const cols = Math.max(...rows.map((r) => r.length));
const W = cols * cell;
const H = rows.length * cell;
const out = new Uint8ClampedArray(W * H * 4);
for (let i = 0; i < out.length; i += 4) out.set([232, 228, 218, 255], i);
rows.forEach((row, r) => row.forEach((id, c) => {
  const img = imageFor(id, ratio)!;
  const ox = c * cell + (cell - img.width) / 2;
  const oy = r * cell + (cell - img.height) / 2;
  for (let y = 0; y < img.height; y++) for (let x = 0; x < img.width; x++) {
    const s = (y * img.width + x) * 4;
    const d = ((Math.floor(oy) + y) * W + Math.floor(ox) + x) * 4;
    const a = img.data[s + 3] / 255;
    for (let k = 0; k < 3; k++) out[d + k] = img.data[s + k] * a + out[d + k] * (1 - a);
  }
}));
writeFileSync(process.argv[2] ?? 'docs/symbols.png', encodePng(W, H, out));
