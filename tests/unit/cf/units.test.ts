import { describe, expect, it } from 'vitest';
import { convertValue, parseUnits } from '../../../app/cf/units.js';
import { StillwaterError } from '../../../app/errors.js';

// Factors follow the SI prefixes and the UDUNITS-2 definitions that CF 1.10 §3.1 refers to
// (1 L = 1e-3 m³, M = mol L⁻¹, K = degC + 273.15). Spellings are the ones climatologies and models write
// (common practice).
describe('parseUnits: concentrations per volume (base mol m-3)', () => {
  const cases: [string, number][] = [
    ['mmol m-3', 1e-3], ['mmol/m^3', 1e-3], ['mmol m^-3', 1e-3], ['mmol/m3', 1e-3], ['mmol m**-3', 1e-3],
    ['mol m-3', 1], ['mol/m3', 1], ['umol/l', 1e-3], ['umol L-1', 1e-3], ['µmol/L', 1e-3], ['µM', 1e-3],
    ['uM', 1e-3], ['μM', 1e-3], ['mM', 1], ['nmol/l', 1e-6], ['millimoles_per_cubic_meter', 1e-3],
    ['mole_per_cubic_meter', 1],
  ];
  for (const [text, factor] of cases) {
    it(`'${text}' is ${factor} mol m-3`, () => {
      const u = parseUnits(text);
      expect(u.kind).toBe('amount_per_volume');
      expect(u.factor).toBeCloseTo(factor, 15);
      expect(u.offset).toBe(0);
      expect(u.text).toBe(text);
    });
  }
  it('canonical spelling of per-volume units', () => {
    expect(parseUnits('mmol/m^3').canonical).toBe('mmol m-3');
    expect(parseUnits('µM').canonical).toBe('mmol m-3');
    expect(parseUnits('mol/m3').canonical).toBe('mol m-3');
  });
});

describe('parseUnits: concentrations per mass (base mol kg-1)', () => {
  for (const text of ['umol kg-1', 'µmol/kg', 'μmol kg-1', 'micromoles_per_kilogram', 'umol/kg', 'micromol/kg', 'umol kg^-1']) {
    it(`'${text}' is 1e-6 mol kg-1`, () => {
      const u = parseUnits(text);
      expect(u.kind).toBe('amount_per_mass');
      expect(u.factor).toBeCloseTo(1e-6, 18);
      expect(u.canonical).toBe('umol kg-1');
    });
  }
  it('mmol/kg is 1e-3 mol kg-1', () => expect(parseUnits('mmol/kg').factor).toBeCloseTo(1e-3, 15));
});

describe('parseUnits: oxygen as gas volume per volume', () => {
  for (const text of ['ml/l', 'mL L-1', 'ml l-1', 'milliliters_per_liter']) {
    it(`'${text}' is 1e-3 L L-1`, () => {
      const u = parseUnits(text);
      expect(u.kind).toBe('gas_volume_per_volume');
      expect(u.factor).toBeCloseTo(1e-3, 15);
      expect(u.canonical).toBe('ml L-1');
    });
  }
});

describe('parseUnits: temperature, salinity, dimensionless, length', () => {
  it('Celsius spellings are degC', () => {
    for (const t of ['degC', 'deg_C', 'degrees_celsius', 'Celsius', 'degree_Celsius', 'Degrees Celsius', 'DEGC']) {
      const u = parseUnits(t);
      expect([u.kind, u.canonical, u.factor, u.offset]).toEqual(['temperature', 'degC', 1, 0]);
    }
  });
  it('kelvin converts with offset −273.15 (SI: 0 °C = 273.15 K)', () => {
    for (const t of ['K', 'kelvin']) {
      const u = parseUnits(t);
      expect(u.kind).toBe('temperature');
      expect(convertValue(273.15, u, parseUnits('degC'))).toBeCloseTo(0, 12);
      expect(convertValue(10, parseUnits('degC'), u)).toBeCloseTo(283.15, 12);
    }
  });
  it('practical salinity spellings are 1e-3', () => {
    for (const t of ['psu', 'PSU', '1e-3', '0.001']) expect(parseUnits(t)).toMatchObject({ kind: 'salinity', canonical: '1e-3', factor: 1 });
    expect(parseUnits('g/kg')).toMatchObject({ kind: 'salinity', canonical: 'g kg-1' });
  });
  it("'1' is dimensionless", () => expect(parseUnits('1')).toMatchObject({ kind: 'dimensionless', factor: 1 }));
  it('lengths in metres', () => {
    expect(parseUnits('m')).toMatchObject({ kind: 'length', factor: 1, canonical: 'm' });
    expect(parseUnits('cm')).toMatchObject({ kind: 'length', factor: 0.01, canonical: 'cm' });
    expect(parseUnits('meters')).toMatchObject({ kind: 'length', factor: 1 });
    expect(parseUnits('metres')).toMatchObject({ kind: 'length', factor: 1 });
  });
  it('other SI products are parsed, not guessed', () => {
    expect(parseUnits('m s-1')).toMatchObject({ kind: 'other', canonical: 'm s-1', factor: 1 });
    expect(parseUnits('mmol m-2 d-1')).toMatchObject({ kind: 'other' });
  });
});

describe('parseUnits: unknown units are reported, never guessed', () => {
  for (const t of ['xyz', 'mmol m-3 furlongs', 'per', 'umol//kg', '%%']) {
    it(`'${t}' throws E_UNITS`, () => {
      let e: unknown;
      try {
        parseUnits(t);
      } catch (x) {
        e = x;
      }
      expect(e).toBeInstanceOf(StillwaterError);
      expect((e as StillwaterError).code).toBe('E_UNITS');
    });
  }
  it("the sentence names the units: unknown units 'xyz'", () => {
    expect(() => parseUnits('xyz')).toThrow("unknown units 'xyz'");
  });
  it('converting between kinds needs more information', () => {
    expect(() => convertValue(1, parseUnits('umol/kg'), parseUnits('mmol m-3'))).toThrow(/cannot convert/);
  });
});
