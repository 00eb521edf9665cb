import type { ParsedUnits } from '../cf/units.js';
import { StillwaterError } from '../errors.js';
import { densityOfLevel as teos10DensityOfLevel } from './density-level.js';

/** Nominal seawater density used when no temperature and salinity are given (common practice). */
export const NOMINAL_DENSITY = 1025;
/**
 * Oxygen per volume of gas at STP: 1 ml O₂ = 44.661 µmol (molar volume 22.392 L/mol; common
 * practice, from memory). So 1 L(gas) per L(water) = 44.661 mol m⁻³.
 */
export const O2_MOL_M3_PER_L_L = 44.661;

export interface ConvertOptions {
  /** variable name, for messages */
  variable: string;
  /** true when the variable is dissolved oxygen: only then are ml L⁻¹ convertible */
  oxygen?: boolean;
  /** density per cell (kg m⁻³), or one value for all */
  density?: Float32Array | Float64Array | number;
  /** potential temperature (°C, ITS-90) and practical salinity per cell: density by TEOS-10 */
  temperature?: Float32Array;
  salinity?: Float32Array;
  /** sea pressure for the density (dbar); 0 (potential density) unless given */
  pressure?: number;
}

export type DensitySource = 'none' | 'given' | 'temperature-salinity' | 'nominal';

export interface ConvertResult {
  values: Float32Array;
  /** where the density came from ('none' when the conversion needed none) */
  density: DensitySource;
  /** a sentence for the output when the nominal density was used anywhere */
  note?: string;
}

type Frame = 'per_volume' | 'per_mass' | 'gas_volume';

/**
 * TEOS-10 density per cell (NaN where temperature or salinity is missing), computed once per level: every
 * variable of every run converted on that level passes the same temperature and salinity arrays. Keyed by
 * the arrays themselves, so it relies on a level's arrays never being written once they are handed out
 * (readLevel gives fresh arrays everywhere).
 */
const levelDensity = new WeakMap<Float32Array, { salinity: Float32Array; pressure: number; rho: Float64Array }>();
function densityOfLevel(T: Float32Array, S: Float32Array, p: number): Float64Array {
  const hit = levelDensity.get(T);
  if (hit && hit.salinity === S && hit.pressure === p) return hit.rho;
  const rho = teos10DensityOfLevel(S, T, p);
  levelDensity.set(T, { salinity: S, pressure: p, rho });
  return rho;
}

function frameOf(u: ParsedUnits): Frame | null {
  if (u.kind === 'amount_per_volume') return 'per_volume';
  if (u.kind === 'amount_per_mass') return 'per_mass';
  if (u.kind === 'gas_volume_per_volume') return 'gas_volume';
  return null;
}

/** True when `from` can be turned into `to` for this variable (oxygen needed for ml L⁻¹). */
export function canConvert(from: ParsedUnits, to: ParsedUnits, oxygen = false): boolean {
  if (from.kind === to.kind && frameOf(from) === null) return true;
  const a = frameOf(from), b = frameOf(to);
  if (!a || !b) return false;
  if ((a === 'gas_volume' || b === 'gas_volume') && a !== b && !oxygen) return false;
  return true;
}

/**
 * Convert one level of a concentration between mmol m⁻³, µmol kg⁻¹, µmol L⁻¹, mol m⁻³ and, for
 * oxygen, ml L⁻¹: per volume = per mass × ρ (common practice), with ρ from the given density, else
 * from temperature and salinity (TEOS-10), else the nominal 1025 kg m⁻³ (and the result says so).
 * Units of any other kind convert only within their kind. Incompatible units throw E_UNITS.
 */
export function convertLevel(values: Float32Array, from: ParsedUnits, to: ParsedUnits, opts: ConvertOptions): ConvertResult {
  const fa = frameOf(from), fb = frameOf(to);
  if (!canConvert(from, to, opts.oxygen)) {
    const why = (fa === 'gas_volume' || fb === 'gas_volume') && fa && fb ? ' (a gas volume per volume converts only for oxygen)' : '';
    throw new StillwaterError('E_UNITS', `Variable '${opts.variable}': there is no conversion from '${from.text}' to '${to.text}'${why}.`, { variable: opts.variable });
  }
  const out = new Float32Array(values.length);
  if (!fa || !fb) {
    // same kind, not a concentration: a factor and an offset (e.g. K to °C)
    for (let i = 0; i < values.length; i++) out[i] = (values[i] * from.factor + from.offset - to.offset) / to.factor;
    return { values: out, density: 'none' };
  }
  // to mol m-3 (per volume) or mol kg-1 (per mass): which of the two needs ρ
  const needsDensity = (fa === 'per_mass') !== (fb === 'per_mass');
  let source: DensitySource = 'none';
  let nominalCells = 0;
  let rho: (i: number) => number = () => NaN;
  if (needsDensity) {
    const d = opts.density;
    if (typeof d === 'number') {
      source = 'given';
      rho = () => d;
    } else if (d) {
      source = 'given';
      rho = (i) => d[i];
    } else if (opts.temperature && opts.salinity) {
      source = 'temperature-salinity';
      const fromFields = densityOfLevel(opts.temperature, opts.salinity, opts.pressure ?? 0);
      rho = (i) => {
        const r = fromFields[i];
        if (r === r) return r;
        nominalCells++;
        return NOMINAL_DENSITY;
      };
    } else {
      source = 'nominal';
      rho = () => NOMINAL_DENSITY;
    }
  }
  const gasFrom = fa === 'gas_volume' ? O2_MOL_M3_PER_L_L : 1;
  const gasTo = fb === 'gas_volume' ? O2_MOL_M3_PER_L_L : 1;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v !== v) {
      out[i] = NaN;
      continue;
    }
    // into a common frame: mol m-3 when a density step is involved, else the shared base
    let base = v * from.factor * gasFrom;
    if (needsDensity) base = fa === 'per_mass' ? base * rho(i) : base / rho(i);
    out[i] = base / gasTo / to.factor;
  }
  const result: ConvertResult = { values: out, density: source };
  if (source === 'nominal') result.note = `Converted '${opts.variable}' from ${from.canonical} to ${to.canonical} with a nominal seawater density of ${NOMINAL_DENSITY} kg m-3 (no temperature and salinity given).`;
  else if (nominalCells > 0) result.note = `Converted '${opts.variable}' with TEOS-10 density from temperature and salinity; ${nominalCells} cells without temperature or salinity used the nominal ${NOMINAL_DENSITY} kg m-3.`;
  return result;
}
