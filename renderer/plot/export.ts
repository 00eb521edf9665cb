/**
 * Figures leave the workbench as SVG (vector, fonts as text) or PNG at print resolution:
 * 180 mm wide at 300 dpi (2126 pixels), with the resolution written into the PNG (pHYs chunk).
 */
import { saveBlob } from '../elements.js';
import { crc32 } from '../../app/figures/png.js';

export const EXPORT_MM = 180;
export const EXPORT_DPI = 300;

/** Standalone SVG text of a figure, sized in millimetres for print. */
export function svgText(svg: SVGSVGElement, widthMm = EXPORT_MM): string {
  const copy = svg.cloneNode(true) as SVGSVGElement;
  const vb = (copy.getAttribute('viewBox') ?? '0 0 100 100').split(/\s+/).map(Number);
  const hMm = (widthMm * vb[3]) / vb[2];
  copy.setAttribute('width', `${widthMm}mm`);
  copy.setAttribute('height', `${hMm.toFixed(2)}mm`);
  copy.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
  copy.setAttribute('xmlns:xlink', 'http://www.w3.org/1999/xlink');
  copy.removeAttribute('class');
  return '<?xml version="1.0" encoding="UTF-8"?>\n' + new XMLSerializer().serializeToString(copy);
}

export function saveSvg(svg: SVGSVGElement, fileBase: string): void {
  saveBlob(new Blob([svgText(svg)], { type: 'image/svg+xml' }), `${fileBase}.svg`);
}

/** Rasterise a figure at publication size. */
export async function pngBlob(svg: SVGSVGElement, widthMm = EXPORT_MM, dpi = EXPORT_DPI): Promise<Blob> {
  const text = svgText(svg, widthMm);
  const vb = (svg.getAttribute('viewBox') ?? '0 0 100 100').split(/\s+/).map(Number);
  const wPx = Math.round((widthMm / 25.4) * dpi);
  const hPx = Math.round((wPx * vb[3]) / vb[2]);
  const url = URL.createObjectURL(new Blob([text], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    img.width = wPx;
    img.height = hPx;
    await new Promise<void>((resolve, reject) => {
      img.onload = () => resolve();
      img.onerror = () => reject(new Error('The figure could not be rasterised.'));
      img.src = url;
    });
    const canvas = document.createElement('canvas');
    canvas.width = wPx;
    canvas.height = hPx;
    const ctx = canvas.getContext('2d');
    if (!ctx) throw new Error('No 2-D canvas is available for the PNG export.');
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, wPx, hPx);
    ctx.drawImage(img, 0, 0, wPx, hPx);
    const blob = await new Promise<Blob>((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('PNG encoding failed.'))), 'image/png'));
    return new Blob([withResolution(new Uint8Array(await blob.arrayBuffer()), dpi)], { type: 'image/png' });
  } finally {
    URL.revokeObjectURL(url);
  }
}

export async function savePng(svg: SVGSVGElement, fileBase: string): Promise<void> {
  saveBlob(await pngBlob(svg), `${fileBase}.png`);
}

/** Insert a pHYs chunk (pixels per metre) right after IHDR, so that the PNG says its print resolution. */
export function withResolution(png: Uint8Array, dpi: number): Uint8Array<ArrayBuffer> {
  const ihdrEnd = 8 + 4 + 4 + 13 + 4;
  const ppm = Math.round(dpi / 0.0254);
  const chunk = new Uint8Array(4 + 4 + 9 + 4);
  const dv = new DataView(chunk.buffer);
  dv.setUint32(0, 9);
  chunk.set([0x70, 0x48, 0x59, 0x73], 4); // "pHYs"
  dv.setUint32(8, ppm);
  dv.setUint32(12, ppm);
  chunk[16] = 1; // unit: metre
  dv.setUint32(17, crc32(chunk.subarray(4, 17)));
  const out = new Uint8Array(png.length + chunk.length);
  out.set(png.subarray(0, ihdrEnd), 0);
  out.set(chunk, ihdrEnd);
  out.set(png.subarray(ihdrEnd), ihdrEnd + chunk.length);
  return out;
}
