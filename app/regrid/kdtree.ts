/**
 * A static k-d tree over points on the unit sphere (as 3-D unit vectors), for nearest-centre
 * queries that need no special care at the poles or the antimeridian.
 */
export class SphereKdTree {
  private readonly xyz: Float64Array;
  private readonly perm: Int32Array;
  private readonly axis: Int8Array;
  private best = -1;
  private bestD = Infinity;

  /** lon/lat in degrees; points with a NaN coordinate are left out. */
  constructor(lonDeg: Float64Array, latDeg: Float64Array) {
    const n = lonDeg.length;
    this.xyz = new Float64Array(3 * n);
    const ids: number[] = [];
    for (let i = 0; i < n; i++) {
      const lo = lonDeg[i] * (Math.PI / 180), la = latDeg[i] * (Math.PI / 180);
      if (!Number.isFinite(lo) || !Number.isFinite(la)) continue;
      const c = Math.cos(la);
      this.xyz[3 * i] = c * Math.cos(lo);
      this.xyz[3 * i + 1] = c * Math.sin(lo);
      this.xyz[3 * i + 2] = Math.sin(la);
      ids.push(i);
    }
    this.perm = Int32Array.from(ids);
    this.axis = new Int8Array(this.perm.length);
    this.build(0, this.perm.length);
  }

  private build(lo: number, hi: number): void {
    if (hi - lo <= 1) return;
    // split on the axis of largest spread
    let mn0 = Infinity, mx0 = -Infinity, mn1 = Infinity, mx1 = -Infinity, mn2 = Infinity, mx2 = -Infinity;
    for (let p = lo; p < hi; p++) {
      const b = 3 * this.perm[p];
      const x = this.xyz[b], y = this.xyz[b + 1], z = this.xyz[b + 2];
      if (x < mn0) mn0 = x;
      if (x > mx0) mx0 = x;
      if (y < mn1) mn1 = y;
      if (y > mx1) mx1 = y;
      if (z < mn2) mn2 = z;
      if (z > mx2) mx2 = z;
    }
    const s0 = mx0 - mn0, s1 = mx1 - mn1, s2 = mx2 - mn2;
    const ax = s0 >= s1 && s0 >= s2 ? 0 : s1 >= s2 ? 1 : 2;
    const mid = (lo + hi) >> 1;
    this.select(lo, hi - 1, mid, ax);
    this.axis[mid] = ax;
    this.build(lo, mid);
    this.build(mid + 1, hi);
  }

  /** Quickselect: perm[k] gets the k-th smallest coordinate on `ax` within [lo, hi]. */
  private select(lo: number, hi: number, k: number, ax: number): void {
    const perm = this.perm, xyz = this.xyz;
    while (hi > lo) {
      const pivot = xyz[3 * perm[(lo + hi) >> 1] + ax];
      let i = lo, j = hi;
      while (i <= j) {
        while (xyz[3 * perm[i] + ax] < pivot) i++;
        while (xyz[3 * perm[j] + ax] > pivot) j--;
        if (i <= j) {
          const t = perm[i];
          perm[i] = perm[j];
          perm[j] = t;
          i++;
          j--;
        }
      }
      if (k <= j) hi = j;
      else if (k >= i) lo = i;
      else return;
    }
  }

  /** Index of the nearest point and its squared chord distance, or -1 when the tree is empty. */
  nearest(lonDeg: number, latDeg: number): { index: number; chord2: number } {
    const lo = lonDeg * (Math.PI / 180), la = latDeg * (Math.PI / 180);
    const c = Math.cos(la);
    this.best = -1;
    this.bestD = Infinity;
    this.search(0, this.perm.length, c * Math.cos(lo), c * Math.sin(lo), Math.sin(la));
    return { index: this.best, chord2: this.bestD };
  }

  private search(lo: number, hi: number, x: number, y: number, z: number): void {
    if (hi <= lo) return;
    const mid = (lo + hi) >> 1;
    const id = this.perm[mid];
    const b = 3 * id;
    const dx = this.xyz[b] - x, dy = this.xyz[b + 1] - y, dz = this.xyz[b + 2] - z;
    const d = dx * dx + dy * dy + dz * dz;
    if (d < this.bestD || (d === this.bestD && id < this.best)) {
      this.bestD = d;
      this.best = id;
    }
    if (hi - lo === 1) return;
    const ax = this.axis[mid];
    const diff = (ax === 0 ? x : ax === 1 ? y : z) - this.xyz[b + ax];
    if (diff < 0) {
      this.search(lo, mid, x, y, z);
      if (diff * diff <= this.bestD) this.search(mid + 1, hi, x, y, z);
    } else {
      this.search(mid + 1, hi, x, y, z);
      if (diff * diff <= this.bestD) this.search(lo, mid, x, y, z);
    }
  }
}

/** Unit vector of a lon/lat point in degrees. */
export function toXyz(lonDeg: number, latDeg: number): [number, number, number] {
  const lo = lonDeg * (Math.PI / 180), la = latDeg * (Math.PI / 180);
  const c = Math.cos(la);
  return [c * Math.cos(lo), c * Math.sin(lo), Math.sin(la)];
}
