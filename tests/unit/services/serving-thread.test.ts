// Untrusted parsing never runs on the thread that serves the screen (issue 16, item 1): the serving threads of
// browser mode and Electron mark themselves, every reader of an outside file refuses to run there, and the
// services that read files run on the pool's threads with the same answers as on this thread.
// The files are committed fixtures written by outside tools (netCDF4-python, GDAL; see their make_*.py).
import { build } from 'esbuild';
import { mkdirSync, mkdtempSync, realpathSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDataset } from '../../../app/io/open.js';
import { checkParsingHere, keepParsingOffThisThread } from '../../../app/io/parsing-thread.js';
import { readStations } from '../../../app/points/run-points.js';
import { loadRecipe } from '../../../app/recipe/load.js';
import { loadGeoJsonRegions } from '../../../app/regions/geojson-regions.js';
import { serviceTable } from '../../../app/service.js';
import type { CallReply } from '../../../contract/transport.js';
import { Dispatcher } from '../../../main/dispatch.js';
import { PathGuard } from '../../../main/path-guard.js';
import { WorkerPool } from '../../../main/workers.js';

const FIXTURES = join(__dirname, '..', '..', 'fixtures');
const DATASETS = {
  'NetCDF classic (CDF-1)': join(FIXTURES, 'io', 'python_classic.nc'),
  'NetCDF CDF-5': join(FIXTURES, 'io', 'python_cdf5.nc'),
  'NetCDF-4': join(FIXTURES, 'io', 'python_nc4.nc'),
  GeoTIFF: join(FIXTURES, 'io', 'grid.tif'),
};

let top: string;
let recipe: string;
let stations: string;
let pool: WorkerPool;
const onThisThread = new Map<string, CallReply>();

/** files.describe, view.variables and cf.inspect of every dataset, as calls. */
function calls(): [string, unknown][] {
  const out: [string, unknown][] = [];
  for (const file of Object.values(DATASETS)) out.push(['files.describe', { path: file }], ['view.variables', { file }], ['cf.inspect', { path: file }]);
  return out;
}

const key = (name: string, input: unknown): string => `${name} ${JSON.stringify(input)}`;

beforeAll(async () => {
  top = realpathSync(mkdtempSync(join(tmpdir(), 'sw-serving-')));
  recipe = join(top, 'recipe.json');
  writeFileSync(recipe, JSON.stringify({ reference: { label: 'ref', file: join(FIXTURES, 'compare', 'ref.nc'), variables: { T: 'T' } }, runs: [{ label: 'run', file: join(FIXTURES, 'compare', 'run_same.nc'), variables: { T: 'T' } }] }));
  stations = join(top, 'stations.csv');
  writeFileSync(stations, '# units: umol kg-1\nid,longitude,latitude,depth,value\nA1,-25.5,10.0,seafloor,0.31\nA2,-25.5,10.0,150,0.12\n');
  // the real pooled worker and the HDF5 library's thread beside it, bundled as main/build.mjs does
  const dist = join(__dirname, '..', '..', '..', 'dist', 'test', `serving-${process.pid}`);
  mkdirSync(dist, { recursive: true });
  const banner = { js: "import { createRequire as __swRequire } from 'node:module'; const require = __swRequire(import.meta.url);" };
  for (const [entry, out] of [['worker.ts', 'worker.mjs'], ['hdf5-worker.ts', 'hdf5-worker.mjs']]) {
    await build({ entryPoints: [join(__dirname, '..', '..', '..', 'main', entry)], outfile: join(dist, out), bundle: true, platform: 'node', format: 'esm', packages: 'external', logLevel: 'error', banner });
  }
  pool = new WorkerPool(join(dist, 'worker.mjs'), { size: 1 });
  // the answers on this thread first, before it is marked as serving
  const here = new Dispatcher({ table: serviceTable, guard: new PathGuard([FIXTURES, top], top), cacheDir: join(top, 'cache') });
  for (const [name, input] of calls()) onThisThread.set(key(name, input), await here.call(name, input, undefined));
  keepParsingOffThisThread('the test server');
}, 120_000);

afterAll(async () => {
  await pool?.close();
});

describe('a thread that serves the screen', () => {
  it('refuses to parse any file from outside, in one sentence naming the file', async () => {
    const refusal = { code: 'E_INTERNAL', message: expect.stringMatching(/would be read on the thread that serves the screen \(the test server\)/) };
    for (const file of Object.values(DATASETS)) await expect(openDataset(file)).rejects.toMatchObject(refusal);
    await expect(loadRecipe(recipe)).rejects.toMatchObject(refusal);
    await expect(readStations(stations)).rejects.toMatchObject(refusal);
    await expect(loadGeoJsonRegions(join(FIXTURES, 'compare', 'polygons.geojson'), { nx: 0, ny: 0 } as never)).rejects.toMatchObject(refusal);
    expect(() => checkParsingHere('/data/x.nc')).toThrow(/^\/data\/x\.nc: would be read/);
  });

  it('still answers every file service, from the pool, exactly as it answered on its own thread', async () => {
    const served = new Dispatcher({ table: serviceTable, guard: new PathGuard([FIXTURES, top], top), cacheDir: join(top, 'cache'), heavy: pool.runner });
    for (const [name, input] of calls()) {
      const before = onThisThread.get(key(name, input));
      expect(before?.ok, `${name} on its own thread: ${JSON.stringify(before)}`).toBe(true);
      const now = await served.call(name, input, undefined);
      expect(now, key(name, input)).toEqual(before);
    }
  }, 120_000);

  it('leaves no file-reading service light: each of those goes to the pool', () => {
    const reads = ['files.describe', 'view.variables', 'view.open', 'view.pair', 'points.compare', 'spinup.open', 'spinup.run', 'spinup.verdict', 'cf.inspect', 'line.sample'];
    for (const name of reads) expect(serviceTable.find((e) => e.name === name)?.heavy, name).toBe(true);
  });
});
