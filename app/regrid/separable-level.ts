import type { AxisOverlap, SeparableWeights } from './conservative-rectilinear.js';
import { WASM_BASE64 } from './kernels/separable-wasm.js';
import type { LevelEngine, LevelRule } from './remap-level.js';

/** The exports of app/regrid/kernels/separable.as.ts (every P argument is a byte offset into its memory). */
interface SeparableKernel {
  accumulate(levP: number, count: number, h: number, ndP: number, first: number): number;
  remapSeparable(
    tny: number,
    tnx: number,
    snx: number,
    latStartP: number,
    latSrcP: number,
    latLenP: number,
    slots: number,
    lonIdxP: number,
    lonWP: number,
    ndP: number,
    rowP: number,
    abP: number,
    invRowRefP: number,
    invRef: number,
    floor: number,
    normalise: number,
    valP: number,
    covP: number,
  ): void;
}

let compiled: WebAssembly.Module | null = null;
function kernelModule(): WebAssembly.Module {
  compiled ??= new WebAssembly.Module(Buffer.from(WASM_BASE64, 'base64'));
  return compiled;
}

/**
 * Per-level conservative remapping between two lat-lon grids with the weights kept as their two
 * factors, run in WebAssembly: one memory per regridded field holds the factors, the sums of the
 * source column (n, d), one row buffer and the level being finished. About twice as fast as
 * the full sparse matrix in JavaScript, and equal to it to rounding (products are grouped per axis).
 */
export class SeparableLevel implements LevelEngine {
  private readonly k: SeparableKernel;
  private readonly mem: WebAssembly.Memory;
  private readonly p: Record<'lonIdx' | 'lonW' | 'latStart' | 'latSrc' | 'latLen' | 'invRowRef' | 'level' | 'nd' | 'row' | 'ab' | 'val' | 'cov', number>;
  private readonly slots: number;
  private readonly nSrc: number;
  private readonly nTgt: number;

  constructor(
    private readonly w: SeparableWeights,
    invRowRef: Float64Array,
  ) {
    const lon = ellpack(w.lon, w.tgtNx);
    this.slots = lon.slots;
    this.nSrc = w.srcNx * w.srcNy;
    this.nTgt = w.tgtNx * w.tgtNy;
    const sizes = {
      lonIdx: lon.idx.byteLength,
      lonW: lon.w.byteLength,
      latStart: w.lat.start.byteLength,
      latSrc: w.lat.src.byteLength,
      latLen: w.lat.len.byteLength,
      invRowRef: 8 * this.nTgt,
      level: 4 * this.nSrc,
      nd: 16 * this.nSrc,
      row: 16 * w.srcNx,
      ab: 16 * w.tgtNx,
      val: 4 * this.nTgt,
      cov: 4 * this.nTgt,
    };
    let top = 0;
    const p = {} as Record<keyof typeof sizes, number>;
    for (const [name, bytes] of Object.entries(sizes) as [keyof typeof sizes, number][]) {
      p[name] = top;
      top += Math.ceil(bytes / 16) * 16; // 16-byte aligned, for the two-lane loads
    }
    this.p = p;
    this.mem = new WebAssembly.Memory({ initial: Math.max(1, Math.ceil(top / 65536)) });
    this.k = new WebAssembly.Instance(kernelModule(), { env: { memory: this.mem } }).exports as unknown as SeparableKernel;
    const buf = this.mem.buffer;
    new Int32Array(buf, p.lonIdx, lon.idx.length).set(lon.idx);
    new Float64Array(buf, p.lonW, lon.w.length).set(lon.w);
    new Int32Array(buf, p.latStart, w.lat.start.length).set(w.lat.start);
    new Int32Array(buf, p.latSrc, w.lat.src.length).set(w.lat.src);
    new Float64Array(buf, p.latLen, w.lat.len.length).set(w.lat.len);
    new Float64Array(buf, p.invRowRef, this.nTgt).set(invRowRef);
  }

  get workBytes(): number {
    return this.mem.buffer.byteLength;
  }

  accumulate(level: Float32Array, h: number, first: boolean): number {
    new Float32Array(this.mem.buffer, this.p.level, this.nSrc).set(level);
    return this.k.accumulate(this.p.level, this.nSrc, h, this.p.nd, first ? 1 : 0);
  }

  clear(): void {
    new Float64Array(this.mem.buffer, this.p.nd, 2 * this.nSrc).fill(0);
  }

  finish(ref: number, rule: LevelRule, values: Float32Array, coverage: Float32Array): void {
    const { k, p, w } = this;
    const invRef = ref > 0 ? 1 / ref : 0;
    k.remapSeparable(w.tgtNy, w.tgtNx, w.srcNx, p.latStart, p.latSrc, p.latLen, this.slots, p.lonIdx, p.lonW, p.nd, p.row, p.ab, p.invRowRef, invRef, rule.threshold - 1e-12, rule.normalise ? 1 : 0, p.val, p.cov);
    values.set(new Float32Array(this.mem.buffer, p.val, this.nTgt));
    coverage.set(new Float32Array(this.mem.buffer, p.cov, this.nTgt));
  }
}

/**
 * A per-target-column list (CSR) as `slots` rows of one entry per column, padded with weight 0 on the
 * column's first source (n and d are finite, so a padded entry adds exactly 0).
 */
export function ellpack(f: AxisOverlap, nt: number): { slots: number; idx: Int32Array; w: Float64Array } {
  let slots = 1;
  for (let t = 0; t < nt; t++) slots = Math.max(slots, f.start[t + 1] - f.start[t]);
  const idx = new Int32Array(slots * nt), w = new Float64Array(slots * nt);
  for (let t = 0; t < nt; t++) {
    const p0 = f.start[t], count = f.start[t + 1] - p0;
    for (let s = 0; s < slots; s++) {
      idx[s * nt + t] = count > 0 ? f.src[p0 + Math.min(s, count - 1)] : 0;
      w[s * nt + t] = s < count ? f.len[p0 + s] : 0;
    }
  }
  return { slots, idx, w };
}
