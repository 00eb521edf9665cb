/** The spin-up's table of drift rates, fits and verdicts, one row a track, notes on a line under it. */
import { typesetUnits } from '../../app/figures/typeset.js';
import type { SpinupTrack } from '../../app/spinup/types.js';
import { formatChange } from '../../app/output/number-format.js';
import { fmt, h, MISSING } from '../elements.js';
import { sortableTable, type Column, type SortableTable } from '../widgets/sortable-table.js';

export type SortKey = 'tracer' | 'region' | 'layer' | 'perKyr' | 'percent' | 'fitPercent' | 'xInf' | 'tau' | 't90' | 'needed' | 'status';

function sortValue(t: SpinupTrack, key: SortKey): number | string | null {
  switch (key) {
    case 'tracer':
    case 'region':
    case 'layer':
      return t[key];
    case 'perKyr':
      return t.drift?.perKyr ?? null;
    case 'percent':
      return t.drift?.percentPerKyr ?? null;
    case 'fitPercent':
      return t.fit?.constrained ? t.fit.driftPercentPerKyr : null;
    case 'xInf':
      return t.fit?.xInf ?? null;
    case 'tau':
      return t.fit?.tau ?? null;
    case 't90':
      return t.fit?.t90 ?? null;
    case 'needed':
      return t.verdict.status === 'settled' ? 0 : (t.fit?.yearsToSettle ?? null);
    case 'status':
      return t.verdict.status;
  }
}

const STATUS_TEXT: Record<SpinupTrack['verdict']['status'], string> = { settled: 'settled', drifting: 'still drifting', undetermined: 'undetermined' };

const COLUMN_TITLES: { key: SortKey; label: string; title: string; text?: boolean }[] = [
  { key: 'tracer', label: 'Tracer', title: 'tracer', text: true },
  { key: 'region', label: 'Region', title: 'region', text: true },
  { key: 'layer', label: 'Layer', title: 'depth layer', text: true },
  { key: 'perKyr', label: 'Drift per 1000 yr', title: 'least-squares slope of the mean over the tail window, tracer units per 1000 model years' },
  { key: 'percent', label: 'Drift, % per 1000 yr', title: 'the slope in per cent of the mean over the tail window, per 1000 model years' },
  { key: 'fitPercent', label: 'Fit drift now, % per 1000 yr', title: 'the constrained first-order fit\'s drift at the last snapshot, in per cent of the same mean; the verdict is judged on it where it exists, else on the tail slope' },
  { key: 'xInf', label: 'Fit x∞', title: 'value the first-order fit heads for' },
  { key: 'tau', label: 'τ (yr)', title: 'e-folding time of the first-order fit, model years' },
  { key: 't90', label: 't90 (yr)', title: 'τ·ln 10: years to cover 90 % of any remaining change' },
  { key: 'needed', label: 'Years still needed', title: 'model years after the last snapshot until the first-order fit\'s drift falls below the threshold, in closed form (– when the fit cannot say)' },
  { key: 'status', label: 'Verdict', title: 'settled, still drifting or undetermined; non-monotonic tracks carry a note', text: true },
];

function cellOf(t: SpinupTrack, key: SortKey): HTMLTableCellElement {
  const d = t.drift;
  const f = t.fit;
  switch (key) {
    case 'tracer':
    case 'region':
    case 'layer':
      return h('td', { class: 'text' }, t[key]);
    case 'perKyr':
      return h('td', { title: d ? `model years ${d.fromYear}–${d.toYear}, ${d.window}` : '' }, d ? `${formatChange(d.perKyr, d.windowMean, 3)} ${typesetUnits(t.units)}` : MISSING);
    case 'percent':
      return h('td', { title: d?.relativeTo ? `relative to ${d.relativeTo}` : '' }, d?.percentPerKyr !== null && d?.percentPerKyr !== undefined ? `${formatChange(d.percentPerKyr, 100, 3)} %` : MISSING);
    case 'fitPercent':
      return h('td', {}, f?.constrained && f.driftPercentPerKyr !== null ? `${formatChange(f.driftPercentPerKyr, 100, 3)} %` : MISSING);
    case 'xInf':
      return h('td', {}, f ? `${fmt(f.xInf, 4)} ${typesetUnits(t.units)}` : MISSING);
    case 'tau':
      return h('td', {}, f ? String(Math.round(f.tau)) : MISSING);
    case 't90':
      return h('td', {}, f ? String(Math.round(f.t90)) : MISSING);
    case 'needed':
      return h('td', {}, t.verdict.status === 'settled' ? '0' : f?.yearsToSettle !== null && f?.yearsToSettle !== undefined ? String(Math.round(f.yearsToSettle)) : MISSING);
    case 'status': {
      const verdict = h('td', { class: `text verdict ${t.verdict.status}`, title: `${t.verdict.sentence} ${t.fitNote}`.trim(), 'data-status': t.verdict.status, 'data-basis': t.verdict.basis }, `${STATUS_TEXT[t.verdict.status]} (${t.verdict.basis === 'first-order fit' ? 'fit' : 'tail'})`);
      if (notesOf(t).length) verdict.append(h('span', { class: 'verdict-flag' }, ' *'));
      return verdict;
    }
  }
}

/** Notes go on a line of their own under the track, so that the columns stay narrow. */
function notesOf(t: SpinupTrack): string[] {
  const notes: string[] = [];
  if (!t.monotonic) notes.push(`non-monotonic: turns back at model year ${t.turningYears.join(', ')}; ${t.fitNote}`);
  if (t.verdict.deepCaution) notes.push('the run may be too short for the deep ocean');
  if (t.fit && !t.fit.constrained) notes.push('fit not constrained: x∞ and τ are lower bounds at best');
  return notes;
}

const COLUMNS: Column<SpinupTrack, SortKey>[] = COLUMN_TITLES.map((c) => ({
  ...c,
  value: (t) => sortValue(t, c.key),
  cell: (t) => cellOf(t, c.key),
  // drift sorts by size, whatever the sign
  byMagnitude: c.key === 'perKyr' || c.key === 'percent',
}));

/** The table of tracks, sorted by the size of the relative drift, largest first. */
export function spinupTable(): SortableTable<SpinupTrack> {
  return sortableTable<SpinupTrack, SortKey>({
    id: 'spinup-table',
    className: 'scores spinup-table',
    columns: COLUMNS,
    sort: { key: 'percent', up: false },
    rowClass: 'track-row',
    numbersLargestFirst: true,
    after(t) {
      const notes = notesOf(t);
      return notes.length ? h('tr', { class: 'verdict-note-row' }, h('td', { colspan: COLUMNS.length, class: 'text verdict-note' }, `${t.tracer}, ${t.region}, ${t.layer}: ${notes.join('; ')}.`)) : null;
    },
  });
}
