/**
 * The one path guard (app/services/recipe-guard.ts over main/path-guard.ts) in browser mode: every kind of
 * path a recipe names is confined to the allowed folders, also when it is reached through a symbolic link
 * inside an allowed folder that points out of it (common practice: OWASP "Path Traversal"); every service
 * that takes a recipe refuses such a recipe, naming the recipe path; outputs go only where they may.
 */
import { mkdirSync, mkdtempSync, realpathSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { serviceTable } from '../../../app/service.js';
import { guardedRecipe } from '../../../app/services/recipe-guard.js';
import type { ServiceContext } from '../../../app/services/types.js';
import { PathGuard } from '../../../main/path-guard.js';

const top = realpathSync(mkdtempSync(join(tmpdir(), 'sw-guard-')));
const allowed = join(top, 'allowed');
const outside = join(top, 'outside');
mkdirSync(allowed);
mkdirSync(outside);
for (const f of ['ref.nc', 'run.nc', 'T.nc', 'S.nc', 'mask.nc', 'regions.geojson', 'snap.nc', 'stations.csv']) {
  writeFileSync(join(allowed, f), 'x');
  writeFileSync(join(outside, f), 'x');
}
// links inside the allowed folder that lead out of it
for (const f of ['T.nc', 'S.nc', 'mask.nc', 'regions.geojson', 'snap.nc', 'stations.csv', 'run.nc']) symlinkSync(join(outside, f), join(allowed, `link-${f}`));

const guard = new PathGuard([allowed], top);
const ctx: ServiceContext = { resolvePath: (p) => guard.resolve(p), roots: guard.roots, cacheDir: join(top, 'cache'), progress: () => undefined, signal: new AbortController().signal };

/** A recipe with every kind of path inside the allowed folder; `change` moves one of them out. */
function recipe(change: (r: Record<string, any>) => void = () => undefined): Record<string, any> { // eslint-disable-line @typescript-eslint/no-explicit-any
  const r = {
    reference: { label: 'ref', file: 'ref.nc', variables: { PO4: 'po4', T: { file: 'T.nc', name: 'thetao' }, S: { file: 'S.nc', name: 'so' } } },
    runs: [{ label: 'run', variables: { PO4: { file: 'run.nc', name: 'po4' } }, snapshots: [{ file: 'snap.nc', year: 10 }] }],
    regions: ['global', { mask: 'mask.nc', variable: 'basin' }, { geojson: 'regions.geojson' }],
    options: { density: { fields: { temperature: 'T', salinity: 'S' } }, derived: { PO4x2: { expression: 'PO4 * 2', units: 'umol kg-1' } } },
  };
  change(r);
  return r;
}

describe('every kind of path a recipe names is confined, links followed', () => {
  const kinds: [string, (r: Record<string, any>) => void, RegExp][] = [ // eslint-disable-line @typescript-eslint/no-explicit-any
    ['a source file', (r) => (r.reference.file = join(outside, 'ref.nc')), /^reference\.file: /],
    ['a run variable through a link', (r) => (r.runs[0].variables.PO4.file = 'link-run.nc'), /^runs\[0\]\.variables\.PO4\.file: /],
    ['temperature for density (also a derived input) through a link', (r) => (r.reference.variables.T.file = 'link-T.nc'), /^reference\.variables\.T\.file: /],
    ['salinity for density through a link', (r) => (r.reference.variables.S.file = 'link-S.nc'), /^reference\.variables\.S\.file: /],
    ['a mask region through a link', (r) => (r.regions[1].mask = 'link-mask.nc'), /^regions\[1\]\.mask: /],
    ['a GeoJSON region through a link', (r) => (r.regions[2].geojson = 'link-regions.geojson'), /^regions\[2\]\.geojson: /],
    ['a spin-up snapshot through a link', (r) => (r.runs[0].snapshots[0].file = 'link-snap.nc'), /^runs\[0\]\.snapshots\[0\]\.file: /],
    ['a path climbing out with ..', (r) => (r.reference.file = '../outside/ref.nc'), /^reference\.file: /],
    ['a report stations file through a link', (r) => (r.report = { stations: [{ file: 'link-stations.csv', variable: 'PO4' }] }), /^report\.stations\[0\]\.file: /],
  ];
  it('the recipe with every path inside passes', () => {
    expect(guardedRecipe({ recipe: recipe(), baseDir: allowed }, ctx).variables).toEqual(['PO4', 'T', 'S', 'PO4x2']);
  });
  for (const [kind, change, where] of kinds) {
    it(kind, () => {
      expect(() => guardedRecipe({ recipe: recipe(change), baseDir: allowed }, ctx)).toThrow(where);
      expect(() => guardedRecipe({ recipe: recipe(change), baseDir: allowed }, ctx)).toThrow(/outside the folders this workbench may read|paths with '\.\.' are not accepted/);
    });
  }
});

describe('every service that takes a recipe uses the guard', () => {
  const bad = recipe((r) => (r.runs[0].snapshots[0].file = 'link-snap.nc'));
  const inputs: Record<string, Record<string, unknown>> = {
    'line.sample': { variable: 'PO4', line: { kind: 'meridian', lon: 0 } },
    'points.compare': { variable: 'PO4', stations: 'stations.csv' },
    'spinup.run': {},
    'spinup.verdict': {},
  };
  for (const [name, extra] of Object.entries(inputs)) {
    it(name, async () => {
      const entry = serviceTable.find((e) => e.name === name)!;
      const call = entry.run(entry.input.parse({ recipe: bad, baseDir: allowed, ...extra }), ctx);
      await expect(call).rejects.toThrow(/^runs\[0\]\.snapshots\[0\]\.file: .*outside the folders/);
    });
  }

  it('view.open refuses a recipe file naming a file out of the allowed folders', async () => {
    writeFileSync(join(allowed, 'bad-recipe.json'), JSON.stringify(bad));
    const entry = serviceTable.find((e) => e.name === 'view.open')!;
    await expect(entry.run({ recipe: join(allowed, 'bad-recipe.json') }, ctx)).rejects.toThrow(/runs\[0\]\.snapshots\[0\]\.file: .*outside the folders/);
  });
});

describe('stations and outputs', () => {
  const points = serviceTable.find((e) => e.name === 'points.compare')!;
  it('a relative stations path is taken from the recipe folder, and a link out of it is refused', async () => {
    const sub = join(allowed, 'sub');
    mkdirSync(sub, { recursive: true });
    // the recipe's folder is sub/, where stations.csv is a link out of the allowed folder; the server's own
    // base folder holds no stations.csv, so the refusal shows the path was taken from the recipe's folder
    symlinkSync(join(outside, 'stations.csv'), join(sub, 'stations.csv'));
    const inSub = recipe((x) => {
      x.reference.file = join(allowed, 'ref.nc');
      x.reference.variables.T.file = join(allowed, 'T.nc');
      x.reference.variables.S.file = join(allowed, 'S.nc');
      x.runs[0].variables.PO4.file = join(allowed, 'run.nc');
      x.runs[0].snapshots[0].file = join(allowed, 'snap.nc');
      x.regions = ['global'];
    });
    await expect(points.run(points.input.parse({ recipe: inSub, baseDir: sub, variable: 'PO4', stations: 'stations.csv' }), ctx)).rejects.toThrow(/^stations: .*sub\/stations\.csv: outside the folders/);
  });



});
