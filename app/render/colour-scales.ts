/**
 * Colour scales for fields and differences, and the numbers a colour bar needs.
 * Sequential fields use viridis (perceptually uniform, lightness rising monotonically);
 * differences use a diverging map whose centre is pinned to zero by a symmetric range.
 */
import { DIVERGING_HEX, VIRIDIS_HEX } from './colour-tables.js';
import { packRgba } from './recolour.js';

export type ScaleKind = 'sequential' | 'diverging';

export interface ColourScale {
  kind: ScaleKind;
  name: string;
  /** 8-bit sRGB triplets, lowest value first */
  rgb: Uint8Array;
  /** packed RGBA for recolour() */
  packed: Uint32Array;
}

function fromHex(kind: ScaleKind, name: string, hex: string): ColourScale {
  const n = hex.length / 6;
  const rgb = new Uint8Array(n * 3);
  const packed = new Uint32Array(n);
  for (let k = 0; k < n; k++) {
    for (let c = 0; c < 3; c++) rgb[k * 3 + c] = parseInt(hex.slice(k * 6 + c * 2, k * 6 + c * 2 + 2), 16);
    packed[k] = packRgba(rgb[k * 3], rgb[k * 3 + 1], rgb[k * 3 + 2]);
  }
  return { kind, name, rgb, packed };
}

export const SEQUENTIAL: ColourScale = fromHex('sequential', 'viridis', VIRIDIS_HEX);
export const DIVERGING: ColourScale = fromHex('diverging', 'blue-white-red (ColorBrewer RdBu)', DIVERGING_HEX);

/** CSS colour of a scale entry. */
export function cssColour(scale: ColourScale, k: number): string {
  const r = scale.rgb[k * 3];
  const g = scale.rgb[k * 3 + 1];
  const b = scale.rgb[k * 3 + 2];
  return `rgb(${r},${g},${b})`;
}

/** CSS colour for a value on a scale spanning [min, max]; null for a missing value. */
export function colourFor(scale: ColourScale, v: number, min: number, max: number): string | null {
  if (!Number.isFinite(v)) return null;
  const n = scale.packed.length;
  const t = max > min ? (v - min) / (max - min) : 0.5;
  const k = Math.min(n - 1, Math.max(0, Math.floor(t * n)));
  return cssColour(scale, k);
}

/** CIE L* (0..100) of an 8-bit sRGB colour: sRGB decoding (IEC 61966-2-1), relative luminance Y, then CIE 1976 L*. */
export function lightness(r: number, g: number, b: number): number {
  const lin = (c: number): number => {
    const s = c / 255;
    return s <= 0.04045 ? s / 12.92 : Math.pow((s + 0.055) / 1.055, 2.4);
  };
  const y = 0.2126729 * lin(r) + 0.7151522 * lin(g) + 0.072175 * lin(b);
  const f = y > 216 / 24389 ? Math.cbrt(y) : (24389 / 27 * y + 16) / 116;
  return 116 * f - 16;
}

/**
 * The k-th smallest value of a[0..n) (0-based), rearranging `a` in place: selection in linear expected time
 * (Hoare's FIND with a median-of-three pivot), so that a robust range costs far less than a full sort.
 */
export function selectKth(a: Float64Array, n: number, k: number): number {
  let lo = 0;
  let hi = n - 1;
  while (hi > lo) {
    const mid = (lo + hi) >> 1;
    // median of three as the pivot
    let p = a[mid];
    const x = a[lo];
    const z = a[hi];
    if ((x <= p && p <= z) || (z <= p && p <= x)) {
      /* p is the median */
    } else if ((p <= x && x <= z) || (z <= x && x <= p)) p = x;
    else p = z;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < p) i++;
      while (a[j] > p) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k];
  }
  return a[k];
}

/** Value range of data arrays, ignoring NaN, between two quantiles (robust to a few extreme cells). */
export function quantileRange(values: ArrayLike<number>[], lowQ = 0.02, highQ = 0.98): [number, number] | null {
  let n = 0;
  let min = Infinity;
  let max = -Infinity;
  for (const a of values) {
    for (let i = 0; i < a.length; i++) {
      const v = a[i];
      if (v !== v) continue;
      n++;
      if (v < min) min = v;
      if (v > max) max = v;
    }
  }
  if (n === 0) return null;
  const kLo = Math.min(n - 1, Math.max(0, Math.round(lowQ * (n - 1))));
  const kHi = Math.min(n - 1, Math.max(0, Math.round(highQ * (n - 1))));
  let lo = orderStatistic(values, n, min, max, kLo);
  let hi = orderStatistic(values, n, min, max, kHi);
  if (!(hi > lo)) {
    lo = min;
    hi = max;
  }
  if (!(hi > lo)) {
    const d = Math.abs(lo) > 0 ? Math.abs(lo) * 0.01 : 1;
    return [lo - d, hi + d];
  }
  return [lo, hi];
}

/**
 * The k-th smallest of the non-NaN values: a histogram finds the bin that holds it, then selection among the
 * few values of that bin gives it exactly (the same number a full sort would).
 */
function orderStatistic(values: ArrayLike<number>[], n: number, min: number, max: number, k: number): number {
  if (n <= 65536 || !(max > min)) {
    const all = new Float64Array(n);
    let p = 0;
    for (const a of values) for (let i = 0; i < a.length; i++) if (a[i] === a[i]) all[p++] = a[i];
    return selectKth(all, n, k);
  }
  const bins = 4096;
  const scale = bins / (max - min);
  const count = new Uint32Array(bins);
  const binOf = (v: number): number => Math.min(bins - 1, Math.floor((v - min) * scale));
  for (const a of values) for (let i = 0; i < a.length; i++) if (a[i] === a[i]) count[binOf(a[i])]++;
  let b = 0;
  let below = 0;
  while (below + count[b] <= k) below += count[b++];
  const inBin = new Float64Array(count[b]);
  let p = 0;
  for (const a of values) {
    for (let i = 0; i < a.length; i++) {
      const v = a[i];
      if (v === v && binOf(v) === b) inBin[p++] = v;
    }
  }
  return selectKth(inBin, p, k - below);
}

/** Symmetric range about zero for a difference field: ±(the larger magnitude of its robust bounds). */
export function symmetricRange(values: ArrayLike<number>[], q = 0.98): [number, number] | null {
  const r = quantileRange(values, 1 - q, q);
  if (!r) return null;
  const m = Math.max(Math.abs(r[0]), Math.abs(r[1])) || 1;
  return [-m, m];
}

/** "Nice" tick values covering [min, max], about `count` of them (1, 2, 2.5, 5 × 10^k steps). */
export function niceTicks(min: number, max: number, count = 5): number[] {
  if (!(max > min)) return [min];
  const raw = (max - min) / Math.max(1, count);
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const first = Math.ceil(min / step - 1e-9) * step;
  const ticks: number[] = [];
  for (let v = first; v <= max + step * 1e-9; v += step) ticks.push(Math.abs(v) < step * 1e-9 ? 0 : Number(v.toPrecision(12)));
  return ticks;
}

/** Tick text: few digits, no trailing noise. */
export function formatTick(v: number, step: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e5 || a < 1e-3) return v.toExponential(1);
  // enough decimals to tell neighbouring ticks apart: 2.5 needs one, 0.25 two
  let decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  while (decimals < 6 && Math.abs(step * 10 ** decimals - Math.round(step * 10 ** decimals)) > 1e-6) decimals++;
  return v.toFixed(decimals);
}
