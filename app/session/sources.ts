/** The reference and the runs of a session's pair as sources, and every level of one, with progress. */
import type { OpenedPair } from '../compare/open-pair.js';
import { StillwaterError } from '../errors.js';
import type { ServiceProgress } from './progress.js';
import type { Period } from '../time/periods.js';
import type { Session, Source } from './session.js';

export function refOf(s: Session, pair: OpenedPair): Source {
  return { label: s.recipe.reference.label, role: 'ref', levels: pair.reference };
}

export async function runOf(pair: OpenedPair, run: string): Promise<Source> {
  const slot = pair.runs.find((r) => r.label === run);
  if (!slot) throw new StillwaterError('E_INPUT', `The run '${run}' has no variable '${pair.variable}'.`, { variable: pair.variable });
  return { label: run, role: 'run', levels: await slot.open() };
}

export async function allLevels(s: Session, pair: OpenedPair, source: Source, ctx: ServiceProgress, what: string, share: [number, number] = [0, 1], period: Period = 'annual'): Promise<Float32Array[]> {
  const nz = s.info.grid.nz;
  const out: Float32Array[] = [];
  for (let k = 0; k < nz; k++) {
    if (ctx.signal.aborted) throw new StillwaterError('E_CANCELLED', 'The work was cancelled.');
    out.push(await s.level(pair, source, k, period));
    ctx.progress(share[0] + ((k + 1) / nz) * (share[1] - share[0]), `${what}: level ${k + 1} of ${nz}`);
  }
  return out;
}

export async function regionNamed(s: Session, name: string) {
  const regions = await s.regions();
  const r = regions.find((x) => x.name === name);
  if (!r) throw new StillwaterError('E_INPUT', `There is no region '${name}' in this recipe; it has ${regions.map((x) => x.name).join(', ')}.`);
  return r;
}
