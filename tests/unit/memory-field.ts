/**
 * The one in-memory field for tests and benchmarks: a FieldSource over values held in memory, on a grid built
 * from edges or given whole. Values are level-major (t * nz + k levels of ny * nx cells each), as one array or
 * as one array per level.
 */
import type { FieldSource } from '../../app/cf/field-source.js';
import { parseUnits, type ParsedUnits } from '../../app/cf/units.js';
import { makeRectilinearGrid } from '../../app/grid/rectilinear.js';
import type { Grid } from '../../app/grid/types.js';
import { makeVerticalAxis } from '../../app/grid/vertical.js';

export const MMOL_M3: ParsedUnits = parseUnits('mmol m-3');
export const UMOL_KG: ParsedUnits = parseUnits('umol kg-1');

/** A lat-lon grid (with depth when depth edges are given) from its cell edges. */
export function gridFromEdges(lonEdges: ArrayLike<number>, latEdges: ArrayLike<number>, depthEdges: ArrayLike<number> | null): Grid {
  return {
    horizontal: makeRectilinearGrid(Float64Array.from(lonEdges), Float64Array.from(latEdges)),
    vertical: depthEdges ? makeVerticalAxis(Float64Array.from(depthEdges)) : null,
  };
}

/** Edges start, start + step, ... up to end inclusive. */
export function edgesOf(start: number, end: number, step: number): Float64Array {
  const n = Math.round((end - start) / step);
  return Float64Array.from({ length: n + 1 }, (_, i) => start + i * step);
}

export interface MemoryFieldOptions {
  file?: string;
  variable?: string;
  /** default mmol m-3 */
  units?: string | ParsedUnits;
  /** time steps (default 1) */
  nt?: number;
}

export function memoryField(grid: Grid, values: Float32Array | Float32Array[], opts: MemoryFieldOptions = {}): FieldSource {
  const ncell = grid.horizontal.nx * grid.horizontal.ny;
  const nz = grid.vertical?.nz ?? 1;
  const nt = opts.nt ?? 1;
  const levels = Array.isArray(values) ? values : Array.from({ length: values.length / ncell }, (_, i) => values.subarray(i * ncell, (i + 1) * ncell));
  if (levels.length !== nt * nz || levels.some((l) => l.length !== ncell)) {
    throw new Error(`memoryField: ${levels.length} levels of ${levels[0]?.length} values for ${nt} x ${nz} levels of ${ncell} cells`);
  }
  return {
    file: opts.file ?? 'memory.nc',
    variable: opts.variable ?? 'tracer',
    units: typeof opts.units === 'string' ? parseUnits(opts.units) : (opts.units ?? MMOL_M3),
    grid,
    nt,
    time: null,
    async readLevel(t: number, k: number): Promise<Float32Array> {
      if (t < 0 || t >= nt || k < 0 || k >= nz) throw new Error(`memoryField: no level t=${t}, k=${k}`);
      return levels[t * nz + k].slice();
    },
  };
}
