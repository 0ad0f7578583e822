import type { RasterImage } from '../map/raster';

const cache = new Map<string, string>();

/** A data: URL of a rasterised symbol, for showing map symbols in HTML (legend, inspector). */
export function rasterImageUrl(key: string, image: RasterImage): string {
  const hit = cache.get(key);
  if (hit) return hit;
  const canvas = document.createElement('canvas');
  canvas.width = image.width;
  canvas.height = image.height;
  const ctx = canvas.getContext('2d');
  if (!ctx) return '';
  ctx.putImageData(new ImageData(new Uint8ClampedArray(image.data), image.width, image.height), 0, 0);
  const url = canvas.toDataURL('image/png');
  cache.set(key, url);
  return url;
}
