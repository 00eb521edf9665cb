import { describe, expect, it } from 'vitest';
import { zonalMeanOfBasin } from '../../../app/lines/zonal-mean.js';
import { edgesOf, gridFromEdges, memoryField } from '../memory-field.js';

// Zonal mean: the area-weighted mean over the basin's cells of a latitude row (common practice). On a
// lat-lon grid every cell of a row has the same area, so it is the plain mean of the row's basin cells.
describe('zonal mean of a basin', () => {
  const lonE = edgesOf(-180, 180, 90); // 4 columns
  const latE = edgesOf(-90, 90, 60); // 3 rows
  const zE = [0, 100, 300];
  // reference: value = column index + 10 × row + 100 × level; one dry cell (row 1, column 2) at level 1
  const ref = new Float32Array(2 * 12);
  for (let k = 0; k < 2; k++) for (let j = 0; j < 3; j++) for (let i = 0; i < 4; i++) ref[k * 12 + j * 4 + i] = i + 10 * j + 100 * k;
  ref[12 + 4 + 2] = NaN;
  const run = ref.map((v) => v + 2);
  const mask = Uint8Array.from([1, 1, 1, 0, 1, 1, 1, 0, 0, 1, 1, 0]); // columns 0..2, except row 2 column 0

  it('averages the basin cells of each row and level, leaving dry cells out', async () => {
    const fields = { reference: { label: 'ref', field: memoryField(gridFromEdges(lonE, latE, zE), ref) }, runs: [{ label: 'run', field: memoryField(gridFromEdges(lonE, latE, zE), run) }] };
    const [r, m, d] = await zonalMeanOfBasin(fields, mask);
    expect(r.role).toBe('reference');
    expect(Array.from(r.values.subarray(0, 3))).toEqual([1, 11, 21.5]); // (0+1+2)/3, (10+11+12)/3, (21+22)/2
    expect(Array.from(r.values.subarray(3, 6))).toEqual([101, 110.5, 121.5]); // row 1 at level 1: (110+111)/2
    expect(Array.from(m.values.subarray(0, 3))).toEqual([3, 13, 23.5]);
    expect(Array.from(d.values)).toEqual([2, 2, 2, 2, 2, 2]);
  });
});
