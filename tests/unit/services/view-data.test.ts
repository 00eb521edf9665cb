// The data behind the Section, Profile and Line views as files (services view.export-section, -profile, -line;
// issue 14, "data out"), on the demo scenario: the NetCDF is read back by netCDF4-python (Debian's
// /usr/bin/python3) and must say the same as the CSV and as the arrays the views draw (view.section,
// view.profile, line.sample); CF attributes checked against the CF Metadata Conventions 1.10 (bounds, units,
// _FillValue, positive = "down" on depth). Bad input is refused in one sentence.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve, sep } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { StillwaterError } from '../../../app/errors.js';
import { linesServices, type LineData } from '../../../app/services/lines.js';
import type { ServiceContext } from '../../../app/services/types.js';
import { viewDataServices } from '../../../app/services/view-data.js';
import type { ExportedFile } from '../../../app/services/view-export.js';
import { viewsServices } from '../../../app/services/views.js';
import type { ProfileData, SectionData, SessionInfo } from '../../../contract/view-types.js';
import { ensureDemo } from '../../../sample-data/generator/generate.js';

const SAMPLE = resolve('sample-data');
const RECIPE = join(SAMPLE, 'demo-recipe.json');
const work = mkdtempSync(join(tmpdir(), 'sw-view-data-'));
const RUN = 'remin-short (L = 200 m)';

const ctx: ServiceContext = {
  roots: [SAMPLE, work],
  cacheDir: join(work, 'cache'),
  signal: new AbortController().signal,
  progress: () => undefined,
  resolvePath(p) {
    const abs = resolve(p);
    if (![SAMPLE, work].some((r) => abs === r || abs.startsWith(r + sep))) throw new StillwaterError('E_FILE', `${p}: outside the folders this workbench may read.`, { file: p });
    return abs;
  },
};

function call<T>(name: string, input: unknown): Promise<T> {
  const e = [...viewsServices, ...viewDataServices, ...linesServices].find((x) => x.name === name);
  if (!e) throw new Error(`no service ${name}`);
  return e.run(e.input.parse(input), ctx) as Promise<T>;
}

interface NcVar {
  dims: string[];
  attrs: Record<string, unknown>;
  /** masked values as null, flattened in C order */
  values: (number | null)[];
  dtype: string;
}

/** Every variable of a NetCDF file as netCDF4-python decodes it (mask and scale on). */
function readNetcdf(bytes: Uint8Array): { attrs: Record<string, string>; vars: Record<string, NcVar> } {
  const file = join(work, `read-${Math.random().toString(36).slice(2)}.nc`);
  writeFileSync(file, bytes);
  const py = spawnSync('/usr/bin/python3', ['-c', [
    'import sys, json, numpy as np, netCDF4',
    'ds = netCDF4.Dataset(sys.argv[1])',
    'def val(x):',
    '    return x.item() if hasattr(x, "item") else (list(x) if hasattr(x, "__len__") and not isinstance(x, str) else x)',
    'out = {"attrs": {k: str(ds.getncattr(k)) for k in ds.ncattrs()}, "vars": {}}',
    'for name, v in ds.variables.items():',
    '    a = np.ma.masked_invalid(np.ma.asarray(v[...], dtype="f8")).ravel()',
    '    out["vars"][name] = {"dims": list(v.dimensions), "dtype": str(v.dtype), "attrs": {k: (val(v.getncattr(k)) if not isinstance(v.getncattr(k), str) else v.getncattr(k)) for k in v.ncattrs()}, "values": [None if m else float(x) for x, m in zip(a.filled(0), np.ma.getmaskarray(a))]}',
    'print(json.dumps(out))',
  ].join('\n'), file], { encoding: 'utf8', maxBuffer: 1 << 28 });
  if (py.status !== 0) throw new Error(py.stderr);
  return JSON.parse(py.stdout) as { attrs: Record<string, string>; vars: Record<string, NcVar> };
}

/** CSV: its '# ' lines as key → value, the heading, and the rows as numbers (empty field → null). */
function readCsv(bytes: Uint8Array): { header: Record<string, string>; heading: string[]; rows: (number | null)[][] } {
  const lines = new TextDecoder().decode(bytes).split('\r\n').filter(Boolean);
  const header: Record<string, string> = {};
  let i = 0;
  for (; lines[i].startsWith('# '); i++) {
    const m = /^# ([^:]+): (.*)$/.exec(lines[i])!;
    header[m[1]] = m[2];
  }
  // headings are quoted where they hold a comma (RFC 4180); none of ours does
  const heading = lines[i].split(',');
  const rows = lines.slice(i + 1).map((l) => l.split(',').map((x) => (x === '' ? null : Number(x))));
  return { header, heading, rows };
}

const f32 = (v: number) => Math.fround(v);
const same = (a: number | null, b: number): void => {
  if (Number.isNaN(b)) expect(a).toBeNull();
  else expect(a).toBe(f32(b));
};

let info: SessionInfo;
beforeAll(async () => {
  await ensureDemo(SAMPLE);
  info = await call<SessionInfo>('view.open', { recipe: RECIPE });
}, 240_000);
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('view.export-section', () => {
  const ask = { variable: 'PO4', run: RUN, kind: 'meridian', at: -150 };
  it('NetCDF (read by netCDF4-python) and CSV hold the section the view draws, with CF coordinates and bounds', async () => {
    const d = await call<SectionData>('view.section', { session: info.session, ...ask });
    const nc = readNetcdf((await call<ExportedFile>('view.export-section', { session: info.session, format: 'netcdf', ...ask })).data);
    const csvFile = await call<ExportedFile>('view.export-section', { session: info.session, format: 'csv', ...ask });
    expect(csvFile.fileName).toMatch(/\.csv$/);
    const csv = readCsv(csvFile.data);
    const n = d.edges.length - 1;
    const nz = d.depthEdges.length - 1;
    // CF 1.10 §7.1: a coordinate names its bounds variable, which has one more dimension of size 2
    expect(nc.attrs.Conventions).toBe('CF-1.10');
    expect(nc.vars.lat.attrs).toMatchObject({ standard_name: 'latitude', units: 'degrees_north', bounds: 'lat_bnds' });
    expect(nc.vars.lat_bnds.dims).toEqual(['lat', 'nv']);
    expect(nc.vars.depth.attrs).toMatchObject({ units: 'm', positive: 'down', bounds: 'depth_bnds' });
    for (let s = 0; s < n; s++) expect(nc.vars.lat_bnds.values.slice(2 * s, 2 * s + 2)).toEqual([d.edges[s], d.edges[s + 1]]);
    for (let k = 0; k < nz; k++) expect(nc.vars.depth_bnds.values.slice(2 * k, 2 * k + 2)).toEqual([d.depthEdges[k], d.depthEdges[k + 1]]);
    // the meridian: a scalar longitude coordinate at the grid column's centre, bounded by its edges
    expect(nc.vars.lon.dims).toEqual([]);
    expect(nc.vars.lon.values[0]).toBeCloseTo(d.atGrid!, 9);
    expect(nc.vars.lon_bnds.values[1]! - nc.vars.lon_bnds.values[0]!).toBeCloseTo(1, 9); // the demo's 1° grid
    const run = nc.vars.PO4_run;
    expect(run.dims).toEqual(['depth', 'lat']);
    expect(run.dtype).toBe('float32');
    expect(run.attrs.units).toBe('umol kg-1');
    expect(typeof run.attrs._FillValue).toBe('number');
    expect(run.attrs.coordinates).toBe('lon');
    let missing = 0;
    for (let i = 0; i < nz * n; i++) {
      same(run.values[i], d.model[i]);
      same(nc.vars.PO4_reference.values[i], d.reference[i]);
      same(nc.vars.PO4_run_minus_reference.values[i], d.difference[i]);
      if (Number.isNaN(d.model[i])) missing++;
    }
    expect(missing).toBeGreaterThan(0); // the seafloor: missing values are masked, not numbers
    // the CSV: the '# ' lines say what, units, period, where; one row per (depth, latitude) with a value
    expect(csv.header).toMatchObject({ variable: 'PO4', units: 'umol kg-1', period: 'annual', run: RUN, reference: 'Demo climatology' });
    expect(csv.header.section).toMatch(/^meridian section along 149\.5°W/);
    expect(csv.heading).toEqual(['depth (m)', 'depth_min', 'depth_max', 'lat (degrees_north)', 'lat_min', 'lat_max', 'seafloor_depth (m)', `${RUN} (umol kg-1)`, 'Demo climatology (reference) (umol kg-1)', `${RUN} minus reference (umol kg-1)`]);
    let row = 0;
    for (let i = 0; i < nz * n; i++) {
      const k = Math.floor(i / n);
      const s = i % n;
      if (run.values[i] === null && nc.vars.PO4_reference.values[i] === null && nc.vars.PO4_run_minus_reference.values[i] === null) continue;
      const r = csv.rows[row++];
      expect(r[0]).toBeCloseTo(nc.vars.depth.values[k]!, 9);
      expect([r[1], r[2]]).toEqual([d.depthEdges[k], d.depthEdges[k + 1]]);
      expect(r[3]).toBeCloseTo(nc.vars.lat.values[s]!, 9);
      expect([r[7], r[8], r[9]]).toEqual([run.values[i], nc.vars.PO4_reference.values[i], nc.vars.PO4_run_minus_reference.values[i]]);
    }
    expect(row).toBe(csv.rows.length);
  }, 240_000);

  it('refuses a latitude beyond the poles, an unknown run and an unknown variable, each in one sentence', async () => {
    for (const [input, re] of [
      [{ ...ask, kind: 'parallel', at: 100 }, /^Latitude 100 must lie between -90 and 90\.$/],
      [{ ...ask, run: 'no-such-run' }, /no-such-run/],
      [{ ...ask, variable: 'NOPE' }, /NOPE/],
    ] as const) {
      const e = await call('view.export-section', { session: info.session, format: 'csv', ...input }).catch((x: unknown) => x);
      expect(e).toBeInstanceOf(StillwaterError);
      expect((e as Error).message.split(/(?<=\.) /)).toHaveLength(1);
      expect((e as Error).message).toMatch(re);
    }
  }, 240_000);

  it('refuses a format it does not write and a session that is not open', async () => {
    const e = viewDataServices.find((x) => x.name === 'view.export-section')!;
    expect(e.input.safeParse({ session: info.session, format: 'xlsx', ...ask }).success).toBe(false);
    await expect(call('view.export-section', { session: 'nope', format: 'csv', ...ask })).rejects.toBeInstanceOf(StillwaterError);
  });
});

describe('view.export-profile', () => {
  it('NetCDF and CSV hold the profile the view draws: the reference and every run over depth', async () => {
    const d = await call<ProfileData>('view.profile', { session: info.session, variable: 'O2', region: 'atlantic' });
    const nc = readNetcdf((await call<ExportedFile>('view.export-profile', { session: info.session, format: 'netcdf', variable: 'O2', region: 'atlantic' })).data);
    const csv = readCsv((await call<ExportedFile>('view.export-profile', { session: info.session, format: 'csv', variable: 'O2', region: 'atlantic' })).data);
    expect(csv.header).toMatchObject({ variable: 'O2', units: d.units, period: 'annual' });
    expect(csv.header.region).toMatch(/^atlantic /);
    expect(csv.heading.slice(3)).toEqual([`Demo climatology (reference) (${d.units})`, ...d.runs.map((r) => `${r.label} (${d.units})`)]);
    const nz = d.depthCentres.length;
    for (let k = 0; k < nz; k++) {
      same(nc.vars.O2_reference.values[k], d.reference[k]);
      d.runs.forEach((r, q) => same(nc.vars[`O2_run${q + 1}`].values[k], r.values[k]));
      expect(nc.vars.depth.values[k]).toBe(d.depthCentres[k]);
    }
    expect(nc.vars.O2_run1.attrs.long_name).toBe(`O2: ${d.runs[0].label}`);
    // one CSV row per level with a value, equal to the NetCDF's
    const withValue = [...Array(nz).keys()].filter((k) => nc.vars.O2_reference.values[k] !== null || d.runs.some((_, q) => nc.vars[`O2_run${q + 1}`].values[k] !== null));
    expect(csv.rows).toHaveLength(withValue.length);
    withValue.forEach((k, i) => expect(csv.rows[i].slice(3)).toEqual([nc.vars.O2_reference.values[k], ...d.runs.map((_, q) => nc.vars[`O2_run${q + 1}`].values[k])]));
  }, 240_000);

  it('refuses a region the session does not have, in one sentence', async () => {
    const e = await call('view.export-profile', { session: info.session, format: 'csv', variable: 'O2', region: 'mediterranean' }).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(StillwaterError);
    expect((e as Error).message).toMatch(/mediterranean/);
  });
});

describe('view.export-line', () => {
  const line = { variable: 'PO4', line: { kind: 'waypoints', points: '-30,-60; -30,0; -20,60' }, spacingKm: 200 };
  it('NetCDF and CSV hold the line the view draws: every source and difference, distance, lon, lat, column means', async () => {
    const d = await call<LineData>('line.sample', { session: info.session, ...line });
    const nc = readNetcdf((await call<ExportedFile>('view.export-line', { session: info.session, format: 'netcdf', ...line })).data);
    const csv = readCsv((await call<ExportedFile>('view.export-line', { session: info.session, format: 'csv', ...line })).data);
    const n = d.distanceKm.length;
    const nz = d.depthCentres.length;
    expect(nc.vars.distance.attrs).toMatchObject({ units: 'km', bounds: 'distance_bnds' });
    expect(nc.vars.lon.dims).toEqual(['distance']);
    expect(nc.vars.lon.attrs).toMatchObject({ standard_name: 'longitude', units: 'degrees_east' });
    // CF 1.10 §5: the fields name their auxiliary longitude and latitude
    expect(nc.vars.PO4_reference.attrs.coordinates).toBe('lon lat');
    const names = ['PO4_reference', 'PO4_run1', 'PO4_run2', 'PO4_run3', 'PO4_run1_minus_reference', 'PO4_run2_minus_reference', 'PO4_run3_minus_reference'];
    names.forEach((name, f) => {
      for (let i = 0; i < nz * n; i++) same(nc.vars[name].values[i], d.fields[f].values[i]);
      for (let s = 0; s < n; s++) {
        const m = d.fields[f].columnMean[s];
        if (Number.isNaN(m)) expect(nc.vars[`${name}_column_mean`].values[s]).toBeNull();
        else expect(nc.vars[`${name}_column_mean`].values[s]).toBeCloseTo(m, 4);
      }
    });
    for (let s = 0; s < n; s++) {
      expect(nc.vars.distance.values[s]).toBe(d.distanceKm[s]);
      expect(nc.vars.lat.values[s]).toBe(d.lat[s]);
    }
    expect(csv.header.line).toMatch(/^great-circle through A 30°W 60°S at 0 km; B 30°W 0° at [\d.]+ km; C 20°W 60°N at [\d.]+ km; sampled every 200 km/);
    expect(csv.heading.slice(0, 9)).toEqual(['depth (m)', 'depth_min', 'depth_max', 'distance (km)', 'distance_min', 'distance_max', 'lon (degrees_east)', 'lat (degrees_north)', 'seafloor_depth (m)']);
    expect(csv.heading).toHaveLength(9 + names.length);
    let row = 0;
    for (let i = 0; i < nz * n; i++) {
      if (names.every((name) => nc.vars[name].values[i] === null)) continue;
      const r = csv.rows[row++];
      expect(r[3]).toBe(nc.vars.distance.values[i % n]);
      expect(r.slice(9)).toEqual(names.map((name) => nc.vars[name].values[i]));
    }
    expect(row).toBe(csv.rows.length);
  }, 240_000);

  it('refuses a line of one waypoint and waypoints that do not parse, in one sentence', async () => {
    for (const points of ['-30,-60', '-30,-60; banana']) {
      const e = await call('view.export-line', { session: info.session, format: 'csv', ...line, line: { kind: 'waypoints', points } }).catch((x: unknown) => x);
      expect(e).toBeInstanceOf(StillwaterError);
      expect((e as Error).message.trim().split('\n')).toHaveLength(1);
    }
  }, 240_000);
});
