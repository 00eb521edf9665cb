/**
 * The invented ocean of the demo scenario: smooth analytic tracer fields that look like the ocean
 * (nutrients rising with depth and water-mass age, an oxygen minimum in the eastern tropics, cold
 * oxygen-rich high latitudes) but are made up. They are never used as a check value.
 *
 * One process choice of our own separates the demo runs: the e-folding depth over which sinking
 * organic matter is remineralised (remineralisation length scale, metres).
 */

export interface ProcessChoice {
  /** remineralisation length scale, m */
  reminLength: number;
  /** multiplier on the strength of the oxygen minimum zones */
  omzStrength: number;
  /** multiplier on the deep nutrient store */
  deepNutrientFactor: number;
}

/** The "observed" ocean of the scenario. */
export const OBSERVED: ProcessChoice = { reminLength: 350, omzStrength: 1, deepNutrientFactor: 1 };

export interface TracerValues {
  temp: number; // degC
  salt: number; // psu
  po4: number; // umol/kg
  no3: number; // umol/kg
  o2: number; // umol/kg
  si: number; // umol/kg
}

const RAD = Math.PI / 180;
const sigmoid = (x: number): number => 1 / (1 + Math.exp(-x));
const gauss = (x: number): number => Math.exp(-x * x);

function wrap180(lon: number): number {
  return ((((lon + 180) % 360) + 360) % 360) - 180;
}

/**
 * Smooth weights (sum 1) of the basins the scenario's water masses belong to. The Arctic takes Atlantic
 * water (a blend in latitude around 66°N), so the basin boxes, whose edges run over land further south,
 * leave no edge across the Arctic Ocean.
 */
function basinWeights(lon: number, lat: number): { atl: number; ind: number; pac: number; sou: number } {
  const l = wrap180(lon);
  const north = sigmoid((lat + 35) / 5);
  const arctic = sigmoid((lat - 66) / 2.5);
  let atl = 0;
  let ind = 0;
  if ((l > -75 && l < 25) || (l > -100 && l <= -75 && lat > 8 && lat < 32) || (l > -100 && l <= -75 && lat > 45)) atl = 1;
  else if (l >= 25 && l < 120 && lat < 32) ind = 1;
  const pac = 1 - atl - ind;
  atl = atl * (1 - arctic) + arctic;
  return { atl: atl * north, ind: ind * (1 - arctic) * north, pac: pac * (1 - arctic) * north, sou: 1 - north };
}

/** Deep-water age of the scenario, years: young in the North Atlantic, oldest in the North Pacific. */
function deepAge(lat: number, w: ReturnType<typeof basinWeights>): number {
  const atl = 250 + 350 * sigmoid(-lat / 15);
  const ind = 900 + 4 * lat;
  const pac = 1000 + 9 * (lat + 35);
  return w.atl * atl + w.ind * ind + w.pac * pac + w.sou * 550;
}

/** Oxygen solubility in the scenario: a rough smooth fit, adequate for invented data only. */
function o2Saturation(t: number, s: number): number {
  return (349 - 8.1 * t + 0.09 * t * t) * (1 - 0.0045 * (s - 35));
}

/** Mild large-scale "weather" so the fields are not perfectly zonal. */
function wiggle(lon: number, lat: number, seed: number): number {
  const x = lon * RAD;
  const y = lat * RAD;
  return 0.5 * Math.sin(3 * x + seed) * Math.cos(2 * y) + 0.3 * Math.cos(5 * x - 2 * y + 2 * seed) + 0.2 * Math.sin(7 * y + x + seed);
}

export function tracersAt(lon: number, lat: number, z: number, p: ProcessChoice = OBSERVED): TracerValues {
  const l = wrap180(lon);
  const w = basinWeights(l, lat);
  const wig = wiggle(l, lat, 0.7);

  const ts = Math.max(-1.8, -1.8 + 30 * gauss(lat / 38) + 1.2 * wig);
  const td = 1.1 + 1.6 * w.atl - 0.8 * w.sou;
  const temp = td + (ts - td) * Math.exp(-z / 550);

  const ss = 34.5 + 1.5 * gauss((Math.abs(lat) - 24) / 12) - 1.6 * gauss((lat - 80) / 14) + 0.5 * w.atl + 0.15 * wig;
  const sd = 34.7 + 0.2 * w.atl;
  const salt = sd + (ss - sd) * Math.exp(-z / 450);

  const age = deepAge(lat, w) * (1 - Math.exp(-z / 900));
  const upwelling = 0.45 * gauss(lat / 5) * gauss((l + 115) / 45);
  const ps = 0.08 + 1.7 * sigmoid(-(lat + 50) / 4) + 0.9 * w.pac * sigmoid((lat - 45) / 5) + upwelling + 0.04 * wig;
  const pd = (1.05 + 0.00095 * deepAge(lat, w)) * p.deepNutrientFactor;
  const pacBump = 0.35 * w.pac * gauss((z - 1000) / 650);
  const po4 = Math.max(0.01, pd - (pd - ps) * Math.exp(-z / p.reminLength) + pacBump * (p.reminLength / 350));

  const omz =
    gauss(Math.hypot((l + 98) / 22, (lat - 6) / 13)) * gauss((z - 420) / 380) +
    0.9 * gauss(Math.hypot((l - 64) / 9, (lat - 15) / 7)) * gauss((z - 500) / 400);
  const no3 = Math.max(0, 14.9 * po4 - 0.7 * w.atl - 6 * omz * p.omzStrength + 0.2 * wig);

  const sis = 1.5 + 55 * sigmoid(-(lat + 56) / 4);
  const sid = 18 + 0.095 * deepAge(lat, w);
  const si = sid - (sid - sis) * Math.exp(-z / 1400);

  const sat = o2Saturation(temp, salt);
  const aou = 235 * (1 - Math.exp(-(age + 120 * (1 - Math.exp(-z / 300))) / 650)) * (350 / p.reminLength) ** 0.25;
  const o2 = Math.max(2, sat - aou - 190 * omz * p.omzStrength);

  return { temp, salt, po4, no3, o2, si };
}

/** In-situ density of the scenario, kg m-3 (rough; only used to express model tracers per volume). */
export function scenarioDensity(temp: number, salt: number, z: number): number {
  return 1027.6 - 0.17 * (temp - 4) - 0.004 * (temp - 4) ** 2 + 0.78 * (salt - 35) + 0.0045 * z;
}
