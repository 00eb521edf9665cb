/**
 * Seawater density, TEOS-10 (IOC, SCOR & IAPSO 2010) in its 75-term polynomial form for specific
 * volume (Roquet et al. 2015, Ocean Modelling 90; the coefficients of the TEOS-10 toolbox).
 *
 * Inputs that models and climatologies carry are potential temperature θ (°C) and practical
 * salinity SP. We use the approximations:
 *   absolute salinity SA ≈ reference salinity SR = (35.16504 / 35) · SP (g/kg), i.e. without the
 *     spatial anomaly δSA, which changes ρ by less than about 0.02 kg m⁻³ in the open ocean;
 *   conservative temperature Θ from θ through the TEOS-10 polynomial for potential enthalpy
 *     (CT_from_pt), Θ = h⁰(SA, θ) / c_p⁰.
 */

/** 35.16504 / 35: reference salinity per unit of practical salinity (TEOS-10). */
export const SR_PER_SP = 35.16504 / 35;
/** c_p⁰, J kg⁻¹ K⁻¹ (TEOS-10). */
const CP0 = 3991.86795711963;
/** 1 / (40 · SR_PER_SP): the salinity scale of the TEOS-10 polynomials. */
const SFAC = 0.0248826675584615;
/** ΔS = 24 g/kg, scaled by SFAC: keeps the square root away from zero. */
const S_OFFSET = 5.971840214030754e-1;

/** Specific volume coefficients v_ijk of xs^i · ys^j · z^k (Roquet et al. 2015, 75 terms). */
const V: [number, number, number, number][] = [
  [0, 0, 0, 1.0769995862e-3], [0, 0, 1, -6.0799143809e-5], [0, 0, 2, 9.9856169219e-6], [0, 0, 3, -1.1309361437e-6],
  [0, 0, 4, 1.053115308e-7], [0, 0, 5, -1.2647261286e-8], [0, 0, 6, 1.961350393e-9],
  [0, 1, 0, -1.5649734675e-5], [0, 1, 1, 1.8505765429e-5], [0, 1, 2, -1.1736386731e-6], [0, 1, 3, -3.6527006553e-7], [0, 1, 4, 3.1454099902e-7],
  [0, 2, 0, 2.7762106484e-5], [0, 2, 1, -1.1716606853e-5], [0, 2, 2, 2.130502874e-6], [0, 2, 3, 2.8695905159e-7],
  [0, 3, 0, -1.6521159259e-5], [0, 3, 1, 7.9279656173e-6], [0, 3, 2, -4.6132540037e-7],
  [0, 4, 0, 6.9111322702e-6], [0, 4, 1, -3.4102187482e-6], [0, 4, 2, -6.3352916514e-8],
  [0, 5, 0, -8.053961554e-7], [0, 5, 1, 5.0736766814e-7],
  [0, 6, 0, 2.0543094268e-7],
  [1, 0, 0, -3.1038981976e-4], [1, 0, 1, 2.4262468747e-5], [1, 0, 2, -5.8484432984e-7], [1, 0, 3, 3.6310188515e-7], [1, 0, 4, -1.1147125423e-7],
  [1, 1, 0, 3.5009599764e-5], [1, 1, 1, -9.5677088156e-6], [1, 1, 2, -5.5699154557e-6], [1, 1, 3, -2.7295696237e-7],
  [1, 2, 0, -3.7435842344e-5], [1, 2, 1, -2.3678308361e-7], [1, 2, 2, 3.913738708e-7],
  [1, 3, 0, 2.4141479483e-5], [1, 3, 1, -3.4558773655e-6], [1, 3, 2, 7.7618888092e-9],
  [1, 4, 0, -8.7595873154e-6], [1, 4, 1, 1.2956717783e-6],
  [1, 5, 0, -3.30527589e-7],
  [2, 0, 0, 6.6928067038e-4], [2, 0, 1, -3.4792460974e-5], [2, 0, 2, -4.8122251597e-6], [2, 0, 3, 1.674630378e-8],
  [2, 1, 0, -4.3592678561e-5], [2, 1, 1, 1.1100834765e-5], [2, 1, 2, 5.4620748834e-6],
  [2, 2, 0, 3.590782276e-5], [2, 2, 1, 2.9283346295e-6], [2, 2, 2, -6.5731104067e-7],
  [2, 3, 0, -1.4353633048e-5], [2, 3, 1, 3.1655306078e-7],
  [2, 4, 0, 4.3703680598e-6],
  [3, 0, 0, -8.5047933937e-4], [3, 0, 1, 3.7470777305e-5], [3, 0, 2, 4.9263106998e-6],
  [3, 1, 0, 3.4532461828e-5], [3, 1, 1, -9.8447117844e-6], [3, 1, 2, -1.3544185627e-6],
  [3, 2, 0, -1.8698584187e-5], [3, 2, 1, -4.88261392e-7],
  [3, 3, 0, 2.2863324556e-6],
  [4, 0, 0, 5.8086069943e-4], [4, 0, 1, -1.7322218612e-5], [4, 0, 2, -1.7811974727e-6],
  [4, 1, 0, -1.1959409788e-5], [4, 1, 1, 2.590922526e-6],
  [4, 2, 0, 3.8595339244e-6],
  [5, 0, 0, -2.1092370507e-4], [5, 0, 1, 3.0927427253e-6],
  [5, 1, 0, 1.3864594581e-6],
  [6, 0, 0, 3.1932457305e-5],
];

/** Potential enthalpy coefficients h_ij of x^i · y^j, x = sqrt(SFAC·SA), y = θ/40 (TEOS-10 CT_from_pt). */
const H: [number, number, number][] = [
  [0, 0, 61.01362420681071], [0, 1, 168776.46138048015], [0, 2, -2735.2785605119625], [0, 3, 2574.2164453821433],
  [0, 4, -1536.6644434977543], [0, 5, 545.7340497931629], [0, 6, -50.91091728474331], [0, 7, -18.30489878927802],
  [2, 0, 268.5520265845071], [2, 1, -12019.028203559312], [2, 2, 3734.858026725145], [2, 3, -2046.7671145057618],
  [2, 4, 465.28655623826234], [2, 5, -0.6370820302376359], [2, 6, -10.650848542359153],
  [3, 0, 937.2099110620707], [3, 1, 588.1802812170108], [3, 2, 248.39476522971285], [3, 3, -3.871557904936333], [3, 4, -2.6268019854268356],
  [4, 0, -1687.914374187449], [4, 1, 936.3206544460336], [4, 2, -942.7827304544439], [4, 3, 369.4389437509002],
  [4, 4, -33.83664947895248], [4, 5, -9.987880382780322],
  [5, 0, 246.9598888781377], [6, 0, 123.59576582457964], [7, 0, -48.5891069025409],
];

/** Absolute salinity (g/kg) approximated by reference salinity from practical salinity. */
export function absoluteSalinityFromPractical(sp: number): number {
  return SR_PER_SP * sp;
}

/** Conservative temperature (°C) from absolute salinity (g/kg) and potential temperature (°C, p_ref = 0). */
export function conservativeFromPotential(sa: number, pt: number): number {
  const x = Math.sqrt(SFAC * Math.max(sa, 0));
  const y = pt * 0.025;
  powers(PX, x, 7);
  powers(PY, y, 7);
  let h = 0;
  for (let t = 0; t < H_C.length; t++) h += H_C[t] * PX[H_I[t]] * PY[H_J[t]];
  return h / CP0;
}

/** Specific volume (m³/kg) from SA (g/kg), CT (°C) and sea pressure p (dbar). */
export function specificVolume(sa: number, ct: number, p: number): number {
  const xs = Math.sqrt(SFAC * Math.max(sa, 0) + S_OFFSET);
  const ys = ct * 0.025;
  const z = p * 1e-4;
  powers(PX, xs, 6);
  powers(PY, ys, 6);
  powers(PZ, z, 6);
  let v = 0;
  for (let t = 0; t < V_C.length; t++) v += V_C[t] * PX[V_I[t]] * PY[V_J[t]] * PZ[V_K[t]];
  return v;
}

// The polynomials as flat arrays and power tables, filled by repeated multiplication: this runs for every
// cell of every level when density comes from temperature and salinity (tuples and ** took 20x longer).
const V_I = Int8Array.from(V, (t) => t[0]), V_J = Int8Array.from(V, (t) => t[1]), V_K = Int8Array.from(V, (t) => t[2]);
const V_C = Float64Array.from(V, (t) => t[3]);
const H_I = Int8Array.from(H, (t) => t[0]), H_J = Int8Array.from(H, (t) => t[1]);
const H_C = Float64Array.from(H, (t) => t[2]);
const PX = new Float64Array(8), PY = new Float64Array(8), PZ = new Float64Array(8);

/** out[n] = x^n for n = 0..top. */
function powers(out: Float64Array, x: number, top: number): void {
  out[0] = 1;
  for (let n = 1; n <= top; n++) out[n] = out[n - 1] * x;
}

/** In-situ density (kg m⁻³) from SA, CT and sea pressure (dbar); p = 0 gives potential density. */
export function densityTeos10(sa: number, ct: number, p: number): number {
  return 1 / specificVolume(sa, ct, p);
}

/** Density (kg m⁻³) from practical salinity and potential temperature, at sea pressure p (dbar). */
export function densityFromPracticalAndPotential(sp: number, pt: number, p = 0): number {
  const sa = absoluteSalinityFromPractical(sp);
  return densityTeos10(sa, conservativeFromPotential(sa, pt), p);
}

/**
 * Sea pressure (dbar) at a depth (m), from the TEOS-10 relation between height and pressure
 * inverted at low order (Saunders 1981 form; from memory): adequate for choosing p in ρ(SA, Θ, p).
 */
export function pressureFromDepth(depth: number, latDeg = 45): number {
  const s2 = Math.sin((latDeg * Math.PI) / 180) ** 2;
  const c1 = (5.92 + 5.25 * s2) * 1e-3;
  return ((1 - c1) - Math.sqrt((1 - c1) ** 2 - 8.84e-6 * depth)) / 4.42e-6;
}
