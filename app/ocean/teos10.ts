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
  return potentialEnthalpy(Math.sqrt(SFAC * Math.max(sa, 0)), pt * 0.025) / CP0;
}

/** Specific volume (m³/kg) from SA (g/kg), CT (°C) and sea pressure p (dbar). */
export function specificVolume(sa: number, ct: number, p: number): number {
  return specificVolumePolynomial(Math.sqrt(SFAC * Math.max(sa, 0) + S_OFFSET), ct * 0.025, p * 1e-4);
}

// The two polynomials in nested (Horner) form over the coefficients of the tables above, in table order:
// this runs for every cell of every level when density comes from temperature and salinity, where a loop
// over the terms with powers took 10-20 times longer. Written out from the tables by a script; a test
// checks both against gsw.
const V_C = Float64Array.from(V, (t) => t[3]);
const H_C = Float64Array.from(H, (t) => t[2]);

/** What the level kernel (kernels/density.as.ts) needs to compute the very same doubles as the functions here. */
export const DENSITY_KERNEL_INPUTS = { specificVolumeTerms: V_C, enthalpyTerms: H_C, SR_PER_SP, SFAC, S_OFFSET, CP0 } as const;

/** Σ v_ijk · xs^i · ys^j · z^k: Horner in xs within ys within z. */
function specificVolumePolynomial(xs: number, ys: number, z: number): number {
  const c = V_C;
  const a00 = c[0] + xs * (c[25] + xs * (c[43] + xs * (c[56] + xs * (c[65] + xs * (c[71] + xs * (c[74]))))));
  const a10 = c[7] + xs * (c[30] + xs * (c[47] + xs * (c[59] + xs * (c[68] + xs * (c[73])))));
  const a20 = c[12] + xs * (c[34] + xs * (c[50] + xs * (c[62] + xs * (c[70]))));
  const a30 = c[16] + xs * (c[37] + xs * (c[53] + xs * (c[64])));
  const a40 = c[19] + xs * (c[40] + xs * (c[55]));
  const a50 = c[22] + xs * (c[42]);
  const a60 = c[24];
  const b0 = a00 + ys * (a10 + ys * (a20 + ys * (a30 + ys * (a40 + ys * (a50 + ys * (a60))))));
  const a01 = c[1] + xs * (c[26] + xs * (c[44] + xs * (c[57] + xs * (c[66] + xs * (c[72])))));
  const a11 = c[8] + xs * (c[31] + xs * (c[48] + xs * (c[60] + xs * (c[69]))));
  const a21 = c[13] + xs * (c[35] + xs * (c[51] + xs * (c[63])));
  const a31 = c[17] + xs * (c[38] + xs * (c[54]));
  const a41 = c[20] + xs * (c[41]);
  const a51 = c[23];
  const b1 = a01 + ys * (a11 + ys * (a21 + ys * (a31 + ys * (a41 + ys * (a51)))));
  const a02 = c[2] + xs * (c[27] + xs * (c[45] + xs * (c[58] + xs * (c[67]))));
  const a12 = c[9] + xs * (c[32] + xs * (c[49] + xs * (c[61])));
  const a22 = c[14] + xs * (c[36] + xs * (c[52]));
  const a32 = c[18] + xs * (c[39]);
  const a42 = c[21];
  const b2 = a02 + ys * (a12 + ys * (a22 + ys * (a32 + ys * (a42))));
  const a03 = c[3] + xs * (c[28] + xs * (c[46]));
  const a13 = c[10] + xs * (c[33]);
  const a23 = c[15];
  const b3 = a03 + ys * (a13 + ys * (a23));
  const a04 = c[4] + xs * (c[29]);
  const a14 = c[11];
  const b4 = a04 + ys * (a14);
  const a05 = c[5];
  const b5 = a05;
  const a06 = c[6];
  const b6 = a06;
  return b0 + z * (b1 + z * (b2 + z * (b3 + z * (b4 + z * (b5 + z * (b6))))));
}

/** Σ h_ij · x^i · y^j: Horner in x within y. */
function potentialEnthalpy(x: number, y: number): number {
  const c = H_C;
  const a0 = c[0] + x * (x * (c[8] + x * (c[15] + x * (c[20] + x * (c[26] + x * (c[27] + x * (c[28])))))));
  const a1 = c[1] + x * (x * (c[9] + x * (c[16] + x * (c[21]))));
  const a2 = c[2] + x * (x * (c[10] + x * (c[17] + x * (c[22]))));
  const a3 = c[3] + x * (x * (c[11] + x * (c[18] + x * (c[23]))));
  const a4 = c[4] + x * (x * (c[12] + x * (c[19] + x * (c[24]))));
  const a5 = c[5] + x * (x * (c[13] + x * (x * (c[25]))));
  const a6 = c[6] + x * (x * (c[14]));
  const a7 = c[7];
  return a0 + y * (a1 + y * (a2 + y * (a3 + y * (a4 + y * (a5 + y * (a6 + y * (a7)))))));
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
