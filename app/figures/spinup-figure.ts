/**
 * The workbench's spin-up figure: how a run's tracers move away from their first snapshot on a logarithmic axis
 * of model years (a panel per tracer in its own units, or one shared panel in per cent), and the skill of each
 * snapshot below. Colour is the region, the dash pattern the tracer. The Spin-up view shows this figure and
 * exports the same one.
 */
import type { SkillPoint, SpinupResult, SpinupTrack } from '../spinup/types.js';
import { FONT_PT, MUTED, widthPt, type FigureWidth } from './page.js';
import { figureRoot, figureTitle, LEFT_AXIS_PT, r2, RUN_COLOURS, text, type Figure, type Rect } from './parts.js';
import { logLinePanel, YEAR_LABEL, yearDomain, type LineSeries } from './log-lines.js';
import { el, type SvgNode } from './svg-tree.js';
import { typesetUnits } from './typeset.js';

export type SpinupQuantity = 'mean' | 'inventory';

export interface SpinupChoice {
  run: string;
  quantity: SpinupQuantity;
  relative: boolean;
  layer: string;
  tracers: string[];
  regions: string[];
  skillTracer: string;
}

const DASHES = ['', '4 1.8', '1.2 1.5', '5 1.8 1.2 1.8', '2.4 2.4', '0.6 1.8'];
const PANEL_H = 105;
const PANEL_GAP = 40;
const SKILL_H = 90;

/** Degrees Celsius are compared in kelvin, as the drift rates are (a zero that is not a zero of amount). */
function relativeBase(track: SpinupTrack, quantity: SpinupQuantity): number {
  const first = quantity === 'mean' ? track.mean[0] : track.inventory[0];
  if (quantity === 'mean' && /^(deg_?C|degC|°C|celsius)$/i.test(track.units)) return Math.abs(first + 273.15);
  return Math.abs(first);
}

function deviation(track: SpinupTrack, c: SpinupChoice): number[] {
  const dev = c.quantity === 'mean' ? track.meanDeviation : track.inventoryDeviation;
  if (!c.relative) return dev;
  const base = relativeBase(track, c.quantity);
  return dev.map((v) => (base > 0 ? (100 * v) / base : NaN));
}

const colourOf = (r: SpinupResult, region: string): string => RUN_COLOURS[Math.max(0, r.regions.indexOf(region)) % RUN_COLOURS.length];
const dashOf = (r: SpinupResult, tracer: string): string => DASHES[Math.max(0, r.tracers.findIndex((t) => t.name === tracer)) % DASHES.length];

function chosenTracks(r: SpinupResult, c: SpinupChoice): SpinupTrack[] {
  return r.tracks.filter((t) => t.layer === c.layer && c.tracers.includes(t.tracer) && c.regions.includes(t.region));
}

function skillSeries(r: SpinupResult, c: SpinupChoice, key: 'rmse' | 'bias' | 'corr'): LineSeries[] {
  return c.regions
    .map((region) => {
      const pts = r.skill.filter((p: SkillPoint) => p.variable === c.skillTracer && p.region === region && p.layer === c.layer).sort((a, b) => a.year - b.year);
      return { xs: pts.map((p) => p.year), ys: pts.map((p) => (typeof p[key] === 'number' ? (p[key] as number) : NaN)), colour: colourOf(r, region), label: `${c.skillTracer}, ${region}` };
    })
    .filter((sr) => sr.xs.length > 0);
}

/** A legend of line samples (colour = region, dash = tracer), in as many columns as the height allows. */
function lineLegend(svg: SvgNode, x: number, y: number, maxH: number, colW: number, items: { label: string; colour: string; dash: string }[]): void {
  const g = el('g', { class: 'legend' });
  g.append(text(x, y, 'Lines', { 'font-size': FONT_PT.label, 'font-weight': 'bold' }));
  g.append(text(x, y + FONT_PT.label + 2, 'colour: region, dash: tracer', { 'font-size': FONT_PT.tick, fill: MUTED }));
  const rows = Math.max(1, Math.floor((maxH - 20) / 10));
  items.forEach((it, i) => {
    const cx = x + Math.floor(i / rows) * colW;
    const cy = y + 24 + (i % rows) * 10;
    g.append(el('line', { x1: r2(cx), x2: r2(cx + 14), y1: r2(cy - 2.5), y2: r2(cy - 2.5), stroke: it.colour, 'stroke-width': 1.1, ...(it.dash ? { 'stroke-dasharray': it.dash } : {}) }));
    g.append(text(cx + 18, cy, it.label, { 'font-size': FONT_PT.label }));
  });
  svg.append(g);
}

export function spinupFigure(r: SpinupResult, c: SpinupChoice, width: FigureWidth = 'double'): Figure {
  const W = widthPt(width);
  const tracks = chosenTracks(r, c);
  const what = c.quantity === 'mean' ? 'mean' : 'inventory';
  // absolute deviations: a panel per tracer (its own units and scale); relative ones share a panel
  const groups = new Map<string, SpinupTrack[]>();
  for (const t of tracks) {
    const key = c.relative ? '%' : t.tracer;
    groups.set(key, [...(groups.get(key) ?? []), t]);
  }
  const first = r.years[0];
  const title = `Spin-up of ${r.run}: ${what} deviation from model year ${first}, layer ${c.layer}`;
  const scratch = el('g');
  const top = figureTitle(scratch, 6, FONT_PT.title + 2, W - 12, title, r.summary.sentence);
  const legendW = width === 'double' ? 120 : 90;
  const left = LEFT_AXIS_PT + 8;
  const panelW = W - left - legendW - 10;
  const skillPanels = (['rmse', 'bias', 'corr'] as const).filter((k) => skillSeries(r, c, k).length);
  const devH = Math.max(1, groups.size) * (PANEL_H + PANEL_GAP);
  const skillTop = top + devH + 8;
  const skillH = skillPanels.length ? 34 + SKILL_H + 30 : 0;
  const H = skillTop + skillH + 6;
  const svg = figureRoot(W, H, `Spin-up of ${r.run}: ${what} deviation and skill against model year`);
  for (const ch of scratch.children) svg.append(ch);
  const domain = yearDomain(r.years);
  if (!groups.size) svg.append(text(left, top + 30, 'Choose at least one tracer and one region.', { fill: MUTED, class: 'no-data' }));
  let y = top;
  for (const ts of groups.values()) {
    const rect: Rect = { x: left, y: y + FONT_PT.panelTitle + 4, w: panelW, h: PANEL_H - FONT_PT.panelTitle - 4 };
    const units = typesetUnits(c.quantity === 'mean' ? ts[0].units : ts[0].inventoryUnits);
    const names = c.relative ? [...new Set(ts.map((t) => t.tracer))].join(', ') : `${ts[0].tracer} (${units})`;
    const g = el('g', { class: 'panel' });
    g.append(text(rect.x, rect.y - 3, names, { 'font-size': FONT_PT.panelTitle, 'font-weight': 'bold', class: 'panel-title' }));
    const yLabel = c.relative ? `Deviation (% of ${what} at year ${first})` : `${c.quantity === 'mean' ? 'Mean' : 'Inventory'} deviation (${units})`;
    const series = ts.map((t) => ({ xs: r.years, ys: deviation(t, c), colour: colourOf(r, t.region), dash: dashOf(r, t.tracer), label: `${t.tracer}, ${t.region}` }));
    logLinePanel(g, rect, domain, series, YEAR_LABEL, yLabel, { zeroLine: true });
    svg.append(g);
    y += PANEL_H + PANEL_GAP;
  }
  const items = tracks.map((t) => ({ label: `${t.tracer}, ${t.region}`, colour: colourOf(r, t.region), dash: dashOf(r, t.tracer) }));
  lineLegend(svg, left + panelW + 10, top + 12, devH - 20, legendW, items);
  if (skillPanels.length) {
    svg.append(el('line', { x1: 6, x2: r2(W - 6), y1: r2(skillTop - 4), y2: r2(skillTop - 4), stroke: '#e3e6ea', 'stroke-width': 0.6 }));
    svg.append(text(6, skillTop + 6, `Skill of ${c.skillTracer} against the reference, layer ${c.layer}`, { 'font-size': FONT_PT.panelTitle, 'font-weight': 'bold' }));
    const shown = skillSeries(r, c, skillPanels[0]).map((sr) => sr.label.slice(c.skillTracer.length + 2));
    svg.append(text(6, skillTop + 6 + FONT_PT.label + 3, `Each snapshot scored as the scores view scores a run; colour: region as above (${shown.join(', ')}).`, { 'font-size': FONT_PT.label, fill: MUTED }));
    const units = typesetUnits(r.skill.find((p) => p.variable === c.skillTracer)?.units ?? '');
    const gap = LEFT_AXIS_PT + 10;
    const w = (W - left - 8 - gap * (skillPanels.length - 1)) / skillPanels.length;
    skillPanels.forEach((k, i) => {
      const rect: Rect = { x: left + i * (w + gap), y: skillTop + 30, w, h: SKILL_H };
      const label = k === 'rmse' ? `RMSE (${units})` : k === 'bias' ? `Bias (${units})` : 'Correlation r (dimensionless)';
      const g = el('g', { class: 'panel skill' });
      logLinePanel(g, rect, domain, skillSeries(r, c, k), YEAR_LABEL, label, { zeroLine: k === 'bias', yTicks: 4 });
      svg.append(g);
    });
  }
  svg.append(el('desc', {}, `Colour: region; dash pattern: tracer. Deviation = value minus the value at model year ${first}.`));
  return { name: `spinup-${r.run}`, title, svg, widthPt: W, heightPt: H };
}
