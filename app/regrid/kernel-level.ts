import { WASM_BASE64 } from './kernels/remap-wasm.js';
import type { LevelEngine, LevelRule, SourceLayer } from './remap-level.js';

/** The exports of app/regrid/kernels/remap.as.ts (every P argument is a byte offset into its memory). */
export interface RemapKernel {
  accumulate(levP: number, count: number, h: number, ndP: number, first: number): number;
  remapSparse(nRows: number, rowPtrP: number, colP: number, wP: number, ndP: number, invRowRefP: number, invRef: number, floor: number, normalise: number, valP: number, covP: number): void;
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

type Common = 'invRowRef' | 'level' | 'nd' | 'val' | 'cov';

/**
 * A level engine run in WebAssembly: one memory, laid out here once (the kernels never allocate),
 * holding the weights, 1 / the full weight of each target cell, the source level being added, the pairs
 * (Σ h·v, Σ h) per source cell, and the values and coverage being finished. Each `remap` uses the
 * buffers from start to end synchronously, so one engine may serve every field that shares the weights.
 * Subclasses add their weights' regions and call a remapping kernel in `apply`.
 */
export abstract class KernelLevel<R extends string> implements LevelEngine {
  protected readonly k: RemapKernel;
  protected readonly p: Record<R | Common, number>;
  private readonly mem: WebAssembly.Memory;

  constructor(
    protected readonly nSrc: number,
    protected readonly nTgt: number,
    invRowRef: Float64Array,
    regions: Record<R, Int32Array | Float64Array | number>,
  ) {
    const all = { ...regions, invRowRef, level: 4 * nSrc, nd: 16 * nSrc, val: 4 * nTgt, cov: 4 * nTgt } as Record<R | Common, Int32Array | Float64Array | number>;
    let top = 0;
    const p = {} as Record<R | Common, number>;
    for (const [name, what] of Object.entries(all) as [R | Common, Int32Array | Float64Array | number][]) {
      p[name] = top;
      top += Math.ceil((typeof what === 'number' ? what : what.byteLength) / 16) * 16; // 16-byte aligned, for the two-lane loads
    }
    this.p = p;
    // never grown: a maximum as large as the start keeps V8 from reserving 4 GiB of address space for it
    // when the trap handler is off (as under `ulimit -v`)
    const pages = Math.max(1, Math.ceil(top / 65536));
    this.mem = new WebAssembly.Memory({ initial: pages, maximum: pages });
    this.k = new WebAssembly.Instance(kernelModule(), { env: { memory: this.mem } }).exports as unknown as RemapKernel;
    for (const [name, what] of Object.entries(all) as [R | Common, Int32Array | Float64Array | number][]) {
      if (typeof what === 'number') continue;
      const view = what instanceof Int32Array ? new Int32Array(this.mem.buffer, p[name], what.length) : new Float64Array(this.mem.buffer, p[name], what.length);
      view.set(what);
    }
  }

  /** A region of the memory as an array (the memory never grows, so the view stays valid). */
  protected region<T extends Int32Array | Float64Array>(name: R, like: T): T {
    const C = like.constructor as new (b: ArrayBuffer, o: number, n: number) => T;
    return new C(this.mem.buffer, this.p[name], like.length);
  }

  get workBytes(): number {
    return this.mem.buffer.byteLength;
  }

  remap(layers: SourceLayer[], ref: number, rule: LevelRule, values: Float32Array, coverage: Float32Array): number[] {
    const { k, p } = this;
    if (layers.length === 0) new Float64Array(this.mem.buffer, p.nd, 2 * this.nSrc).fill(0);
    const valid = layers.map(({ level, h }, i) => {
      new Float32Array(this.mem.buffer, p.level, this.nSrc).set(level);
      return k.accumulate(p.level, this.nSrc, h, p.nd, i === 0 ? 1 : 0);
    });
    this.apply(ref > 0 ? 1 / ref : 0, rule.threshold - 1e-12, rule.normalise ? 1 : 0);
    values.set(new Float32Array(this.mem.buffer, p.val, this.nTgt));
    coverage.set(new Float32Array(this.mem.buffer, p.cov, this.nTgt));
    return valid;
  }

  /** Run the remapping kernel on the pairs nd into val and cov. */
  protected abstract apply(invRef: number, floor: number, normalise: number): void;
}
