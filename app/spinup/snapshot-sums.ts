import type { Grid } from '../grid/types.js';
import type { LayerSpec } from '../regions/layers.js';
import type { Region } from '../regions/region.js';
import { layerFractions } from './layer-fractions.js';
import type { SnapshotSums } from './types.js';

/** The part of a FieldSource the sums need: a grid and one level at a time. */
export interface LevelReader {
  grid: Grid;
  readLevel(t: number, k: number): Promise<Float32Array>;
}

/**
 * Volume-weighted sums of one snapshot of one tracer for every region x layer, reading one level at a time:
 * memory holds one level plus, for the bottom layer, the deepest wet value of each column.
 * Cell volume = cell area x level thickness (x the fraction of the level inside the layer); 2-D fields use
 * the cell area. Result is indexed [region][layer].
 */
export async function snapshotSums(src: LevelReader, t: number, regions: Pick<Region, 'name' | 'cells'>[], layers: LayerSpec[]): Promise<SnapshotSums[][]> {
  const { horizontal, vertical } = src.grid;
  const area = horizontal.area;
  const nz = vertical ? vertical.nz : 1;
  const fractions = layerFractions(layers, vertical);
  const out: SnapshotSums[][] = regions.map(() => layers.map(() => ({ sumCV: 0, volume: 0, n: 0 })));
  const wantBottom = layers.some((l) => l.kind === 'bottom');
  const ncell = horizontal.nx * horizontal.ny;
  const bottomValue = wantBottom ? new Float64Array(ncell).fill(NaN) : null;
  const bottomLevel = wantBottom ? new Int16Array(ncell).fill(-1) : null;
  for (let k = 0; k < nz; k++) {
    const level = await src.readLevel(t, k);
    const thickness = vertical ? vertical.thickness[k] : 1;
    for (let r = 0; r < regions.length; r++) {
      const cells = regions[r].cells;
      let sumCA = 0;
      let sumA = 0;
      let n = 0;
      for (let i = 0; i < cells.length; i++) {
        const c = cells[i];
        const v = level[c];
        if (v === v) {
          sumCA += v * area[c];
          sumA += area[c];
          n++;
        }
      }
      for (let l = 0; l < layers.length; l++) {
        const f = fractions[l];
        if (!f || f[k] === 0) continue;
        const acc = out[r][l];
        acc.sumCV += sumCA * thickness * f[k];
        acc.volume += sumA * thickness * f[k];
        acc.n += n;
      }
    }
    if (bottomValue && bottomLevel) {
      for (let c = 0; c < ncell; c++) {
        const v = level[c];
        if (v === v) {
          bottomValue[c] = v;
          bottomLevel[c] = k;
        }
      }
    }
  }
  if (bottomValue && bottomLevel) {
    for (let l = 0; l < layers.length; l++) {
      if (layers[l].kind !== 'bottom') continue;
      for (let r = 0; r < regions.length; r++) {
        const acc = out[r][l];
        for (const c of regions[r].cells) {
          const k = bottomLevel[c];
          if (k < 0) continue;
          const vol = area[c] * (vertical ? vertical.thickness[k] : 1);
          acc.sumCV += bottomValue[c] * vol;
          acc.volume += vol;
          acc.n++;
        }
      }
    }
  }
  return out;
}
