import { DENSITY_KERNEL_INPUTS as K } from './teos10.js';
import { WASM_BASE64 } from './kernels/density-wasm.js';

/** The export of app/ocean/kernels/density.as.ts (P arguments are byte offsets into its memory). */
interface DensityKernel {
  densityLevel(sP: number, tP: number, count: number, p: number, rhoP: number, coefP: number, srPerSp: number, sfac: number, sOffset: number, cp0: number): void;
}

const COEF_BYTES = (K.specificVolumeTerms.length + K.enthalpyTerms.length) * 8;

let kernel: { k: DensityKernel; mem: WebAssembly.Memory } | null = null;

/** One instance per thread, its memory grown to the largest level seen (levels of one grid repeat). */
function kernelFor(count: number): { k: DensityKernel; mem: WebAssembly.Memory } {
  const need = COEF_BYTES + align16(4 * count) * 2 + 8 * count;
  if (!kernel) {
    const mem = new WebAssembly.Memory({ initial: Math.max(1, Math.ceil(need / 65536)) });
    const k = new WebAssembly.Instance(new WebAssembly.Module(Buffer.from(WASM_BASE64, 'base64')), { env: { memory: mem } }).exports as unknown as DensityKernel;
    // the coefficients go in once: growing a memory keeps its contents, and levels are written after them
    const coef = new Float64Array(mem.buffer, 0, COEF_BYTES / 8);
    coef.set(K.specificVolumeTerms);
    coef.set(K.enthalpyTerms, K.specificVolumeTerms.length);
    kernel = { k, mem };
  } else if (kernel.mem.buffer.byteLength < need) {
    kernel.mem.grow(Math.ceil((need - kernel.mem.buffer.byteLength) / 65536));
  }
  return kernel;
}

function align16(n: number): number {
  return Math.ceil(n / 16) * 16;
}

/**
 * TEOS-10 density (kg m⁻³) of every cell of a level from practical salinity S and potential temperature T
 * at sea pressure p (dbar), NaN where either is missing: densityFromPracticalAndPotential cell by cell,
 * computed two cells at a time in WebAssembly with the same operations, so the same doubles.
 */
export function densityOfLevel(S: Float32Array, T: Float32Array, p: number): Float64Array {
  const n = Math.min(S.length, T.length);
  const { k, mem } = kernelFor(n);
  const sP = COEF_BYTES, tP = sP + align16(4 * n), rhoP = tP + align16(4 * n);
  new Float32Array(mem.buffer, sP, n).set(S.subarray(0, n));
  new Float32Array(mem.buffer, tP, n).set(T.subarray(0, n));
  k.densityLevel(sP, tP, n, p, rhoP, 0, K.SR_PER_SP, K.SFAC, K.S_OFFSET, K.CP0);
  return new Float64Array(mem.buffer, rhoP, n).slice();
}
