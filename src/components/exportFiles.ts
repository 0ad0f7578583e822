/**
 * Browser-side export plumbing shared by the panels: an SVG drawn into a PNG, and a file
 * handed to the user as a download.
 */

/**
 * Draws standalone SVG text into a canvas at `scale` times its size and encodes it as PNG.
 * @example const png = await svgToPng(panel.toSvg(), 2);
 */
export async function svgToPng(svgText: string, scale = 2): Promise<Blob> {
  const url = URL.createObjectURL(new Blob([svgText], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    img.src = url;
    await img.decode();
    const canvas = document.createElement('canvas');
    canvas.width = Math.round(img.naturalWidth * scale);
    canvas.height = Math.round(img.naturalHeight * scale);
    const ctx = canvas.getContext('2d');
    if (!ctx) throw new Error('PNG export: this browser gave no 2D canvas');
    ctx.drawImage(img, 0, 0, canvas.width, canvas.height);
    return await new Promise<Blob>((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('PNG export: the canvas could not be encoded'))), 'image/png'));
  } finally {
    URL.revokeObjectURL(url);
  }
}

/**
 * Offers a blob to the user as a file download.
 * @example downloadBlob(new Blob(['a,b'], { type: 'text/csv' }), 'numbers.csv');
 */
export function downloadBlob(blob: Blob, fileName: string): void {
  const a = document.createElement('a');
  a.href = URL.createObjectURL(blob);
  a.download = fileName;
  a.click();
  setTimeout(() => URL.revokeObjectURL(a.href), 1000);
}
