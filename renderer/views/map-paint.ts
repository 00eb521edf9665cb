/**
 * What a map shows of a level (which array, which range, which words) and how it is coloured: the pixel-to-cell
 * lookup is built once per projection, grid and canvas size, so a change of depth, variable or range only
 * recolours.
 */
import { DIVERGING, SEQUENTIAL, quantileRange, symmetricRange } from '../../app/render/colour-scales.js';
import { buildPixelLookup } from '../../app/render/pixel-lookup.js';
import { makeProjection, type MapProjection, type ProjectionId } from '../../app/render/projections.js';
import { packRgba, recolour } from '../../app/render/recolour.js';
import type { LevelData, ViewGrid } from '../../contract/view-types.js';
import { currentVariable, type AppState } from '../state.js';

const MISSING = packRgba(200, 200, 196);
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

/** The lookup for one projection × grid × canvas size, built once and kept (a few of them). */
export function lookupFor(proj: MapProjection, grid: ViewGrid, w: number, h: number): Int32Array {
  const key = `${proj.info.id}|${grid.nx}x${grid.ny}|${grid.lonEdges[0]}|${grid.latEdges[0]}|${w}x${h}`;
  let lut = lookups.get(key);
  if (!lut) {
    lut = buildPixelLookup(proj, grid.lonEdges, grid.latEdges, w, h);
    lookups.set(key, lut);
    while (lookups.size > 8) lookups.delete(lookups.keys().next().value as string);
  }
  return lut;
}

export interface MapChoice {
  values: Float32Array;
  min: number;
  max: number;
  diverging: boolean;
  caption: string;
  title: string;
  subtitle: string;
  units: string;
}

/** Automatic ranges are worked out once per level that arrives. */
const autoRanges = new WeakMap<LevelData, { field: [number, number] | null; diff: [number, number] | null }>();

function autoRange(data: LevelData, difference: boolean): [number, number] | null {
  let r = autoRanges.get(data);
  if (!r) {
    r = { field: null, diff: null };
    autoRanges.set(data, r);
  }
  if (difference) return (r.diff ??= symmetricRange([data.difference]));
  return (r.field ??= quantileRange([data.model, data.reference]));
}

/** What the view shows for a level: which array, which range, which words. */
export function mapChoice(st: AppState, data: LevelData, difference: boolean): MapChoice | null {
  const session = st.session!;
  const v = currentVariable();
  const name = v?.longName && v.longName !== v.key ? `${v.longName} (${v.key})` : data.variable;
  const where = `${data.layer.label}; ${projectionOf(st.sel.projection).info.label}`;
  if (difference) {
    const r = st.sel.diffRange ?? autoRange(data, true);
    if (!r) return null;
    return {
      values: data.difference,
      min: r[0],
      max: r[1],
      diverging: true,
      caption: `${data.variable} difference`,
      title: `${name}: ${data.run} minus ${session.reference.label}`,
      subtitle: where,
      units: data.units,
    };
  }
  const r = st.sel.fieldRange ?? autoRange(data, false);
  if (!r) return null;
  const showModel = st.sel.mapField === 'model';
  return {
    values: showModel ? data.model : data.reference,
    min: r[0],
    max: r[1],
    diverging: false,
    caption: data.variable,
    title: `${name}: ${showModel ? data.run : session.reference.label}`,
    subtitle: where,
    units: data.units,
  };
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
  recolour(choice.values, lut, px, {
    palette: (choice.diverging ? DIVERGING : SEQUENTIAL).packed,
    min: choice.min,
    max: choice.max,
    missing: MISSING,
    background: BACKGROUND,
  });
  ctx.putImageData(img, 0, 0);
}

