/**
 * TEOS-10 density for unit conversion with temperature and salinity: one 1° level (64 800 cells) of
 * practical salinity and potential temperature at 1000 dbar, through densityOfLevel (the WebAssembly kernel
 * that convertLevel uses: SR from SP, Θ from θ, 75-term specific volume, two cells at a time), beside the
 * scalar densityFromPracticalAndPotential cell by cell (which the kernel must equal bit for bit). Bar from
 * the speed issue: at most 1× gsw. Peer: tests/bench/peers/seawater_peer.py, python3-gsw (vectorised C) on the same cells;
 * the sums of both must agree to 1e-9 relative. Fastest of REPEATS passes after one untimed pass.
 */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { densityFromPracticalAndPotential } from '../../app/ocean/teos10.js';
import { densityOfLevel } from '../../app/ocean/density-level.js';

const REPEATS = 9;
const N = 64800;

function main(): void {
  const T = new Float32Array(N), S = new Float32Array(N);
  for (let i = 0; i < N; i++) {
    T[i] = -1.5 + (i % 317) * 0.1;
    S[i] = 30 + (i % 89) * 0.08;
  }
  const scalar = new Float64Array(N);
  let bestScalar = Infinity;
  for (let r = -1; r < REPEATS; r++) {
    const t0 = performance.now();
    for (let i = 0; i < N; i++) scalar[i] = densityFromPracticalAndPotential(S[i], T[i], 1000);
    if (r >= 0) bestScalar = Math.min(bestScalar, performance.now() - t0);
  }
  let rho: Float64Array = new Float64Array(N);
  let best = Infinity;
  for (let r = -1; r < REPEATS; r++) {
    const t0 = performance.now();
    rho = densityOfLevel(S, T, 1000);
    if (r >= 0) best = Math.min(best, performance.now() - t0);
  }
  const identical = rho.every((v, i) => Object.is(v, scalar[i]));
  const checksum = rho.reduce((a, b) => a + b, 0);
  const p = spawnSync('/usr/bin/python3', [join(process.cwd(), 'tests', 'bench', 'peers', 'seawater_peer.py'), String(REPEATS)], { encoding: 'utf8' });
  if (p.status !== 0) throw new Error(`peer failed: ${p.stderr}`);
  const peer = JSON.parse(p.stdout) as { seconds: number[]; checksum: number };
  const peerMs = Math.min(...peer.seconds) * 1000;
  const agree = Math.abs(checksum / peer.checksum - 1) < 1e-9;
  console.log(`TEOS-10 density of one 1° level (${N} cells, 1000 dbar), fastest of ${REPEATS} passes`);
  console.log(`ours (kernel) ${best.toFixed(2)} ms   python3-gsw ${peerMs.toFixed(2)} ms   ratio ${(best / peerMs).toFixed(2)}   bar 1.00 ${best <= peerMs ? 'met' : 'NOT MET'}`);
  console.log(`ours (scalar, cell by cell) ${bestScalar.toFixed(2)} ms   ratio ${(bestScalar / peerMs).toFixed(2)}   kernel equals scalar bit for bit: ${identical ? 'yes' : 'NO'}`);
  console.log(`sum of densities ours ${checksum.toFixed(6)} / gsw ${peer.checksum.toFixed(6)}: ${agree ? 'agree' : 'DISAGREE'}`);
  if (!agree || !identical) process.exitCode = 1;
}

main();
