import { cellCorners } from '../grid/corners.js';
import { EARTH_RADIUS_M, type HorizontalGrid } from '../grid/types.js';
import { ascendingEdges, cellRange } from './edge-search.js';
import { TripletBuilder, type SparseWeights } from './csr.js';
import { ArcTable, PolyBuffer, bbox, clipSlab, polygonArea } from './polygon-clip.js';
import { cellToFrame } from './sphere-polygon.js';

const RAD = Math.PI / 180;

/**
 * First-order conservative weights from a grid of quadrilaterals (curvilinear, corners given, edges
 * great-circle arcs) onto a lat-lon grid. Each source cell is drawn once into the cylindrical equal-area frame
 * (sphere-polygon.ts), cut into the target's latitude bands, then into its longitude columns; the
 * target rows and columns a cell can touch come from its bounding box by binary search, so the cost
 * is proportional to the number of overlaps.
 */
export function conservativeCurvilinear(source: HorizontalGrid, target: HorizontalGrid, radius = EARTH_RADIUS_M): SparseWeights {
  const ta = target.axes!;
  const tLon = ascendingEdges(ta.lonEdges);
  const tLat = ascendingEdges(ta.latEdges);
  const ySin = new Float64Array(tLat.edges.length);
  for (let j = 0; j < ySin.length; j++) ySin[j] = Math.sin(tLat.edges[j] * RAD);
  const x0 = tLon.edges[0], x1 = tLon.edges[tLon.edges.length - 1];
  const tnx = target.nx;
  const nSrc = source.nx * source.ny;
  // a cell overlaps a few target cells at most when the source is finer; the builder grows when it is not
  const b = new TripletBuilder(Math.min(nSrc * 8, 1 << 20));
  const poly = new PolyBuffer(64), strip = new PolyBuffer(64), piece = new PolyBuffer(64);
  const arcs = new ArcTable();
  const cLon = new Float64Array(4), cLat = new Float64Array(4);
  const scale = RAD * radius * radius;
  for (let s = 0; s < nSrc; s++) {
    cellCorners(source, s, cLon, cLat);
    if (!cellToFrame(cLon, cLat, poly, arcs)) continue;
    const [px0, px1, py0, py1] = bbox(poly);
    const [r0, r1] = cellRange(ySin, py0, py1);
    if (r0 >= r1) continue;
    const kmin = Math.ceil((x0 - px1) / 360), kmax = Math.floor((x1 - px0) / 360);
    for (let r = r0; r < r1; r++) {
      clipSlab(poly, strip, 1, ySin[r], ySin[r + 1], arcs);
      if (strip.n < 3) continue;
      const row0 = tLat.index[r] * tnx;
      const [sx0, sx1] = bbox(strip);
      for (let k = kmin; k <= kmax; k++) {
        const [c0, c1] = cellRange(tLon.edges, sx0 + 360 * k, sx1 + 360 * k);
        for (let col = c0; col < c1; col++) {
          clipSlab(strip, piece, 0, tLon.edges[col] - 360 * k, tLon.edges[col + 1] - 360 * k, arcs);
          const a = Math.abs(polygonArea(piece, arcs)) * scale;
          if (a > 0) b.push(row0 + tLon.index[col], s, a);
        }
      }
    }
  }
  return b.toCsr('conservative', target.nx * target.ny, nSrc);
}

/** Area of each source quadrilateral (great-circle edges) as the frame computes it, m². */
export function frameCellAreas(grid: HorizontalGrid, radius = EARTH_RADIUS_M): Float64Array {
  const n = grid.nx * grid.ny;
  const out = new Float64Array(n);
  const poly = new PolyBuffer(64);
  const arcs = new ArcTable();
  const cLon = new Float64Array(4), cLat = new Float64Array(4);
  for (let s = 0; s < n; s++) {
    cellCorners(grid, s, cLon, cLat);
    const ok = cellToFrame(cLon, cLat, poly, arcs);
    out[s] = ok ? Math.abs(polygonArea(poly, arcs)) * RAD * radius * radius : NaN;
  }
  return out;
}
