/**
 * Builds the demo scenario into <sample-data>/generated/: a 1° reference climatology (33 standard levels,
 * umol/kg), three runs on a ~2° curvilinear grid (20 levels, mmol/m3), the spin-up snapshots of one run,
 * and a CSV of station observations. Deterministic: the same files every time.
 */
import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { makeRegularGrid } from '../../app/grid/rectilinear.js';
import { edgesFromCentres } from '../../app/grid/vertical.js';
import { createNetcdf, type WriteVariable } from '../../app/io/netcdf-writer.js';
import { loadLandRings, rasteriseLand } from './land.js';
import { MODEL_DEPTH_EDGES, MODEL_NX, MODEL_NY, REFERENCE_LEVELS, modelGrid } from './model-grid.js';
import { OBSERVED, scenarioDensity, tracersAt, type ProcessChoice, type TracerValues } from './ocean-state.js';
import { DEMO_RUNS, INITIAL, RUN_YEAR, SPINUP_RUN, SPINUP_YEARS, spunUp } from './scenario.js';
import { seafloorDepth } from './seafloor.js';
import { writeStations } from './stations.js';

/** Bump when the scenario changes, so that old generated files are rebuilt. */
export const SCENARIO_VERSION = '3';
const FILL = 1e20;
const TRACERS: (keyof TracerValues)[] = ['temp', 'salt', 'po4', 'no3', 'o2', 'si'];

const REF_META: Record<keyof TracerValues, { name: string; units: string; standard_name: string; long_name: string }> = {
  temp: { name: 'temp_mean', units: 'degC', standard_name: 'sea_water_temperature', long_name: 'Temperature, climatological mean' },
  salt: { name: 'salt_mean', units: '1e-3', standard_name: 'sea_water_practical_salinity', long_name: 'Practical salinity, climatological mean' },
  po4: { name: 'po4_mean', units: 'umol kg-1', standard_name: 'moles_of_phosphate_per_unit_mass_in_sea_water', long_name: 'Phosphate, climatological mean' },
  no3: { name: 'no3_mean', units: 'umol kg-1', standard_name: 'moles_of_nitrate_per_unit_mass_in_sea_water', long_name: 'Nitrate, climatological mean' },
  o2: { name: 'o2_mean', units: 'umol kg-1', standard_name: 'moles_of_oxygen_per_unit_mass_in_sea_water', long_name: 'Dissolved oxygen, climatological mean' },
  si: { name: 'si_mean', units: 'umol kg-1', standard_name: 'moles_of_silicate_per_unit_mass_in_sea_water', long_name: 'Silicate, climatological mean' },
};
const MODEL_META: Record<keyof TracerValues, { name: string; units: string; standard_name: string; long_name: string }> = {
  temp: { name: 'thetao', units: 'degC', standard_name: 'sea_water_potential_temperature', long_name: 'Potential temperature' },
  salt: { name: 'so', units: 'psu', standard_name: 'sea_water_salinity', long_name: 'Salinity' },
  po4: { name: 'po4', units: 'mmol m-3', standard_name: 'mole_concentration_of_phosphate_in_sea_water', long_name: 'Phosphate' },
  no3: { name: 'no3', units: 'mmol m-3', standard_name: 'mole_concentration_of_nitrate_in_sea_water', long_name: 'Nitrate' },
  o2: { name: 'o2', units: 'mmol m-3', standard_name: 'mole_concentration_of_dissolved_molecular_oxygen_in_sea_water', long_name: 'Dissolved oxygen' },
  si: { name: 'si', units: 'mmol m-3', standard_name: 'mole_concentration_of_silicate_in_sea_water', long_name: 'Silicate' },
};

export interface DemoPaths {
  dir: string;
  recipe: string;
}

function wrap180(lon: number): number {
  return ((((lon + 180) % 360) + 360) % 360) - 180;
}

function floatVar(name: string, dims: string[], attrs: Record<string, string | number[]>): WriteVariable {
  return { name, dims, dtype: 'f4', attrs: { ...attrs, _FillValue: [FILL] } };
}

async function writeReference(dir: string, land1: Uint8Array, depth1: Float32Array): Promise<void> {
  const grid = makeRegularGrid(1, 1);
  const nx = grid.nx;
  const ny = grid.ny;
  const levels = Float64Array.from(REFERENCE_LEVELS);
  const edges = edgesFromCentres(levels);
  const w = await createNetcdf(join(dir, 'ref.nc'), {
    dimensions: [
      { name: 'depth', size: levels.length },
      { name: 'lat', size: ny },
      { name: 'lon', size: nx },
      { name: 'nv', size: 2 },
    ],
    attrs: {
      Conventions: 'CF-1.10',
      title: 'Stillwater demo reference climatology (invented data)',
      comment: 'An invented climatology of the Stillwater demo scenario. Not observations; never a check value.',
    },
    variables: [
      { name: 'lat', dims: ['lat'], dtype: 'f8', attrs: { units: 'degrees_north', standard_name: 'latitude', axis: 'Y', bounds: 'lat_bnds' } },
      { name: 'lat_bnds', dims: ['lat', 'nv'], dtype: 'f8' },
      { name: 'lon', dims: ['lon'], dtype: 'f8', attrs: { units: 'degrees_east', standard_name: 'longitude', axis: 'X', bounds: 'lon_bnds' } },
      { name: 'lon_bnds', dims: ['lon', 'nv'], dtype: 'f8' },
      { name: 'depth', dims: ['depth'], dtype: 'f8', attrs: { units: 'm', standard_name: 'depth', positive: 'down', axis: 'Z', bounds: 'depth_bnds' } },
      { name: 'depth_bnds', dims: ['depth', 'nv'], dtype: 'f8' },
      ...TRACERS.map((t) => floatVar(REF_META[t].name, ['depth', 'lat', 'lon'], { units: REF_META[t].units, standard_name: REF_META[t].standard_name, long_name: REF_META[t].long_name })),
    ],
  });
  try {
    const ax = grid.axes!;
    await w.write('lat', ax.lat);
    await w.write('lon', ax.lon);
    await w.write('lat_bnds', Float64Array.from({ length: ny * 2 }, (_, q) => ax.latEdges[(q >> 1) + (q & 1)]));
    await w.write('lon_bnds', Float64Array.from({ length: nx * 2 }, (_, q) => ax.lonEdges[(q >> 1) + (q & 1)]));
    await w.write('depth', levels);
    await w.write('depth_bnds', Float64Array.from({ length: levels.length * 2 }, (_, q) => edges[(q >> 1) + (q & 1)]));
    const buffers = TRACERS.map(() => new Float32Array(nx * ny));
    for (let k = 0; k < levels.length; k++) {
      for (let c = 0; c < nx * ny; c++) {
        const wet = !land1[c] && levels[k] <= depth1[c];
        if (!wet) {
          for (const b of buffers) b[c] = FILL;
          continue;
        }
        const v = tracersAt(grid.lon[c], grid.lat[c], levels[k], OBSERVED);
        TRACERS.forEach((t, q) => (buffers[q][c] = v[t]));
      }
      for (let q = 0; q < TRACERS.length; q++) await w.write(REF_META[TRACERS[q]].name, buffers[q], [k, 0, 0]);
    }
    await w.close();
  } catch (e) {
    await w.abort();
    throw e;
  }
}

interface ModelColumns {
  lon: Float64Array;
  lat: Float64Array;
  lonBounds: Float64Array;
  latBounds: Float64Array;
  seafloor: Float32Array;
  wetLayers: Int16Array;
}

function modelColumns(land4: Uint8Array, depth1: Float32Array): ModelColumns {
  const g = modelGrid();
  const n = MODEL_NX * MODEL_NY;
  const seafloor = new Float32Array(n);
  const wetLayers = new Int16Array(n);
  for (let c = 0; c < n; c++) {
    const lon = wrap180(g.lon[c]);
    const lat = g.lat[c];
    const i4 = Math.min(1439, Math.floor((lon + 180) * 4));
    const j4 = Math.min(719, Math.max(0, Math.floor((lat + 90) * 4)));
    const i1 = Math.min(359, Math.floor(lon + 180));
    const j1 = Math.min(179, Math.max(0, Math.floor(lat + 90)));
    const d = depth1[j1 * 360 + i1];
    if (land4[j4 * 1440 + i4] || !(d > 0)) {
      seafloor[c] = NaN;
      continue;
    }
    let k = 0;
    while (k < MODEL_DEPTH_EDGES.length - 1 && 0.5 * (MODEL_DEPTH_EDGES[k] + MODEL_DEPTH_EDGES[k + 1]) < d) k++;
    wetLayers[c] = k;
    seafloor[c] = k > 0 ? MODEL_DEPTH_EDGES[k] : NaN;
  }
  return { ...g, seafloor, wetLayers };
}

/** The equilibrium of a run, umol/kg and degC/psu, one Float32Array per tracer and layer. */
function runEquilibrium(cols: ModelColumns, process: ProcessChoice): Float32Array[][] {
  const n = MODEL_NX * MODEL_NY;
  const nz = MODEL_DEPTH_EDGES.length - 1;
  const out = TRACERS.map(() => Array.from({ length: nz }, () => new Float32Array(n).fill(NaN)));
  for (let k = 0; k < nz; k++) {
    const z = 0.5 * (MODEL_DEPTH_EDGES[k] + MODEL_DEPTH_EDGES[k + 1]);
    for (let c = 0; c < n; c++) {
      if (k >= cols.wetLayers[c]) continue;
      const v = tracersAt(cols.lon[c], cols.lat[c], z, process);
      TRACERS.forEach((t, q) => (out[q][k][c] = v[t]));
    }
  }
  return out;
}

async function writeModelFile(path: string, cols: ModelColumns, eq: Float32Array[][], year: number, label: string, tracers: (keyof TracerValues)[]): Promise<void> {
  const nz = MODEL_DEPTH_EDGES.length - 1;
  const n = MODEL_NX * MODEL_NY;
  const centres = Float64Array.from({ length: nz }, (_, k) => 0.5 * (MODEL_DEPTH_EDGES[k] + MODEL_DEPTH_EDGES[k + 1]));
  const w = await createNetcdf(path, {
    dimensions: [
      { name: 'time', size: 1 },
      { name: 'depth', size: nz },
      { name: 'y', size: MODEL_NY },
      { name: 'x', size: MODEL_NX },
      { name: 'nv', size: 4 },
      { name: 'bnds', size: 2 },
    ],
    attrs: {
      Conventions: 'CF-1.10',
      title: `Stillwater demo model run '${label}', model year ${year} (invented data)`,
      comment: 'An invented model state of the Stillwater demo scenario on a curvilinear grid. Never a check value.',
      model_year: [year],
    },
    variables: [
      { name: 'time', dims: ['time'], dtype: 'f8', attrs: { units: 'days since 0001-01-01 00:00:00', calendar: 'noleap', standard_name: 'time', axis: 'T' } },
      { name: 'depth', dims: ['depth'], dtype: 'f8', attrs: { units: 'm', standard_name: 'depth', positive: 'down', axis: 'Z', bounds: 'depth_bnds' } },
      { name: 'depth_bnds', dims: ['depth', 'bnds'], dtype: 'f8' },
      { name: 'lat', dims: ['y', 'x'], dtype: 'f8', attrs: { units: 'degrees_north', standard_name: 'latitude', bounds: 'lat_bnds' } },
      { name: 'lat_bnds', dims: ['y', 'x', 'nv'], dtype: 'f8' },
      { name: 'lon', dims: ['y', 'x'], dtype: 'f8', attrs: { units: 'degrees_east', standard_name: 'longitude', bounds: 'lon_bnds' } },
      { name: 'lon_bnds', dims: ['y', 'x', 'nv'], dtype: 'f8' },
      floatVar('deptho', ['y', 'x'], { units: 'm', standard_name: 'sea_floor_depth_below_geoid', long_name: 'Sea floor depth', coordinates: 'lat lon' }),
      ...tracers.map((t) =>
        floatVar(MODEL_META[t].name, ['time', 'depth', 'y', 'x'], { units: MODEL_META[t].units, standard_name: MODEL_META[t].standard_name, long_name: MODEL_META[t].long_name, coordinates: 'lat lon' }),
      ),
    ],
  });
  try {
    await w.write('time', [year * 365]);
    await w.write('depth', centres);
    await w.write('depth_bnds', Float64Array.from({ length: nz * 2 }, (_, q) => MODEL_DEPTH_EDGES[(q >> 1) + (q & 1)]));
    await w.write('lat', cols.lat);
    await w.write('lon', cols.lon);
    await w.write('lat_bnds', cols.latBounds);
    await w.write('lon_bnds', cols.lonBounds);
    await w.write('deptho', cols.seafloor.map((d) => (Number.isNaN(d) ? FILL : d)));
    const iT = TRACERS.indexOf('temp');
    const iS = TRACERS.indexOf('salt');
    const level = new Float32Array(n);
    for (const t of tracers) {
      const q = TRACERS.indexOf(t);
      for (let k = 0; k < nz; k++) {
        const z = centres[k];
        const src = eq[q][k];
        for (let c = 0; c < n; c++) {
          const e = src[c];
          if (Number.isNaN(e)) {
            level[c] = FILL;
            continue;
          }
          if (t === 'temp' || t === 'salt') {
            level[c] = e;
            continue;
          }
          const perMass = t === 'po4' || t === 'no3' || t === 'o2' ? spunUp(e, INITIAL[t], year, z, t === 'o2' ? 28 : 0) : e;
          level[c] = (perMass * scenarioDensity(eq[iT][k][c], eq[iS][k][c], z)) / 1000;
        }
        await w.write(MODEL_META[t].name, level, [0, k, 0, 0]);
      }
    }
    await w.close();
  } catch (e) {
    await w.abort();
    throw e;
  }
}

/** Generate the whole scenario into `sampleDir`/generated. Returns the paths. */
export async function generateDemo(sampleDir: string, log: (s: string) => void = () => undefined): Promise<DemoPaths> {
  const dir = join(sampleDir, 'generated');
  const partial = join(sampleDir, 'generated.partial');
  rmSync(partial, { recursive: true, force: true });
  mkdirSync(join(partial, 'spinup'), { recursive: true });

  log('land and seafloor');
  const rings = loadLandRings('50m');
  const land1 = rasteriseLand(rings, 360, 180);
  const land4 = rasteriseLand(rings, 1440, 720);
  const grid1 = makeRegularGrid(1, 1);
  const depth1 = seafloorDepth(land1, grid1.lon, grid1.lat, 360, 180);

  log('reference climatology (1°, 33 levels)');
  await writeReference(partial, land1, depth1);

  const cols = modelColumns(land4, depth1);
  for (const run of DEMO_RUNS) {
    log(`model run ${run.label}`);
    const eq = runEquilibrium(cols, run.process);
    await writeModelFile(join(partial, run.file), cols, eq, RUN_YEAR, run.label, TRACERS);
    if (run.key === SPINUP_RUN) {
      for (const year of SPINUP_YEARS) {
        log(`spin-up snapshot, year ${year}`);
        await writeModelFile(join(partial, 'spinup', snapshotName(year)), cols, eq, year, run.label, ['temp', 'salt', 'po4', 'no3', 'o2']);
      }
    }
  }
  log('station observations');
  writeStations(join(partial, 'stations.csv'), land1, depth1);
  writeFileSync(join(partial, 'VERSION'), SCENARIO_VERSION + '\n');

  rmSync(dir, { recursive: true, force: true });
  renameSync(partial, dir);
  const recipe = join(sampleDir, 'demo-recipe.json');
  return { dir, recipe };
}

export function snapshotName(year: number): string {
  return `year-${String(year).padStart(5, '0')}.nc`;
}

function demoIsCurrent(dir: string): boolean {
  const version = join(dir, 'VERSION');
  return existsSync(version) && readFileSync(version, 'utf8').trim() === SCENARIO_VERSION;
}

/** How long a lock may stand before it is taken to belong to a process that died (generation takes ~1 min). */
const STALE_LOCK_MS = 5 * 60_000;

/**
 * Generate the scenario unless an up-to-date copy is already there. Test files run in parallel processes and
 * each may ask for the scenario: one generates at a time (a lock folder beside it), the others wait and then
 * find it current.
 */
export async function ensureDemo(sampleDir: string, log: (s: string) => void = () => undefined): Promise<DemoPaths> {
  const dir = join(sampleDir, 'generated');
  const paths = { dir, recipe: join(sampleDir, 'demo-recipe.json') };
  if (demoIsCurrent(dir)) return paths;
  const lock = join(sampleDir, 'generated.lock');
  for (;;) {
    try {
      mkdirSync(lock);
      break;
    } catch {
      const age = lockAge(lock);
      if (age !== null && age > STALE_LOCK_MS) rmSync(lock, { recursive: true, force: true });
      await new Promise((r) => setTimeout(r, 250));
    }
  }
  try {
    return demoIsCurrent(dir) ? paths : await generateDemo(sampleDir, log);
  } finally {
    rmSync(lock, { recursive: true, force: true });
  }
}

function lockAge(lock: string): number | null {
  try {
    return Date.now() - statSync(lock).mtimeMs;
  } catch {
    return null;
  }
}
