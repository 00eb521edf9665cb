/**
 * A comparison by month converts per-volume to per-mass units with that month's own TEOS-10 density, from the
 * reference's monthly temperature and salinity; with one T and S (a "mean") every month takes the year's.
 * Held against tests/fixtures/density-months/expected.json (make_density_months.py): xarray's
 * groupby('time.month') with day-count weights for T, S and the run, gsw.rho(SR_from_SP(SP),
 * CT_from_pt(SA, pt), p_from_z(-depth, 45)) for the density (python3-gsw, TEOS-10), and
 * umol kg-1 = mmol m-3 × 1000 / rho (common practice).
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { openPair } from '../../../app/compare/open-pair.js';
import { runComparison } from '../../../app/compare/run.js';
import { loadRecipe } from '../../../app/recipe/load.js';

const HERE = resolve(__dirname, '../../fixtures/density-months');
const expected = JSON.parse(readFileSync(join(HERE, 'expected.json'), 'utf8')) as Record<string, (number | null)[][]>;
const work = mkdtempSync(join(tmpdir(), 'sw-density-months-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));
const CELLS = 12; // 4 × 3 per level, 2 levels

/** Largest relative difference between our months of level k and the expected ones (cells both have). */
function worst(ours: Float32Array[], want: (number | null)[][], k: number): number {
  let w = 0;
  for (let m = 0; m < 12; m++) {
    for (let c = 0; c < CELLS; c++) {
      const e = want[m][k * CELLS + c];
      if (e === null) {
        expect(Number.isNaN(ours[m][c])).toBe(true);
        continue;
      }
      w = Math.max(w, Math.abs(ours[m][c] - e) / Math.abs(e));
    }
  }
  return w;
}

describe('density by month', () => {
  it("converts each month with that month's TEOS-10 density from the reference's monthly T and S (xarray + gsw)", async () => {
    const recipe = await loadRecipe(join(HERE, 'recipe-months.json'));
    const pair = await openPair(recipe, 'X', { cacheDir: work, monthlyRows: true });
    try {
      const run = await pair.runs[0].open();
      for (let k = 0; k < 2; k++) {
        const months = await run.months(k);
        // float32 fields and the 75-term density (Roquet et al. 2015) against gsw: within 2e-6 relative
        expect(worst(months, expected.runMonths, k)).toBeLessThan(2e-6);
        // the year's density would be off by up to ~0.4 % at the surface: the check can tell the two apart
        if (k === 0) expect(worst(months, expected.runMonthsYearDensity, k)).toBeGreaterThan(1e-3);
      }
      expect(run.conversions).toContain("each month converted with TEOS-10 density from that month's T and S of the reference");
    } finally {
      await pair.close();
    }
  });

  it('the year of a monthly pair is the day-weighted mean of the converted months, as its annual skill rows are', async () => {
    const recipe = await loadRecipe(join(HERE, 'recipe-months.json'));
    const pair = await openPair(recipe, 'X', { cacheDir: work, monthlyRows: true });
    try {
      const run = await pair.runs[0].open();
      // days of each month over 1999-2000 in the standard calendar (2000 is a leap year)
      const days = [62, 57, 62, 60, 62, 60, 62, 62, 60, 62, 60, 62];
      expect(Array.from(run.monthWeights!)).toEqual(days);
      const year = await run.level(0);
      const total = days.reduce((a, b) => a + b, 0);
      for (let c = 0; c < CELLS; c++) {
        const e = expected.runMonths.map((m) => m[c]);
        if (e[0] === null) continue;
        const want = e.reduce<number>((s, v, m) => s + (v as number) * days[m], 0) / total;
        expect(Math.abs(year[c] - want) / want).toBeLessThan(2e-6);
      }
    } finally {
      await pair.close();
    }
  });

  it("T and S given as one mean: every month takes the year's density, and the conversions say so", async () => {
    const recipe = await loadRecipe(join(HERE, 'recipe-year-ts.json'));
    const pair = await openPair(recipe, 'X', { cacheDir: work, monthlyRows: true });
    try {
      const run = await pair.runs[0].open();
      for (let k = 0; k < 2; k++) expect(worst(await run.months(k), expected.runMonthsYearDensity, k)).toBeLessThan(2e-6);
      expect(run.conversions).toContain("every month converted with TEOS-10 density from the year's T and S of the reference (they give no months)");
    } finally {
      await pair.close();
    }
  });

  it("the comparison's notes say which density the months used", async () => {
    const recipe = await loadRecipe(join(HERE, 'recipe-months.json'));
    const result = await runComparison(recipe, { cacheDir: work });
    const notes = result.variables[0].conversions.filter((c) => c.source === 'Run').map((c) => c.note);
    expect(notes).toContain("each month converted with TEOS-10 density from that month's T and S of the reference");
    expect(result.rows.filter((r) => r.period === 'JAN')).toHaveLength(1);
  });
});
