import type { Page } from 'playwright-core';

/** An RGBA image: `data` holds 4 bytes a pixel, row by row from the top. */
export interface Pixels {
  readonly width: number;
  readonly height: number;
  readonly data: Uint8Array;
}

/**
 * Decodes a PNG screenshot with the page's own canvas (no image library needed in Node) and
 * hands the pixels back to the test.
 */
export async function pngPixels(page: Page, png: Buffer): Promise<Pixels> {
  const { width, height, base64 } = await page.evaluate(async (source) => {
    const img = new Image();
    img.src = `data:image/png;base64,${source}`;
    await img.decode();
    const canvas = document.createElement('canvas');
    canvas.width = img.naturalWidth;
    canvas.height = img.naturalHeight;
    const ctx = canvas.getContext('2d')!;
    ctx.drawImage(img, 0, 0);
    const d = ctx.getImageData(0, 0, canvas.width, canvas.height).data;
    let text = '';
    for (let i = 0; i < d.length; i += 0x8000) text += String.fromCharCode(...d.subarray(i, i + 0x8000));
    return { width: canvas.width, height: canvas.height, base64: btoa(text) };
  }, png.toString('base64'));
  return { width, height, data: new Uint8Array(Buffer.from(base64, 'base64')) };
}

/** Brightness (0-255) of the pixel whose red byte is at `i`. */
export const brightnessAt = (d: Uint8Array, i: number): number => 0.3 * d[i] + 0.59 * d[i + 1] + 0.11 * d[i + 2];
