/**
 * The mean over cells of the correlation between a run's and the reference's 12-month cycles, per
 * region × layer, fed one level at a time: each cell's correlation is weighted by its volume in the layer
 * (area × metres of the level inside the layer; area for 2-D fields). Cells where either cycle is flat or
 * misses a month take no part. The bottom layer is not followed (its cells change level from column to
 * column), so it gets no value.
 */
import type { VerticalAxis } from '../grid/types.js';
import { layerLevelMetres, type LayerSpec } from '../regions/layers.js';
import type { Region } from '../regions/region.js';
import { cycleCorrelation } from '../stats/seasonal-cycle.js';

export interface CellCorrelation {
  /** weighted mean of the cells' correlations, null when no cell has one */
  mean: number | null;
  cells: number;
}

export class CycleCorrelationAccumulator {
  private readonly metres: (Float64Array | null)[];
  private readonly sum: Float64Array[];
  private readonly weight: Float64Array[];
  private readonly count: Float64Array[];
  private r = new Float64Array(0);

  constructor(
    private readonly regions: Region[],
    private readonly layers: LayerSpec[],
    vertical: VerticalAxis | null,
    private readonly area: Float64Array,
  ) {
    this.metres = layers.map((l) => {
      if (l.kind === 'bottom') return null;
      if (vertical) return layerLevelMetres(l, vertical);
      return l.kind === 'surface' || l.kind === 'all' ? Float64Array.of(1) : null;
    });
    this.sum = regions.map(() => new Float64Array(layers.length));
    this.weight = regions.map(() => new Float64Array(layers.length));
    this.count = regions.map(() => new Float64Array(layers.length));
  }

  addLevel(k: number, model: readonly Float32Array[], ref: readonly Float32Array[]): void {
    const n = this.area.length;
    if (this.r.length !== n) this.r = new Float64Array(n);
    const a = new Float64Array(12);
    const b = new Float64Array(12);
    for (let c = 0; c < n; c++) {
      for (let m = 0; m < 12; m++) {
        a[m] = model[m][c];
        b[m] = ref[m][c];
      }
      this.r[c] = cycleCorrelation(a, b);
    }
    this.regions.forEach((region, ri) => {
      let s = 0;
      let w = 0;
      let cnt = 0;
      for (const c of region.cells) {
        const rc = this.r[c];
        if (rc === rc) {
          s += this.area[c] * rc;
          w += this.area[c];
          cnt++;
        }
      }
      if (w === 0) return;
      for (let l = 0; l < this.layers.length; l++) {
        const h = this.metres[l]?.[k] ?? 0;
        if (h > 0) {
          this.sum[ri][l] += s * h;
          this.weight[ri][l] += w * h;
          this.count[ri][l] += cnt;
        }
      }
    });
  }

  result(region: number, layer: number): CellCorrelation {
    const w = this.weight[region][layer];
    return { mean: w > 0 ? this.sum[region][layer] / w : null, cells: this.count[region][layer] };
  }
}
