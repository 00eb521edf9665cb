/**
 * The spin-up figure: how a run's tracers move away from their first snapshot on a logarithmic axis of model
 * years (a panel per tracer, or one shared panel in per cent), and the skill of each snapshot below.
 */
import { typesetUnits } from '../../app/figures/typeset.js';
import type { SkillPoint, SpinupResult, SpinupTrack } from '../../app/spinup/types.js';
import { s } from '../elements.js';
import { logLinePanel, yearDomain, type LineSeries } from '../plot/log-lines.js';
import { figureRoot, MUTED, RUN_COLOURS, text, title, type Rect } from '../plot/svg-parts.js';

export type Quantity = 'mean' | 'inventory';
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
    const units = typesetUnits(c.quantity === 'mean' ? ts[0].units : ts[0].inventoryUnits);
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
    const units = typesetUnits(r.skill.find((p) => p.variable === c.skillTracer)?.units ?? '');
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
