/**
 * A small comparison written with ncgen (netcdf-bin) for the line and points command tests:
 * a global 10° grid with four layers (edges 0, 100, 300, 600, 1000 m). The reference is linear in
 * latitude and depth, c = 1 + 0.01·lat + 0.002·z at each cell centre, so bilinear and trilinear
 * sampling and thickness-weighted column means have exact answers; the run is the reference + 0.5.
 * Land: the four cells around (0°, 0°). A shallow column at (45°E, 25°N) has two wet layers (seafloor 300 m).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const Z_EDGES = [0, 100, 300, 600, 1000];
export const Z_CENTRES = [50, 200, 450, 800];
export const LON = Array.from({ length: 36 }, (_, i) => -175 + 10 * i);
export const LAT = Array.from({ length: 18 }, (_, j) => -85 + 10 * j);

export function truth(lat: number, z: number): number {
  return 1 + 0.01 * lat + 0.002 * z;
}

function wetLayers(lon: number, lat: number): number {
  if (Math.abs(lon) === 5 && Math.abs(lat) === 5) return 0;
  if (lon === 45 && lat === 25) return 2;
  return 4;
}

function cdl(name: string, offset: number): string {
  const values: string[] = [];
  for (let k = 0; k < 4; k++) for (const lat of LAT) for (const lon of LON) values.push(k < wetLayers(lon, lat) ? (truth(lat, Z_CENTRES[k]) + offset).toFixed(6) : '_');
  const bounds = Z_CENTRES.map((_, k) => `${Z_EDGES[k]}, ${Z_EDGES[k + 1]}`).join(', ');
  return `netcdf ${name} {
dimensions:
  lon = 36 ; lat = 18 ; depth = 4 ; nv = 2 ;
variables:
  double lon(lon) ; lon:units = "degrees_east" ; lon:standard_name = "longitude" ;
  double lat(lat) ; lat:units = "degrees_north" ; lat:standard_name = "latitude" ;
  double depth(depth) ; depth:units = "m" ; depth:positive = "down" ; depth:axis = "Z" ; depth:bounds = "depth_bnds" ;
  double depth_bnds(depth, nv) ;
  float po4(depth, lat, lon) ; po4:units = "umol kg-1" ; po4:_FillValue = -999.f ;
data:
  lon = ${LON.join(', ')} ;
  lat = ${LAT.join(', ')} ;
  depth = ${Z_CENTRES.join(', ')} ;
  depth_bnds = ${bounds} ;
  po4 = ${values.join(', ')} ;
}
`;
}

/** Writes ref.nc, run.nc and recipe.json into a fresh temporary folder; returns the folder. */
export function makeLineScenario(): string {
  const dir = mkdtempSync(join(tmpdir(), 'sw-lines-'));
  for (const [name, offset] of [['ref', 0], ['run', 0.5]] as const) {
    writeFileSync(join(dir, `${name}.cdl`), cdl(name, offset));
    execFileSync('ncgen', ['-k', 'classic', '-o', join(dir, `${name}.nc`), join(dir, `${name}.cdl`)]);
  }
  const recipe = {
    reference: { label: 'climatology', variables: { PO4: { file: 'ref.nc', name: 'po4' } } },
    runs: [{ label: 'plus-half', variables: { PO4: { file: 'run.nc', name: 'po4' } } }],
  };
  writeFileSync(join(dir, 'recipe.json'), JSON.stringify(recipe));
  return dir;
}

const launcher = fileURLToPath(new URL('../../main/launch.mjs', import.meta.url));

/** Run the real command line; returns exit code, stdout and stderr. */
export function stillwater(args: string[]): { code: number; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [launcher, ...args], { encoding: 'utf8' });
  return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}
