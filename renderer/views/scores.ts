/** Scores view: the skill table, sortable and filterable, exported as CSV, Markdown, LaTeX or JSON. */
import type { ComparisonResult } from '../../app/compare/run.js';
import type { SkillRow } from '../../app/compare/rows.js';
import type { TableFormat } from '../../contract/view-types.js';
import { typesetUnits } from '../../app/figures/typeset.js';
import { periodLabel } from '../../app/render/period-labels.js';
import { getSkill, getTable } from '../service-client.js';
import { fmt, h, MISSING, saveBlob } from '../elements.js';
import { state, type AppState } from '../state.js';
import { sortableTable, type Column } from '../widgets/sortable-table.js';
import { spinupBanner } from './spinup-banner.js';
import { errorText, note, type ViewFactory } from './view.js';

type Key = keyof SkillRow & string;

const text = (key: Key, label: string, title: string): Column<SkillRow, Key> => ({ key, label, title, text: true, value: (r) => r[key] as string });
const num = (key: Key, label: string, title: string, show: (v: number | null) => string = (v) => fmt(v)): Column<SkillRow, Key> => ({
  key,
  label,
  title,
  value: (r) => r[key] as number | null,
  cell: (r) => h('td', { title: r.note ?? '' }, show(typeof r[key] === 'number' ? (r[key] as number) : null)),
});

const COLUMNS: Column<SkillRow, Key>[] = [
  text('run', 'Run', 'model run'),
  text('variable', 'Variable', 'variable key of the recipe'),
  text('region', 'Region', 'region'),
  text('layer', 'Layer', 'depth layer'),
  text('period', 'Period', 'period of the year: annual, a month or a season (the Period menu above chooses)'),
  { key: 'units', label: 'Units', title: 'units of means, bias, RMSE, E′ and standard deviations', text: true, value: (r) => r.units, cell: (r) => h('td', { class: 'text units' }, typesetUnits(r.units)) },
  num('n', 'n', 'number of compared cells', (v) => (v === null ? MISSING : String(v))),
  num('model_mean', 'Model mean', 'weighted mean of the run'),
  num('ref_mean', 'Ref. mean', 'weighted mean of the reference'),
  num('bias', 'Bias', 'model mean minus reference mean'),
  num('rmse', 'RMSE', 'root-mean-square difference'),
  num('crmse', 'E′', 'centred RMS difference (Taylor 2001)'),
  num('corr', 'r', 'weighted Pearson correlation'),
  num('std_ratio', 'σm/σr', 'ratio of standard deviations'),
  num('taylor_skill', 'Taylor S', 'Taylor (2001) skill score'),
  num('nse', 'NSE', 'Nash–Sutcliffe efficiency'),
  num('compared_fraction', 'Compared', 'share of the reference weight that was compared', (v) => (v === null ? MISSING : `${(v * 100).toFixed(1)} %`)),
];

/** "PO4, remin-short: mmol m-3 → umol kg-1 with a nominal density of 1025 kg m-3" with units typeset. */
function conversionNote(variable: string, source: string, note: string): string {
  // a note names units in UDUNITS spelling, one factor a word ("mmol m-3"): each factor typeset
  const typeset = note
    .split(' ')
    .map((w) => (/^(?:[kmuµ]?(?:g|mol|L|l)|m|s|J|W|K)-?\d+$|^u(?:mol|g|M|L)$|^degC$/.test(w) ? typesetUnits(w) : w))
    .join(' ');
  return `${variable}, ${source}: ${typeset}`;
}

export const scoresView: ViewFactory = (el) => {
  const toolbar = h('div', { class: 'view-toolbar', role: 'toolbar', 'aria-label': 'Table options' });
  const wrap = h('div', { class: 'scores-table-wrap' });
  const count = h('span', { class: 'toolbar-hint', id: 'scores-count' });
  // whether the scored runs have settled: filled in the background, never holding up the table
  const settling = h('div', { class: 'scores-spinup-banner', id: 'scores-spinup-banner', role: 'status' });
  // how the units were brought together (a nominal density, a conversion): said above the numbers
  const notes = h('ul', { class: 'scores-notes', id: 'scores-notes', 'aria-label': 'Unit conversions' });
  el.append(toolbar, settling, notes, wrap);
  let result: ComparisonResult | null = null;
  let filterText = '';
  let onlyVariable = true;
  let token = 0;
  const table = sortableTable<SkillRow, Key>({ id: 'scores-table', columns: COLUMNS, sort: { key: 'run', up: true } });

  const shown = (): SkillRow[] => {
    if (!result) return [];
    const words = filterText.toLowerCase().split(/\s+/).filter(Boolean);
    return result.rows.filter((r) => {
      if (onlyVariable && r.variable !== state.sel.variable) return false;
      // rows written before periods existed are the year's
      if ((r.period ?? 'annual') !== state.sel.period) return false;
      const hay = `${r.run} ${r.variable} ${r.region} ${r.layer}`.toLowerCase();
      return words.every((w) => hay.includes(w));
    });
  };

  const drawTable = (): void => {
    const rows = shown();
    table.show(rows);
    if (table.el.parentElement !== wrap) wrap.replaceChildren(table.el);
    count.textContent = `${rows.length} of ${result?.rows.length ?? 0} rows (${periodLabel(state.sel.period)})`;
    // what is shown, for tests and the benchmark to wait for: the variable (or every one) and the rows it has
    wrap.dataset.drawn = `${onlyVariable ? state.sel.variable : '*all'}|${result?.rows.length ?? 0}`;
    drawNotes(rows);
  };

  const drawNotes = (rows: SkillRow[]): void => {
    const shownVariables = new Set(rows.map((r) => r.variable));
    const items = (result?.variables ?? [])
      .filter((v) => shownVariables.has(v.variable))
      .flatMap((v) => v.conversions.map((c) => conversionNote(v.variable, c.source, c.note)));
    notes.replaceChildren(...items.map((t) => h('li', {}, t)));
  };

  const exportAs = async (format: TableFormat): Promise<void> => {
    if (!result) return;
    try {
      const t = await getTable({ ...result, rows: table.order(shown()) }, state.session?.recipePath ?? null, format);
      saveBlob(new Blob([t.text], { type: t.mime }), t.fileName);
    } catch (e) {
      note(wrap, errorText(e), 'error');
    }
  };

  const filter = h('input', { type: 'search', placeholder: 'filter: run, region, layer…', 'aria-label': 'Filter rows', id: 'scores-filter' });
  filter.addEventListener('input', () => {
    filterText = filter.value;
    drawTable();
  });
  const all = h('input', { type: 'checkbox', id: 'scores-all-variables' });
  all.addEventListener('change', () => {
    onlyVariable = !all.checked;
    result = null;
    void draw(state);
  });
  const exports = h('div', { class: 'row', role: 'group', 'aria-label': 'Export the table' }, h('span', { class: 'toolbar-label' }, 'Export'));
  for (const [f, label] of [
    ['csv', 'CSV'],
    ['markdown', 'Markdown'],
    ['latex', 'LaTeX'],
    ['json', 'JSON'],
  ] as const) {
    const b = h('button', { type: 'button', id: `export-table-${f}` }, label);
    b.addEventListener('click', () => void exportAs(f));
    exports.append(b);
  }
  toolbar.append(filter, h('label', { class: 'toolbar-label' }, all, ' all variables'), exports, count);

  const draw = async (st: AppState): Promise<void> => {
    if (!st.session) return note(wrap, 'Open a recipe to see its scores.');
    const my = ++token;
    if (!settling.childElementCount) spinupBanner(settling, st);
    if (!result) note(wrap, onlyVariable ? `Computing the skill rows of ${st.sel.variable} (this runs in the background)…` : 'Computing the skill rows of every variable (this runs in the background)…', 'busy');
    try {
      const r = await getSkill(st.session.session, onlyVariable ? st.sel.variable : null);
      if (my !== token) return;
      result = r;
    } catch (e) {
      if (my === token) note(wrap, errorText(e), 'error');
      return;
    }
    drawTable();
  };
  return {
    update(st, changed) {
      if (changed.size === 1 && changed.has('probe')) return;
      if (changed.has('session')) {
        result = null;
        settling.replaceChildren();
      }
      void draw(st);
    },
    dispose() {
      token++;
    },
  };
};
