/**
 * CF decoding cost: a 360x180x102 int16 variable packed with scale_factor/add_offset and a _FillValue,
 * descending latitude, read level by level as decoded Float32 with NaN on a latitude-increasing grid.
 *   ours:  openField(...).readLevel(0, k) for every k (mask, unpack, row flip)
 *   peer:  netCDF4-python v[0, k, ::-1, :].filled(nan) with auto mask and scale (tests/bench/peers/cf_peer.py)
 * Both sides decode the same files: classic (64-bit offset) and NetCDF-4 deflate. Fastest of REPEATS passes
 * after one warm-up. The checksum (sum over a sparse sample of each level) and valid counts must agree.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openField } from '../../app/cf/open-field.js';

const REPEATS = 10;
const PY = '/usr/bin/python3';
const PEER = join(process.cwd(), 'tests', 'bench', 'peers', 'cf_peer.py');
const BAR = 1.5;

async function timeOurs(path: string): Promise<{ ms: number; checksum: number; valid: number }> {
  const field = await openField(path, 'temp');
  const { nx, ny } = field.grid.horizontal;
  const nz = field.grid.vertical!.nz;
  const times: number[] = [];
  let checksum = 0;
  let valid = 0;
  for (let r = 0; r <= REPEATS; r++) {
    const t0 = performance.now();
    checksum = 0;
    valid = 0;
    for (let k = 0; k < nz; k++) {
      const level = await field.readLevel(0, k);
      for (let j = 0; j < ny; j += 37) for (let i = 0; i < nx; i += 41) if (!Number.isNaN(level[j * nx + i])) checksum += level[j * nx + i];
      for (let c = 0; c < level.length; c++) if (!Number.isNaN(level[c])) valid++;
    }
    if (r > 0) times.push(performance.now() - t0);
  }
  await field.close?.();
  return { ms: Math.min(...times), checksum, valid };
}

function timePeer(path: string): { ms: number; checksum: number; valid: number } {
  const r = spawnSync(PY, [PEER, 'read', path, String(REPEATS + 1)], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`peer failed: ${r.stderr}`);
  const out = JSON.parse(r.stdout) as { seconds: number[]; checksum: number; valid: number };
  return { ms: Math.min(...out.seconds.slice(1)) * 1000, checksum: out.checksum, valid: out.valid };
}

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'sw-cf-bench-'));
  try {
    const made = spawnSync(PY, [PEER, 'make', dir], { encoding: 'utf8' });
    if (made.status !== 0) throw new Error(`could not make the benchmark files: ${made.stderr}`);
    console.log(`decode 'temp' (int16 packed, _FillValue, descending latitude; 360x180x102) level by level, fastest of ${REPEATS} passes, ms per pass`);
    const head = ['file', 'ours ms', 'netCDF4-python ms', 'ratio', 'bar', '', 'values agree'];
    const rows: string[][] = [];
    let bad = false;
    for (const file of ['packed_classic.nc', 'packed_nc4.nc']) {
      const p = join(dir, file);
      const ours = await timeOurs(p);
      const peer = timePeer(p);
      const ratio = ours.ms / peer.ms;
      const agree = ours.valid === peer.valid && Math.abs(ours.checksum - peer.checksum) <= 1e-5 * Math.abs(peer.checksum);
      if (ratio > BAR || !agree) bad = true;
      rows.push([file, ours.ms.toFixed(1), peer.ms.toFixed(1), `${ratio.toFixed(2)}x`, `<= ${BAR}x`, ratio <= BAR ? 'ok' : 'MISSED', agree ? `yes (${ours.valid} valid)` : `NO (${ours.valid} vs ${peer.valid}, ${ours.checksum} vs ${peer.checksum})`]);
    }
    const widths = head.map((h, i) => Math.max(h.length, ...rows.map((l) => l[i].length)));
    for (const l of [head, ...rows]) console.log(l.map((c, i) => c.padEnd(widths[i])).join('  '));
    if (bad) process.exitCode = 1;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

await main();
