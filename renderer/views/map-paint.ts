/**
 * What a map shows of a level (which array, which range, which words) and how it is coloured: the pixel-to-cell
 * lookup is built once per projection, grid and canvas size, so a change of depth, variable or range only
 * recolours.
 */
import { periodLabel } from '../../app/render/period-labels.js';
import { clipped, log10Values, positiveRange } from '../../app/render/colour-mapping.js';
import { DIVERGING, SEQUENTIAL, quantileRange, symmetricRange, type ColourScale } from '../../app/render/colour-scales.js';
import { DIFF_SCALES, FIELD_SCALES, namedScale } from '../../app/render/named-scales.js';
import { buildPixelLookup, shiftPixelLookup } from '../../app/render/pixel-lookup.js';
import { makeProjection, type MapProjection, type ProjectionId } from '../../app/render/projections.js';
import { cellColours, gatherColours, packRgba, type RecolourStyle } from '../../app/render/recolour.js';
import type { LevelData, ViewGrid } from '../../contract/view-types.js';
import { currentVariable, type AppState } from '../state.js';

/** land (no water in the common grid) and water without values: two greys a person can tell apart */
export const LAND = packRgba(190, 188, 182);
export const NO_DATA = packRgba(236, 236, 240);
const BACKGROUND = packRgba(255, 255, 255, 0);

const lookups = new Map<string, Int32Array>();
const projections = new Map<ProjectionId, MapProjection>();

export function projectionOf(id: ProjectionId): MapProjection {
  let p = projections.get(id);
  if (!p) {
    p = makeProjection(id);
    projections.set(id, p);
  }
  return p;
}

/** Where each kept lookup looks: to pan by whole pixels from one of them instead of building anew. */
const lookupWindows = new Map<string, { id: string; grid: string; w: number; h: number; e: MapProjection['extent'] }>();

/** The lookup for one projection × window × grid × canvas size, built once and kept (a few of them). */
export function lookupFor(proj: MapProjection, grid: ViewGrid, w: number, h: number): Int32Array {
  const e = proj.extent;
  const gridKey = `${grid.nx}x${grid.ny}|${grid.lonEdges[0]}|${grid.latEdges[0]}`;
  const key = `${proj.info.id}|${e.xmin},${e.xmax},${e.ymin},${e.ymax}|${gridKey}|${w}x${h}`;
  let lut = lookups.get(key);
  if (!lut) {
    lut = panned(proj, grid, gridKey, w, h) ?? buildPixelLookup(proj, grid.lonEdges, grid.latEdges, w, h);
    lookups.set(key, lut);
    lookupWindows.set(key, { id: proj.info.id, grid: gridKey, w, h, e: { ...e } });
    while (lookups.size > 8) {
      const oldest = lookups.keys().next().value as string;
      lookups.delete(oldest);
      lookupWindows.delete(oldest);
    }
  }
  return lut;
}

/** A kept lookup of a window of the same size a whole number of pixels away, shifted; null when there is none. */
function panned(proj: MapProjection, grid: ViewGrid, gridKey: string, w: number, h: number): Int32Array | null {
  const e = proj.extent;
  const pxW = (e.xmax - e.xmin) / w;
  const pxH = (e.ymax - e.ymin) / h;
  for (const [key, k] of lookupWindows) {
    if (k.id !== proj.info.id || k.grid !== gridKey || k.w !== w || k.h !== h) continue;
    if (Math.abs(k.e.xmax - k.e.xmin - (e.xmax - e.xmin)) > pxW * 1e-6 || Math.abs(k.e.ymax - k.e.ymin - (e.ymax - e.ymin)) > pxH * 1e-6) continue;
    const dx = (e.xmin - k.e.xmin) / pxW;
    const dy = (e.ymin - k.e.ymin) / pxH;
    if (Math.abs(dx - Math.round(dx)) > 1e-6 || Math.abs(dy - Math.round(dy)) > 1e-6) continue;
    if (Math.abs(dx) >= w || Math.abs(dy) >= h) continue;
    return shiftPixelLookup(lookups.get(key)!, proj, grid.lonEdges, grid.latEdges, w, h, Math.round(dx), Math.round(dy));
  }
  return null;
}

export interface MapChoice {
  /** the values shown, in their units */
  values: Float32Array;
  /** range of the colour bar, in the values' units */
  min: number;
  max: number;
  diverging: boolean;
  caption: string;
  title: string;
  subtitle: string;
  units: string;
  /** the chosen scale (the default of its kind when absent) */
  scale?: ColourScale;
  /** logarithmic stretch */
  log?: boolean;
  /** values beyond the range (arrows on the colour bar) */
  below?: boolean;
  above?: boolean;
  /** above zero where the cell has water (a value in the run or the reference), to tell no data from land */
  water?: Float32Array;
}

/** Automatic ranges are worked out once per level that arrives. */
const autoRanges = new WeakMap<LevelData, { field: [number, number] | null; diff: [number, number] | null }>();

export function autoRange(data: LevelData, difference: boolean): [number, number] | null {
  let r = autoRanges.get(data);
  if (!r) {
    r = { field: null, diff: null };
    autoRanges.set(data, r);
  }
  if (difference) return (r.diff ??= symmetricRange([data.difference]));
  return (r.field ??= quantileRange([data.model, data.reference]));
}

/** One automatic range over the reference and every run's level (the range locked across runs). */
export function sharedRange(levels: LevelData[], difference: boolean): [number, number] | null {
  return difference ? symmetricRange(levels.map((d) => d.difference)) : quantileRange([levels[0]?.reference ?? new Float32Array(0), ...levels.map((d) => d.model)]);
}

/** log10 of a level's values, worked out once per array. */
const logged = new WeakMap<Float32Array, Float32Array>();
function logOf(values: Float32Array): Float32Array {
  let l = logged.get(values);
  if (!l) {
    l = log10Values(values);
    logged.set(values, l);
  }
  return l;
}

/**
 * 1 where the run or the reference has a value: a missing value there is water without data (drawn apart from
 * land, where both are missing).
 */
const presence = new WeakMap<LevelData, Float32Array>();
function eitherPresent(data: LevelData): Float32Array {
  let p = presence.get(data);
  if (!p) {
    p = new Float32Array(data.model.length);
    for (let i = 0; i < p.length; i++) p[i] = data.model[i] === data.model[i] || data.reference[i] === data.reference[i] ? 1 : 0;
    presence.set(data, p);
  }
  return p;
}

/** What the view shows for a level: which array, which range, which words, which colours. */
export function mapChoice(st: AppState, data: LevelData, difference: boolean, locked: [number, number] | null = null): MapChoice | null {
  const session = st.session!;
  const v = currentVariable();
  const name = v?.longName && v.longName !== v.key ? `${v.longName} (${v.key})` : data.variable;
  const when = data.period !== 'annual' || session.periods.length > 1 ? `${periodLabel(data.period)}; ` : '';
  const where = `${when}${data.layer.label}; ${projectionOf(st.sel.projection).info.label}${st.sel.lockRange ? '; colour range shared by every run' : ''}`;
  const values = difference ? data.difference : st.sel.mapField === 'model' ? data.model : data.reference;
  let r = (difference ? st.sel.diffRange : st.sel.fieldRange) ?? (st.sel.lockRange ? locked : null) ?? autoRange(data, difference);
  if (!r) return null;
  const log = !difference && st.sel.logColour;
  if (log) {
    r = positiveRange(r[0], r[1]);
    if (!r) return null;
  }
  const clip = clipped(values, r[0], r[1]);
  const showModel = st.sel.mapField === 'model';
  return {
    values,
    min: r[0],
    max: r[1],
    diverging: difference,
    caption: difference ? `${data.variable} difference` : data.variable,
    title: difference ? `${name}: ${data.run} minus ${session.reference.label}` : `${name}: ${showModel ? data.run : session.reference.label}`,
    subtitle: where,
    units: data.units,
    scale: difference ? namedScale(DIFF_SCALES, st.sel.diffScale) : namedScale(FIELD_SCALES, st.sel.fieldScale),
    log,
    below: clip.below,
    above: clip.above,
    water: eitherPresent(data),
  };
}

/** The scale a choice is drawn in. */
export function scaleOf(choice: MapChoice): ColourScale {
  return choice.scale ?? (choice.diverging ? DIVERGING : SEQUENTIAL);
}

/** The cells' colours of the last paint: a zoom or a pan changes only the lookup, so they are gathered again as they are. */
let lastColours: { values: Float32Array; style: RecolourStyle; colours: Uint32Array } | null = null;

function coloursOf(values: Float32Array, style: RecolourStyle): Uint32Array {
  const l = lastColours;
  if (l && l.values === values && l.style.palette === style.palette && l.style.min === style.min && l.style.max === style.max && l.style.water === style.water) return l.colours;
  const colours = cellColours(values, style, l && l.colours.length === values.length ? l.colours : undefined);
  lastColours = { values, style, colours };
  return colours;
}

/** Colour one level into a canvas through the lookup. */
const images = new WeakMap<HTMLCanvasElement, ImageData>();

export function paint(canvas: HTMLCanvasElement, lut: Int32Array, choice: MapChoice): void {
  const ctx = canvas.getContext('2d');
  if (!ctx) return;
  let img = images.get(canvas);
  if (!img || img.width !== canvas.width || img.height !== canvas.height) {
    img = ctx.createImageData(canvas.width, canvas.height);
    images.set(canvas, img);
  }
  const px = new Uint32Array(img.data.buffer);
  const style = {
    palette: scaleOf(choice).packed,
    min: choice.log ? Math.log10(choice.min) : choice.min,
    max: choice.log ? Math.log10(choice.max) : choice.max,
    missing: LAND,
    background: BACKGROUND,
    water: choice.water,
    noData: NO_DATA,
  };
  gatherColours(coloursOf(choice.log ? logOf(choice.values) : choice.values, style), lut, px, style);
  ctx.putImageData(img, 0, 0);
}
