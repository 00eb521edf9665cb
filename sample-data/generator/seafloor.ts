/**
 * An invented but plausible seafloor for the demo: shelves along the coasts, continental slopes,
 * abyssal plains near 5 km and mid-ocean ridges rising to about 2.5 km.
 */
const RAD = Math.PI / 180;
const gauss = (x: number): number => Math.exp(-x * x);

/** Distance from land in km per cell of a regular global grid (breadth-first over neighbours, periodic in x). */
export function distanceFromLand(land: Uint8Array, nx: number, ny: number): Float32Array {
  const steps = new Int32Array(nx * ny).fill(-1);
  const queue = new Int32Array(nx * ny);
  let head = 0;
  let tail = 0;
  for (let c = 0; c < land.length; c++) if (land[c]) { steps[c] = 0; queue[tail++] = c; }
  while (head < tail) {
    const c = queue[head++];
    const j = Math.floor(c / nx);
    const i = c - j * nx;
    const next = [j * nx + ((i + 1) % nx), j * nx + ((i + nx - 1) % nx), j > 0 ? c - nx : -1, j < ny - 1 ? c + nx : -1];
    for (const n of next) {
      if (n >= 0 && steps[n] < 0) { steps[n] = steps[c] + 1; queue[tail++] = n; }
    }
  }
  const km = new Float32Array(nx * ny);
  const cellKm = (180 / ny) * 111.2;
  for (let c = 0; c < km.length; c++) km[c] = steps[c] < 0 ? 1e4 : steps[c] * cellKm;
  return km;
}

function ridge(lon: number, lat: number): number {
  const atlantic = gauss((lon - (-28 + 14 * Math.sin(2 * lat * RAD))) / 7) * (lat > -55 && lat < 68 ? 1 : 0);
  const pacific = gauss((lon - (-108 + 12 * Math.sin(lat * RAD))) / 9) * (lat > -58 && lat < 22 ? 1 : 0);
  const indian = gauss((lon - (68 + 8 * Math.sin(3 * lat * RAD))) / 7) * (lat > -45 && lat < 12 ? 1 : 0);
  const southern = gauss((lat + 55 + 4 * Math.sin(2 * lon * RAD)) / 5);
  return Math.max(atlantic, pacific, indian, 0.8 * southern);
}

/** Seafloor depth in metres (positive down) of ocean cells; NaN on land. */
export function seafloorDepth(land: Uint8Array, lon: Float64Array, lat: Float64Array, nx: number, ny: number): Float32Array {
  const dist = distanceFromLand(land, nx, ny);
  const depth = new Float32Array(nx * ny);
  for (let c = 0; c < depth.length; c++) {
    if (land[c]) { depth[c] = NaN; continue; }
    const shelf = 120 + 5000 * (1 - Math.exp(-Math.max(0, dist[c] - 80) / 320));
    const bumps = 250 * Math.sin(4 * lon[c] * RAD) * Math.cos(5 * lat[c] * RAD);
    depth[c] = Math.min(5900, Math.max(40, shelf - 2600 * ridge(lon[c], lat[c]) + bumps));
  }
  return depth;
}
