/**
 * Polygons of the cylindrical equal-area frame (x = longitude in degrees, y = sin latitude) whose
 * edges are either straight in the frame (meridians, parallels, cuts along a target cell's sides) or
 * great-circle arcs, which are curves y(x) with a closed form. Polygons are clipped against lines
 * x = const and y = const (Sutherland–Hodgman: against a convex window the clipped area is exact,
 * also for concave subjects) and their area is integrated exactly along the arcs.
 *
 * A great circle with unit normal n = (nx, ny, nz), nz ≠ 0, is in the frame
 *   y(λ) = S·c·cos u / sqrt(1 − c² sin² u),   u = λ − λ0,  c = |(nx, ny)|, λ0 = atan2(ny, nx), S = −sign(nz)
 * and ∫ y dλ = S·asin(c·sin u) (λ in radians), so each arc contributes exactly to the area.
 */
const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;

/** The great circles of one polygon, referenced from its edges by index. */
export class ArcTable {
  c: Float64Array = new Float64Array(16);
  l0: Float64Array = new Float64Array(16);
  s: Float64Array = new Float64Array(16);
  nz: Float64Array = new Float64Array(16);
  n = 0;
  clear(): void {
    this.n = 0;
  }
  /** Add the great circle through two unit vectors; returns its index, or -1 for a meridian (straight). */
  add(ax: number, ay: number, az: number, bx: number, by: number, bz: number): number {
    let nx = ay * bz - az * by, ny = az * bx - ax * bz, nz = ax * by - ay * bx;
    const len = Math.hypot(nx, ny, nz);
    if (len === 0) return -1;
    nx /= len;
    ny /= len;
    nz /= len;
    if (Math.abs(nz) < 1e-15) return -1;
    if (this.n === this.c.length) {
      this.c = grow(this.c);
      this.l0 = grow(this.l0);
      this.s = grow(this.s);
      this.nz = grow(this.nz);
    }
    const k = this.n++;
    this.c[k] = Math.min(1, Math.hypot(nx, ny));
    this.l0[k] = Math.atan2(ny, nx);
    this.s[k] = nz > 0 ? -1 : 1;
    this.nz[k] = nz;
    return k;
  }
  /** y = sin(latitude) of arc k at longitude x (degrees). */
  y(k: number, xDeg: number): number {
    const u = xDeg * RAD - this.l0[k];
    const c = this.c[k], nz = this.nz[k];
    const cu = c * Math.cos(u);
    // 1 − c² sin²u written as nz² + c² cos²u: no cancellation for nearly meridional arcs
    return (this.s[k] * cu) / Math.sqrt(nz * nz + cu * cu);
  }
  /**
   * ∫ y dx along arc k from x1 to x2 (degrees), in degree units: S·(asin(c·sin u2) − asin(c·sin u1)),
   * the difference taken as one angle whose sine and cosine are written without subtracting nearly
   * equal numbers (near a pole a piece's area is a small part of that difference).
   */
  integral(k: number, x1: number, x2: number): number {
    const c = this.c[k], nz = this.nz[k];
    const u1 = x1 * RAD - this.l0[k], du = (x2 - x1) * RAD, u2 = u1 + du;
    const s1 = Math.sin(u1), s2 = Math.sin(u2);
    const cos1 = c * Math.cos(u1), cos2 = c * Math.cos(u2);
    const r1 = Math.sqrt(nz * nz + cos1 * cos1), r2 = Math.sqrt(nz * nz + cos2 * cos2);
    // sin u2 − sin u1 and r1 − r2 = c²·(cos²u1 − cos²u2)/(r1 + r2), both from the half difference
    const dSin = 2 * Math.cos(u1 + 0.5 * du) * Math.sin(0.5 * du);
    const dR = (c * c * Math.sin(du) * Math.sin(2 * u1 + du)) / (r1 + r2);
    const sinD = c * (dSin * r1 + s1 * dR);
    const cosD = r1 * r2 + c * c * s1 * s2;
    return this.s[k] * Math.atan2(sinD, cosD) * DEG;
  }
  /** Longitudes (degrees) in (x1, x2) where arc k reaches its highest or lowest latitude. */
  extremaBetween(k: number, x1: number, x2: number, out: number[]): void {
    out.length = 0;
    const lo = Math.min(x1, x2) * RAD, hi = Math.max(x1, x2) * RAD, l0 = this.l0[k];
    for (let m = Math.ceil((lo - l0) / Math.PI); l0 + m * Math.PI < hi; m++) {
      const x = (l0 + m * Math.PI) * DEG;
      if (x > Math.min(x1, x2) + 1e-12 && x < Math.max(x1, x2) - 1e-12) out.push(x);
    }
    if (x1 > x2) out.reverse();
  }
  /** Longitude in [x1, x2] where arc k (monotone in y there) reaches y = target. */
  xAtY(k: number, x1: number, y1: number, x2: number, y2: number, target: number): number {
    if (target === y1) return x1;
    if (target === y2) return x2;
    // closed form: tan²u = (c² − y²) / (y² nz²); the piece lies within one half-period
    // (mπ, (m+1)π) of u, where the two roots are mπ + a and mπ + π − a; the sign of y picks one
    const c = this.c[k], l0 = this.l0[k], nz = this.nz[k];
    const a = Math.atan2(Math.sqrt(Math.max(0, (c - target) * (c + target))), Math.abs(target * nz));
    const m = Math.floor((0.5 * (x1 + x2) * RAD - l0) / Math.PI);
    let u = m * Math.PI + a;
    if (this.s[k] * Math.cos(u) * target < 0) u = m * Math.PI + Math.PI - a;
    const x = (u + l0) * DEG;
    const lo = Math.min(x1, x2), hi = Math.max(x1, x2);
    if (x >= lo && x <= hi && Math.abs(this.y(k, x) - target) <= 1e-12) return x;
    return this.bisect(k, x1, y1, x2, target);
  }
  /** Bisection on a monotone piece, where the closed form is ill-conditioned. */
  private bisect(k: number, x1: number, y1: number, x2: number, target: number): number {
    let a = x1, b = x2, ya = y1 - target;
    for (let it = 0; it < 64; it++) {
      const m = 0.5 * (a + b);
      if (m === a || m === b) break;
      const ym = this.y(k, m) - target;
      if (ym === 0) return m;
      if (ym > 0 === ya > 0) {
        a = m;
        ya = ym;
      } else b = m;
    }
    return 0.5 * (a + b);
  }
}

function grow(a: Float64Array): Float64Array {
  const b = new Float64Array(a.length * 2);
  b.set(a);
  return b;
}

/** Vertices (x, y) and, per vertex, the edge that ends there: an arc index or -1 for straight. */
export class PolyBuffer {
  xy: Float64Array;
  edge: Int32Array;
  n = 0;
  constructor(capacity = 64) {
    this.xy = new Float64Array(capacity * 2);
    this.edge = new Int32Array(capacity);
  }
  clear(): void {
    this.n = 0;
  }
  /** Add a vertex reached by a straight edge (arc = -1) or along arc `arc`. */
  push(x: number, y: number, arc = -1): void {
    if (this.n === this.edge.length) {
      const b = new Float64Array(this.xy.length * 2);
      b.set(this.xy);
      this.xy = b;
      const e = new Int32Array(this.edge.length * 2);
      e.set(this.edge);
      this.edge = e;
    }
    this.xy[2 * this.n] = x;
    this.xy[2 * this.n + 1] = y;
    this.edge[this.n] = arc;
    this.n++;
  }
}

const scratch = new PolyBuffer(256);

/** Keep the part of `src` where coordinate `axis` (0 = x, 1 = y) lies in [lo, hi]; result into `dst`. */
export function clipSlab(src: PolyBuffer, dst: PolyBuffer, axis: 0 | 1, lo: number, hi: number, arcs: ArcTable): void {
  clipHalf(src, scratch, axis, lo, 1, arcs);
  clipHalf(scratch, dst, axis, hi, -1, arcs);
}

/** Keep side·(coordinate − bound) >= 0. */
function clipHalf(src: PolyBuffer, dst: PolyBuffer, axis: 0 | 1, bound: number, side: 1 | -1, arcs: ArcTable): void {
  dst.clear();
  const n = src.n;
  if (n === 0) return;
  const a = src.xy;
  let px = a[2 * (n - 1)], py = a[2 * (n - 1) + 1];
  let pin = side * ((axis === 0 ? px : py) - bound) >= 0;
  for (let i = 0; i < n; i++) {
    const cx = a[2 * i], cy = a[2 * i + 1];
    const arc = src.edge[i];
    const cin = side * ((axis === 0 ? cx : cy) - bound) >= 0;
    if (cin !== pin) {
      let ix: number, iy: number;
      if (axis === 0) {
        ix = bound;
        iy = arc >= 0 ? arcs.y(arc, bound) : py + ((bound - px) / (cx - px)) * (cy - py);
      } else {
        iy = bound;
        ix = arc >= 0 ? arcs.xAtY(arc, px, py, cx, cy, bound) : px + ((bound - py) / (cy - py)) * (cx - px);
      }
      // leaving: the cut keeps the arc up to the crossing; entering: the crossing is reached along the clip line
      dst.push(ix, iy, pin ? arc : -1);
    }
    if (cin) dst.push(cx, cy, arc);
    px = cx;
    py = cy;
    pin = cin;
  }
}

/** Signed area in the frame (degrees × sin-latitude units), positive counter-clockwise: −∮ y dx. */
export function polygonArea(p: PolyBuffer, arcs: ArcTable | null = null): number {
  const a = p.xy, n = p.n;
  if (n < 3) return 0;
  let s = 0;
  // measured from the first vertex's y: the same area with less cancellation for thin polygons
  const y0 = a[1];
  let px = a[2 * (n - 1)], py = a[2 * (n - 1) + 1] - y0;
  for (let i = 0; i < n; i++) {
    const x = a[2 * i], y = a[2 * i + 1] - y0;
    const arc = p.edge[i];
    if (arc >= 0 && arcs && x !== px) s -= arcs.integral(arc, px, x) - y0 * (x - px);
    else s -= 0.5 * (py + y) * (x - px);
    px = x;
    py = y;
  }
  return s;
}

/** Bounding box [xmin, xmax, ymin, ymax] of the vertices (arcs are split at their extremes, so this holds). */
export function bbox(p: PolyBuffer): [number, number, number, number] {
  let x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity;
  for (let i = 0; i < p.n; i++) {
    const x = p.xy[2 * i], y = p.xy[2 * i + 1];
    if (x < x0) x0 = x;
    if (x > x1) x1 = x;
    if (y < y0) y0 = y;
    if (y > y1) y1 = y;
  }
  return [x0, x1, y0, y1];
}
