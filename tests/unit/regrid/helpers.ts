import type { FieldSource } from '../../../app/cf/field-source.js';
import type { Grid, HorizontalGrid } from '../../../app/grid/types.js';
import { EARTH_RADIUS_M } from '../../../app/grid/types.js';
import { frameCellAreas } from '../../../app/regrid/conservative-curvilinear.js';
import type { SparseWeights } from '../../../app/regrid/csr.js';
import type { LevelRule } from '../../../app/regrid/remap-level.js';
import { MMOL_M3 } from '../memory-field.js';

/** A field computed from a function of lon, lat, depth, on demand. */
export function functionField(grid: Grid, f: (lon: number, lat: number, z: number, cell: number) => number): FieldSource & { reads: number } {
  const h = grid.horizontal;
  const obj = {
    file: 'analytic.nc',
    variable: 'tracer',
    units: MMOL_M3,
    grid,
    nt: 1,
    time: null,
    reads: 0,
    async readLevel(_t: number, k: number) {
      obj.reads++;
      const z = grid.vertical ? grid.vertical.centres[k] : 0;
      const out = new Float32Array(h.nx * h.ny);
      for (let c = 0; c < out.length; c++) out[c] = f(h.lon[c], h.lat[c], z, c);
      return out;
    },
  };
  return obj;
}

/**
 * A curvilinear test grid built by hand: a lat-lon grid of nx × ny cells whose corners are moved by a
 * smooth distortion (sheared in longitude, stretched in latitude), so cells are general quadrilaterals.
 * Cell areas are those of the quadrilaterals with great-circle edges.
 */
export function distortedGrid(nx: number, ny: number, lat0: number, lat1: number, amp = 1, lon0 = -180): HorizontalGrid {
  const dlon = 360 / nx;
  const cornerAt = (i: number, j: number): [number, number] => {
    const u = lon0 + i * dlon;
    const v = lat0 + ((lat1 - lat0) * j) / ny;
    // keep the outer rows on their parallels so the grid covers exactly [lat0, lat1]
    const inner = j > 0 && j < ny ? 1 : 0;
    const lon = u + amp * 0.6 * dlon * Math.sin((v * Math.PI) / 45) * inner;
    const lat = v + inner * amp * 0.3 * ((lat1 - lat0) / ny) * Math.sin((u * Math.PI) / 60);
    return [lon, lat];
  };
  const n = nx * ny;
  const cornerLon = new Float64Array(4 * n), cornerLat = new Float64Array(4 * n);
  const lon = new Float64Array(n), lat = new Float64Array(n);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const c = j * nx + i;
      const pts = [cornerAt(i, j), cornerAt(i + 1, j), cornerAt(i + 1, j + 1), cornerAt(i, j + 1)];
      let sx = 0, sy = 0;
      pts.forEach(([x, y], q) => {
        cornerLon[4 * c + q] = x;
        cornerLat[4 * c + q] = y;
        sx += x;
        sy += y;
      });
      lon[c] = sx / 4;
      lat[c] = sy / 4;
    }
  }
  const g: HorizontalGrid = { kind: 'curvilinear', nx, ny, lon, lat, cornerLon, cornerLat, boundsDerived: false, periodic: true, area: new Float64Array(n) };
  g.area = frameCellAreas(g, EARTH_RADIUS_M);
  return g;
}

/**
 * The remapping rule of regridField written plainly, in double precision, as the reference for the
 * engines (app/regrid/*-level.ts): per target row (a, b) = Σ w·(n, d); coverage = min(b / full, 1) with
 * full = rowRef · ref; value = a / b (or a / full unnormalised) where b > 0 and coverage ≥ the threshold.
 */
export function referenceRemap(w: SparseWeights, rowRef: Float64Array, ref: number, n: Float64Array, d: Float64Array, rule: LevelRule): { values: Float64Array; coverage: Float64Array } {
  const values = new Float64Array(w.nRows), coverage = new Float64Array(w.nRows);
  for (let r = 0; r < w.nRows; r++) {
    let a = 0, b = 0;
    for (let p = w.rowPtr[r]; p < w.rowPtr[r + 1]; p++) {
      a += w.w[p] * n[w.col[p]];
      b += w.w[p] * d[w.col[p]];
    }
    const full = rowRef[r] * ref;
    coverage[r] = full > 0 ? Math.min(b / full, 1) : 0;
    values[r] = b > 0 && coverage[r] >= rule.threshold - 1e-12 ? (rule.normalise ? a / b : a / full) : NaN;
  }
  return { values, coverage };
}
