/**
 * Converting one level of values between units. Same kind: linear (factor and offset of app/cf/units).
 * Per mass ↔ per volume: through seawater density, mol m-3 = mol kg-1 × ρ (common practice), ρ from
 * temperature and salinity fields when the recipe names them, otherwise a nominal value that the output
 * flags. Oxygen gas volume ↔ amount: 1 ml(STP) O2 = 44.661 µmol (common practice; from memory).
 */
import type { ParsedUnits, UnitKind } from '../cf/units.js';
import { StillwaterError } from '../errors.js';

/** mol of O2 per litre of gas at STP (22.392 L mol-1), so mol m-3 per (L L-1) = 1000 / 22.392 */
export const O2_MOL_PER_L_GAS = 44.661e-3;

export interface LevelConverter {
  /** true when a density level must be given to apply */
  needsDensity: boolean;
  /** convert in place; `density` (kg m-3) per cell when needsDensity */
  apply(values: Float32Array, density?: ArrayLike<number> | number): void;
  /** a note for the output, e.g. "converted mmol m-3 to umol kg-1 with a nominal density of 1025 kg m-3" */
  describe(densityNote: string): string;
}

/** to base of `from`, then (maybe) across kinds, then from base of `to`: value·a(·ρ^p) + b */
export function makeLevelConverter(from: ParsedUnits, to: ParsedUnits, what: string): LevelConverter | null {
  if (from.kind === to.kind) {
    if (from.factor === to.factor && from.offset === to.offset) return null;
    return linear(from.factor / to.factor, (from.offset - to.offset) / to.factor, from, to);
  }
  const toVolume = (k: UnitKind, f: number): { per: 'volume' | 'mass'; f: number } | null => {
    if (k === 'amount_per_volume') return { per: 'volume', f };
    if (k === 'amount_per_mass') return { per: 'mass', f };
    if (k === 'gas_volume_per_volume') return { per: 'volume', f: f * O2_MOL_PER_L_GAS * 1000 };
    return null;
  };
  const a = toVolume(from.kind, from.factor);
  const b = toVolume(to.kind, to.factor);
  if (!a || !b) {
    throw new StillwaterError('E_UNITS', `${what}: cannot convert '${from.text}' to '${to.text}' (${from.kind.replace(/_/g, ' ')} to ${to.kind.replace(/_/g, ' ')}).`);
  }
  const ratio = a.f / b.f;
  if (a.per === b.per) return linear(ratio, 0, from, to);
  // mass → volume multiplies by ρ; volume → mass divides
  const power: 1 | -1 = a.per === 'mass' ? 1 : -1;
  return {
    needsDensity: true,
    apply(values, density) {
      if (density === undefined) throw new Error('density level missing');
      if (typeof density === 'number') {
        const s = power === 1 ? ratio * density : ratio / density;
        for (let i = 0; i < values.length; i++) values[i] *= s;
        return;
      }
      for (let i = 0; i < values.length; i++) {
        const rho = density[i];
        values[i] = power === 1 ? values[i] * ratio * rho : (values[i] * ratio) / rho;
      }
    },
    describe: (densityNote) => `converted ${from.canonical} to ${to.canonical} with ${densityNote}`,
  };
}

function linear(a: number, b: number, from: ParsedUnits, to: ParsedUnits): LevelConverter {
  return {
    needsDensity: false,
    apply(values) {
      for (let i = 0; i < values.length; i++) values[i] = values[i] * a + b;
    },
    describe: () => `converted ${from.canonical} to ${to.canonical}`,
  };
}
