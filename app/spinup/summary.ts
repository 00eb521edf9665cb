import { formatSigned as fmtSigned } from '../output/number-format.js';
import type { SpinupSummary, SpinupTrack } from './types.js';

/** The whole run in one verdict, for the banner on the scores view. */
export function summarise(run: string, lastYear: number, tracks: SpinupTrack[]): SpinupSummary {
  const drifting = tracks.filter((t) => t.verdict.status === 'drifting');
  const undetermined = tracks.filter((t) => t.verdict.status === 'undetermined').length;
  const shortForDeep = tracks.some((t) => t.verdict.deepCaution);
  const worst = [...drifting]
    .sort((a, b) => Math.abs(b.verdict.percentPerKyr ?? 0) - Math.abs(a.verdict.percentPerKyr ?? 0))
    .slice(0, 5)
    .map((t) => ({ tracer: t.tracer, region: t.region, layer: t.layer, percentPerKyr: t.verdict.percentPerKyr, sentence: t.verdict.sentence }));
  const settled = drifting.length === 0 && undetermined === 0 && !shortForDeep;
  const parts: string[] = [];
  if (drifting.length === 0) {
    parts.push(`Run ${run} at model year ${Math.round(lastYear)}: all ${tracks.length - undetermined} judged tracks are settled.`);
  } else {
    const w = worst[0];
    parts.push(
      `Run ${run} at model year ${Math.round(lastYear)} has not settled: ${drifting.length} of ${tracks.length} tracks still drift (most: ${w.tracer}, ${w.region}, ${w.layer}, ${w.percentPerKyr === null ? '?' : fmtSigned(w.percentPerKyr, 3)} % per 1000 years); its scores describe a transient.`,
    );
  }
  if (undetermined > 0) parts.push(`${undetermined} track${undetermined > 1 ? 's' : ''} could not be judged.`);
  if (shortForDeep) parts.push('The run is shorter than a few thousand model years, so the deep ocean has not settled (England 1995; common practice).');
  return { run, lastYear, settled, drifting: drifting.length, undetermined, tracks: tracks.length, shortForDeep, sentence: parts.join(' '), worst };
}
