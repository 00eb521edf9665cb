/**
 * Gathers a curvilinear grid's 4-per-cell corners (CF bounds, read in bands of rows) onto the lattice of
 * shared corners (corners.ts), as long as every cell agrees with it: a corner of a cell must give the same
 * doubles from the lattice (unwrapped next to the cell's centre) as from the cell's own bounds. The first
 * cell that disagrees (bounds that do not meet, or another order of the vertices) makes `shared` false.
 */
import { nearLongitude, type CornerLattice } from './corners.js';

export class LatticeBuilder {
  shared = true;
  private readonly lon: Float64Array;
  private readonly lat: Float64Array;
  private readonly seen: Uint8Array;

  constructor(
    private readonly centreLon: Float64Array,
    private readonly nx: number,
    ny: number,
  ) {
    const n = (nx + 1) * (ny + 1);
    this.lon = new Float64Array(n);
    this.lat = new Float64Array(n);
    this.seen = new Uint8Array(n);
  }

  /** Rows j0.. of bounds, 4 per cell (rows * nx * 4), longitudes as stored. */
  addRows(j0: number, bLon: ArrayLike<number>, bLat: ArrayLike<number>): void {
    const { nx, lon, lat, seen } = this;
    const w = nx + 1;
    const rows = bLon.length / (4 * nx);
    for (let r = 0; r < rows && this.shared; r++) {
      const j = j0 + r;
      for (let i = 0; i < nx; i++) {
        const s = j * nx + i;
        const ref = this.centreLon[s];
        const a = j * w + i;
        const at = [a, a + 1, a + w + 1, a + w];
        for (let q = 0; q < 4; q++) {
          const v = at[q];
          const x = bLon[4 * (r * nx + i) + q], y = bLat[4 * (r * nx + i) + q];
          if (!seen[v]) {
            seen[v] = 1;
            lon[v] = x;
            lat[v] = y;
          } else if (!(nearLongitude(lon[v], ref) === nearLongitude(x, ref) && lat[v] === y)) {
            this.shared = false;
            return;
          }
        }
      }
    }
  }

  result(): CornerLattice {
    return { lon: this.lon, lat: this.lat };
  }
}
