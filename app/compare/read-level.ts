/** One level of a field at the time step a recipe asks for (an index, the last, or the mean over steps). */
import type { FieldSource } from '../cf/field.js';

export type TimeChoice = number | 'mean' | 'last' | undefined;

export function timeIndex(src: FieldSource, time: TimeChoice): number | 'mean' {
  if (time === undefined) return src.nt <= 1 ? 0 : 'mean';
  if (time === 'mean') return 'mean';
  if (time === 'last') return src.nt - 1;
  return time < 0 ? src.nt + time : time;
}

/** The level as the source gives it (callers must not modify it). The mean skips missing steps of a cell. */
export async function readLevelAt(src: FieldSource, t: number | 'mean', k: number): Promise<Float32Array> {
  if (t !== 'mean') return src.readLevel(t, k);
  if (src.nt === 1) return src.readLevel(0, k);
  let sum: Float64Array | null = null;
  let count: Uint32Array | null = null;
  for (let s = 0; s < src.nt; s++) {
    const v = await src.readLevel(s, k);
    if (!sum || !count) {
      sum = new Float64Array(v.length);
      count = new Uint32Array(v.length);
    }
    for (let c = 0; c < v.length; c++) {
      const x = v[c];
      if (x - x === 0) {
        sum[c] += x;
        count[c]++;
      }
    }
  }
  const out = new Float32Array(sum ? sum.length : 0);
  for (let c = 0; c < out.length; c++) out[c] = count![c] ? sum![c] / count![c] : NaN;
  return out;
}
