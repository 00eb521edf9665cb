import type { Grid } from '../grid/types.js';

function sameArray(a: Float64Array, b: Float64Array, tol: number): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (Math.abs(a[i] - b[i]) > tol) return false;
  return true;
}

/** null when two grids are the same (to 1e-6 degree and 1e-3 m), else what differs, in words. */
export function gridDifference(a: Grid, b: Grid): string | null {
  const ha = a.horizontal;
  const hb = b.horizontal;
  if (ha.nx !== hb.nx || ha.ny !== hb.ny) return `${hb.nx} x ${hb.ny} cells instead of ${ha.nx} x ${ha.ny}`;
  if (!sameArray(ha.lon, hb.lon, 1e-6) || !sameArray(ha.lat, hb.lat, 1e-6)) return 'cell centres at other longitudes or latitudes';
  const va = a.vertical;
  const vb = b.vertical;
  if (!va !== !vb) return va ? 'no depth axis' : 'a depth axis where the first has none';
  if (va && vb) {
    if (va.nz !== vb.nz) return `${vb.nz} depth levels instead of ${va.nz}`;
    if (!sameArray(va.edges, vb.edges, 1e-3)) return 'other depth levels';
  }
  return null;
}
