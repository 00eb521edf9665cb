/**
 * Canonical units. Concentration units are split into an amount part and a "per" part so that
 * conversion (app/ocean) can tell per-volume from per-mass. Filled in by the units parser.
 */
export type UnitKind =
  | 'amount_per_volume' // e.g. mmol m-3, umol L-1, mol m-3, uM
  | 'amount_per_mass' // e.g. umol kg-1
  | 'gas_volume_per_volume' // ml L-1 (oxygen)
  | 'temperature'
  | 'salinity'
  | 'dimensionless'
  | 'length'
  | 'other';

export interface ParsedUnits {
  /** the text as written in the file or recipe */
  text: string;
  kind: UnitKind;
  /** canonical spelling, e.g. "mmol m-3", "umol kg-1", "degC", "K", "1e-3", "m" */
  canonical: string;
  /**
   * multiply a value in these units by `factor` to get the kind's base unit:
   * mol m-3 for amount_per_volume, mol kg-1 for amount_per_mass, L L-1 for gas volume, degC offset handled by `offset`.
   */
  factor: number;
  offset: number;
}
