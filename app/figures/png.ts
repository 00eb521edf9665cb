/**
 * A small PNG encoder (ISO/IEC 15948): 8-bit RGBA, one IDAT, filter "sub" on every row (cheap and good on
 * the flat colour runs of a map raster), zlib from fflate (pure JavaScript, the same in Node and the screen),
 * and a pHYs chunk with the print resolution when one is given.
 */
import { zlibSync } from 'fflate';

/** zlib (RFC 1950) compression of a PNG's filtered rows. */
export type ZlibDeflate = (data: Uint8Array) => Uint8Array;

let deflate: ZlibDeflate = (data) => zlibSync(data, { level: 6 });

/**
 * Use another zlib compressor, e.g. Node's native one on the command line (about 3.5× faster than fflate on a
 * map raster); the screen keeps fflate. The bytes differ, the pixels do not.
 */
export function useDeflate(fn: ZlibDeflate): void {
  deflate = fn;
}

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

/** CRC-32 as the PNG specification (ISO/IEC 15948, annex D) defines it. */
export function crc32(bytes: Uint8Array, start = 0, end = bytes.length): number {
  let c = 0xffffffff;
  for (let i = start; i < end; i++) c = CRC_TABLE[(c ^ bytes[i]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Uint8Array): Uint8Array {
  const out = new Uint8Array(12 + data.length);
  const dv = new DataView(out.buffer);
  dv.setUint32(0, data.length);
  for (let i = 0; i < 4; i++) out[4 + i] = type.charCodeAt(i);
  out.set(data, 8);
  dv.setUint32(8 + data.length, crc32(out, 4, 8 + data.length));
  return out;
}

/** pHYs data: pixels per metre on both axes, unit metre. */
export function physData(dpi: number): Uint8Array {
  const d = new Uint8Array(9);
  const dv = new DataView(d.buffer);
  const ppm = Math.round(dpi / 0.0254);
  dv.setUint32(0, ppm);
  dv.setUint32(4, ppm);
  d[8] = 1;
  return d;
}

/**
 * PNG bytes of `rgba` (width × height pixels, 4 bytes each, row 0 at the top). `dpi` adds a pHYs chunk.
 * Packed pixels from recolour() (0xAABBGGRR, little-endian) are these bytes when seen as a Uint8Array.
 */
export function encodePng(rgba: Uint8Array, width: number, height: number, dpi?: number): Uint8Array {
  if (!(width > 0 && height > 0) || rgba.length !== width * height * 4) throw new RangeError(`PNG of ${width} × ${height} pixels needs ${width * height * 4} bytes, not ${rgba.length}`);
  const stride = width * 4;
  const raw = new Uint8Array((stride + 1) * height);
  for (let y = 0; y < height; y++) {
    const o = y * (stride + 1);
    const src = y * stride;
    raw[o] = 1; // filter type 1: sub
    for (let i = 0; i < 4 && i < stride; i++) raw[o + 1 + i] = rgba[src + i];
    for (let i = 4; i < stride; i++) raw[o + 1 + i] = (rgba[src + i] - rgba[src + i - 4]) & 0xff;
  }
  const ihdr = new Uint8Array(13);
  const dv = new DataView(ihdr.buffer);
  dv.setUint32(0, width);
  dv.setUint32(4, height);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 6; // colour type: truecolour with alpha
  const parts = [new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr)];
  if (dpi !== undefined) parts.push(chunk('pHYs', physData(dpi)));
  parts.push(chunk('IDAT', deflate(raw)), chunk('IEND', new Uint8Array(0)));
  const total = parts.reduce((n, p) => n + p.length, 0);
  const out = new Uint8Array(total);
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

/** Insert a pHYs chunk right after IHDR of an existing PNG (one without pHYs), so that it says its print resolution. */
export function withResolution(png: Uint8Array, dpi: number): Uint8Array {
  const ihdrEnd = 8 + 12 + 13;
  const phys = chunk('pHYs', physData(dpi));
  const out = new Uint8Array(png.length + phys.length);
  out.set(png.subarray(0, ihdrEnd), 0);
  out.set(phys, ihdrEnd);
  out.set(png.subarray(ihdrEnd), ihdrEnd + phys.length);
  return out;
}

const B64 = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';

/** Base64 (RFC 4648) without Buffer or btoa, so the core needs neither Node nor a browser. */
export function base64(bytes: Uint8Array): string {
  const parts: string[] = [];
  let chunkStr = '';
  for (let i = 0; i < bytes.length; i += 3) {
    const a = bytes[i];
    const b = i + 1 < bytes.length ? bytes[i + 1] : 0;
    const c = i + 2 < bytes.length ? bytes[i + 2] : 0;
    const n = (a << 16) | (b << 8) | c;
    chunkStr += B64[(n >> 18) & 63] + B64[(n >> 12) & 63] + (i + 1 < bytes.length ? B64[(n >> 6) & 63] : '=') + (i + 2 < bytes.length ? B64[n & 63] : '=');
    if (chunkStr.length >= 8192) {
      parts.push(chunkStr);
      chunkStr = '';
    }
  }
  parts.push(chunkStr);
  return parts.join('');
}

export function pngDataUrl(png: Uint8Array): string {
  return `data:image/png;base64,${base64(png)}`;
}
