/**
 * The period choice of the view services on the monthly fixtures of tests/fixtures/time (reference: a noleap
 * run read as a monthly climatology; run: a standard-calendar run with a leap year), held against xarray's
 * time grouping with day-count weights (tests/fixtures/views-periods/expected.json, written by
 * make_views_periods.py from Debian's python3-xarray). Also the bad-input sentences: a period the recipe has no
 * data for, the bottom for a monthly cycle.
 */
import { readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve, sep } from 'node:path';
import { mkdtempSync, rmSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { StillwaterError } from '../../../app/errors.js';
import type { ServiceContext } from '../../../app/services/types.js';
import { closeAllViewSessions, viewsServices } from '../../../app/services/views.js';
import { screenSectionSchema } from '../../../app/recipe/screen-schema.js';
import { MONTH_NAMES } from '../../../app/time/periods.js';
import type { LevelData, ProfileCycleData, ProfileData, SectionData, SessionInfo } from '../../../contract/view-types.js';

const FX = resolve(__dirname, '../../fixtures');
const HERE = join(FX, 'views-periods');
const expected = JSON.parse(readFileSync(join(HERE, 'expected.json'), 'utf8'));
const work = mkdtempSync(join(tmpdir(), 'sw-view-periods-'));

const ctx: ServiceContext = {
  roots: [FX, work],
  cacheDir: join(work, 'cache'),
  signal: new AbortController().signal,
  progress: () => undefined,
  resolvePath(p) {
    const abs = resolve(p);
    if (![FX, work].some((r) => abs === r || abs.startsWith(r + sep))) throw new StillwaterError('E_FILE', `${p}: outside the folders this workbench may read.`, { file: p });
    return abs;
  },
};

function call<T>(name: string, input: unknown): Promise<T> {
  const e = viewsServices.find((x) => x.name === name);
  if (!e) throw new Error(`no service ${name}`);
  return e.run(e.input.parse(input), ctx) as Promise<T>;
}

/** Float32 values against xarray's float64 (null: NaN). */
function expectClose(got: ArrayLike<number>, want: (number | null)[]): void {
  expect(got.length).toBe(want.length);
  for (let i = 0; i < want.length; i++) {
    const w = want[i];
    if (w === null) expect(Number.isNaN(got[i])).toBe(true);
    else expect(Math.abs(got[i] - w)).toBeLessThan(1e-5 * Math.max(1, Math.abs(w)));
  }
}

/** The first level (12 cells) of an xarray level list of (depth, lat, lon) = (2, 3, 4). */
const level0 = (v: (number | null)[]) => v.slice(0, 12);

let info: SessionInfo;
beforeAll(async () => {
  info = await call<SessionInfo>('view.open', { recipe: join(HERE, 'recipe.json') });
}, 60_000);
afterAll(async () => {
  await closeAllViewSessions();
  rmSync(work, { recursive: true, force: true });
});

describe('periods of a monthly recipe', () => {
  it('the session offers the year, the 12 months and the 4 seasons', () => {
    expect(info.periods).toEqual(['annual', ...MONTH_NAMES, 'DJF', 'MAM', 'JJA', 'SON']);
    expect(info.periodsNote).toBeUndefined();
    // the fixture's common grid is the reference's 4 × 3 × 2 grid, edges as the expected values assume
    expect([...info.grid.latEdges]).toEqual(expected.latEdges);
  });

  it("a month's map is that month's climatology of each source (xarray groupby('time.month'), day weights)", async () => {
    for (const m of [0, 1, 6]) {
      const d = await call<LevelData>('view.level', { session: info.session, variable: 'X', run: 'Run', layer: 'k:0', period: MONTH_NAMES[m] });
      expect(d.period).toBe(MONTH_NAMES[m]);
      expectClose(d.model, level0(expected.run.months[m]));
      expectClose(d.reference, level0(expected.reference.months[m]));
      const diff = level0(expected.run.months[m]).map((x: number | null, c: number) => (x === null ? null : x - expected.reference.months[m][c]));
      expectClose(d.difference, diff);
    }
  });

  it("a season's map is the season's day-weighted mean (xarray groupby('time.season'))", async () => {
    for (const s of ['DJF', 'JJA'] as const) {
      const d = await call<LevelData>('view.level', { session: info.session, variable: 'X', run: 'Run', layer: 'k:0', period: s });
      expectClose(d.model, level0(expected.run.seasons[s]));
      expectClose(d.reference, level0(expected.reference.seasons[s]));
    }
  });

  it('April and October differ, and the year is neither (the fixture has a cosine cycle of amplitude 2 peaking in April)', async () => {
    const get = (period: string) => call<LevelData>('view.level', { session: info.session, variable: 'X', run: 'Run', layer: 'k:0', period });
    const [apr, oct, year] = await Promise.all([get('APR'), get('OCT'), get('annual')]);
    expect(year.period).toBe('annual');
    expect(apr.model[5] - oct.model[5]).toBeGreaterThan(2);
    expect(year.model[5]).toBeLessThan(apr.model[5] - 1);
    expect(year.model[5]).toBeGreaterThan(oct.model[5] + 1);
  });

  it("a section and a profile of a month are built from that month's levels", async () => {
    const sec = await call<SectionData>('view.section', { session: info.session, variable: 'X', run: 'Run', kind: 'meridian', at: 135, period: 'MAR' });
    expect(sec.period).toBe('MAR');
    // the meridian 135° E is grid column 1: level-major values [k * ny + j], the cells j * nx + 1
    const want = [0, 1].flatMap((k) => [0, 1, 2].map((j) => expected.run.months[2][k * 12 + j * 4 + 1]));
    expectClose(sec.model, want);
    const prof = await call<ProfileData>('view.profile', { session: info.session, variable: 'X', region: 'global', period: 'JAN' });
    expect(prof.period).toBe('JAN');
    // the profile's means are the monthly cycle's January column (same cells, same weights)
    const cyc = expected.globalCycle;
    expect(prof.reference[0]).toBeCloseTo(cyc.reference[0], 5);
    expect(prof.reference[1]).toBeCloseTo(cyc.reference[12], 5);
    expect(prof.runs[0].values[0]).toBeCloseTo(cyc.model[0], 5);
    expect(prof.runs[0].values[1]).toBeCloseTo(cyc.model[12], 5);
  });

  it('the monthly cycle of the global mean, month × depth, with the run minus the reference (area-weighted, xarray months)', async () => {
    const d = await call<ProfileCycleData>('view.profileCycle', { session: info.session, variable: 'X', run: 'Run', region: 'global', layer: 'all' });
    expect(d.firstLevel).toBe(0);
    expect(d.depthEdges.length).toBe(3);
    expectClose(d.reference, expected.globalCycle.reference);
    expectClose(d.model, expected.globalCycle.model);
    expectClose(d.difference, expected.globalCycle.difference);
    // noleap months: 31, 28, 31, ... days (CF calendar "noleap")
    expect([...d.monthDays].slice(0, 3)).toEqual([31 * 3, 28 * 3, 31 * 3]);
    // a layer of the upper 20 m holds the first level alone (5 m; the second is centred at 50 m)
    const upper = await call<ProfileCycleData>('view.profileCycle', { session: info.session, variable: 'X', run: 'Run', region: 'global', layer: 'layer:0-20' });
    expect(upper.reference.length).toBe(12);
    expectClose(upper.reference, expected.globalCycle.reference.slice(0, 12));
  });

  it('the saved view carries the period and the monthly-cycle choice', () => {
    expect(screenSectionSchema.parse({ period: 'JJA', profileCycle: true })).toEqual({ period: 'JJA', profileCycle: true });
    expect(() => screenSectionSchema.parse({ period: 'June' })).toThrow();
  });
});

describe('bad input', () => {
  it('the bottom has no depth axis for a monthly cycle: one sentence', async () => {
    await expect(call('view.profileCycle', { session: info.session, variable: 'X', run: 'Run', region: 'global', layer: 'bottom' })).rejects.toThrow(/needs levels or a depth layer/);
  });

  it('a period that is not a period is refused by the schema', async () => {
    await expect(async () => call('view.level', { session: info.session, variable: 'X', run: 'Run', layer: 'k:0', period: 'winter' })).rejects.toThrow(/Invalid option/);
  });

  it('a recipe with seasons only refuses a month, naming options.periods', async () => {
    const s = await call<SessionInfo>('view.open', { recipe: join(HERE, 'recipe-seasons.json') });
    expect(s.periods).toEqual(['annual', 'DJF', 'MAM', 'JJA', 'SON']);
    const e = await call('view.level', { session: s.session, variable: 'X', run: 'Run', layer: 'k:0', period: 'JAN' }).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(StillwaterError);
    expect((e as StillwaterError).code).toBe('E_INPUT');
    expect((e as Error).message).toBe('There is no JAN to show: the recipe\'s options.periods asks for "seasons" only.');
    const jja = await call<LevelData>('view.level', { session: s.session, variable: 'X', run: 'Run', layer: 'k:0', period: 'JJA' });
    expectClose(jja.model, level0(expected.run.seasons.JJA));
  });

  it('a recipe that compares the year only offers the year, says why, and refuses a month and the monthly cycle', async () => {
    const s = await call<SessionInfo>('view.open', { recipe: join(HERE, 'recipe-annual.json') });
    expect(s.periods).toEqual(['annual']);
    expect(s.periodsNote).toMatch(/compares the year only/);
    await expect(call('view.section', { session: s.session, variable: 'X', run: 'Run', kind: 'meridian', at: 135, period: 'JJA' })).rejects.toThrow(/There is no JJA to show\. The recipe compares the year only/);
    await expect(call('view.profileCycle', { session: s.session, variable: 'X', run: 'Run', region: 'global', layer: 'all' })).rejects.toThrow(/no monthly cycle/);
  });
});
