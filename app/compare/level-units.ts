/**
 * Bringing one level into the table's units, through app/ocean/convert.ts: linear within a kind; per mass ↔
 * per volume through seawater density (from the reference's temperature and salinity when the recipe names
 * them, otherwise the nominal density, flagged in the output); ml L-1 only for oxygen.
 */
import type { ParsedUnits } from '../cf/units.js';
import { StillwaterError } from '../errors.js';
import { canConvert, convertLevel } from '../ocean/convert.js';

/** What the density step needs for one level. */
export type DensityInput = { density: number } | { temperature: Float32Array; salinity: Float32Array; pressure: number };

export interface LevelConverter {
  /** true when a density input must be given */
  needsDensity: boolean;
  apply(values: Float32Array, density?: DensityInput): Float32Array;
  /** for notes: "converted mmol m-3 to umol kg-1 with <density note>" */
  describe(densityNote: string): string;
}

const CONCENTRATION = new Set(['amount_per_volume', 'amount_per_mass', 'gas_volume_per_volume']);

/** Dissolved oxygen, by the recipe's key or the file's standard_name: only oxygen converts from ml L-1. */
export function looksLikeOxygen(key: string, standardName?: string): boolean {
  return /^(o2|oxygen|doxy|dissolved_?oxygen)$/i.test(key) || /oxygen/i.test(standardName ?? '');
}

export function makeLevelConverter(from: ParsedUnits, to: ParsedUnits, what: string, variable: string, oxygen: boolean): LevelConverter | null {
  if (from.kind === to.kind && from.factor === to.factor && from.offset === to.offset) return null;
  if (!canConvert(from, to, oxygen)) {
    const why = from.kind === 'gas_volume_per_volume' || to.kind === 'gas_volume_per_volume' ? ' (a gas volume per volume converts only for oxygen)' : '';
    throw new StillwaterError('E_UNITS', `${what}: cannot convert '${from.text}' to '${to.text}'${why}.`);
  }
  const needsDensity = CONCENTRATION.has(from.kind) && CONCENTRATION.has(to.kind) && (from.kind === 'amount_per_mass') !== (to.kind === 'amount_per_mass');
  return {
    needsDensity,
    apply(values, density) {
      const extra = !needsDensity || !density ? {} : 'density' in density ? { density: density.density } : density;
      return convertLevel(values, from, to, { variable, oxygen, ...extra }).values;
    },
    describe: (densityNote) => `converted ${from.canonical} to ${to.canonical}${needsDensity ? ` with ${densityNote}` : ''}`,
  };
}
