/**
 * Which stations belong on a map of one depth slice: those whose depth lies in the slice (a level's or a
 * layer's depth interval), or, on the bottom map, those at the seafloor (given as `seafloor`, or within the
 * bottom tolerance of the seafloor of their column; without a tolerance, within the column's deepest cell).
 * A full-depth mean shows every station. The rule is returned as words for the screen.
 */
export interface SliceForStations {
  kind: 'level' | 'interval' | 'bottom' | 'surface' | 'all';
  /** metres, positive down; null for bottom and all */
  top: number | null;
  bottom: number | null;
  /** bottom map only: metres from the seafloor a station may be (null: within the deepest cell) */
  bottomTolerance?: number | null;
}

export interface StationDepths {
  /** metres, positive down; NaN where the station is at the seafloor */
  depth: ArrayLike<number>;
  /** 1 where the depth was given as the seafloor */
  seafloor: ArrayLike<number>;
}

/** The seafloor of a station's column and the top of its deepest wet cell, m; NaN where unknown (land, off the grid). */
export type ColumnFloor = (station: number) => { floor: number; deepestTop: number };

export interface StationSelection {
  shown: Uint8Array;
  nShown: number;
  nHidden: number;
  /** e.g. "stations at 100–500 m", "stations within 200 m of the seafloor" */
  rule: string;
}

export function stationsOnSlice(st: StationDepths, slice: SliceForStations, floorOf: ColumnFloor): StationSelection {
  const n = st.depth.length;
  const shown = new Uint8Array(n);
  const tol = slice.bottomTolerance ?? null;
  for (let i = 0; i < n; i++) {
    const d = st.depth[i];
    if (slice.kind === 'all') shown[i] = 1;
    else if (slice.kind === 'bottom') {
      if (st.seafloor[i]) shown[i] = 1;
      else {
        const { floor, deepestTop } = floorOf(i);
        // a station deeper than its column's seafloor is still a bottom observation of that column
        shown[i] = Number.isFinite(floor) && (tol !== null ? Math.abs(d - floor) <= tol : d >= deepestTop) ? 1 : 0;
      }
    } else if (!st.seafloor[i] && slice.top !== null && slice.bottom !== null) {
      // half-open, so a station on the boundary of two levels shows on one of them
      shown[i] = d >= slice.top && d < slice.bottom ? 1 : 0;
    }
  }
  let nShown = 0;
  for (let i = 0; i < n; i++) nShown += shown[i];
  return { shown, nShown, nHidden: n - nShown, rule: ruleText(slice, tol) };
}

function ruleText(slice: SliceForStations, tol: number | null): string {
  if (slice.kind === 'all') return 'all stations (full-depth mean)';
  if (slice.kind === 'bottom') return tol !== null ? `stations within ${tol} m of the seafloor` : 'stations in the deepest wet cell of their column or at the seafloor';
  return `stations at ${slice.top ?? '?'}–${slice.bottom ?? '?'} m`;
}
