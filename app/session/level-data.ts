/** Model, reference and difference on the common grid for one level, a layer mean, or the bottom cells. */
import { StillwaterError } from '../errors.js';
import { atLevels, bottomLevels, layerMeans } from '../lines/slices.js';
import { layerLevelMetres, type LayerSpec } from '../regions/layers.js';
import type { LevelData } from '../../contract/view-types.js';
import type { ServiceProgress } from './progress.js';
import type { Period } from '../time/periods.js';
import { checkPeriod } from './periods.js';
import type { Session } from './session.js';
import { allLevels, refOf, runOf } from './sources.js';

export async function levelData(s: Session, variable: string, run: string, layerId: string, ctx: ServiceProgress, period: Period = 'annual'): Promise<LevelData> {
  const layer = s.info.layers.find((l) => l.id === layerId);
  if (!layer) throw new StillwaterError('E_INPUT', `There is no depth choice '${layerId}' in this session.`);
  checkPeriod(s.recipe, period);
  const pair = await s.pair(variable);
  const model = await runOf(pair, run);
  const g = s.info.grid;
  const base = { variable, run, period, layer, units: pair.unitsText };
  if (layer.kind === 'level') {
    const k = layer.k ?? 0;
    const [m, r] = await Promise.all([s.level(pair, model, k, period), s.level(pair, refOf(s, pair), k, period)]);
    const difference = new Float32Array(m.length);
    const thickness = new Float32Array(m.length);
    const dz = g.depthEdges[k + 1] - g.depthEdges[k];
    for (let c = 0; c < m.length; c++) {
      difference[c] = m[c] - r[c];
      thickness[c] = m[c] === m[c] && r[c] === r[c] ? dz : 0;
    }
    return { ...base, model: m, reference: r, difference, thickness };
  }
  const ms = await allLevels(s, pair, model, ctx, `${variable}, ${run}`, [0, 0.5], period);
  const rs = await allLevels(s, pair, refOf(s, pair), ctx, `${variable}, ${s.recipe.reference.label}`, [0.5, 1], period);
  if (layer.kind === 'bottom') {
    const k = bottomLevels(ms, rs);
    const mb = atLevels(ms, k);
    const rb = atLevels(rs, k);
    const difference = new Float32Array(mb.length);
    const thickness = new Float32Array(mb.length);
    for (let c = 0; c < mb.length; c++) {
      difference[c] = mb[c] - rb[c];
      thickness[c] = k[c] >= 0 ? g.depthEdges[k[c] + 1] - g.depthEdges[k[c]] : 0;
    }
    return { ...base, model: mb, reference: rb, difference, thickness, bottomLevel: k };
  }
  const spec: LayerSpec = layer.kind === 'interval' ? { kind: 'interval', top: layer.top!, bottom: layer.bottom! } : { kind: layer.kind };
  const metres = s.grid.vertical ? layerLevelMetres(spec, s.grid.vertical) : Float64Array.from([1]);
  const mean = layerMeans(ms, rs, metres);
  return { ...base, ...mean };
}
