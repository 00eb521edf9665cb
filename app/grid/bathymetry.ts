/**
 * Wet mask and seafloor from the data itself: a cell is wet where the field has a value. Columns are
 * scanned level by level from the top; a column's wet levels are those above its first missing value.
 */
import type { Bathymetry, Grid, VerticalAxis } from './types.js';

/** Anything that hands out one horizontal level at a time (a FieldSource at a fixed time step, say). */
export type LevelReader = (k: number) => Promise<ArrayLike<number>>;

/** Number of wet levels per column (0 = land) and wet depth, reading one level at a time. */
export async function bathymetryFromLevels(grid: Grid, readLevel: LevelReader): Promise<Bathymetry> {
  const n = grid.horizontal.nx * grid.horizontal.ny;
  const nz = grid.vertical ? grid.vertical.nz : 1;
  const wetLevels = new Int16Array(n);
  // columns still wet down to the level being read
  let open = n;
  const stillOpen = new Uint8Array(n).fill(1);
  for (let k = 0; k < nz && open > 0; k++) {
    const level = await readLevel(k);
    for (let c = 0; c < n; c++) {
      if (!stillOpen[c]) continue;
      if (Number.isFinite(level[c])) wetLevels[c] = k + 1;
      else {
        stillOpen[c] = 0;
        open--;
      }
    }
  }
  const depth = new Float64Array(n);
  if (grid.vertical) {
    const edges = grid.vertical.edges;
    for (let c = 0; c < n; c++) depth[c] = wetLevels[c] > 0 ? edges[wetLevels[c]] - edges[0] : 0;
  }
  return { wetLevels, depth };
}

/** Index of the deepest wet level of each column, -1 for land. */
export function bottomIndex(b: Bathymetry): Int16Array {
  const out = new Int16Array(b.wetLevels.length);
  for (let c = 0; c < out.length; c++) out[c] = b.wetLevels[c] - 1;
  return out;
}

/** Whether cell (k, c) is wet. */
export function isWet(b: Bathymetry, k: number, c: number): boolean {
  return k < b.wetLevels[c];
}

/** Cell volumes of level k: area × layer thickness where wet, 0 elsewhere (m³). */
export function levelVolumes(grid: Grid, b: Bathymetry, k: number): Float64Array {
  const h = grid.horizontal;
  const thickness = layerThickness(grid.vertical, k);
  const out = new Float64Array(h.nx * h.ny);
  for (let c = 0; c < out.length; c++) out[c] = k < b.wetLevels[c] ? h.area[c] * thickness : 0;
  return out;
}

function layerThickness(v: VerticalAxis | null, k: number): number {
  return v ? v.thickness[k] : 1;
}
