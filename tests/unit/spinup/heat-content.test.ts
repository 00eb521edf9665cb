import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import type { ParsedUnits } from '../../../app/cf/units.js';
import { CP0, inventoryUnits } from '../../../app/spinup/inventory-units.js';
import { analyseTrack } from '../../../app/spinup/analyse-track.js';

const DEGC: ParsedUnits = { text: 'degC', kind: 'temperature', canonical: 'degC', factor: 1, offset: 0 };
const KELVIN: ParsedUnits = { text: 'K', kind: 'temperature', canonical: 'K', factor: 1, offset: -273.15 };

describe('temperature: heat content and drift relative to kelvin', () => {
  it('cp0 is TEOS-10’s: potential enthalpy at p = 0 divided by Conservative Temperature (python3-gsw)', () => {
    const r = spawnSync('/usr/bin/python3', ['-c', 'import gsw; print(repr(gsw.enthalpy_CT_exact(35.0, 10.0, 0.0) / 10.0))'], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    expect(Math.abs(CP0 / Number(r.stdout) - 1)).toBeLessThan(1e-12);
  });

  it('gives heat content relative to 0 °C in J, ρ0·cp0·Σ T·V, the same for degC and K', () => {
    const c = inventoryUnits(DEGC, 1025);
    const k = inventoryUnits(KELVIN, 1025);
    expect(c.units).toBe('J');
    expect(c.note).toMatch(/nominal density of 1025 kg m⁻³.*cp0/);
    // one cubic metre at 10 °C = 283.15 K
    const fromC = c.factor * 10 + (c.perVolume ?? 0);
    const fromK = k.factor * 283.15 + (k.perVolume ?? 0);
    expect(fromC).toBeCloseTo(1025 * CP0 * 10, 6);
    expect(fromK / fromC - 1).toBeCloseTo(0, 12);
  });

  it('takes a temperature drift relative to the mean in kelvin, so the verdict does not depend on the zero of the scale', () => {
    const years = [0, 500, 1000, 1500, 2000];
    const degC = years.map((t) => 2 + 0.001 * t); // 1 K per 1000 years
    const kelvin = degC.map((v) => v + 273.15);
    const base = { years, units: 'degC', deep: false, thresholdPercentPerKyr: 0.1 };
    const a = analyseTrack({ ...base, mean: degC, inventory: degC, scaleZero: 273.15 });
    const b = analyseTrack({ ...base, units: 'K', mean: kelvin, inventory: kelvin, scaleZero: 0 });
    const meanK = (3 + 3.5 + 4) / 3 + 273.15; // tail: last 3 snapshots (years 1000–2000)
    expect(a.drift!.percentPerKyr).toBeCloseTo((1 / meanK) * 100, 9);
    expect(b.drift!.percentPerKyr).toBeCloseTo(a.drift!.percentPerKyr!, 9);
    expect(a.verdict.sentence).toMatch(/of the mean in kelvin/);
  });
});
