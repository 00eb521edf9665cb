/**
 * Log10 of values for statistics of quantities spanning decades (chlorophyll, iron...).
 * Zero, negative and missing values become NaN and so drop out of the comparison.
 */
export function log10Values(values: ArrayLike<number>, out?: Float32Array): Float32Array {
  const res = out && out.length === values.length ? out : new Float32Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    res[i] = v > 0 ? Math.log10(v) : NaN;
  }
  return res;
}
