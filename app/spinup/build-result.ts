import type { ParsedUnits } from '../cf/units.js';
import { analyseTrack, DEEP_SETTLING_YEARS } from './analyse-track.js';
import { inventoryUnits } from './inventory-units.js';
import { isDeepLayer } from './layer-fractions.js';
import { layerLabel } from '../regions/layers.js';
import type { SeriesSums } from './series.js';
import { summarise } from './summary.js';
import type { SkillPoint, SpinupResult, SpinupSettings, SpinupTrack } from './types.js';

/**
 * The zero of a temperature scale in the field's units (273.15 for degC, 0 for K): a drift relative to a
 * mean in degC would depend on where the scale puts its zero, so temperatures are taken relative to kelvin.
 */
function scaleZero(u: ParsedUnits): number {
  return u.kind === 'temperature' ? (u.offset + 273.15) / u.factor : 0;
}

/** Tracks (series + drift + fit + verdict) for every tracer x region x layer, and the run's summary. */
export function buildResult(run: string, series: SeriesSums, settings: SpinupSettings, skill: SkillPoint[] = []): SpinupResult {
  const years = series.snapshots.map((s) => s.year);
  const weightsAreAreas = series.grid.vertical === null;
  const notes: string[] = [];
  const tracers = series.tracers.map((t) => {
    const inv = inventoryUnits(t.field.units, settings.nominalDensity, weightsAreAreas);
    if (inv.note) notes.push(`${t.spec.name}: ${inv.note}.`);
    return { name: t.spec.name, variable: t.spec.variable, units: t.field.units.text, inventoryUnits: inv.units, inventoryNote: inv.note, factor: inv.factor, perVolume: inv.perVolume ?? 0, scaleZero: scaleZero(t.field.units) };
  });
  const tracks: SpinupTrack[] = [];
  tracers.forEach((tr, j) => {
    series.regions.forEach((region, r) => {
      series.layers.forEach((layer, l) => {
        const mean = series.sums.map((s) => {
          const a = s[j][r][l];
          return a.volume > 0 ? a.sumCV / a.volume : NaN;
        });
        const inventory = series.sums.map((s) => {
          const a = s[j][r][l];
          return a.volume > 0 ? a.sumCV * tr.factor + a.volume * tr.perVolume : NaN;
        });
        const a = analyseTrack({
          years,
          mean,
          inventory,
          units: tr.units,
          deep: isDeepLayer(layer, series.grid.vertical),
          scaleZero: tr.scaleZero,
          thresholdPercentPerKyr: settings.thresholdPercentPerKyr,
          tailYears: settings.tailYears,
        });
        tracks.push({
          tracer: tr.name,
          variable: tr.variable,
          region,
          layer: layerLabel(layer),
          units: tr.units,
          inventoryUnits: tr.inventoryUnits,
          mean,
          inventory,
          meanDeviation: mean.map((v) => v - mean[0]),
          inventoryDeviation: inventory.map((v) => v - inventory[0]),
          volume: series.sums[0][j][r][l].volume,
          ...a,
        });
      });
    });
  });
  const lastYear = years[years.length - 1];
  if (lastYear < DEEP_SETTLING_YEARS && series.layers.some((l) => isDeepLayer(l, series.grid.vertical))) {
    notes.push(
      `The run is only ${Math.round(lastYear)} model years long: a spin-up much shorter than a few thousand years has not settled in the deep ocean (England 1995; common practice); drift verdicts for deep layers may mislead.`,
    );
  }
  return {
    run,
    years,
    snapshots: series.snapshots.map((s) => ({ file: s.file, year: s.year, ...(s.timeIndex !== undefined ? { timeIndex: s.timeIndex } : {}) })),
    tracers: tracers.map(({ factor: _f, perVolume: _p, scaleZero: _z, ...t }) => t),
    regions: series.regions,
    layers: series.layers.map(layerLabel),
    settings,
    tracks,
    skill,
    summary: summarise(run, lastYear, tracks),
    notes,
  };
}
