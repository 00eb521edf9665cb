import { cellCorners } from '../grid/corners.js';
import type { HorizontalGrid } from '../grid/types.js';
import { lowerEdge } from './edge-search.js';
import { SphereKdTree, toXyz } from './kdtree.js';
import { unwrap } from './sphere-polygon.js';

/** Up to four source cells and their bilinear weights (summing to 1). */
export interface Stencil {
  n: number;
  idx: Int32Array;
  w: Float64Array;
}

export function newStencil(): Stencil {
  return { n: 0, idx: new Int32Array(4), w: new Float64Array(4) };
}

/**
 * Finds where a point falls on a source grid: the bilinear stencil between cell centres and the
 * nearest centres in order of distance. Lat-lon grids use their axes; curvilinear grids a k-d tree
 * of centres and an inverse bilinear map in a plane tangent at the point (gnomonic, where arcs
 * between centres are straight).
 */
export class PointLocator {
  private readonly tree?: SphereKdTree;
  private readonly xc?: Float64Array;
  private readonly xi?: Int32Array;
  private readonly yc?: Float64Array;
  private readonly yi?: Int32Array;
  private readonly xe?: Float64Array;
  private readonly ye?: Float64Array;
  private reach?: Float64Array;

  constructor(readonly grid: HorizontalGrid) {
    if (grid.kind === 'rectilinear' && grid.axes) {
      [this.xc, this.xi] = ascending(grid.axes.lon);
      [this.yc, this.yi] = ascending(grid.axes.lat);
      this.xe = ascending(grid.axes.lonEdges)[0];
      this.ye = ascending(grid.axes.latEdges)[0];
    } else {
      this.tree = new SphereKdTree(grid.lon, grid.lat);
    }
  }

  /** Bilinear stencil at (lon, lat); false when the point lies outside the source grid. */
  bilinear(lon: number, lat: number, out: Stencil): boolean {
    out.n = 0;
    return this.xc ? this.bilinearRect(lon, lat, out) : this.bilinearCurv(lon, lat, out);
  }

  /** Nearest centres (the nearest first, then its neighbours by distance); 0 when outside. */
  nearest(lon: number, lat: number, out: Int32Array): number {
    const s = this.xc ? this.containingRect(lon, lat) : this.nearestCurv(lon, lat);
    if (s < 0) return 0;
    const g = this.grid;
    const j = Math.floor(s / g.nx), i = s - j * g.nx;
    const [px, py, pz] = toXyz(lon, lat);
    const cand: { s: number; d: number }[] = [];
    for (let dj = -1; dj <= 1; dj++) {
      const jj = j + dj;
      if (jj < 0 || jj >= g.ny) continue;
      for (let di = -1; di <= 1; di++) {
        let ii = i + di;
        if (ii < 0 || ii >= g.nx) {
          if (!g.periodic) continue;
          ii = (ii + g.nx) % g.nx;
        }
        const c = jj * g.nx + ii;
        const [x, y, z] = toXyz(g.lon[c], g.lat[c]);
        cand.push({ s: c, d: (x - px) ** 2 + (y - py) ** 2 + (z - pz) ** 2 });
      }
    }
    cand.sort((a, b) => a.d - b.d || a.s - b.s);
    // the containing cell always comes first, even where a neighbour's centre is nearer
    const first = cand.findIndex((c) => c.s === s);
    const ordered = [cand[first], ...cand.filter((_, k) => k !== first)];
    const n = Math.min(out.length, ordered.length);
    for (let k = 0; k < n; k++) out[k] = ordered[k].s;
    return n;
  }

  private containingRect(lon: number, lat: number): number {
    const xe = this.xe!, ye = this.ye!;
    if (lat < ye[0] || lat > ye[ye.length - 1]) return -1;
    const x = this.wrapLon(lon, xe[0], xe[xe.length - 1]);
    if (x < xe[0] || x > xe[xe.length - 1]) return -1;
    const i = Math.min(lowerEdge(xe, x), xe.length - 2), j = Math.min(lowerEdge(ye, lat), ye.length - 2);
    return this.yi![j] * this.grid.nx + this.xi![i];
  }

  private wrapLon(lon: number, lo: number, hi: number): number {
    const mid = 0.5 * (lo + hi);
    return unwrap(lon, mid);
  }

  private bilinearRect(lon: number, lat: number, out: Stencil): boolean {
    const xc = this.xc!, yc = this.yc!, xe = this.xe!, ye = this.ye!, nx = this.grid.nx;
    if (!(lat >= ye[0] && lat <= ye[ye.length - 1])) return false;
    let j0: number, j1: number, fy: number;
    const ny = yc.length;
    if (lat <= yc[0]) [j0, j1, fy] = [0, 0, 0];
    else if (lat >= yc[ny - 1]) [j0, j1, fy] = [ny - 1, ny - 1, 0];
    else {
      j0 = lowerEdge(yc, lat);
      j1 = j0 + 1;
      fy = (lat - yc[j0]) / (yc[j1] - yc[j0]);
    }
    let i0: number, i1: number, fx: number;
    const m = xc.length;
    if (this.grid.periodic) {
      const x = unwrap(lon, xc[0] + 180);
      if (x >= xc[m - 1] || x < xc[0]) {
        const xx = x < xc[0] ? x + 360 : x;
        i0 = m - 1;
        i1 = 0;
        fx = (xx - xc[m - 1]) / (xc[0] + 360 - xc[m - 1]);
      } else {
        i0 = lowerEdge(xc, x);
        i1 = i0 + 1;
        fx = (x - xc[i0]) / (xc[i1] - xc[i0]);
      }
    } else {
      const x = this.wrapLon(lon, xe[0], xe[xe.length - 1]);
      if (!(x >= xe[0] && x <= xe[xe.length - 1])) return false;
      if (x <= xc[0]) [i0, i1, fx] = [0, 0, 0];
      else if (x >= xc[m - 1]) [i0, i1, fx] = [m - 1, m - 1, 0];
      else {
        i0 = lowerEdge(xc, x);
        i1 = i0 + 1;
        fx = (x - xc[i0]) / (xc[i1] - xc[i0]);
      }
    }
    const xi = this.xi!, yi = this.yi!;
    put(out, yi[j0] * nx + xi[i0], (1 - fx) * (1 - fy));
    put(out, yi[j0] * nx + xi[i1], fx * (1 - fy));
    put(out, yi[j1] * nx + xi[i1], fx * fy);
    put(out, yi[j1] * nx + xi[i0], (1 - fx) * fy);
    return true;
  }

  private nearestCurv(lon: number, lat: number): number {
    const { index, chord2 } = this.tree!.nearest(lon, lat);
    if (index < 0) return -1;
    // inside the grid when no farther from the nearest centre than that cell's own corners reach
    const reach = this.cellReach();
    return chord2 <= reach[index] * 1.0001 ? index : -1;
  }

  /** Squared chord distance from each centre to its farthest corner. */
  private cellReach(): Float64Array {
    if (this.reach) return this.reach;
    const g = this.grid;
    const n = g.nx * g.ny;
    const r = new Float64Array(n);
    const cl = new Float64Array(4), ca = new Float64Array(4);
    for (let s = 0; s < n; s++) {
      const [x, y, z] = toXyz(g.lon[s], g.lat[s]);
      let m = 0;
      cellCorners(g, s, cl, ca);
      for (let c = 0; c < 4; c++) {
        const [a, b, d] = toXyz(cl[c], ca[c]);
        const q = (a - x) ** 2 + (b - y) ** 2 + (d - z) ** 2;
        if (q > m) m = q;
      }
      r[s] = Number.isFinite(m) ? m : 0;
    }
    this.reach = r;
    return r;
  }

  private bilinearCurv(lon: number, lat: number, out: Stencil): boolean {
    const s = this.nearestCurv(lon, lat);
    if (s < 0) return false;
    const g = this.grid;
    const j = Math.floor(s / g.nx), i = s - j * g.nx;
    const p = toXyz(lon, lat);
    // tangent basis at the point, for a gnomonic projection
    const e1 = normalise(cross([0, 0, 1], p), p);
    const e2 = cross(p, e1);
    const proj = (c: number): [number, number] | null => {
      const q = toXyz(g.lon[c], g.lat[c]);
      const d = dot(q, p);
      if (d <= 0.1) return null;
      return [dot(q, e1) / d, dot(q, e2) / d];
    };
    // the four dual quads (between centres) that share centre (j, i)
    for (const [dj, di] of [[0, 0], [-1, 0], [0, -1], [-1, -1]]) {
      const j0 = j + dj;
      let i0 = i + di;
      if (j0 < 0 || j0 + 1 >= g.ny) continue;
      if (i0 < 0) {
        if (!g.periodic) continue;
        i0 += g.nx;
      }
      let i1 = i0 + 1;
      if (i1 >= g.nx) {
        if (!g.periodic) continue;
        i1 -= g.nx;
      }
      const c00 = j0 * g.nx + i0, c10 = j0 * g.nx + i1, c11 = (j0 + 1) * g.nx + i1, c01 = (j0 + 1) * g.nx + i0;
      const q00 = proj(c00), q10 = proj(c10), q11 = proj(c11), q01 = proj(c01);
      if (!q00 || !q10 || !q11 || !q01) continue;
      const uv = inverseBilinear(q00, q10, q11, q01);
      if (!uv) continue;
      const [u, v] = uv;
      put(out, c00, (1 - u) * (1 - v));
      put(out, c10, u * (1 - v));
      put(out, c11, u * v);
      put(out, c01, (1 - u) * v);
      return true;
    }
    // near the grid's rim: the containing cell's value
    put(out, s, 1);
    return true;
  }
}

function put(st: Stencil, idx: number, w: number): void {
  if (w === 0 && st.n > 0) return;
  for (let k = 0; k < st.n; k++) {
    if (st.idx[k] === idx) {
      st.w[k] += w;
      return;
    }
  }
  st.idx[st.n] = idx;
  st.w[st.n++] = w;
}

/** (u, v) in [0, 1]² with p = bilinear(q00, q10, q11, q01) at the origin; null when outside. */
export function inverseBilinear(q00: [number, number], q10: [number, number], q11: [number, number], q01: [number, number]): [number, number] | null {
  let u = 0.5, v = 0.5;
  for (let it = 0; it < 30; it++) {
    const fx = q00[0] + u * (q10[0] - q00[0]) + v * (q01[0] - q00[0]) + u * v * (q00[0] - q10[0] + q11[0] - q01[0]);
    const fy = q00[1] + u * (q10[1] - q00[1]) + v * (q01[1] - q00[1]) + u * v * (q00[1] - q10[1] + q11[1] - q01[1]);
    const a = q10[0] - q00[0] + v * (q00[0] - q10[0] + q11[0] - q01[0]);
    const b = q01[0] - q00[0] + u * (q00[0] - q10[0] + q11[0] - q01[0]);
    const c = q10[1] - q00[1] + v * (q00[1] - q10[1] + q11[1] - q01[1]);
    const d = q01[1] - q00[1] + u * (q00[1] - q10[1] + q11[1] - q01[1]);
    const det = a * d - b * c;
    if (det === 0) return null;
    const du = (d * fx - b * fy) / det, dv = (-c * fx + a * fy) / det;
    u -= du;
    v -= dv;
    if (Math.abs(du) + Math.abs(dv) < 1e-14) break;
  }
  const eps = 1e-9;
  if (!(u >= -eps && u <= 1 + eps && v >= -eps && v <= 1 + eps)) return null;
  return [Math.min(1, Math.max(0, u)), Math.min(1, Math.max(0, v))];
}

function ascending(a: Float64Array): [Float64Array, Int32Array] {
  const n = a.length;
  const idx = new Int32Array(n);
  if (n > 1 && a[n - 1] < a[0]) {
    const r = new Float64Array(n);
    for (let k = 0; k < n; k++) {
      r[k] = a[n - 1 - k];
      idx[k] = n - 1 - k;
    }
    return [r, idx];
  }
  for (let k = 0; k < n; k++) idx[k] = k;
  return [a, idx];
}

type V3 = [number, number, number];
function cross(a: V3, b: V3): V3 {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}
function dot(a: V3, b: V3): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}
function normalise(a: V3, p: V3): V3 {
  let n = Math.hypot(a[0], a[1], a[2]);
  if (n < 1e-12) {
    // at a pole any tangent direction will do
    a = cross([1, 0, 0], p);
    n = Math.hypot(a[0], a[1], a[2]);
  }
  return [a[0] / n, a[1] / n, a[2] / n];
}
