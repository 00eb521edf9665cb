import type { FieldSource } from '../../../app/cf/field-source.js';
import type { ParsedUnits } from '../../../app/cf/units.js';
import { makeRectilinearGrid } from '../../../app/grid/rectilinear.js';
import { makeVerticalAxis } from '../../../app/grid/vertical.js';
import type { Grid } from '../../../app/grid/types.js';
import { StillwaterError } from '../../../app/errors.js';
import type { SnapshotHandle, SnapshotOpener } from '../../../app/spinup/series.js';

export const MMOL_M3: ParsedUnits = { text: 'mmol m-3', kind: 'amount_per_volume', canonical: 'mmol m-3', factor: 1e-3, offset: 0 };
export const UMOL_KG: ParsedUnits = { text: 'umol kg-1', kind: 'amount_per_mass', canonical: 'umol kg-1', factor: 1e-6, offset: 0 };

export function handGrid(lonEdges: number[], latEdges: number[], depthEdges: number[] | null): Grid {
  return {
    horizontal: makeRectilinearGrid(Float64Array.from(lonEdges), Float64Array.from(latEdges)),
    vertical: depthEdges ? makeVerticalAxis(Float64Array.from(depthEdges)) : null,
  };
}

/** A FieldSource over a whole 3-D array (nz * ny * nx) held in memory, one time step. */
export function handField(file: string, variable: string, grid: Grid, data: Float32Array, units: ParsedUnits = MMOL_M3): FieldSource {
  const ncell = grid.horizontal.nx * grid.horizontal.ny;
  return {
    file,
    variable,
    units,
    grid,
    nt: 1,
    time: null,
    async readLevel(t: number, k: number) {
      if (t !== 0) throw new Error('one time step only');
      return data.slice(k * ncell, (k + 1) * ncell);
    },
  };
}

/** A set of in-memory snapshot files: file name -> variable -> field. Records how many files are open. */
export function memoryOpener(files: Record<string, Record<string, FieldSource>>): SnapshotOpener & { openCount: () => number } {
  let open = 0;
  const opener = async (file: string): Promise<SnapshotHandle> => {
    const vars = files[file];
    if (!vars) throw new StillwaterError('E_FILE', `${file}: no such file.`, { file });
    open++;
    return {
      async field(variable: string) {
        const f = vars[variable];
        if (!f) throw new StillwaterError('E_VARIABLE', `${file}: there is no variable '${variable}'.`, { file, variable });
        return f;
      },
      has: (variable: string) => variable in vars,
      async close() {
        open--;
      },
    };
  };
  return Object.assign(opener, { openCount: () => open });
}
