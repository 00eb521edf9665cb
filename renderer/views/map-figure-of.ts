/**
 * The figure a Map or Difference view shows: app/figures' map figure (the one the export writes) made from what
 * the view shows of a level. On screen its raster is the view's canvas laid on the figure's plot; the export
 * paints the same level through the same pixel lookup into a PNG embedded in the figure.
 */
import { mapFigure, mapFigureLayout, type MapFigure, type MapFigureSpec } from '../../app/figures/map-figure.js';
import { paintMap, rasterWidth } from '../../app/figures/map-raster.js';
import { MM_PER_PT } from '../../app/figures/page.js';
import { withUnits } from '../../app/figures/typeset.js';
import { zoomOf } from '../../app/render/map-window.js';
import type { MapProjection } from '../../app/render/projections.js';
import type { ViewGrid } from '../../contract/view-types.js';
import { scaleOf, type MapChoice } from './map-paint.js';

export function mapFigureSpec(choice: MapChoice, full: MapProjection, shown: MapProjection, coast: Float64Array[], grid: ViewGrid, contours: boolean): MapFigureSpec {
  return {
    name: 'map',
    title: choice.title,
    subtitle: choice.subtitle,
    width: 'double',
    projection: shown,
    coast,
    scale: scaleOf(choice),
    min: choice.min,
    max: choice.max,
    barLabel: withUnits(choice.caption, choice.units),
    bar: { log: choice.log, below: choice.below, above: choice.above },
    contours: contours ? { values: choice.values, lonEdges: grid.lonEdges, latEdges: grid.latEdges } : null,
    zoom: zoomOf(full.extent, shown.extent),
  };
}

/** The figure with its raster painted at 300 dpi over the map's width and embedded as PNG. */
export function exportedMapFigure(spec: MapFigureSpec, choice: MapChoice, grid: ViewGrid): MapFigure {
  const { plot } = mapFigureLayout(spec);
  const px = rasterWidth(plot.w * MM_PER_PT, grid.nx);
  const raster = paintMap(spec.projection, grid, choice.values, scaleOf(choice), choice.min, choice.max, px, { log: choice.log, water: choice.water });
  return mapFigure({ ...spec, raster: raster.url });
}
