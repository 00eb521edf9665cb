/**
 * The monthly cycle of a region's mean over the levels of a depth choice (a month × depth section): the
 * reference, a run and the run minus the reference. Read level by level: one level's 12 months of each source
 * at a time, reduced to 12 regional means before the next level is read.
 */
import { StillwaterError } from '../errors.js';
import { areaMean } from '../lines/slices.js';
import { layerLevelMetres, type LayerSpec } from '../regions/layers.js';
import type { LayerChoice, ProfileCycleData } from '../../contract/view-types.js';
import type { ServiceProgress } from './progress.js';
import { recipeIsMonthly } from './periods.js';
import type { Session } from './session.js';
import { refOf, regionNamed, runOf } from './sources.js';

/** The levels of the common grid a depth choice covers, top down (a run of consecutive levels). */
function levelsOf(s: Session, layer: LayerChoice): number[] {
  const v = s.grid.vertical;
  if (layer.kind === 'bottom') {
    throw new StillwaterError('E_INPUT', 'The monthly cycle is drawn against depth, so it needs levels or a depth layer; the bottom follows the seafloor column by column: choose another depth.');
  }
  if (!v) return [0];
  if (layer.kind === 'level') return [layer.k ?? 0];
  const spec: LayerSpec = layer.kind === 'interval' ? { kind: 'interval', top: layer.top!, bottom: layer.bottom! } : { kind: layer.kind };
  const metres = layerLevelMetres(spec, v);
  const out: number[] = [];
  for (let k = 0; k < v.nz; k++) if (metres[k] > 0) out.push(k);
  if (!out.length) throw new StillwaterError('E_INPUT', `The depth choice '${layer.label}' covers no level of the common grid.`);
  return out;
}

export async function profileCycleData(s: Session, input: { variable: string; run: string; region: string; layer: string }, ctx: ServiceProgress): Promise<ProfileCycleData> {
  if (!recipeIsMonthly(s.recipe)) {
    throw new StillwaterError('E_INPUT', 'The recipe compares the year only, so there is no monthly cycle: add "periods": ["months"] to its options.', { path: 'options.periods' });
  }
  const layer = s.info.layers.find((l) => l.id === input.layer);
  if (!layer) throw new StillwaterError('E_INPUT', `There is no depth choice '${input.layer}' in this session.`);
  const ks = levelsOf(s, layer);
  const pair = await s.pair(input.variable);
  const region = await regionNamed(s, input.region);
  const ref = refOf(s, pair).levels;
  const run = (await runOf(pair, input.run)).levels;
  const monthDays = ref.monthWeights;
  if (!monthDays || !run.monthWeights) throw new StillwaterError('E_INTERNAL', `'${input.variable}' was opened without its months.`);
  const area = s.info.grid.area;
  const n = ks.length * 12;
  const reference = new Float64Array(n);
  const model = new Float64Array(n);
  const difference = new Float64Array(n);
  for (let q = 0; q < ks.length; q++) {
    if (ctx.signal.aborted) throw new StillwaterError('E_CANCELLED', 'The work was cancelled.');
    const r = await ref.months(ks[q]);
    const m = await run.months(ks[q]);
    for (let t = 0; t < 12; t++) {
      reference[q * 12 + t] = areaMean(r[t], area, region.cells);
      // the run over the cells where both have values, as the profile and the skill rows take it
      model[q * 12 + t] = areaMean(m[t], area, region.cells, r[t]);
      difference[q * 12 + t] = model[q * 12 + t] - areaMean(r[t], area, region.cells, m[t]);
    }
    ctx.progress((q + 1) / ks.length, `${input.variable}, monthly cycle: level ${q + 1} of ${ks.length}`);
  }
  const g = s.info.grid;
  return {
    variable: input.variable,
    run: input.run,
    region: region.name,
    layer,
    units: pair.unitsText,
    depthEdges: g.depthEdges.slice(ks[0], ks[ks.length - 1] + 2),
    firstLevel: ks[0],
    monthDays: Float64Array.from(monthDays),
    reference,
    model,
    difference,
  };
}
