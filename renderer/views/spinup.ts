/**
 * Spin-up view: how a run's tracers move away from their first snapshot, on a logarithmic axis of model
 * years, for several tracers and regions at once; the skill of each snapshot against the reference on the
 * same axis; and the drift rates, fits and verdicts of every track in a sortable table (service 'spinup.run').
 */
import type { SkillPoint, SpinupResult, SpinupSummary, SpinupTrack } from '../../app/spinup/types.js';
import { tracked, sessionRecipe } from '../data.js';
import { fmt, h, s } from '../dom.js';
import { logLinePanel, yearDomain, type LineSeries } from '../plot/log-lines.js';
import { figureRoot, MUTED, RUN_COLOURS, text, title, type Rect } from '../plot/svg-parts.js';
import { state, type AppState } from '../state.js';
import { EXPORT_WIDTH, errorText, note, type ViewFactory } from './view.js';

type Quantity = 'mean' | 'inventory';
const DASHES = ['', '7 3', '2 2.5', '9 3 2 3', '4 4', '1 3'];
const X_LABEL = 'Model year (log scale)';

export interface Choice {
  run: string;
  quantity: Quantity;
  relative: boolean;
  layer: string;
  tracers: string[];
  regions: string[];
  skillTracer: string;
}

/** Degrees Celsius are compared in kelvin, as the drift rates are (a zero that is not a zero of amount). */
function relativeBase(track: SpinupTrack, quantity: Quantity): number {
  const first = quantity === 'mean' ? track.mean[0] : track.inventory[0];
  if (quantity === 'mean' && /^(deg_?C|degC|°C|celsius)$/i.test(track.units)) return Math.abs(first + 273.15);
  return Math.abs(first);
}

function deviation(track: SpinupTrack, c: Choice): number[] {
  const dev = c.quantity === 'mean' ? track.meanDeviation : track.inventoryDeviation;
  if (!c.relative) return dev;
  const base = relativeBase(track, c.quantity);
  return dev.map((v) => (base > 0 ? (100 * v) / base : NaN));
}

function colourOf(r: SpinupResult, region: string): string {
  return RUN_COLOURS[Math.max(0, r.regions.indexOf(region)) % RUN_COLOURS.length];
}

function dashOf(r: SpinupResult, tracer: string): string {
  return DASHES[Math.max(0, r.tracers.findIndex((t) => t.name === tracer)) % DASHES.length];
}

function chosenTracks(r: SpinupResult, c: Choice): SpinupTrack[] {
  return r.tracks.filter((t) => t.layer === c.layer && c.tracers.includes(t.tracer) && c.regions.includes(t.region));
}

function skillSeries(r: SpinupResult, c: Choice, key: 'rmse' | 'bias' | 'corr'): LineSeries[] {
  return c.regions
    .map((region) => {
      const pts = r.skill
        .filter((p: SkillPoint) => p.variable === c.skillTracer && p.region === region && p.layer === c.layer)
        .sort((a, b) => a.year - b.year);
      return { xs: pts.map((p) => p.year), ys: pts.map((p) => (typeof p[key] === 'number' ? (p[key] as number) : NaN)), colour: colourOf(r, region), label: `${c.skillTracer}, ${region}` };
    })
    .filter((sr) => sr.xs.length > 0);
}

/** A legend of line samples (colour = region, dash = tracer), in as many columns as the height allows. */
function lineLegend(svg: SVGElement, x: number, y: number, maxH: number, colW: number, items: { label: string; colour: string; dash: string }[]): void {
  const g = s('g', { class: 'legend' });
  g.append(text(x, y, 'Lines', { 'font-size': 11.5, 'font-weight': 600 }));
  g.append(text(x + 40, y, 'colour: region, dash: tracer', { 'font-size': 10.5, fill: MUTED }));
  const rows = Math.max(1, Math.floor((maxH - 16) / 17));
  items.forEach((it, i) => {
    const cx = x + Math.floor(i / rows) * colW;
    const cy = y + 18 + (i % rows) * 17;
    g.append(s('line', { x1: cx, x2: cx + 26, y1: cy - 4, y2: cy - 4, stroke: it.colour, 'stroke-width': 2, ...(it.dash ? { 'stroke-dasharray': it.dash } : {}) }));
    g.append(text(cx + 32, cy, it.label, { 'font-size': 11.5 }));
  });
  svg.append(g);
}

export function spinupFigure(r: SpinupResult, c: Choice, width: number): SVGSVGElement {
  const tracks = chosenTracks(r, c);
  const what = c.quantity === 'mean' ? 'mean' : 'inventory';
  // absolute deviations: a panel per tracer (its own units and scale); relative ones share a panel
  const groups = new Map<string, SpinupTrack[]>();
  for (const t of tracks) {
    const key = c.relative ? '%' : t.tracer;
    groups.set(key, [...(groups.get(key) ?? []), t]);
  }
  const legendW = width >= 900 ? 230 : 190;
  const left = 84;
  const panelW = width - left - legendW - 28;
  const panelH = width >= 900 ? 210 : 190;
  const panelGap = 74;
  const skillPanels = (['rmse', 'bias', 'corr'] as const).filter((k) => skillSeries(r, c, k).length);
  const top = 66;
  const devH = Math.max(1, groups.size) * (panelH + panelGap);
  const skillTop = top + devH + 24;
  const skillH = skillPanels.length ? 52 + 170 + 60 : 0;
  const height = skillTop + skillH + 10;
  const svg = figureRoot(width, height, `Spin-up of ${r.run}: ${what} deviation and skill against model year`);
  const first = r.years[0];
  title(svg, 12, 18, `Spin-up of ${r.run}: ${what} deviation from model year ${first}, layer ${c.layer}`, r.summary.sentence);
  const domain = yearDomain(r.years);
  if (!groups.size) svg.append(text(left, top + 40, 'Choose at least one tracer and one region.', { fill: MUTED }));
  let y = top;
  for (const ts of groups.values()) {
    const rect: Rect = { x: left, y: y + 16, w: panelW, h: panelH - 16 };
    const units = c.quantity === 'mean' ? ts[0].units : ts[0].inventoryUnits;
    const names = c.relative ? [...new Set(ts.map((t) => t.tracer))].join(', ') : `${ts[0].tracer} (${units})`;
    svg.append(text(rect.x, y + 10, names, { 'font-size': 12, 'font-weight': 600 }));
    const yLabel = c.relative ? `Deviation (% of ${what} at year ${first})` : `${c.quantity === 'mean' ? 'Mean' : 'Inventory'} deviation (${units})`;
    const series = ts.map((t) => ({ xs: r.years, ys: deviation(t, c), colour: colourOf(r, t.region), dash: dashOf(r, t.tracer), label: `${t.tracer}, ${t.region}` }));
    logLinePanel(svg, rect, domain, series, X_LABEL, yLabel, { zeroLine: true });
    y += panelH + panelGap;
  }
  const items = tracks.map((t) => ({ label: `${t.tracer}, ${t.region}`, colour: colourOf(r, t.region), dash: dashOf(r, t.tracer) }));
  lineLegend(svg, left + panelW + 26, top + 26, devH - 40, legendW, items);
  if (skillPanels.length) {
    svg.append(s('line', { x1: 12, x2: width - 12, y1: skillTop - 10, y2: skillTop - 10, stroke: '#e3e6ea' }));
    svg.append(text(12, skillTop + 8, `Skill of ${c.skillTracer} against the reference, layer ${c.layer}`, { 'font-size': 13, 'font-weight': 600 }));
    const shown = skillSeries(r, c, skillPanels[0]).map((sr) => sr.label.slice(c.skillTracer.length + 2));
    svg.append(text(12, skillTop + 24, `Each snapshot scored as the scores view scores a run; colour: region as above (${shown.join(', ')}).`, { 'font-size': 11.5, fill: MUTED }));
    const units = r.skill.find((p) => p.variable === c.skillTracer)?.units ?? '';
    const gap = 96;
    const w = (width - left - 24 - gap * (skillPanels.length - 1)) / skillPanels.length;
    skillPanels.forEach((k, i) => {
      const rect: Rect = { x: left + i * (w + gap), y: skillTop + 52, w, h: 170 };
      const label = k === 'rmse' ? `RMSE (${units})` : k === 'bias' ? `Bias (${units})` : 'Correlation r (dimensionless)';
      logLinePanel(svg, rect, domain, skillSeries(r, c, k), X_LABEL, label, { zeroLine: k === 'bias', yTicks: 4 });
    });
  }
  svg.append(s('desc', {}, `Colour: region; dash pattern: tracer. Deviation = value minus the value at model year ${first}.`));
  return svg;
}

type SortKey = 'tracer' | 'region' | 'layer' | 'perKyr' | 'percent' | 'xInf' | 'tau' | 't90' | 'needed' | 'status';

const TABLE_COLUMNS: { key: SortKey; label: string; title: string; text?: boolean }[] = [
  { key: 'tracer', label: 'Tracer', title: 'tracer', text: true },
  { key: 'region', label: 'Region', title: 'region', text: true },
  { key: 'layer', label: 'Layer', title: 'depth layer', text: true },
  { key: 'perKyr', label: 'Drift per 1000 yr', title: 'least-squares slope of the mean over the tail window, tracer units per 1000 model years' },
  { key: 'percent', label: 'Drift, % per 1000 yr', title: 'the slope in per cent of the mean over the tail window, per 1000 model years' },
  { key: 'xInf', label: 'Fit x∞', title: 'value the first-order fit heads for' },
  { key: 'tau', label: 'τ (yr)', title: 'e-folding time of the first-order fit, model years' },
  { key: 't90', label: 't90 (yr)', title: 'τ·ln 10: years to cover 90 % of any remaining change' },
  { key: 'needed', label: 'Years still needed', title: 'model years after the last snapshot until the drift falls below the threshold (– when the fit cannot say)' },
  { key: 'status', label: 'Verdict', title: 'settled, still drifting or undetermined; non-monotonic tracks carry a note', text: true },
];

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

export const spinupView: ViewFactory = (el) => {
  const toolbar = h('div', { class: 'view-toolbar', role: 'toolbar', 'aria-label': 'Spin-up options' });
  const pickers = h('div', { class: 'view-toolbar spinup-pickers' });
  const banner = h('p', { class: 'spinup-banner', role: 'status' });
  const scroll = h('div', { class: 'spinup-scroll' });
  const stage = h('div', { class: 'figure-stage spinup-stage' });
  const tableHead = h('div', { class: 'view-toolbar spinup-table-head' });
  const tableWrap = h('div', { class: 'spinup-table-wrap' });
  scroll.append(stage, tableHead, tableWrap);
  el.append(toolbar, pickers, banner, scroll);
  let result: SpinupResult | null = null;
  let resultKey = '';
  let token = 0;
  let sortKey: SortKey = 'percent';
  let sortUp = false;
  let allTracks = false;
  const c: Choice = { run: '', quantity: 'mean', relative: false, layer: 'all', tracers: [], regions: [], skillTracer: '' };

  const redraw = (): void => {
    if (result) render(result);
  };

  const segmented = (label: string, id: string, options: [string, string][], value: string, onPick: (v: string) => void): HTMLElement => {
    const g = h('div', { class: 'segmented', role: 'group', 'aria-label': label, id });
    for (const [v, text] of options) {
      const b = h('button', { type: 'button', 'aria-pressed': String(v === value), 'data-value': v }, text);
      b.addEventListener('click', () => {
        for (const o of g.querySelectorAll('button')) o.setAttribute('aria-pressed', String(o === b));
        onPick(v);
      });
      g.append(b);
    }
    return h('span', { class: 'row' }, h('span', { class: 'toolbar-label' }, label), g);
  };

  const selectOf = (label: string, id: string, options: string[], value: string, onPick: (v: string) => void): HTMLElement => {
    const sel = h('select', { 'aria-label': label, id });
    for (const o of options) {
      const opt = h('option', { value: o }, o);
      if (o === value) opt.selected = true;
      sel.append(opt);
    }
    sel.addEventListener('change', () => onPick(sel.value));
    return h('label', { class: 'toolbar-label' }, `${label} `, sel);
  };

  const checkboxes = (legendText: string, id: string, options: string[], chosen: string[], onChange: (v: string[]) => void): HTMLElement => {
    const fs = h('fieldset', { class: 'spinup-checks', id }, h('legend', {}, legendText));
    for (const o of options) {
      const box = h('input', { type: 'checkbox', value: o, 'data-value': o });
      box.checked = chosen.includes(o);
      box.addEventListener('change', () => onChange([...fs.querySelectorAll('input:checked')].map((e) => (e as HTMLInputElement).value)));
      fs.append(h('label', {}, box, o));
    }
    return fs;
  };

  const drawControls = (r: SpinupResult, runs: string[]): void => {
    const tracerNames = r.tracers.map((t) => t.name);
    toolbar.replaceChildren(
      ...(runs.length > 1
        ? [
            selectOf('Run', 'spinup-run', runs, c.run, (v) => {
              c.run = v;
              void draw(state);
            }),
          ]
        : []),
      segmented('Show', 'spinup-quantity', [['mean', 'mean'], ['inventory', 'inventory']], c.quantity, (v) => {
        c.quantity = v as Quantity;
        redraw();
      }),
      segmented('as', 'spinup-scale', [['absolute', 'absolute'], ['relative', 'relative (%)']], c.relative ? 'relative' : 'absolute', (v) => {
        c.relative = v === 'relative';
        redraw();
      }),
      selectOf('Layer', 'spinup-layer', r.layers, c.layer, (v) => {
        c.layer = v;
        redraw();
      }),
      selectOf('Skill of', 'spinup-skill-tracer', tracerNames.filter((n) => r.skill.some((p) => p.variable === n)), c.skillTracer, (v) => {
        c.skillTracer = v;
        redraw();
      }),
      h('span', { class: 'toolbar-hint' }, `Run ${r.run}: ${r.years.length} snapshots, model years ${r.years[0]}–${r.years[r.years.length - 1]}`),
    );
    pickers.replaceChildren(
      checkboxes('Tracers', 'spinup-tracers', tracerNames, c.tracers, (v) => {
        c.tracers = v;
        if (v.length && !v.includes(c.skillTracer) && r.skill.some((p) => p.variable === v[0])) {
          c.skillTracer = v[0];
          const skillSelect = toolbar.querySelector<HTMLSelectElement>('#spinup-skill-tracer');
          if (skillSelect) skillSelect.value = v[0];
        }
        redraw();
      }),
      checkboxes('Regions', 'spinup-regions', r.regions, c.regions, (v) => {
        c.regions = v;
        redraw();
      }),
    );
  };

  const drawTable = (r: SpinupResult): void => {
    const rows = r.tracks.filter((t) => allTracks || (c.tracers.includes(t.tracer) && c.regions.includes(t.region)));
    const sign = sortUp ? 1 : -1;
    rows.sort((a, b) => {
      let x = sortValue(a, sortKey);
      let y = sortValue(b, sortKey);
      if (x === null) return 1;
      if (y === null) return -1;
      // drift sorts by size, whatever the sign
      if (sortKey === 'perKyr' || sortKey === 'percent') {
        x = Math.abs(x as number);
        y = Math.abs(y as number);
      }
      if (typeof x === 'number' && typeof y === 'number') return sign * (x - y);
      return sign * String(x).localeCompare(String(y), undefined, { numeric: true });
    });
    const head = h('tr', {});
    for (const col of TABLE_COLUMNS) {
      const b = h('button', { type: 'button', title: `${col.title}; sort by this column` }, col.label, sortKey === col.key ? (sortUp ? ' ▲' : ' ▼') : '');
      b.addEventListener('click', () => {
        if (sortKey === col.key) sortUp = !sortUp;
        else {
          sortKey = col.key;
          sortUp = !!col.text;
        }
        drawTable(r);
      });
      head.append(h('th', { class: col.text ? 'text' : '', scope: 'col', 'aria-sort': sortKey === col.key ? (sortUp ? 'ascending' : 'descending') : 'none' }, b));
    }
    const body = h('tbody', {});
    for (const t of rows) {
      const d = t.drift;
      const f = t.fit;
      const needed = t.verdict.status === 'settled' ? '0' : f?.yearsToSettle !== null && f?.yearsToSettle !== undefined ? String(Math.round(f.yearsToSettle)) : '–';
      const verdict = h('td', { class: `text verdict ${t.verdict.status}`, title: `${t.verdict.sentence} ${t.fitNote}`.trim(), 'data-status': t.verdict.status }, STATUS_TEXT[t.verdict.status]);
      // notes go on a line of their own under the track, so that the columns stay narrow
      const notes: string[] = [];
      if (!t.monotonic) notes.push(`non-monotonic: turns back at model year ${t.turningYears.join(', ')}; ${t.fitNote}`);
      if (t.verdict.deepCaution) notes.push('the run may be too short for the deep ocean');
      if (f && !f.constrained) notes.push('fit not constrained: x∞ and τ are lower bounds at best');
      if (notes.length) verdict.append(h('span', { class: 'verdict-flag' }, ' *'));
      body.append(
        h(
          'tr',
          { class: 'track-row' },
          h('td', { class: 'text' }, t.tracer),
          h('td', { class: 'text' }, t.region),
          h('td', { class: 'text' }, t.layer),
          h('td', { title: d ? `model years ${d.fromYear}–${d.toYear}, ${d.window}` : '' }, d ? `${fmt(d.perKyr, 3)} ${t.units}` : '–'),
          h('td', { title: d?.relativeTo ? `relative to ${d.relativeTo}` : '' }, d?.percentPerKyr !== null && d?.percentPerKyr !== undefined ? `${fmt(d.percentPerKyr, 3)} %` : '–'),
          h('td', {}, f ? `${fmt(f.xInf, 4)} ${t.units}` : '–'),
          h('td', {}, f ? String(Math.round(f.tau)) : '–'),
          h('td', {}, f ? String(Math.round(f.t90)) : '–'),
          h('td', {}, needed),
          verdict,
        ),
      );
      if (notes.length) body.append(h('tr', { class: 'verdict-note-row' }, h('td', { colspan: TABLE_COLUMNS.length, class: 'text verdict-note' }, `${t.tracer}, ${t.region}, ${t.layer}: ${notes.join('; ')}.`)));
    }
    const all = h('input', { type: 'checkbox', id: 'spinup-all-tracks' });
    all.checked = allTracks;
    all.addEventListener('change', () => {
      allTracks = all.checked;
      drawTable(r);
    });
    tableHead.replaceChildren(
      h('h3', { class: 'spinup-table-title' }, 'Drift rates and verdicts'),
      h('label', { class: 'toolbar-label' }, all, ' every tracer and region'),
      h('span', { class: 'toolbar-hint' }, `${rows.length} of ${r.tracks.length} tracks; settled below ${r.settings.thresholdPercentPerKyr} % of the mean per 1000 years`),
    );
    tableWrap.replaceChildren(h('table', { class: 'scores spinup-table', id: 'spinup-table' }, h('thead', {}, head), body));
  };

  const render = (r: SpinupResult): void => {
    banner.textContent = [r.summary.sentence, ...r.notes].join(' ');
    banner.className = `spinup-banner ${r.summary.settled ? 'settled' : 'drifting'}`;
    const width = Math.max(640, Math.floor(stage.clientWidth || scroll.clientWidth || 900) - 4);
    stage.replaceChildren(spinupFigure(r, c, width));
    stage.dataset.drawn = `${c.run}|${c.quantity}|${c.relative ? 'relative' : 'absolute'}|${c.layer}|${c.tracers.join(',')}|${c.regions.join(',')}`;
    drawTable(r);
  };

  const draw = async (st: AppState): Promise<void> => {
    const session = st.session;
    if (!session) return note(stage, 'Open a recipe to follow its spin-up.');
    const runs = session.runs.filter((r) => r.snapshots?.length).map((r) => r.label);
    if (!runs.length) return note(stage, 'No run of this recipe lists spin-up snapshots (runs[i].snapshots).');
    if (!runs.includes(c.run)) c.run = runs[0];
    const key = `${session.session}|${c.run}`;
    const my = ++token;
    if (!result || resultKey !== key) {
      note(stage, `Following ${c.run} through its snapshots (in the background)…`, 'busy');
      try {
        const r = await tracked<SpinupResult>('Following the spin-up', 'spinup.run', { ...(await sessionRecipe(session.session)), run: c.run });
        if (my !== token) return;
        result = r;
        resultKey = key;
      } catch (e) {
        if (my === token) note(stage, /no service/i.test(errorText(e)) ? 'The spin-up analysis is not part of this build yet.' : errorText(e), 'error');
        return;
      }
      // first look: the chosen variable and the tracer that drifts most, the chosen region and where it drifts most
      const names = result.tracers.map((t) => t.name);
      const worst = result.summary.worst[0];
      c.tracers = [...new Set([st.sel.variable, worst?.tracer].filter((v): v is string => !!v && names.includes(v)))];
      if (!c.tracers.length) c.tracers = names.slice(0, 1);
      c.regions = [...new Set([st.sel.region, worst?.region].filter((v): v is string => !!v && result!.regions.includes(v)))];
      if (!c.regions.length) c.regions = result.regions.slice(0, 1);
      c.layer = worst && result.layers.includes(worst.layer) ? worst.layer : (result.layers[0] ?? 'all');
      c.skillTracer = c.tracers.find((t) => result!.skill.some((p) => p.variable === t)) ?? result.skill[0]?.variable ?? '';
    }
    drawControls(result, runs);
    render(result);
  };
  return {
    update(st, changed) {
      if (changed.size === 1 && changed.has('probe')) return;
      // the spin-up keeps its own choice of tracers and regions; only a new session or a resize redraws
      if (result && !changed.has('session') && !changed.has('size')) return;
      void draw(st);
    },
    async figure() {
      return result ? spinupFigure(result, c, EXPORT_WIDTH) : null;
    },
    fileBase: () => `stillwater-spinup-${c.run}-${c.quantity}-${c.layer}`.replace(/[^A-Za-z0-9._-]+/g, '_'),
    dispose() {
      token++;
    },
  };
};

/** Verdicts asked for by the scores view, per session and run (a failed request is asked again next time). */
const verdicts = new Map<string, Promise<SpinupSummary | null>>();

/**
 * The banner above the scores table: for every run that lists spin-up snapshots, whether it has settled
 * ('spinup.verdict', heavy, so in the background: the table never waits for it); one plain line for the runs
 * without snapshots, whose settling is unknown.
 */
export function spinupBanner(el: HTMLElement, st: AppState): void {
  const session = st.session;
  if (!session) {
    el.replaceChildren();
    return;
  }
  const withSnapshots = session.runs.filter((r) => r.snapshots?.length).map((r) => r.label);
  const without = session.runs.filter((r) => !r.snapshots?.length).map((r) => r.label);
  const unknown = (): HTMLElement | null =>
    without.length
      ? h('p', { class: 'unknown' }, `Whether ${without.join(', ')} ${without.length > 1 ? 'have' : 'has'} settled is unknown: ${without.length > 1 ? 'they list' : 'it lists'} no spin-up snapshots (runs[i].snapshots).`)
      : null;
  if (!withSnapshots.length) {
    el.className = 'scores-spinup-banner busy';
    el.replaceChildren(...[unknown()].filter((x): x is HTMLElement => !!x));
    return;
  }
  el.className = 'scores-spinup-banner busy';
  el.replaceChildren(h('p', {}, `Checking whether ${withSnapshots.join(', ')} ${withSnapshots.length > 1 ? 'have' : 'has'} settled (in the background)…`));
  const asked = session.session;
  void Promise.all(
    withSnapshots.map((run) => {
      const key = `${asked}|${run}`;
      let p = verdicts.get(key);
      if (!p) {
        p = (async () => tracked<SpinupSummary | null>(`Has ${run} settled?`, 'spinup.verdict', { ...(await sessionRecipe(asked)), run }))();
        verdicts.set(key, p);
        p.catch(() => verdicts.delete(key));
      }
      return p.then(
        (v) => ({ run, v, error: '' }),
        (e: unknown) => ({ run, v: null, error: errorText(e) }),
      );
    }),
  ).then((answers) => {
    if (state.session?.session !== asked || !el.isConnected) return;
    const lines: HTMLElement[] = [];
    let drifting = false;
    for (const a of answers) {
      if (a.v) {
        drifting ||= !a.v.settled;
        lines.push(h('p', { class: a.v.settled ? 'settled' : 'drifting', 'data-run': a.run }, a.v.sentence));
      } else if (a.error) lines.push(h('p', { class: 'unknown' }, `Whether ${a.run} has settled could not be checked: ${a.error}`));
    }
    const u = unknown();
    if (u) lines.push(u);
    el.className = `scores-spinup-banner${drifting ? ' drifting' : ' busy'}`;
    el.replaceChildren(...lines);
  });
}
