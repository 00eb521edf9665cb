/**
 * Statistics of one (run, variable) pair for every region × layer at once, fed one depth level at a time.
 * Regions are grouped into partitions (sets of regions that share no cell, such as the basins): per level
 * and partition, one labelled two-pass moment computation weighted by cell area gives every member's
 * moments; a region holding every cell is the exact merge of a partition that covers the grid. Every interval
 * layer then takes a level's moments scaled by the metres of that level inside the layer (weights = area ×
 * overlap = volume). The bottom layer is gathered column by column and summarised at the end.
 */
import type { VerticalAxis } from '../grid/types.js';
import { BottomTracker } from '../regions/bottom.js';
import { layerLevelMetres, type LayerSpec } from '../regions/layers.js';
import type { Region } from '../regions/region.js';
import { emptyMoments, labelledMoments, mergeMoments, pairMoments, type PairMoments } from '../stats/moments.js';

export interface CellResult {
  region: number;
  layer: number;
  moments: PairMoments;
  /** weight (volume, or area for bottom and 2-D fields) of the cells where the reference has data */
  refWeight: number;
  /** why a layer does not apply, if it does not */
  inapplicable?: string;
}

export class PairAccumulator {
  private readonly metres: (Float64Array | null)[];
  private readonly acc: PairMoments[][];
  private readonly refW: Float64Array[];
  /** full depth per region (for the multi-tracer cost) */
  private readonly full: PairMoments[];
  private readonly fullRefW: Float64Array;
  /** whole grid, full depth (for the cost) */
  private readonly globalFull: PairMoments = emptyMoments();
  private readonly partitions: { labels: Int32Array; count: number }[] = [];
  /** where each region's level moments come from: one label of a partition, or all labels merged */
  private readonly sourceOf: { partition: number; label: number | 'all' }[] = [];
  /** the partition whose merge is the whole grid */
  private readonly wholePartition: number;
  private readonly bottom: BottomTracker | null;
  private readonly levelThickness: Float64Array;

  constructor(
    private readonly regions: Region[],
    private readonly layers: LayerSpec[],
    private readonly vertical: VerticalAxis | null,
    private readonly area: Float64Array,
    private readonly bottomTolerance: number | null = null,
  ) {
    // a 2-D field is one level of "thickness" 1: weights are areas; only surface and all apply
    this.metres = layers.map((l) => {
      if (vertical) return l.kind === 'bottom' ? null : layerLevelMetres(l, vertical);
      return l.kind === 'surface' || l.kind === 'all' ? Float64Array.of(1) : null;
    });
    this.levelThickness = vertical ? vertical.thickness : Float64Array.of(1);
    this.acc = regions.map(() => layers.map(() => emptyMoments()));
    this.refW = regions.map(() => new Float64Array(layers.length));
    this.full = regions.map(() => emptyMoments());
    this.fullRefW = new Float64Array(regions.length);
    const ncell = area.length;
    const whole: number[] = [];
    regions.forEach((region, r) => {
      if (region.cells.length === ncell) {
        whole.push(r);
        return;
      }
      let p = this.partitions.findIndex((part) => region.cells.every((c) => part.labels[c] < 0));
      if (p < 0) {
        this.partitions.push({ labels: new Int32Array(ncell).fill(-1), count: 0 });
        p = this.partitions.length - 1;
      }
      const part = this.partitions[p];
      for (const c of region.cells) part.labels[c] = part.count;
      this.sourceOf[r] = { partition: p, label: part.count++ };
    });
    let covering = this.partitions.findIndex((part) => part.labels.every((L) => L >= 0));
    if (covering < 0) {
      this.partitions.push({ labels: new Int32Array(ncell), count: 1 });
      covering = this.partitions.length - 1;
    }
    this.wholePartition = covering;
    for (const r of whole) this.sourceOf[r] = { partition: covering, label: 'all' };
    const wantsBottom = vertical !== null && layers.some((l) => l.kind === 'bottom');
    this.bottom = wantsBottom ? new BottomTracker(area.length) : null;
  }

  addLevel(k: number, model: ArrayLike<number>, ref: ArrayLike<number>): void {
    const thick = this.levelThickness[k];
    const levels = this.partitions.map((part) => labelledMoments(model, ref, this.area, part.labels, part.count));
    const merged = (p: number): { mo: PairMoments; refArea: number } => {
      const mo = emptyMoments();
      let refArea = 0;
      levels[p].moments.forEach((m, L) => {
        mergeMoments(mo, m);
        refArea += levels[p].refWeight[L];
      });
      return { mo, refArea };
    };
    const whole = merged(this.wholePartition);
    for (let r = 0; r < this.regions.length; r++) {
      const src = this.sourceOf[r];
      const { mo, refArea } = src.label === 'all' ? whole : { mo: levels[src.partition].moments[src.label], refArea: levels[src.partition].refWeight[src.label] };
      for (let l = 0; l < this.layers.length; l++) {
        const m = this.metres[l];
        const s = m ? m[k] : 0;
        if (s > 0) {
          mergeMoments(this.acc[r][l], mo, s);
          this.refW[r][l] += refArea * s;
        }
      }
      mergeMoments(this.full[r], mo, thick);
      this.fullRefW[r] += refArea * thick;
    }
    mergeMoments(this.globalFull, whole.mo, thick);
    this.bottom?.update(k, model, ref);
  }

  /** Moments over every cell and the full depth (volume-weighted), for the multi-tracer cost. */
  globalFullDepth(): PairMoments {
    return { ...this.globalFull };
  }

  results(): CellResult[] {
    const out: CellResult[] = [];
    let bottomSel: { model: Float64Array; ref: Float64Array } | null = null;
    let refCols: Float64Array | null = null;
    if (this.bottom && this.vertical) {
      bottomSel = this.bottom.select(this.vertical.centres, this.bottomTolerance);
      refCols = this.bottom.refColumns();
    }
    for (let r = 0; r < this.regions.length; r++) {
      for (let l = 0; l < this.layers.length; l++) {
        const layer = this.layers[l];
        if (layer.kind === 'bottom' && bottomSel && refCols) {
          const cells = this.regions[r].cells;
          out.push({
            region: r,
            layer: l,
            moments: pairMoments(bottomSel.model, bottomSel.ref, this.area, cells),
            refWeight: validWeight(refCols, this.area, cells),
          });
        } else if (this.metres[l] === null) {
          out.push({ region: r, layer: l, moments: emptyMoments(), refWeight: 0, inapplicable: 'a 2-D field has no depth layers' });
        } else {
          out.push({ region: r, layer: l, moments: { ...this.acc[r][l] }, refWeight: this.refW[r][l] });
        }
      }
    }
    return out;
  }

  /** Full-depth moments of one region (all levels, volume-weighted). */
  fullDepth(r: number): { moments: PairMoments; refWeight: number } {
    return { moments: { ...this.full[r] }, refWeight: this.fullRefW[r] };
  }
}

/** Σ weight over the cells (of the list) where `values` is valid. */
function validWeight(values: ArrayLike<number>, weight: ArrayLike<number>, cells: Int32Array): number {
  let s = 0;
  for (let q = 0; q < cells.length; q++) {
    const c = cells[q];
    const v = values[c];
    if (v - v === 0) s += weight[c];
  }
  return s;
}
