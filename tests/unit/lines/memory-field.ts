/** A FieldSource held in memory (level-major values), for line and station tests and benchmarks. */
import type { FieldSource } from '../../../app/cf/field-source.js';
import { parseUnits } from '../../../app/cf/units.js';
import { makeRectilinearGrid } from '../../../app/grid/rectilinear.js';
import { makeVerticalAxis } from '../../../app/grid/vertical.js';

export function memoryField(
  lonEdges: ArrayLike<number>,
  latEdges: ArrayLike<number>,
  zEdges: ArrayLike<number> | null,
  values: Float32Array,
  units = 'mmol m-3',
  variable = 'tracer',
): FieldSource {
  const horizontal = makeRectilinearGrid(Float64Array.from(lonEdges), Float64Array.from(latEdges));
  const vertical = zEdges ? makeVerticalAxis(Float64Array.from(zEdges)) : null;
  const nxy = horizontal.nx * horizontal.ny;
  const nz = vertical?.nz ?? 1;
  if (values.length !== nxy * nz) throw new Error(`memoryField: ${values.length} values for ${nz} x ${nxy} cells`);
  return {
    file: 'memory.nc',
    variable,
    units: parseUnits(units),
    grid: { horizontal, vertical },
    nt: 1,
    time: null,
    async readLevel(_t: number, k: number): Promise<Float32Array> {
      return values.slice(k * nxy, (k + 1) * nxy);
    },
  };
}

/** Edges start, start + step, ... up to end inclusive. */
export function edgesOf(start: number, end: number, step: number): Float64Array {
  const n = Math.round((end - start) / step);
  return Float64Array.from({ length: n + 1 }, (_, i) => start + i * step);
}
