/** Area-weighted mean profile of a region: the reference and every run, each over the cells where it and the reference both have water. */
import { areaMean } from '../lines/slices.js';
import type { ProfileData } from '../../contract/view-types.js';
import type { ServiceProgress } from './progress.js';
import type { Period } from '../time/periods.js';
import { checkPeriod } from './periods.js';
import type { Session, Source } from './session.js';
import { allLevels, refOf, regionNamed, runOf } from './sources.js';

export async function profileData(s: Session, variable: string, regionName: string, ctx: ServiceProgress, period: Period = 'annual'): Promise<ProfileData> {
  checkPeriod(s.recipe, period);
  const pair = await s.pair(variable);
  const region = await regionNamed(s, regionName);
  const g = s.info.grid;
  const sources: Source[] = [refOf(s, pair)];
  for (const slot of pair.runs) sources.push(await runOf(pair, slot.label));
  const levels: Float32Array[][] = [];
  for (let q = 0; q < sources.length; q++) {
    levels.push(await allLevels(s, pair, sources[q], ctx, `${variable}, ${sources[q].label}`, [q / sources.length, (q + 1) / sources.length], period));
  }
  const ref = levels[0];
  const reference = new Float64Array(g.nz);
  for (let k = 0; k < g.nz; k++) reference[k] = areaMean(ref[k], g.area, region.cells);
  const runs = sources.slice(1).map((src, q) => {
    const values = new Float64Array(g.nz);
    // each run over the cells where it and the reference both have water, as in the skill rows
    for (let k = 0; k < g.nz; k++) values[k] = areaMean(levels[q + 1][k], g.area, region.cells, ref[k]);
    return { label: src.label, values };
  });
  return { variable, region: regionName, period, units: pair.unitsText, depthCentres: g.depthCentres, depthEdges: g.depthEdges, reference, runs };
}
