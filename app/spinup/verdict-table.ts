import { fmt, fmtSigned, years } from './format.js';
import type { SpinupResult } from './types.js';

/**
 * The compact verdict table the command prints: one line per tracer x region x layer.
 * Marks: ~ non-monotonic (fit after the last turning point), ! deep layer of a run shorter than a few
 * thousand years, ? fit not constrained (the tail still looks straight).
 */
export function verdictTable(r: SpinupResult): string {
  const rows = r.tracks.map((t) => [
    t.tracer,
    t.region,
    t.layer,
    t.verdict.status,
    t.drift?.percentPerKyr == null ? '-' : fmtSigned(t.drift.percentPerKyr),
    t.fit?.constrained ? fmt(t.fit.xInf, 4) : '-',
    t.fit?.constrained ? years(t.fit.tau) : '-',
    t.fit?.yearsToSettle == null ? '-' : years(t.fit.yearsToSettle),
    t.units,
    (t.monotonic ? '' : '~') + (t.verdict.deepCaution ? '!' : '') + (t.fit && !t.fit.constrained ? '?' : ''),
  ]);
  const head = ['tracer', 'region', 'layer', 'verdict', '%/kyr', 'x_inf', 'tau_yr', 'yr_to_settle', 'units', ''];
  const right = new Set([4, 5, 6, 7]);
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i].length)));
  const line = (cells: string[]): string => cells.map((c, i) => (right.has(i) ? c.padStart(widths[i]) : c.padEnd(widths[i]))).join('  ').trimEnd();
  const lines = [
    r.summary.sentence,
    `Snapshots: ${r.years.length}, model years ${years(r.years[0])}–${years(r.years[r.years.length - 1])}; threshold ${fmt(r.settings.thresholdPercentPerKyr)} % of the mean per 1000 years.`,
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
