import { describe, expect, it } from 'vitest';
import { latLabel, lonLabel, typesetUnits } from '../../../app/figures/typeset.js';

// SI brochure (BIPM, 9th edition 2019): unit symbols with superscript exponents and the prefix µ; the degree
// sign for Celsius. UDUNITS-2 spellings (umol kg-1, degC) are what CF files carry.
describe('units as a printed figure shows them', () => {
  it.each([
    ['umol kg-1', 'µmol kg⁻¹'],
    ['mmol m-3', 'mmol m⁻³'],
    ['degC', '°C'],
    ['degrees_Celsius', '°C'],
    ['mol m-3', 'mol m⁻³'],
    ['mmol/m3', 'mmol m⁻³'],
    ['umol/kg', 'µmol kg⁻¹'],
    ['m2 s-1', 'm² s⁻¹'],
    ['ml L-1', 'ml L⁻¹'],
    ['1e-3 m3', '10⁻³ m³'],
    ['J kg-1 K-1', 'J kg⁻¹ K⁻¹'],
  ])('%s → %s', (raw, printed) => expect(typesetUnits(raw)).toBe(printed));
});

// common practice in cartography: hemisphere letters instead of signs
describe('longitudes and latitudes', () => {
  it.each([
    [-30, '30°W'],
    [30, '30°E'],
    [0, '0°'],
    [180, '180°'],
    [-180, '180°'],
    [330, '30°W'],
  ])('longitude %d → %s', (v, t) => expect(lonLabel(v)).toBe(t));
  it.each([
    [-60, '60°S'],
    [45, '45°N'],
    [0, '0°'],
  ])('latitude %d → %s', (v, t) => expect(latLabel(v)).toBe(t));
});
