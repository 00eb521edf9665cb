import { describe, expect, it } from 'vitest';
import { parseUnits } from '../../../app/cf/units.js';
import { convertLevel, NOMINAL_DENSITY } from '../../../app/ocean/convert.js';
import { densityFromPracticalAndPotential } from '../../../app/ocean/teos10.js';
import { StillwaterError } from '../../../app/errors.js';

const u = parseUnits;

describe('concentration units by density (common practice: mmol m-3 = µmol kg-1 × ρ / 1000)', () => {
  it('µmol/kg to mmol/m3 with the nominal 1025 kg m-3 when no T/S are given, and says so', () => {
    const r = convertLevel(Float32Array.of(100, NaN), u('umol kg-1'), u('mmol m-3'), { variable: 'NO3' });
    expect(r.values[0]).toBeCloseTo(102.5, 4);
    expect(Number.isNaN(r.values[1])).toBe(true);
    expect(r.density).toBe('nominal');
    expect(r.note).toMatch(/nominal seawater density of 1025 kg m-3/);
    expect(NOMINAL_DENSITY).toBe(1025);
  });
  it('uses TEOS-10 density from temperature and salinity when given (checked against gsw in seawater.test.ts)', () => {
    const T = Float32Array.of(2, 25), S = Float32Array.of(34.7, 36);
    const r = convertLevel(Float32Array.of(2000, 2000), u('mmol m-3'), u('umol kg-1'), { variable: 'PO4', temperature: T, salinity: S });
    expect(r.density).toBe('temperature-salinity');
    expect(r.note).toBeUndefined();
    expect(r.values[0]).toBeCloseTo((2000 / densityFromPracticalAndPotential(34.7, 2)) * 1000, 2);
    expect(r.values[1]).toBeCloseTo((2000 / densityFromPracticalAndPotential(36, 25)) * 1000, 2);
    expect(r.values[0]).not.toBeCloseTo(r.values[1], 1);
  });
  it('per-volume units convert among themselves without density: mol m-3, mmol m-3, µmol L-1', () => {
    const r = convertLevel(Float32Array.of(0.0021), u('mol m-3'), u('mmol m-3'), { variable: 'PO4' });
    expect(r.values[0]).toBeCloseTo(2.1, 5);
    expect(r.density).toBe('none');
    expect(convertLevel(Float32Array.of(2.1), u('umol L-1'), u('mmol m-3'), { variable: 'PO4' }).values[0]).toBeCloseTo(2.1, 5);
  });
  it('oxygen ml/L: 1 ml(STP) O2 = 44.661 µmol (common practice, from memory)', () => {
    const r = convertLevel(Float32Array.of(1), u('ml/l'), u('mmol m-3'), { variable: 'O2', oxygen: true });
    expect(r.values[0]).toBeCloseTo(44.661, 3);
    const back = convertLevel(Float32Array.of(44.661 * 1.025), u('umol kg-1'), u('ml L-1'), { variable: 'O2', oxygen: true });
    expect(back.values[0]).toBeCloseTo(1.025 * 1.025, 4);
  });
  it('ml/L for anything but oxygen, or units of different kinds, is an error naming both units and the variable', () => {
    expect(() => convertLevel(Float32Array.of(1), u('ml/l'), u('mmol m-3'), { variable: 'NO3' })).toThrow(/'NO3'.*'ml\/l'.*'mmol m-3'.*oxygen/);
    try {
      convertLevel(Float32Array.of(1), u('degC'), u('umol kg-1'), { variable: 'thetao' });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(StillwaterError);
      expect((e as StillwaterError).code).toBe('E_UNITS');
      expect((e as Error).message).toBe("Variable 'thetao': there is no conversion from 'degC' to 'umol kg-1'.");
    }
  });
  it('same-kind units other than concentrations convert by factor and offset (K to °C)', () => {
    expect(convertLevel(Float32Array.of(273.15 + 4), u('K'), u('degC'), { variable: 'thetao' }).values[0]).toBeCloseTo(4, 4);
  });
});
