import { typesetUnits } from '../figures/typeset.js';
import { formatNumber } from '../output/number-format.js';
import type { ParsedUnits } from '../cf/units.js';
import type { InventoryUnits } from './types.js';

/** TEOS-10 cp0, the heat capacity that turns Conservative Temperature into potential enthalpy, J kg-1 K-1 (IOC et al. 2010). */
export const CP0 = 3991.86795711963;

/** Molar volume of an ideal gas at STP, L mol-1 (1 ml(STP) O2 = 44.661 µmol; common practice, from memory). */
export const MOLAR_VOLUME_STP_L = 22.392;

/**
 * How Σ c·V (field units x m³) becomes an inventory with proper units:
 * amount per volume x m³ -> mol; amount per mass x nominal density x m³ -> mol (said so);
 * gas volume per volume (ml L-1) x m³ -> mol through the molar volume at STP (said so);
 * temperature -> heat content relative to 0 °C, ρ0·cp0·Σ T·V in J (nominal density and TEOS-10 cp0, said so);
 * anything else stays Σ c·V in "<units> m3" (a volume integral, not an amount).
 * `weightsAreAreas` for 2-D fields, whose weights are cell areas.
 */
export function inventoryUnits(units: ParsedUnits, nominalDensity: number, weightsAreAreas = false): InventoryUnits {
  // the notes are read by people (banner, report): units typeset as the figures print them
  const u = typesetUnits(units.text);
  if (weightsAreAreas) return { units: `${units.canonical} m2`, factor: 1, note: 'a 2-D field: the inventory is the area integral Σ c·A' };
  switch (units.kind) {
    case 'amount_per_volume':
      return { units: 'mol', factor: units.factor };
    case 'amount_per_mass':
      return {
        units: 'mol',
        factor: units.factor * nominalDensity,
        note: `${u} was turned into an amount with a nominal seawater density of ${nominalDensity} kg m⁻³ (common practice)`,
      };
    case 'gas_volume_per_volume':
      return {
        units: 'mol',
        factor: (units.factor * 1000) / MOLAR_VOLUME_STP_L,
        note: `${u} was turned into an amount with the molar volume of a gas at STP, ${MOLAR_VOLUME_STP_L} L mol⁻¹ (common practice)`,
      };
    case 'temperature':
      return {
        units: 'J',
        factor: nominalDensity * CP0 * units.factor,
        perVolume: nominalDensity * CP0 * units.offset,
        note: `the inventory of ${u} is the heat content relative to 0 °C, ρ0·cp0·Σ T·V with a nominal density of ${nominalDensity} kg m⁻³ and the TEOS-10 heat capacity cp0 = ${formatNumber(CP0)} J kg⁻¹ K⁻¹ (common practice)`,
      };
    default:
      return { units: `${units.canonical} m3`, factor: 1, note: `${u} is not an amount: the inventory column is the volume integral Σ c·V` };
  }
}
