import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { makeLineScenario, stillwater, truth } from './lines-fixture.js';

// The reference is linear in latitude and depth (tests/integration/lines-fixture.ts), so trilinear
// sampling between cell centres is exact: at a station the model is 1 + 0.01·lat + 0.002·z.
// Observed values are set 0.1 below that, so bias and RMSE are known exactly: 0.1 for the
// reference and 0.6 for the run (reference + 0.5); the centred RMS difference is 0 (Taylor 2001).

let dir = '';
beforeAll(() => {
  dir = makeLineScenario();
});

const good: [string, number, number, number | 'seafloor'][] = [
  ['A', -30, 20, 200],
  ['B', 100, -40, 375],
  ['C', -150, 60.5, 700],
  ['D', 10, -33.3, 120],
  ['E', 170, 12, 610],
];

function stationsFile(name: string, rows: string[]): string {
  const path = join(dir, name);
  writeFileSync(path, rows.join('\n') + '\n');
  return path;
}

describe('stillwater points', () => {
  it('statistics against stations with known offsets; land, below-seafloor and seafloor stations are reported per station', () => {
    const rows = ['# units: umol kg-1', 'id,longitude,latitude,depth,value'];
    for (const [id, lon, lat, z] of good) rows.push(`${id},${lon},${lat},${z},${(truth(lat, z as number) - 0.1).toFixed(6)}`);
    rows.push('LAND,0,0,100,1.0'); // line 8: the four cells around (0, 0) are land
    rows.push('DEEP,45,25,700,1.0'); // line 9: that column ends at 300 m
    rows.push(`FLOOR,45,25,seafloor,${(truth(25, 200) - 0.1).toFixed(6)}`); // the bottom wet cell has its centre at 200 m
    const file = stationsFile('stations.csv', rows);
    const out = join(dir, 'points');
    const r = stillwater(['points', '--recipe', join(dir, 'recipe.json'), '--var', 'PO4', '--stations', file, '--out', out, '--json']);
    expect(r.stderr).not.toMatch(/internal fault/);
    expect(r.code).toBe(0);
    const problems = r.stderr.trim().split('\n');
    expect(problems).toHaveLength(2);
    expect(problems[0]).toMatch(/stations\.csv line 8 \(station LAND at 0, 0, 100 m\): on land in climatology, plus-half; left out of those statistics\./);
    expect(problems[1]).toMatch(/stations\.csv line 9 \(station DEEP at 45, 25, 700 m\): below the seafloor of climatology \(300 m\), plus-half \(300 m\)/);
    const summary = JSON.parse(r.stdout);
    const [ref, run] = summary.skill;
    expect(ref.counts).toEqual({ ok: 6, from_neighbour: 0, on_land: 1, below_seafloor: 1, outside_grid: 0 });
    expect(ref.stats.n).toBe(6);
    expect(ref.stats.bias).toBeCloseTo(0.1, 5);
    expect(ref.stats.rmse).toBeCloseTo(0.1, 5);
    expect(ref.stats.crmse).toBeCloseTo(0, 5);
    expect(run.stats.bias).toBeCloseTo(0.6, 5);
    expect(run.stats.rmse).toBeCloseTo(0.6, 5);
    // log10 statistics: bias of log10 values is the mean of log10(model / observed)
    const table = JSON.parse(readFileSync(join(out, 'points.json'), 'utf8'));
    const obs: number[] = table.stations.observed;
    const model: (number | null)[] = table.sources[0].model;
    let s = 0, n = 0;
    obs.forEach((o, i) => {
      if (model[i] !== null) {
        s += Math.log10(model[i]! / o);
        n++;
      }
    });
    expect(ref.log10.bias).toBeCloseTo(s / n, 6);
    expect(table.sources[0].status).toEqual(['ok', 'ok', 'ok', 'ok', 'ok', 'on_land', 'below_seafloor', 'ok']);
    expect(table.sources[0].model_depth_m[7]).toBe(200);
    // the station table: model, observed and difference per source
    const csv = readFileSync(join(out, 'points.csv'), 'utf8').trim().split('\n');
    expect(csv[0]).toMatch(/^id,line,lon,lat,depth_m,time,observed,climatology,climatology minus observed,climatology status,/);
    expect(csv[8]).toMatch(/^FLOOR,10,45,25,seafloor,/);
  });

  it('nearest wet cell sampling', () => {
    const file = stationsFile('one.csv', ['longitude,latitude,depth,value', '-28,18,200,1.5']);
    const r = stillwater(['points', '--recipe', join(dir, 'recipe.json'), '--var', 'PO4', '--stations', file, '--out', join(dir, 'nearest'), '--method', 'nearest', '--json']);
    expect(r.code).toBe(0);
    // the cell holding (-28, 18, 200 m) has its centre at (-25, 15, 200 m)
    expect(JSON.parse(r.stdout).skill[0].stats.model_mean).toBeCloseTo(truth(15, 200), 5);
  });
});

describe('a stations file that names its variable', () => {
  it('is compared with its own variable, whichever variable was asked for, and says so', () => {
    // a recipe with a second (derived) variable; the file's values are PO4, 0.1 below the reference
    writeFileSync(join(dir, 'two-variables.json'), JSON.stringify({ ...JSON.parse(readFileSync(join(dir, 'recipe.json'), 'utf8')), options: { derived: { P2: { expression: 'PO4 * 2', units: 'umol kg-1' } } } }));
    const rows = ['# variable: PO4', '# units: umol kg-1', 'id,longitude,latitude,depth,value'];
    for (const [id, lon, lat, z] of good) rows.push(`${id},${lon},${lat},${z},${(truth(lat, z as number) - 0.1).toFixed(6)}`);
    const file = stationsFile('po4-named.csv', rows);
    const r = stillwater(['points', '--recipe', join(dir, 'two-variables.json'), '--var', 'P2', '--stations', file, '--out', join(dir, 'own-variable'), '--json']);
    expect(r.code, r.stderr).toBe(0);
    const summary = JSON.parse(r.stdout);
    expect(summary.variable).toBe('PO4');
    expect(summary.skill[0].stats.bias).toBeCloseTo(0.1, 5);
    expect(summary.notes.join(' ')).toMatch(/po4-named\.csv holds PO4 \(its '# variable' line\), so the stations are compared with PO4, not P2\./);
  });
});

describe('stillwater points refuses bad station files with one sentence and exit 2', () => {
  const cases: [string, string, string[], RegExp][] = [
    ['an empty file', 'empty.csv', [], /empty\.csv: the file is empty \(no header and no stations\)\./],
    ['a malformed row', 'malformed.csv', ['longitude,latitude,depth,value', '1,2,3,4', '1,2,x,4'], /malformed\.csv line 3: depth 'x' is neither metres nor the word seafloor\./],
    ['only stations on land', 'land-only.csv', ['longitude,latitude,depth,value', '0,0,10,1', '5,-5,20,1'], /land-only\.csv: none of its 2 stations lies in the water of the reference or any run/],
    ['units that cannot be converted (a file of another variable)', 'celsius.csv', ['# units: degC', 'longitude,latitude,depth,value', '-30,20,200,1.5'], /celsius\.csv: its values in 'degC' do not match the variable PO4, whose units cannot be converted to them; choose the variable the file holds, or name it in a '# variable: NAME' line\./],
    ['a variable the recipe does not compare', 'temperature.csv', ['# variable: T', 'longitude,latitude,depth,value', '-30,20,200,1.5'], /temperature\.csv: its '# variable: T' line names a variable the recipe does not compare \(it compares PO4\)\./],
  ];
  for (const [name, fileName, lines, message] of cases) {
    it(name, () => {
      const file = stationsFile(fileName, lines);
      if (lines.length === 0) writeFileSync(file, '');
      const out = join(dir, `bad-${name.replace(/\W+/g, '-')}`);
      const r = stillwater(['points', '--recipe', join(dir, 'recipe.json'), '--var', 'PO4', '--stations', file, '--out', out]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(existsSync(out)).toBe(false);
    });
  }
});
