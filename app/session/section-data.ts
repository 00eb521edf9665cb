/** A section along a meridian or a parallel, or the zonal mean of a region, with the seafloor. */
import { StillwaterError } from '../errors.js';
import { levelsOf, meridianSection, parallelSection, seafloorOf, zonalMeans } from '../lines/slices.js';
import { findInterval } from '../render/pixel-lookup.js';
import type { SectionData } from '../../contract/view-types.js';
import type { ServiceProgress } from './progress.js';
import type { Period } from '../time/periods.js';
import { checkPeriod } from './periods.js';
import type { Session } from './session.js';
import { allLevels, refOf, regionNamed, runOf } from './sources.js';

export async function sectionData(
  s: Session,
  input: { variable: string; run: string; kind: 'meridian' | 'parallel' | 'zonal'; at: number | null; region: string | null; period?: Period },
  ctx: ServiceProgress,
): Promise<SectionData> {
  const period = input.period ?? 'annual';
  checkPeriod(s.recipe, period);
  const pair = await s.pair(input.variable);
  const model = await runOf(pair, input.run);
  const g = s.info.grid;
  const ms = await allLevels(s, pair, model, ctx, `${input.variable}, ${input.run}`, [0, 0.5], period);
  const rs = await allLevels(s, pair, refOf(s, pair), ctx, `${input.variable}, ${s.recipe.reference.label}`, [0.5, 1], period);
  const nz = g.nz;
  let mSec: Float32Array, rSec: Float32Array, dSec: Float32Array, n: number, edges: Float64Array, atGrid: number | null = null;
  let axis: SectionData['axis'];
  if (input.kind === 'zonal') {
    const region = await regionNamed(s, input.region ?? 'global');
    const mask = new Uint8Array(g.nx * g.ny);
    for (const c of region.cells) mask[c] = 1;
    const z = zonalMeans(ms, rs, g.area, mask, g.nx, g.ny);
    mSec = z.model;
    rSec = z.reference;
    dSec = z.difference;
    n = g.ny;
    edges = g.latEdges;
    axis = 'latitude';
  } else {
    const at = input.at ?? 0;
    if (input.kind === 'meridian') {
      const west = g.lonEdges[0];
      const lon = Math.abs(g.lonEdges[g.nx] - west - 360) < 1e-6 ? west + ((((at - west) % 360) + 360) % 360) : at;
      const i = findInterval(g.lonEdges, lon);
      if (i < 0) throw new StillwaterError('E_INPUT', `Longitude ${at} lies outside the common grid (${g.lonEdges[0]} to ${g.lonEdges[g.nx]}).`);
      mSec = meridianSection(ms, g.nx, g.ny, i);
      rSec = meridianSection(rs, g.nx, g.ny, i);
      n = g.ny;
      edges = g.latEdges;
      axis = 'latitude';
      atGrid = 0.5 * (g.lonEdges[i] + g.lonEdges[i + 1]);
    } else {
      if (!(at >= -90 && at <= 90)) throw new StillwaterError('E_INPUT', `Latitude ${at} must lie between -90 and 90.`);
      const j = findInterval(g.latEdges, at);
      if (j < 0) throw new StillwaterError('E_INPUT', `Latitude ${at} lies outside the common grid (${g.latEdges[0]} to ${g.latEdges[g.ny]}).`);
      mSec = parallelSection(ms, g.nx, j);
      rSec = parallelSection(rs, g.nx, j);
      n = g.nx;
      edges = g.lonEdges;
      axis = 'longitude';
      atGrid = 0.5 * (g.latEdges[j] + g.latEdges[j + 1]);
    }
    dSec = new Float32Array(mSec.length);
    for (let q = 0; q < dSec.length; q++) dSec[q] = mSec[q] - rSec[q];
  }
  // the seafloor: below the deepest level where the model or the reference has water
  const either = new Float32Array(mSec.length);
  for (let q = 0; q < either.length; q++) either[q] = mSec[q] === mSec[q] ? mSec[q] : rSec[q];
  const seafloor = seafloorOf(levelsOf(either, nz, n), n, g.depthEdges);
  return {
    variable: input.variable,
    run: input.run,
    period,
    kind: input.kind,
    at: input.kind === 'zonal' ? null : input.at,
    atGrid,
    region: input.kind === 'zonal' ? (input.region ?? 'global') : null,
    units: pair.unitsText,
    axis,
    edges,
    depthEdges: g.depthEdges,
    model: mSec,
    reference: rSec,
    difference: dSec,
    seafloor,
  };
}
