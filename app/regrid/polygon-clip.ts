/**
 * Polygons in a plane frame as flat coordinate buffers (x0, y0, x1, y1, ...), clipped against
 * axis-parallel lines (Sutherland–Hodgman). Against a convex window the clipped area is exact even
 * for concave subjects (degenerate bridges have zero area).
 */
export class PolyBuffer {
  xy: Float64Array;
  n = 0;
  constructor(capacity = 64) {
    this.xy = new Float64Array(capacity * 2);
  }
  clear(): void {
    this.n = 0;
  }
  push(x: number, y: number): void {
    if (2 * this.n + 2 > this.xy.length) {
      const b = new Float64Array(this.xy.length * 2);
      b.set(this.xy);
      this.xy = b;
    }
    this.xy[2 * this.n] = x;
    this.xy[2 * this.n + 1] = y;
    this.n++;
  }
}

/**
 * Keep the part of `src` where coordinate `axis` (0 = x, 1 = y) lies in [lo, hi]; result into `dst`.
 */
export function clipSlab(src: PolyBuffer, dst: PolyBuffer, axis: 0 | 1, lo: number, hi: number): void {
  // two half-planes: c >= lo, then c <= hi, through a scratch buffer
  clipHalf(src, scratch, axis, lo, 1);
  clipHalf(scratch, dst, axis, hi, -1);
}

const scratch = new PolyBuffer(256);

/** Keep side*(c − bound) >= 0. */
function clipHalf(src: PolyBuffer, dst: PolyBuffer, axis: 0 | 1, bound: number, side: 1 | -1): void {
  dst.clear();
  const n = src.n;
  if (n === 0) return;
  const a = src.xy;
  let px = a[2 * (n - 1)], py = a[2 * (n - 1) + 1];
  let pc = axis === 0 ? px : py;
  let pin = side * (pc - bound) >= 0;
  for (let i = 0; i < n; i++) {
    const cx = a[2 * i], cy = a[2 * i + 1];
    const cc = axis === 0 ? cx : cy;
    const cin = side * (cc - bound) >= 0;
    if (cin !== pin) {
      // crossing point on the bound
      const t = (bound - pc) / (cc - pc);
      const po = axis === 0 ? py : px, co = axis === 0 ? cy : cx;
      const other = po + t * (co - po);
      if (axis === 0) dst.push(bound, other);
      else dst.push(other, bound);
    }
    if (cin) dst.push(cx, cy);
    px = cx;
    py = cy;
    pc = cc;
    pin = cin;
  }
}

/** Signed area (shoelace), positive counter-clockwise. */
export function polygonArea(p: PolyBuffer): number {
  const a = p.xy, n = p.n;
  if (n < 3) return 0;
  let s = 0;
  let px = a[2 * (n - 1)], py = a[2 * (n - 1) + 1];
  for (let i = 0; i < n; i++) {
    const x = a[2 * i], y = a[2 * i + 1];
    s += (px - x) * (py + y);
    px = x;
    py = y;
  }
  return 0.5 * s;
}

/** Bounding box [xmin, xmax, ymin, ymax]. */
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
