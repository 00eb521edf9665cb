/** Invented bottle observations of phosphate for the demo (values from the scenario's ocean plus noise). */
import { writeFileSync } from 'node:fs';
import { tracersAt } from './ocean-state.js';

/** A small deterministic generator (a linear congruential sequence), so the demo is the same every time. */
function sequence(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

const DEPTHS = [5, 30, 100, 250, 500, 1000, 1500, 2000, 3000, 4000];

export function writeStations(path: string, land1: Uint8Array, depth1: Float32Array, count = 400): void {
  const rand = sequence(20261201);
  const lines = ['# units: umol kg-1', '# variable: PO4 (invented bottle data of the Stillwater demo scenario)', 'id,longitude,latitude,depth,value'];
  let made = 0;
  while (made < count) {
    const i = Math.floor(rand() * 360);
    const j = Math.floor(rand() * 160) + 10;
    const c = j * 360 + i;
    if (land1[c]) continue;
    const lon = -180 + i + rand();
    const lat = -90 + j + rand();
    const seafloor = rand() < 0.2;
    const candidates = DEPTHS.filter((d) => d < depth1[c]);
    if (candidates.length === 0) continue;
    const depth = seafloor ? depth1[c] : candidates[Math.floor(rand() * candidates.length)];
    const noise = (rand() + rand() + rand() - 1.5) * 0.08;
    const value = Math.max(0.01, tracersAt(lon, lat, depth).po4 * (1 + noise));
    made++;
    lines.push(`S${String(made).padStart(4, '0')},${lon.toFixed(3)},${lat.toFixed(3)},${seafloor ? 'seafloor' : depth},${value.toFixed(3)}`);
  }
  writeFileSync(path, lines.join('\n') + '\n');
}
