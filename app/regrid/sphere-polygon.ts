import { PolyBuffer, polygonArea } from './polygon-clip.js';

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;
const POLE_EPS = 1e-12;

/**
 * A quadrilateral cell of the sphere, its edges taken as great-circle arcs between the corners,
 * drawn into the cylindrical equal-area frame x = longitude (degrees, unwrapped so the outline is
 * continuous), y = sin(latitude). Lat-lon rectangles are exact rectangles in this frame and areas
 * scale by R²·π/180, so overlaps with lat-lon target cells reduce to plane clipping. Great-circle
 * arcs are curves in this frame: each is cut into enough chords that the area between arc and
 * chords stays below `relTol` times the squared edge length (with the default 1e-6, the area of a
 * 2° cell is within about 1e-7 of its spherical area).
 *
 * A corner at a pole becomes a segment along y = ±1; a cell around a pole (longitudes winding
 * through 360°) is closed along y = ±1.
 */
export function cellToFrame(lonDeg: ArrayLike<number>, latDeg: ArrayLike<number>, out: PolyBuffer, relTol = 1e-6): boolean {
  out.clear();
  const m = lonDeg.length;
  const px = new Float64Array(m), py = new Float64Array(m), pz = new Float64Array(m);
  const pole = new Int8Array(m);
  for (let c = 0; c < m; c++) {
    const lo = lonDeg[c], la = latDeg[c];
    if (!Number.isFinite(lo) || !Number.isFinite(la)) return false;
    const cl = Math.cos(la * RAD);
    px[c] = cl * Math.cos(lo * RAD);
    py[c] = cl * Math.sin(lo * RAD);
    pz[c] = Math.sin(la * RAD);
    pole[c] = la >= 90 - POLE_EPS ? 1 : la <= -90 + POLE_EPS ? -1 : 0;
  }
  const first = pole.indexOf(0);
  if (first < 0) return false;
  const startLon = lonDeg[first];
  out.push(startLon, pz[first]);
  let cur = startLon;
  let c = first;
  let steps = 0;
  while (steps < m) {
    let nxt = (c + 1) % m;
    if (pole[nxt] !== 0) {
      // a run of pole corners: along y = ±1 from this corner's longitude to the next corner's
      const y = pole[nxt];
      while (pole[nxt] !== 0 && steps < m) {
        nxt = (nxt + 1) % m;
        steps++;
      }
      const nl = unwrap(lonDeg[nxt], cur);
      out.push(cur, y);
      out.push(nl, y);
      out.push(nl, pz[nxt]);
      cur = nl;
    } else {
      cur = arcToFrame(px, py, pz, c, nxt, cur, relTol, out);
    }
    steps++;
    c = nxt;
  }
  // the last point pushed repeats the first corner; its unwrapped longitude tells whether the
  // outline winds around a pole
  out.n--;
  const wind = cur - startLon;
  if (Math.abs(wind) > 180) {
    const y = wind > 0 ? 1 : -1;
    out.push(cur, pz[first]);
    out.push(cur, y);
    out.push(startLon, y);
  }
  return out.n >= 3;
}

/** Push the arc from corner a (already in `out`) to corner b; returns b's unwrapped longitude. */
function arcToFrame(px: Float64Array, py: Float64Array, pz: Float64Array, a: number, b: number, lonA: number, relTol: number, out: PolyBuffer): number {
  const ax = px[a], ay = py[a], az = pz[a], bx = px[b], by = py[b], bz = pz[b];
  // the tolerance depends on the edge alone (its squared length), so that the two cells sharing an
  // edge cut it into the same chords and the cells still tile the frame exactly
  const tol = Math.max(relTol * ((ax - bx) ** 2 + (ay - by) ** 2 + (az - bz) ** 2), 1e-20);
  const lonB = unwrap(Math.atan2(by, bx) * DEG, lonA);
  const dl = (lonB - lonA) * RAD;
  let pieces = 1;
  if (Math.abs(dl) > 1e-12) {
    // deviation of the arc's midpoint from the chord, in y at the midpoint's longitude
    let mx = ax + bx, my = ay + by, mz = az + bz;
    const mn = Math.hypot(mx, my, mz);
    mx /= mn;
    my /= mn;
    mz /= mn;
    const lonM = unwrap(Math.atan2(my, mx) * DEG, lonA);
    const f = (lonM - lonA) / (lonB - lonA);
    const dev = Math.abs(mz - (az + f * (bz - az)));
    const err = (2 / 3) * Math.abs(dl) * dev;
    if (err > tol) pieces = Math.min(512, Math.ceil(Math.sqrt(err / tol)));
  }
  let prev = lonA;
  if (pieces > 1) {
    const omega = Math.acos(Math.max(-1, Math.min(1, ax * bx + ay * by + az * bz)));
    const so = Math.sin(omega);
    for (let q = 1; q < pieces; q++) {
      const t = q / pieces;
      const wa = Math.sin((1 - t) * omega) / so, wb = Math.sin(t * omega) / so;
      const x = wa * ax + wb * bx, y = wa * ay + wb * by, z = wa * az + wb * bz;
      const lon = unwrap(Math.atan2(y, x) * DEG, prev);
      out.push(lon, z);
      prev = lon;
    }
  }
  const lb = unwrap(lonB, prev);
  out.push(lb, bz);
  return lb;
}

/** The longitude equal to `lon` modulo 360 that lies nearest to `ref`. */
export function unwrap(lon: number, ref: number): number {
  return lon + 360 * Math.round((ref - lon) / 360);
}

/** Area of a frame polygon in m² on a sphere of the given radius. */
export function frameArea(p: PolyBuffer, radius: number): number {
  return polygonArea(p) * RAD * radius * radius;
}
