/**
 * Spin-up view: one tracer × region × layer over the model years of a run's snapshots, with the
 * first-order fit and the verdict of the spin-up part (service 'spinup.run'), and the skill of each
 * snapshot against the reference when there is one.
 */
import type { SpinupResult, SpinupTrack } from '../../app/spinup/types.js';
import { tracked, sessionRecipe } from '../data.js';
import { h, s } from '../dom.js';
import { linear, padded } from '../plot/scale.js';
import { bottomAxis, figureRoot, INK, leftAxis, legend, MUTED, RUN_COLOURS, text, title, type Rect } from '../plot/svg-parts.js';
import { state, type AppState } from '../state.js';
import { EXPORT_WIDTH, errorText, note, type ViewFactory } from './view.js';

function linePath(xs: number[], ys: number[], sx: (v: number) => number, sy: (v: number) => number): string {
  let d = '';
  let pen = false;
  for (let i = 0; i < xs.length; i++) {
    if (!Number.isFinite(ys[i])) {
      pen = false;
      continue;
    }
    d += `${pen ? 'L' : 'M'}${sx(xs[i]).toFixed(2)},${sy(ys[i]).toFixed(2)}`;
    pen = true;
  }
  return d;
}

function spinupFigure(r: SpinupResult, track: SpinupTrack, rmse: { year: number; rmse: number }[], width: number, height: number): SVGSVGElement {
  const svg = figureRoot(width, height, `Spin-up of ${track.tracer}, ${track.region}, ${track.layer}`);
  const lines = title(svg, 12, 18, `Spin-up of ${r.run}: ${track.tracer}, ${track.region}, ${track.layer}`, track.verdict.sentence);
  const twoPanels = rmse.length > 1;
  const gap = 90;
  const w = twoPanels ? (width - 76 - gap - 24) / 2 : width - 76 - 24 - 180;
  const top = lines > 1 ? 72 : 60;
  const plot: Rect = { x: 76, y: top, w, h: height - top - 56 };
  const years = r.years;
  const sx = linear(padded(Math.min(...years), Math.max(...years), 0.03), [plot.x, plot.x + plot.w]);
  const vals = track.mean.filter(Number.isFinite);
  let lo = Math.min(...vals);
  let hi = Math.max(...vals);
  const fit = track.fit;
  const fitX: number[] = [];
  const fitY: number[] = [];
  if (fit) {
    const last = years[years.length - 1];
    for (let i = 0; i <= 80; i++) {
      const t = fit.t0 + ((last - fit.t0) * i) / 80;
      fitX.push(t);
      fitY.push(fit.xInf + (fit.x0 - fit.xInf) * Math.exp(-(t - fit.t0) / fit.tau));
    }
    lo = Math.min(lo, ...fitY);
    hi = Math.max(hi, ...fitY);
  }
  const sy = linear(padded(lo, hi), [plot.y + plot.h, plot.y]);
  const g = s('g', {});
  bottomAxis(g, plot, sx, 'Model year', { grid: true, ticks: 6 });
  leftAxis(g, plot, sy, `Mean ${track.tracer} (${track.units})`, { grid: true, ticks: 6 });
  svg.append(g);
  svg.append(s('rect', { x: plot.x, y: plot.y, width: plot.w, height: plot.h, fill: 'none', stroke: INK, 'stroke-width': 0.9 }));
  if (fit) svg.append(s('path', { d: linePath(fitX, fitY, sx, sy), fill: 'none', stroke: '#D55E00', 'stroke-width': 1.6, 'stroke-dasharray': '6 3' }));
  svg.append(s('path', { d: linePath(years, track.mean, sx, sy), fill: 'none', stroke: RUN_COLOURS[0], 'stroke-width': 1.8 }));
  years.forEach((y, i) => {
    if (Number.isFinite(track.mean[i])) svg.append(s('circle', { cx: sx(y), cy: sy(track.mean[i]), r: 3, fill: RUN_COLOURS[0] }));
  });
  const items = [{ label: 'snapshot means', colour: RUN_COLOURS[0], marker: 'line' as const }];
  if (fit) items.push({ label: `first-order fit, τ = ${Math.round(fit.tau)} yr`, colour: '#D55E00', marker: 'line' as const });
  if (twoPanels) {
    legend(svg, plot.x + 10, plot.y + 12, items);
    const p2: Rect = { x: plot.x + plot.w + gap, y: plot.y, w, h: plot.h };
    const sx2 = linear(padded(Math.min(...rmse.map((p) => p.year)), Math.max(...rmse.map((p) => p.year)), 0.03), [p2.x, p2.x + p2.w]);
    const sy2 = linear(padded(Math.min(...rmse.map((p) => p.rmse)), Math.max(...rmse.map((p) => p.rmse))), [p2.y + p2.h, p2.y]);
    const g2 = s('g', {});
    bottomAxis(g2, p2, sx2, 'Model year', { grid: true, ticks: 6 });
    leftAxis(g2, p2, sy2, `RMSE against the reference (${track.units})`, { grid: true, ticks: 6 });
    svg.append(g2);
    svg.append(s('rect', { x: p2.x, y: p2.y, width: p2.w, height: p2.h, fill: 'none', stroke: INK, 'stroke-width': 0.9 }));
    svg.append(s('path', { d: linePath(rmse.map((p) => p.year), rmse.map((p) => p.rmse), sx2, sy2), fill: 'none', stroke: RUN_COLOURS[2], 'stroke-width': 1.8 }));
  } else legend(svg, plot.x + plot.w + 16, plot.y + 8, items);
  const drift = track.drift;
  if (drift) svg.append(text(plot.x, height - 8, `Drift over years ${drift.fromYear}–${drift.toYear}: ${drift.perKyr.toPrecision(3)} ${track.units} per 1000 years${drift.percentPerKyr !== null ? ` (${drift.percentPerKyr.toPrecision(2)} % per 1000 years)` : ''}.`, { 'font-size': 11, fill: MUTED }));
  return svg;
}

export const spinupView: ViewFactory = (el) => {
  const toolbar = h('div', { class: 'view-toolbar', role: 'toolbar', 'aria-label': 'Spin-up options' });
  const banner = h('p', { class: 'spinup-banner' });
  const stage = h('div', { class: 'figure-stage' });
  el.append(toolbar, banner, stage);
  let result: SpinupResult | null = null;
  let forSession = '';
  let layer = '';
  let token = 0;
  let current: { track: SpinupTrack; rmse: { year: number; rmse: number }[] } | null = null;

  const pick = (st: AppState): SpinupTrack | null => {
    if (!result) return null;
    const tracks = result.tracks.filter((t) => t.tracer === st.sel.variable);
    const layers = [...new Set(tracks.map((t) => t.layer))];
    if (!layers.includes(layer)) layer = layers[0] ?? '';
    return tracks.find((t) => t.region === st.sel.region && t.layer === layer) ?? tracks.find((t) => t.layer === layer) ?? null;
  };

  const draw = async (st: AppState): Promise<void> => {
    const session = st.session;
    if (!session) return note(stage, 'Open a recipe to follow its spin-up.');
    if (!session.runs.some((r) => r.snapshots?.length)) return note(stage, 'No run of this recipe lists spin-up snapshots (runs[i].snapshots).');
    const my = ++token;
    if (!result || forSession !== session.session) {
      note(stage, 'Reading the spin-up snapshots (in the background)…', 'busy');
      try {
        const r = await tracked<SpinupResult>('Following the spin-up', 'spinup.run', await sessionRecipe(session.session));
        if (my !== token) return;
        result = r;
        forSession = session.session;
      } catch (e) {
        if (my === token) note(stage, /no service/i.test(errorText(e)) ? 'The spin-up analysis is not part of this build yet.' : errorText(e), 'error');
        return;
      }
    }
    banner.textContent = result.summary.sentence;
    banner.className = `spinup-banner ${result.summary.settled ? 'settled' : 'drifting'}`;
    const track = pick(st);
    const layers = [...new Set(result.tracks.filter((t) => t.tracer === st.sel.variable).map((t) => t.layer))];
    const sel = h('select', { 'aria-label': 'Layer', id: 'spinup-layer' });
    for (const l of layers) {
      const o = h('option', { value: l }, l);
      if (l === layer) o.selected = true;
      sel.append(o);
    }
    sel.addEventListener('change', () => {
      layer = sel.value;
      void draw(state);
    });
    toolbar.replaceChildren(h('label', { class: 'toolbar-label' }, 'Layer ', sel), h('span', { class: 'toolbar-hint' }, `Run ${result.run}; variable and region from the bar above.`));
    if (!track) return note(stage, `The spin-up snapshots do not follow ${st.sel.variable}.`);
    const rmse = result.skill
      .filter((p) => p.variable === track.tracer && p.region === track.region && p.layer === track.layer && typeof p.rmse === 'number')
      .map((p) => ({ year: p.year, rmse: p.rmse as number }))
      .sort((a, b) => a.year - b.year);
    current = { track, rmse };
    const width = Math.max(560, Math.floor(stage.clientWidth || 900));
    const height = Math.max(320, Math.min(Math.floor(stage.clientHeight || 520), Math.round(width * 0.5)));
    stage.replaceChildren(spinupFigure(result, track, rmse, width, height));
    stage.dataset.drawn = `${track.tracer}|${track.region}|${track.layer}`;
  };
  return {
    update(st, changed) {
      if (changed.size === 1 && changed.has('probe')) return;
      void draw(st);
    },
    async figure() {
      if (!result || !current) return null;
      return spinupFigure(result, current.track, current.rmse, EXPORT_WIDTH, Math.round(EXPORT_WIDTH * 0.5));
    },
    fileBase: () => `stillwater-spinup-${state.sel.variable}-${state.sel.region}-${layer}`.replace(/[^A-Za-z0-9._-]+/g, '_'),
    dispose() {
      token++;
    },
  };
};
