/** Scores view: the skill table, sortable and filterable, exported as CSV, Markdown, LaTeX or JSON. */
import type { ComparisonResult } from '../../app/compare/run.js';
import type { SkillRow } from '../../app/compare/rows.js';
import type { TableFormat } from '../../contract/view-types.js';
import { getSkill, getTable } from '../data.js';
import { fmt, h, saveBlob } from '../dom.js';
import { state, type AppState } from '../state.js';
import { spinupBanner } from './spinup.js';
import { errorText, note, type ViewFactory } from './view.js';

const COLUMNS: { key: keyof SkillRow; label: string; text?: boolean; title: string }[] = [
  { key: 'run', label: 'Run', text: true, title: 'model run' },
  { key: 'variable', label: 'Variable', text: true, title: 'variable key of the recipe' },
  { key: 'region', label: 'Region', text: true, title: 'region' },
  { key: 'layer', label: 'Layer', text: true, title: 'depth layer' },
  { key: 'units', label: 'Units', text: true, title: 'units of means, bias, RMSE, E′ and standard deviations' },
  { key: 'n', label: 'n', title: 'number of compared cells' },
  { key: 'model_mean', label: 'Model mean', title: 'weighted mean of the run' },
  { key: 'ref_mean', label: 'Ref. mean', title: 'weighted mean of the reference' },
  { key: 'bias', label: 'Bias', title: 'model mean minus reference mean' },
  { key: 'rmse', label: 'RMSE', title: 'root-mean-square difference' },
  { key: 'crmse', label: 'E′', title: 'centred RMS difference (Taylor 2001)' },
  { key: 'corr', label: 'r', title: 'weighted Pearson correlation' },
  { key: 'std_ratio', label: 'σm/σr', title: 'ratio of standard deviations' },
  { key: 'taylor_skill', label: 'Taylor S', title: 'Taylor (2001) skill score' },
  { key: 'nse', label: 'NSE', title: 'Nash–Sutcliffe efficiency' },
  { key: 'compared_fraction', label: 'Compared', title: 'share of the reference weight that was compared' },
];

export const scoresView: ViewFactory = (el) => {
  const toolbar = h('div', { class: 'view-toolbar', role: 'toolbar', 'aria-label': 'Table options' });
  const wrap = h('div', { class: 'scores-table-wrap' });
  const count = h('span', { class: 'toolbar-hint', id: 'scores-count' });
  // whether the scored runs have settled: filled in the background, never holding up the table
  const settling = h('div', { class: 'scores-spinup-banner', id: 'scores-spinup-banner', role: 'status' });
  el.append(toolbar, settling, wrap);
  let result: ComparisonResult | null = null;
  let sortKey: keyof SkillRow = 'run';
  let sortUp = true;
  let filterText = '';
  let onlyVariable = true;
  let token = 0;

  const shown = (): SkillRow[] => {
    if (!result) return [];
    const words = filterText.toLowerCase().split(/\s+/).filter(Boolean);
    const rows = result.rows.filter((r) => {
      if (onlyVariable && r.variable !== state.sel.variable) return false;
      const hay = `${r.run} ${r.variable} ${r.region} ${r.layer}`.toLowerCase();
      return words.every((w) => hay.includes(w));
    });
    const sign = sortUp ? 1 : -1;
    return rows.sort((a, b) => {
      const x = a[sortKey];
      const y = b[sortKey];
      if (typeof x === 'number' && typeof y === 'number') return sign * (x - y);
      if (x === null || x === undefined) return 1;
      if (y === null || y === undefined) return -1;
      return sign * String(x).localeCompare(String(y), undefined, { numeric: true });
    });
  };

  const drawTable = (): void => {
    const rows = shown();
    const head = h('tr', {});
    for (const c of COLUMNS) {
      const b = h('button', { type: 'button', title: `${c.title}; sort by this column` }, c.label, sortKey === c.key ? (sortUp ? ' ▲' : ' ▼') : '');
      b.addEventListener('click', () => {
        if (sortKey === c.key) sortUp = !sortUp;
        else {
          sortKey = c.key;
          sortUp = true;
        }
        drawTable();
      });
      head.append(h('th', { class: c.text ? 'text' : '', scope: 'col', 'aria-sort': sortKey === c.key ? (sortUp ? 'ascending' : 'descending') : 'none' }, b));
    }
    const body = h('tbody', {});
    for (const r of rows) {
      const tr = h('tr', {});
      for (const c of COLUMNS) {
        const v = r[c.key];
        const text = c.key === 'compared_fraction' ? (typeof v === 'number' ? `${(v * 100).toFixed(1)} %` : '–') : c.text ? String(v ?? '') : c.key === 'n' ? String(v ?? '–') : fmt(v as number | null);
        tr.append(h('td', { class: c.text ? 'text' : '', title: r.note ?? '' }, text));
      }
      body.append(tr);
    }
    wrap.replaceChildren(h('table', { class: 'scores', id: 'scores-table' }, h('thead', {}, head), body));
    count.textContent = `${rows.length} of ${result?.rows.length ?? 0} rows`;
  };

  const exportAs = async (format: TableFormat): Promise<void> => {
    if (!result) return;
    try {
      const t = await getTable({ ...result, rows: shown() }, state.session?.recipePath ?? null, format);
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
