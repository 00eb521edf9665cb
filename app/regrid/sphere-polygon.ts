import { ArcTable, PolyBuffer, polygonArea } from './polygon-clip.js';

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;
const POLE_EPS = 1e-12;
const extrema: number[] = [];

/**
 * A quadrilateral cell of the sphere, its edges taken as great-circle arcs between the corners,
 * drawn into the cylindrical equal-area frame x = longitude (degrees, unwrapped so the outline is
 * continuous), y = sin(latitude). Lat-lon rectangles are exact rectangles in this frame and areas
 * scale by R²·π/180, so overlaps with lat-lon target cells reduce to plane clipping; the arcs keep
 * their exact shape (polygon-clip.ts), so areas are exact up to round-off. Each arc is split where it
 * reaches its highest or lowest latitude, so every edge is monotone in x and in y.
 *
 * A corner at a pole becomes a segment along y = ±1; so does an edge through a pole (a meridian that
 * goes over it, as on rotated grids whose spacing divides 180°); a cell around a pole (longitudes
 * winding through 360°) is closed along y = ±1. Returns false for a cell with missing corners.
 */
export function cellToFrame(lonDeg: ArrayLike<number>, latDeg: ArrayLike<number>, out: PolyBuffer, arcs: ArcTable): boolean {
  out.clear();
  arcs.clear();
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
    if (pole[c] !== 0) pz[c] = pole[c];
  }
  const first = pole.indexOf(0);
  if (first < 0) return false;
  const startLon = lonDeg[first];
  out.push(startLon, pz[first]);
  let cur = startLon;
  let c = first;
  let steps = 0;
  let crossing = -1;
  while (steps < m) {
    let nxt = (c + 1) % m;
    if (pole[nxt] !== 0) {
      // a run of pole corners: meridian to the pole, along y = ±1, meridian back down
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
      const arc = arcs.add(px[c], py[c], pz[c], px[nxt], py[nxt], pz[nxt]);
      const lonNext = Math.atan2(py[nxt], px[nxt]) * DEG;
      const d = unwrap(lonNext, cur) - cur;
      if (arc < 0 && Math.abs(d) > 90) {
        // a meridian through a pole: up to it, along y = ±1, down the opposite meridian; the half
        // turn's direction is settled once the whole outline is known
        const y = pz[c] + pz[nxt] > 0 ? 1 : -1;
        out.push(cur, y);
        crossing = out.n;
        cur += 180;
        out.push(cur, y);
        out.push(cur, pz[nxt]);
      } else if (arc < 0) {
        cur += d;
        out.push(cur, pz[nxt]);
      } else {
        // along a great circle longitude moves the way of the normal's z (by less than 180°), which
        // settles edges that pass next to a pole where the two ways round are equally near
        const sweep = d * arcs.nz[arc] >= 0 ? d : d - 360 * Math.sign(d);
        const lonB = cur + sweep;
        arcs.extremaBetween(arc, cur, lonB, extrema);
        for (const x of extrema) out.push(x, arcs.y(arc, x), arc);
        out.push(lonB, pz[nxt], arc);
        cur = lonB;
      }
    }
    steps++;
    c = nxt;
  }
  // the last point pushed repeats the first corner; its unwrapped longitude tells whether the
  // outline winds around a pole
  const closingArc = out.edge[out.n - 1];
  out.n--;
  if (crossing >= 0 && Math.abs(cur - startLon) > 180) {
    // an edge through a pole leaves the pole on the outline, not inside: the half turn goes the other way
    for (let i = crossing; i < out.n; i++) out.xy[2 * i] -= 360;
    cur -= 360;
  }
  const wind = cur - startLon;
  if (Math.abs(wind) > 180) {
    // the enclosed pole is the one on the cell's side, whichever way round its corners are given
    let zSum = 0;
    for (let q = 0; q < m; q++) zSum += pz[q];
    const y = zSum > 0 ? 1 : -1;
    out.push(cur, pz[first], closingArc);
    out.push(cur, y);
    out.push(startLon, y);
    // the first vertex is reached straight down from the pole line
    out.edge[0] = -1;
  } else {
    out.edge[0] = closingArc;
  }
  return out.n >= 3;
}

/** The longitude equal to `lon` modulo 360 that lies nearest to `ref`. */
export function unwrap(lon: number, ref: number): number {
  return lon + 360 * Math.round((ref - lon) / 360);
}

/** Area of a frame polygon in m² on a sphere of the given radius. */
export function frameArea(p: PolyBuffer, arcs: ArcTable, radius: number): number {
  return polygonArea(p, arcs) * RAD * radius * radius;
}
