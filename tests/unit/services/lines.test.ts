// The workbench's line and station services, over the same scenario as the command tests
// (tests/integration/lines-fixture.ts: a field linear in latitude and depth), through the path guard
// of browser mode.
import { mkdtempSync, readFileSync, realpathSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { linesServices, type LineData, type PointsData } from '../../../app/services/lines.js';
import { viewsServices } from '../../../app/services/views.js';
import type { SessionInfo } from '../../../contract/view-types.js';
import type { ServiceContext } from '../../../app/services/types.js';
import { PathGuard } from '../../../main/path-guard.js';
import { makeLineScenario, truth } from '../../integration/lines-fixture.js';

let dir = '';
let ctx: ServiceContext;
let recipe: unknown;
beforeAll(() => {
  dir = realpathSync(makeLineScenario());
  const g = new PathGuard([dir]);
  ctx = { resolvePath: (p) => g.resolve(p), roots: g.roots, cacheDir: join(dir, 'cache'), progress: () => undefined, signal: new AbortController().signal };
  recipe = JSON.parse(readFileSync(join(dir, 'recipe.json'), 'utf8'));
});
const svc = (name: string) => linesServices.find((e) => e.name === name)!;

describe('line and station services', () => {
  it('line.sample takes typed waypoints and returns sections and column means', async () => {
    const input = svc('line.sample').input.parse({ recipe, baseDir: dir, variable: 'PO4', line: { kind: 'waypoints', points: '-40,-30; -20,30' }, spacingKm: 250 });
    const d = (await svc('line.sample').run(input, ctx)) as LineData;
    expect(d.fields.map((f) => f.role)).toEqual(['reference', 'run', 'difference']);
    expect(d.lon).toBeInstanceOf(Float64Array);
    for (let s = 0; s < d.lat.length; s++) expect(d.fields[0].columnMean[s]).toBeCloseTo(truth(d.lat[s], 500), 4);
    expect(d.skill[0].bias).toBeCloseTo(0.5, 5);
  });
  it('points.compare', async () => {
    writeFileSync(join(dir, 'st.csv'), '# units: umol kg-1\nid,lon,lat,depth,value\nA,-28,18,200,1.5\nB,0,0,10,1\n');
    const input = svc('points.compare').input.parse({ recipe, baseDir: dir, variable: 'PO4', stations: join(dir, 'st.csv') });
    const p = (await svc('points.compare').run(input, ctx)) as PointsData;
    expect(p.stations.id).toEqual(['A', 'B']);
    expect(p.stations.units).toBe('umol kg-1');
    expect(p.sources[0].model[0]).toBeCloseTo(truth(18, 200), 5);
    expect(p.sources[0].status).toEqual(['ok', 'on_land']);
    expect(p.problems).toHaveLength(1);
    expect(p.problems[0]).toMatch(/line 4 \(station B at 0, 0, 10 m\): on land in climatology, plus-half/);
  });
  it('line.sample on an open session gives what the same recipe sent as JSON gives', async () => {
    const open = viewsServices.find((e) => e.name === 'view.open')!;
    const info = (await open.run(open.input.parse({ recipe: join(dir, 'recipe.json') }), ctx)) as SessionInfo;
    const line = { kind: 'waypoints', points: '-40,-30; -20,30' };
    const bySession = (await svc('line.sample').run(svc('line.sample').input.parse({ session: info.session, variable: 'PO4', line, spacingKm: 250 }), ctx)) as LineData;
    const byJson = (await svc('line.sample').run(svc('line.sample').input.parse({ recipe, baseDir: dir, variable: 'PO4', line, spacingKm: 250 }), ctx)) as LineData;
    expect(bySession.fields.map((f) => f.label)).toEqual(byJson.fields.map((f) => f.label));
    expect(Array.from(bySession.fields[0].columnMean)).toEqual(Array.from(byJson.fields[0].columnMean));
    expect(bySession.skill).toEqual(byJson.skill);
  });
  it("line.sample on a session samples the session's own levels (read for the map first): every value and note as by JSON", async () => {
    const open = viewsServices.find((e) => e.name === 'view.open')!;
    const level = viewsServices.find((e) => e.name === 'view.level')!;
    const info = (await open.run(open.input.parse({ recipe: join(dir, 'recipe.json') }), ctx)) as SessionInfo;
    await level.run(level.input.parse({ session: info.session, variable: 'PO4', run: info.variables[0].runs[0], layer: 'k:1' }), ctx);
    const line = { kind: 'meridian', lon: -25 };
    const bySession = (await svc('line.sample').run(svc('line.sample').input.parse({ session: info.session, variable: 'PO4', line, spacingKm: 300 }), ctx)) as LineData;
    const byJson = (await svc('line.sample').run(svc('line.sample').input.parse({ recipe, baseDir: dir, variable: 'PO4', line, spacingKm: 300 }), ctx)) as LineData;
    expect(bySession.fields.length).toBeGreaterThan(1);
    expect(bySession).toEqual(byJson);
  });
  it('a call naming neither a session nor a recipe is one sentence', async () => {
    const input = svc('line.sample').input.parse({ variable: 'PO4', line: { kind: 'meridian', lon: 0 } });
    await expect(svc('line.sample').run(input, ctx)).rejects.toThrow(/^Name an open session, or send a recipe with the folder/);
    const gone = svc('line.sample').input.parse({ session: 'no-such-session', variable: 'PO4', line: { kind: 'meridian', lon: 0 } });
    await expect(svc('line.sample').run(gone, ctx)).rejects.toThrow(/session 'no-such-session' is no longer open/);
  });
  it('files outside the allowed folders are refused', async () => {
    const other = mkdtempSync(join(tmpdir(), 'sw-outside-'));
    writeFileSync(join(other, 'st.csv'), 'lon,lat,depth,value\n1,2,3,4\n');
    await expect(svc('points.compare').run(svc('points.compare').input.parse({ recipe, baseDir: dir, variable: 'PO4', stations: join(other, 'st.csv') }), ctx)).rejects.toThrow(/outside the folders/);
    await expect(svc('line.sample').run(svc('line.sample').input.parse({ recipe, baseDir: other, variable: 'PO4', line: { kind: 'meridian', lon: 0 } }), ctx)).rejects.toThrow();
  });
});
