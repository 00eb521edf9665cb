import { formatNumber as fmt, formatSigned as fmtSigned, formatYears as years, MISSING } from '../output/number-format.js';
import type { SpinupResult, SpinupTrack } from './types.js';

/**
 * The full verdict table (--full-table): one line per tracer x region x layer.
 * Marks: ~ non-monotonic (fit after the last turning point), ! deep layer of a run shorter than a few
 * thousand years, ? fit not constrained (the tail still looks straight).
 */
export function fullVerdictTable(r: SpinupResult): string {
  const rows = r.tracks.map((t) => [
    t.tracer,
    t.region,
    t.layer,
    t.verdict.status,
    t.drift?.percentPerKyr == null ? MISSING : fmtSigned(t.drift.percentPerKyr, 3),
    t.fit?.constrained && t.fit.driftPercentPerKyr !== null ? fmtSigned(t.fit.driftPercentPerKyr, 3) : MISSING,
    t.verdict.basis === 'first-order fit' ? 'fit' : 'tail',
    t.fit?.constrained ? fmt(t.fit.xInf, 4) : '-',
    t.fit?.constrained ? years(t.fit.tau) : '-',
    t.fit?.yearsToSettle == null ? MISSING : years(t.fit.yearsToSettle),
    t.units,
    (t.monotonic ? '' : '~') + (t.verdict.deepCaution ? '!' : '') + (t.fit && !t.fit.constrained ? '?' : ''),
  ]);
  const head = ['tracer', 'region', 'layer', 'verdict', 'tail_%/kyr', 'fit_%/kyr', 'judged_on', 'x_inf', 'tau_yr', 'yr_to_settle', 'units', ''];
  const right = new Set([4, 5, 7, 8, 9]);
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i].length)));
  const line = (cells: string[]): string => cells.map((c, i) => (right.has(i) ? c.padStart(widths[i]) : c.padEnd(widths[i]))).join('  ').trimEnd();
  const lines = [
    r.summary.sentence,
    `Snapshots: ${r.years.length}, model years ${years(r.years[0])}–${years(r.years[r.years.length - 1])}; threshold ${fmt(r.settings.thresholdPercentPerKyr, 3)} % of the mean per 1000 years.`,
    '',
    line(head),
    ...rows.map(line),
  ];
  const marks: string[] = [];
  if (r.tracks.some((t) => !t.monotonic)) marks.push('~ overshoots and turns back: fitted after the last turning point');
  if (r.tracks.some((t) => t.verdict.deepCaution)) marks.push('! deep ocean of a run shorter than a few thousand years: not settled whatever the drift says (England 1995)');
  if (r.tracks.some((t) => t.fit && !t.fit.constrained)) marks.push('? the fit cannot place x_inf yet');
  if (marks.length) lines.push('', ...marks);
  return lines.join('\n');
}

/**
 * The compact verdict table the command prints: drift in per cent of the mean per 1000 years, one row per
 * tracer and layer, one column per region, each value marked settled (.) or drifting (*), then one line per
 * tracer for the whole ocean and column with the fit. Details are in spinup.csv and spinup.json.
 */
export function verdictTable(r: SpinupResult): string {
  const mark = (t: SpinupTrack): string =>
    (t.verdict.status === 'settled' ? '.' : t.verdict.status === 'drifting' ? '*' : '?') + (t.monotonic ? '' : '~') + (t.verdict.deepCaution ? '!' : '');
  const cell = (t: SpinupTrack | undefined): string => {
    if (!t) return '';
    const p = t.drift?.percentPerKyr;
    return `${p == null ? MISSING : Math.abs(p) < 0.005 ? '0' : fmtSigned(p, 2)} ${mark(t).padEnd(3)}`;
  };
  const tracers = [...new Set(r.tracks.map((t) => t.tracer))];
  const layers = [...new Set(r.tracks.map((t) => t.layer))];
  const find = (tracer: string, region: string, layer: string) => r.tracks.find((t) => t.tracer === tracer && t.region === region && t.layer === layer);
  const head = ['tracer', 'layer', ...r.regions];
  const rows = tracers.flatMap((tr) => layers.map((l) => [tr, l, ...r.regions.map((g) => cell(find(tr, g, l)))]));
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i].length)));
  const line = (cells: string[]): string => cells.map((c, i) => (i < 2 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ').trimEnd();
  const whole = r.layers[0];
  const fits = tracers.map((tr) => {
    const t = find(tr, r.regions[0], whole);
    if (!t) return '';
    const f = t.fit;
    const fitText = !f
      ? t.fitNote
      : !f.constrained
        ? 'the fit cannot place its end yet (the tail still looks straight)'
        : `heading for ${fmt(f.xInf, 4)} ${t.units}, τ ${years(f.tau)} yr` +
          (f.driftPercentPerKyr !== null ? `, drift now ${fmtSigned(f.driftPercentPerKyr, 3)} %/kyr by the fit` : '') +
          (t.verdict.status === 'drifting' ? (f.yearsToSettle == null ? ', time to settle not estimable' : `, about ${years(f.yearsToSettle)} more years to settle`) : '');
    const tail = t.drift?.percentPerKyr != null ? `tail slope ${fmtSigned(t.drift.percentPerKyr, 3)} %/kyr, ` : '';
    return `  ${tr}: ${t.verdict.status} (${tail}judged on the ${t.verdict.basis}); ${fitText}`;
  });
  const lines = [
    r.summary.sentence,
    `Snapshots: ${r.years.length}, model years ${years(r.years[0])}–${years(r.years[r.years.length - 1])}. Drift over the tail in % of the mean per 1000 years; settled below ${fmt(r.settings.thresholdPercentPerKyr, 3)}. The marks are the verdicts, judged on the first-order fit's drift at the last snapshot where the fit is constrained, else on the tail slope.`,
    '',
    line(head),
    ...rows.map(line),
    '',
    '. settled  * still drifting  ? undetermined',
    ...(r.tracks.some((t) => !t.monotonic) ? ['~ overshoots and turns back (fitted after the last turning point)'] : []),
    ...(r.tracks.some((t) => t.verdict.deepCaution) ? ['! deep ocean of a run shorter than a few thousand years: not settled whatever the drift says (England 1995; common practice)'] : []),
    '',
    `${r.regions[0]}, ${whole}:`,
    ...fits.filter((f) => f.length > 0),
  ];
  return lines.join('\n');
}
