// `stillwater report` with a recipe's report.stations (issue 11, station comparisons): the scatter figure is
// written (SVG + PNG), shown in report.html with its table, and its panel numbers are exact. The reference of
// the line scenario is linear in latitude and depth (tests/integration/lines-fixture.ts), so trilinear
// sampling is exact there, and observations 0.1 below the truth give bias = RMSE = 0.1 for the reference and
// 0.6 for the run (the reference + 0.5) (exact arithmetic). Bad stations files stop the report before anything
// is written: one sentence, exit 2, no folder and no staging left.
import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { makeLineScenario, stillwater, truth } from './lines-fixture.js';

let dir = '';
beforeAll(() => {
  dir = makeLineScenario();
});

const good: [string, number, number, number][] = [
  ['A', -30, 20, 200],
  ['B', 100, -40, 375],
  ['C', -150, 60.5, 700],
  ['D', 10, -33.3, 120],
  ['E', 170, 12, 610],
];

function withReport(name: string, stations: string, extra: Record<string, unknown> = {}): string {
  const recipe = JSON.parse(readFileSync(join(dir, 'recipe.json'), 'utf8')) as Record<string, unknown>;
  recipe.report = { mapLayers: ['bottom'], lines: [], zonalBasins: [], spinup: false, stations: [{ file: stations, variable: 'PO4' }] };
  Object.assign(recipe, extra);
  const path = join(dir, `${name}.json`);
  writeFileSync(path, JSON.stringify(recipe));
  return path;
}

function stationsFile(name: string, rows: string[]): string {
  const path = join(dir, name);
  writeFileSync(path, rows.join('\n') + '\n');
  return path;
}

describe('report: station comparisons', () => {
  it('draws model against observation with n, bias, RMSE, r in each panel, in report.html and figures/', () => {
    const rows = ['# units: umol kg-1', '# variable: PO4 (bottles of the line scenario)', 'id,longitude,latitude,depth,value'];
    for (const [id, lon, lat, z] of good) rows.push(`${id},${lon},${lat},${z},${(truth(lat, z) - 0.1).toFixed(6)}`);
    rows.push('LAND,0,0,100,1.0');
    const out = join(dir, 'report-stations');
    const r = stillwater(['report', '--recipe', withReport('r-stations', stationsFile('bottles.csv', rows), { options: { logStats: ['PO4'] } }), '--out', out]);
    expect(r.stderr).not.toMatch(/internal fault/);
    expect(r.code).toBe(0);
    const figs = readdirSync(join(out, 'figures'));
    expect(figs).toContain('po4-stations-1.svg');
    expect(figs).toContain('po4-stations-1.png');
    const svg = readFileSync(join(out, 'figures', 'po4-stations-1.svg'), 'utf8');
    const panels = [...svg.matchAll(/<g class="panel-stats">(.*?)<\/g>/g)].map((m) => m[1].replace(/<[^>]+>/g, '|'));
    expect(panels).toHaveLength(2);
    // reference then run; 5 of the 6 stations are in the water (LAND is not)
    const num = (p: string, label: string) => Number(new RegExp(`\\|${label} (\\S+)`).exec(p)![1].replace('−', '-'));
    expect(panels[0]).toContain('n 5 of 6 stations');
    expect(num(panels[0], 'bias')).toBeCloseTo(0.1, 4);
    expect(num(panels[0], 'RMSE')).toBeCloseTo(0.1, 4);
    expect(num(panels[1], 'bias')).toBeCloseTo(0.6, 4);
    expect(num(panels[1], 'RMSE')).toBeCloseTo(0.6, 4);
    // logStats: log axes and log10 statistics
    expect(svg).toMatch(/Observed PO4, log scale/);
    expect(panels[0]).toMatch(/log₁₀ bias/);
    const html = readFileSync(join(out, 'report.html'), 'utf8');
    expect(html).toContain('PO4 at stations: bottles.csv');
    expect(html).toContain('<figure id="po4-stations-1">');
    // the station section follows its variable's section
    expect(html.indexOf('PO4 at stations')).toBeGreaterThan(html.indexOf('<h2 id="po4-'));
    expect(html).not.toMatch(/https?:|file:/);
  });

  it.each([
    ['a malformed row', ['id,longitude,latitude,depth,value', 'A,-30,20,deep,1.0'], /bad\.csv line 2: depth 'deep'/],
    ['a file of another variable', ['# variable: NO3', 'id,longitude,latitude,depth,value', 'A,-30,20,200,1.0'], /report\.stations\[0\]: .*holds NO3 .*not PO4/],
  ])('refuses %s before anything is written: one sentence, exit 2', (_what, rows, message) => {
    const out = join(dir, `bad-${Math.random().toString(36).slice(2, 7)}`);
    const r = stillwater(['report', '--recipe', withReport(`r-bad-${Math.random().toString(36).slice(2, 7)}`, stationsFile('bad.csv', rows)), '--out', out]);
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(message);
    expect(existsSync(out)).toBe(false);
    expect(readdirSync(dir).filter((f) => f.includes('partial'))).toEqual([]);
  });
});
