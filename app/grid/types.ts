import type { CornerLattice } from './corners.js';

/**
 * The grid model. Index order is always row-major with longitude fastest:
 * cell (j, i) is at j * nx + i; a 3-D cell (k, j, i) at (k * ny + j) * nx + i; k = 0 is the top layer.
 */

/** Mean Earth radius R1 of GRS 80 (Moritz 2000), metres. */
export const EARTH_RADIUS_M = 6_371_008.8;

export interface RectilinearAxes {
  /** cell-centre longitudes (nx), degrees east, as in the file (monotonic increasing after normalisation) */
  lon: Float64Array;
  /** cell-centre latitudes (ny), degrees north, increasing */
  lat: Float64Array;
  /** cell edges (nx + 1), degrees east */
  lonEdges: Float64Array;
  /** cell edges (ny + 1), degrees north */
  latEdges: Float64Array;
}

export interface HorizontalGrid {
  kind: 'rectilinear' | 'curvilinear';
  nx: number;
  ny: number;
  /** cell-centre longitude per cell (ny * nx), degrees east */
  lon: Float64Array;
  /** cell-centre latitude per cell (ny * nx), degrees north */
  lat: Float64Array;
  /**
   * cell corners, 4 per cell (ny * nx * 4), counter-clockwise seen from above:
   * (i-, j-), (i+, j-), (i+, j+), (i-, j+). Degrees.
   */
  cornerLon: Float64Array;
  cornerLat: Float64Array;
  /**
   * Curvilinear grids whose cells share their corners keep each corner once (grid/corners.ts); cornerLon
   * and cornerLat are then made when first asked for. Read corners through cellCorners where cost matters.
   */
  lattice?: CornerLattice;
  /** present for rectilinear grids only */
  axes?: RectilinearAxes;
  /** true when bounds were derived from centres rather than read from the file */
  boundsDerived: boolean;
  /** true when the grid wraps around in longitude */
  periodic: boolean;
  /** cell area on the sphere, m² (ny * nx) */
  area: Float64Array;
}

export interface VerticalAxis {
  nz: number;
  /** level centres, metres, positive down */
  centres: Float64Array;
  /** layer edges (nz + 1), metres, positive down, increasing */
  edges: Float64Array;
  /** edges[k+1] - edges[k] */
  thickness: Float64Array;
  boundsDerived: boolean;
}

export interface Grid {
  horizontal: HorizontalGrid;
  /** null for 2-D (surface or single-level) fields */
  vertical: VerticalAxis | null;
}
