import { describe, expect, it } from 'vitest';
import { snapshotSums } from '../../../app/spinup/snapshot-sums.js';
import { cellsWhere } from '../../../app/regions/region.js';
import { inventoryUnits } from '../../../app/spinup/inventory-units.js';
import { EARTH_RADIUS_M } from '../../../app/grid/types.js';
import type { LayerSpec } from '../../../app/spinup/types.js';
import { gridFromEdges, memoryField, MMOL_M3, UMOL_KG } from '../memory-field.js';

// A 2 x 2 x 2 grid: longitudes 0–10–20 °E, latitudes 0–10–30 °N, layers 0–100–300 m.
// Cell area on a sphere, exact geometry: R² Δλ (sin φ2 − sin φ1), R = 6 371 008.8 m (GRS 80 mean radius, Moritz 2000).
const R2 = EARTH_RADIUS_M * EARTH_RADIUS_M;
const dLon = (10 * Math.PI) / 180;
const s = (deg: number): number => Math.sin((deg * Math.PI) / 180);
const A_south = R2 * dLon * (s(10) - s(0)); // row j = 0
const A_north = R2 * dLon * (s(30) - s(10)); // row j = 1
const nan = NaN;
// level 0 (0–100 m): [1, 2 | 3, land]; level 1 (100–300 m): [4, 5 | land, land]
const data = Float32Array.from([1, 2, 3, nan, 4, 5, nan, nan]);
const grid = gridFromEdges([0, 10, 20], [0, 10, 30], [0, 100, 300]);
/** region cells from a 0/1 mask */
const region = (name: string, mask: number[]) => ({ name, cells: cellsWhere(mask.length, (c) => mask[c] === 1) });
const layers: LayerSpec[] = [
  { kind: 'all' },
  { kind: 'interval', top: 0, bottom: 200 },
  { kind: 'bottom' },
];

describe('volume-weighted sums and inventory, computed by hand on a small grid', () => {
  it('sums Σ c·V and V per layer; a level straddling a layer edge counts with the part inside', async () => {
    const f = memoryField(grid, data, { file: 'hand.nc', variable: 'PO4' });
    const [global, west] = await snapshotSums(f, 0, [region('global', [1, 1, 1, 1]), region('west', [1, 0, 1, 0])], layers);
    const cvAll = (1 * A_south + 2 * A_south + 3 * A_north) * 100 + (4 * A_south + 5 * A_south) * 200;
    const vAll = (2 * A_south + A_north) * 100 + 2 * A_south * 200;
    expect(global[0].sumCV / cvAll - 1).toBeCloseTo(0, 12);
    expect(global[0].volume / vAll - 1).toBeCloseTo(0, 12);
    // 0–200 m: all of level 0, half of level 1
    const cv200 = (1 * A_south + 2 * A_south + 3 * A_north) * 100 + (4 * A_south + 5 * A_south) * 100;
    expect(global[1].sumCV / cv200 - 1).toBeCloseTo(0, 12);
    // bottom: deepest wet cell of each column (4 and 5 at 100–300 m, 3 at 0–100 m)
    const cvBottom = (4 * A_south + 5 * A_south) * 200 + 3 * A_north * 100;
    const vBottom = 2 * A_south * 200 + A_north * 100;
    expect(global[2].sumCV / cvBottom - 1).toBeCloseTo(0, 12);
    expect(global[2].volume / vBottom - 1).toBeCloseTo(0, 12);
    expect(global[2].n).toBe(3);
    // the western column only
    expect(west[0].sumCV / ((1 * A_south + 3 * A_north) * 100 + 4 * A_south * 200) - 1).toBeCloseTo(0, 12);
  });

  it('turns mmol m-3 x m³ into mol (1 mmol = 1e-3 mol)', async () => {
    const inv = inventoryUnits(MMOL_M3, 1025);
    expect(inv.units).toBe('mol');
    expect(inv.factor).toBe(1e-3);
    expect(inv.note).toBeUndefined();
    const f = memoryField(grid, data, { file: 'hand.nc', variable: 'PO4' });
    const [[all]] = await snapshotSums(f, 0, [region('global', [1, 1, 1, 1])], layers.slice(0, 1));
    const molByHand = 1e-3 * ((1 * A_south + 2 * A_south + 3 * A_north) * 100 + (4 * A_south + 5 * A_south) * 200);
    expect((all.sumCV * inv.factor) / molByHand - 1).toBeCloseTo(0, 12);
  });

  it('turns µmol kg-1 into mol with a nominal density of 1025 kg m-3 and says so (common practice)', () => {
    const inv = inventoryUnits(UMOL_KG, 1025);
    expect(inv.units).toBe('mol');
    expect(inv.factor).toBeCloseTo(1e-6 * 1025, 18);
    expect(inv.note).toMatch(/nominal seawater density of 1025 kg m⁻³/);
  });
});
