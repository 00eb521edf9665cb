/**
 * Curvilinear horizontal grids: 2-D centre longitudes and latitudes (ny × nx, longitude index fastest),
 * cell corners read from CF bounds or derived, and cell areas as spherical polygons with great-circle edges.
 */
import { StillwaterError } from '../errors.js';
import { EARTH_RADIUS_M, type HorizontalGrid } from './types.js';
import { fromUnitVector, toUnitVector, triangleSolidAngle, type Vec3 } from './spherical-area.js';
import { cellCorners, expandLattice, nearLongitude, type CornerLattice } from './corners.js';

export { nearLongitude };

export interface Corners {
  /** ny * nx * 4 corner longitudes, counter-clockwise: (i-, j-), (i+, j-), (i+, j+), (i-, j+) */
  lon: Float64Array;
  lat: Float64Array;
}

/** Great-circle angle between two unit vectors, radians. */
function angle(a: Vec3, b: Vec3): number {
  const c: Vec3 = [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
  return Math.atan2(Math.hypot(c[0], c[1], c[2]), a[0] * b[0] + a[1] * b[1] + a[2] * b[2]);
}

/** A grid wraps in i when, along its middle row, the last centre is as close to the first as neighbours are. */
export function wrapsInI(lon: ArrayLike<number>, lat: ArrayLike<number>, nx: number, ny: number): boolean {
  if (nx < 3) return false;
  const j = Math.floor(ny / 2);
  // unit vectors of that one row only: a vector per cell of the whole grid cost about 80 bytes a cell
  const row: Vec3[] = [];
  for (let i = 0; i < nx; i++) row.push(toUnitVector(lon[j * nx + i], lat[j * nx + i]));
  let sum = 0;
  for (let i = 1; i < nx; i++) sum += angle(row[i - 1], row[i]);
  const mean = sum / (nx - 1);
  return angle(row[nx - 1], row[0]) < 1.5 * mean;
}

/**
 * Corners as averages of the four surrounding centres, in longitude and latitude (longitudes unwrapped
 * around the first of the four, so the 0/360 or ±180 seam needs no care); outside the grid the centres are
 * extrapolated linearly, except across the seam of a grid that wraps in i. Latitudes are clipped to ±90.
 * Where the four centres spread over more than 90° of longitude (next to a pole of the grid), longitude
 * averages mean nothing: there the corner is the normalised mean of the centres' unit vectors.
 */
export function deriveCorners(lon2d: ArrayLike<number>, lat2d: ArrayLike<number>, nx: number, ny: number, periodic: boolean): Corners {
  return expandLattice(deriveLattice(lon2d, lat2d, nx, ny, periodic), Float64Array.from(lon2d), nx, ny);
}

/** The derived corners once each, (ny + 1) × (nx + 1), before unwrapping next to each cell's centre. */
export function deriveLattice(lon2d: ArrayLike<number>, lat2d: ArrayLike<number>, nx: number, ny: number, periodic: boolean): CornerLattice {
  if (nx < 2 || ny < 2) throw new StillwaterError('E_GRID', 'Deriving cell corners needs a curvilinear grid of at least 2 × 2 cells.');
  const W = nx + 2;
  const H = ny + 2;
  const eLon = new Float64Array(H * W);
  const eLat = new Float64Array(H * W);
  const set = (jj: number, ii: number, lo: number, la: number): void => {
    eLon[jj * W + ii] = lo;
    eLat[jj * W + ii] = la;
  };
  /** 2a - b in longitude (b unwrapped next to a) and latitude */
  const extrapolate = (ja: number, ia: number, jb: number, ib: number, jj: number, ii: number): void => {
    const la = eLon[ja * W + ia];
    set(jj, ii, 2 * la - nearLongitude(eLon[jb * W + ib], la), 2 * eLat[ja * W + ia] - eLat[jb * W + ib]);
  };
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) set(j + 1, i + 1, lon2d[j * nx + i], lat2d[j * nx + i]);
  for (let jj = 1; jj <= ny; jj++) {
    if (periodic) {
      set(jj, 0, eLon[jj * W + nx], eLat[jj * W + nx]);
      set(jj, nx + 1, eLon[jj * W + 1], eLat[jj * W + 1]);
    } else {
      extrapolate(jj, 1, jj, 2, jj, 0);
      extrapolate(jj, nx, jj, nx - 1, jj, nx + 1);
    }
  }
  for (let ii = 0; ii < W; ii++) {
    extrapolate(1, ii, 2, ii, 0, ii);
    extrapolate(ny, ii, ny - 1, ii, ny + 1, ii);
  }
  const CW = nx + 1;
  const cLon = new Float64Array((ny + 1) * CW);
  const cLat = new Float64Array((ny + 1) * CW);
  for (let jj = 0; jj <= ny; jj++) {
    for (let ii = 0; ii <= nx; ii++) {
      const idx = [jj * W + ii, jj * W + ii + 1, (jj + 1) * W + ii, (jj + 1) * W + ii + 1];
      const ref = eLon[idx[0]];
      let sumLon = 0;
      let sumLat = 0;
      let lo = Infinity;
      let hi = -Infinity;
      for (const q of idx) {
        const x = nearLongitude(eLon[q], ref);
        lo = Math.min(lo, x);
        hi = Math.max(hi, x);
        sumLon += x;
        sumLat += eLat[q];
      }
      let lon = sumLon / 4;
      let lat = sumLat / 4;
      if (hi - lo > 90) {
        const sum: Vec3 = [0, 0, 0];
        for (const q of idx) {
          const u = toUnitVector(eLon[q], Math.max(-90, Math.min(90, eLat[q])));
          sum[0] += u[0];
          sum[1] += u[1];
          sum[2] += u[2];
        }
        ({ lon, lat } = fromUnitVector(sum));
      }
      cLon[jj * CW + ii] = lon;
      cLat[jj * CW + ii] = Math.max(-90, Math.min(90, lat));
    }
  }
  return { lon: cLon, lat: cLat };
}

/** Area of one quadrilateral cell with great-circle edges, m². */
export function quadArea(lon: ArrayLike<number>, lat: ArrayLike<number>, offset: number, radius = EARTH_RADIUS_M): number {
  const a = toUnitVector(lon[offset], lat[offset]);
  const b = toUnitVector(lon[offset + 1], lat[offset + 1]);
  const c = toUnitVector(lon[offset + 2], lat[offset + 2]);
  const d = toUnitVector(lon[offset + 3], lat[offset + 3]);
  return Math.abs(triangleSolidAngle(a, b, c) + triangleSolidAngle(a, c, d)) * radius * radius;
}

/**
 * A curvilinear grid from 2-D centres (ny * nx, i fastest; Float64Arrays are kept, not copied). Corners
 * from the file's bounds when given, 4 per cell or once each on the lattice of shared corners, else derived
 * (and the grid flagged boundsDerived). Corners on a lattice are expanded to 4 per cell only when someone
 * reads cornerLon/cornerLat.
 */
export function makeCurvilinearGrid(
  lon2d: ArrayLike<number>,
  lat2d: ArrayLike<number>,
  nx: number,
  ny: number,
  corners?: Corners | { lattice: CornerLattice },
  radius = EARTH_RADIUS_M,
): HorizontalGrid {
  const n = nx * ny;
  if (lon2d.length !== n || lat2d.length !== n) throw new StillwaterError('E_GRID', `A curvilinear grid of ${ny} × ${nx} needs ${n} centre longitudes and latitudes.`);
  const lon = lon2d instanceof Float64Array ? lon2d : Float64Array.from(lon2d);
  const lat = lat2d instanceof Float64Array ? lat2d : Float64Array.from(lat2d);
  const periodic = wrapsInI(lon, lat, nx, ny);
  const lattice = corners && 'lattice' in corners ? corners.lattice : corners ? undefined : deriveLattice(lon, lat, nx, ny, periodic);
  const perCell = corners && !('lattice' in corners) ? corners : undefined;
  if (lattice && (lattice.lon.length !== (nx + 1) * (ny + 1) || lattice.lat.length !== (nx + 1) * (ny + 1))) {
    throw new StillwaterError('E_GRID', `Shared cell corners of a ${ny} × ${nx} grid need ${(nx + 1) * (ny + 1)} values.`);
  }
  if (perCell && (perCell.lon.length !== n * 4 || perCell.lat.length !== n * 4)) throw new StillwaterError('E_GRID', `Cell corners of a ${ny} × ${nx} grid need ${n * 4} values.`);
  let expanded: Corners | undefined = perCell;
  const expand = (): Corners => (expanded ??= expandLattice(lattice!, lon, nx, ny));
  const grid: HorizontalGrid = {
    kind: 'curvilinear',
    nx,
    ny,
    lon,
    lat,
    get cornerLon() {
      return expand().lon;
    },
    get cornerLat() {
      return expand().lat;
    },
    ...(lattice ? { lattice } : {}),
    boundsDerived: !corners,
    periodic,
    area: new Float64Array(n),
  };
  const cl = new Float64Array(4), ca = new Float64Array(4);
  for (let c = 0; c < n; c++) {
    cellCorners(grid, c, cl, ca);
    grid.area[c] = quadArea(cl, ca, 0, radius);
  }
  return grid;
}
