/** TEOS-10 density (kg m-3) from python3-gsw (tests/fixtures/render/gsw_density.py) for [pt, sp, depth, lon, lat] rows. */
import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';

export function gswDensity(rows: number[][]): number[] {
  const r = spawnSync('/usr/bin/python3', [resolve('tests/fixtures/render/gsw_density.py')], { input: JSON.stringify(rows), encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`gsw_density.py failed: ${r.stderr}`);
  return JSON.parse(r.stdout) as number[];
}
