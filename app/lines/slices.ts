/**
 * Slices of a field on the common grid that the views draw, from levels already in memory:
 * layer means, the bottom cell of each column, meridian and parallel sections, zonal means of a
 * region, and area-weighted mean profiles. Pure; levels are arrays of ny * nx values, NaN for missing.
 */

/**
 * Thickness-weighted mean over levels of model and reference, using in each column only the levels
 * where both have values, so that the difference is the mean of differences. `metres[k]` is how much
 * of level k lies in the layer.
 */
export function layerMeans(
  model: Float32Array[],
  reference: Float32Array[],
  metres: ArrayLike<number>,
): { model: Float32Array; reference: Float32Array; difference: Float32Array; thickness: Float32Array } {
  const n = model[0]?.length ?? 0;
  const sm = new Float64Array(n);
  const sr = new Float64Array(n);
  const sw = new Float64Array(n);
  for (let k = 0; k < model.length; k++) {
    const w = metres[k];
    if (!(w > 0)) continue;
    const m = model[k];
    const r = reference[k];
    for (let c = 0; c < n; c++) {
      const a = m[c];
      const b = r[c];
      if (a === a && b === b) {
        sm[c] += w * a;
        sr[c] += w * b;
        sw[c] += w;
      }
    }
  }
  const out = { model: new Float32Array(n), reference: new Float32Array(n), difference: new Float32Array(n), thickness: new Float32Array(n) };
  for (let c = 0; c < n; c++) {
    if (sw[c] > 0) {
      out.model[c] = sm[c] / sw[c];
      out.reference[c] = sr[c] / sw[c];
      out.difference[c] = (sm[c] - sr[c]) / sw[c];
      out.thickness[c] = sw[c];
    } else {
      out.model[c] = out.reference[c] = out.difference[c] = NaN;
    }
  }
  return out;
}

/** The deepest level of each column where both model and reference have values (-1: none). */
export function bottomLevels(model: Float32Array[], reference: Float32Array[]): Int16Array {
  const n = model[0]?.length ?? 0;
  const k = new Int16Array(n).fill(-1);
  for (let z = 0; z < model.length; z++) {
    const m = model[z];
    const r = reference[z];
    for (let c = 0; c < n; c++) if (m[c] === m[c] && r[c] === r[c]) k[c] = z;
  }
  return k;
}

/** Values of every column at its own level (NaN where the level is -1). */
export function atLevels(levels: Float32Array[], k: Int16Array): Float32Array {
  const out = new Float32Array(k.length);
  for (let c = 0; c < k.length; c++) out[c] = k[c] >= 0 ? levels[k[c]][c] : NaN;
  return out;
}

/** Level-major section along grid column i (a meridian): [k * ny + j]. */
export function meridianSection(levels: Float32Array[], nx: number, ny: number, i: number): Float32Array {
  const out = new Float32Array(levels.length * ny);
  for (let k = 0; k < levels.length; k++) for (let j = 0; j < ny; j++) out[k * ny + j] = levels[k][j * nx + i];
  return out;
}

/** Level-major section along grid row j (a parallel): [k * nx + i]. */
export function parallelSection(levels: Float32Array[], nx: number, j: number): Float32Array {
  const out = new Float32Array(levels.length * nx);
  for (let k = 0; k < levels.length; k++) out.set(levels[k].subarray(j * nx, (j + 1) * nx), k * nx);
  return out;
}

/**
 * Zonal means over the cells of a region (mask of ny * nx, 1 = in), area-weighted, per level and row,
 * using the cells where both model and reference have values: [k * ny + j].
 */
export function zonalMeans(
  model: Float32Array[],
  reference: Float32Array[],
  area: ArrayLike<number>,
  mask: Uint8Array,
  nx: number,
  ny: number,
): { model: Float32Array; reference: Float32Array; difference: Float32Array } {
  const nz = model.length;
  const out = { model: new Float32Array(nz * ny), reference: new Float32Array(nz * ny), difference: new Float32Array(nz * ny) };
  for (let k = 0; k < nz; k++) {
    const m = model[k];
    const r = reference[k];
    for (let j = 0; j < ny; j++) {
      let sm = 0;
      let sr = 0;
      let sw = 0;
      for (let i = 0; i < nx; i++) {
        const c = j * nx + i;
        if (!mask[c]) continue;
        const a = m[c];
        const b = r[c];
        if (a === a && b === b) {
          const w = area[c];
          sm += w * a;
          sr += w * b;
          sw += w;
        }
      }
      const o = k * ny + j;
      if (sw > 0) {
        out.model[o] = sm / sw;
        out.reference[o] = sr / sw;
        out.difference[o] = (sm - sr) / sw;
      } else out.model[o] = out.reference[o] = out.difference[o] = NaN;
    }
  }
  return out;
}

/** Depth of the seafloor under each sample of a level-major section: the lower edge of its deepest valued level. */
export function seafloorOf(values: Float32Array[], n: number, depthEdges: ArrayLike<number>): Float64Array {
  const out = new Float64Array(n).fill(NaN);
  for (let k = 0; k < values.length; k++) {
    const v = values[k];
    for (let s = 0; s < n; s++) if (v[s] === v[s]) out[s] = depthEdges[k + 1];
  }
  return out;
}

/** Split a level-major array [k * n + s] into its levels. */
export function levelsOf(section: Float32Array, nz: number, n: number): Float32Array[] {
  const out: Float32Array[] = [];
  for (let k = 0; k < nz; k++) out.push(section.subarray(k * n, (k + 1) * n));
  return out;
}

/**
 * Area-weighted mean of one level over the cells of a region where `level` has a value and, when given,
 * `alsoValid` has one too. NaN when no cell qualifies.
 */
export function areaMean(level: Float32Array, area: ArrayLike<number>, cells: Int32Array, alsoValid?: Float32Array): number {
  let s = 0;
  let w = 0;
  for (let q = 0; q < cells.length; q++) {
    const c = cells[q];
    const v = level[c];
    if (v !== v) continue;
    if (alsoValid && alsoValid[c] !== alsoValid[c]) continue;
    s += area[c] * v;
    w += area[c];
  }
  return w > 0 ? s / w : NaN;
}
