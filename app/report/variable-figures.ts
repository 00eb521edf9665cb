/** The figures of one variable from its gathered data and its skill rows (maps, zonal means, transects, diagrams). */
import type { SkillRow } from '../compare/rows.js';
import { diagramsFigure } from '../figures/diagrams.js';
import { mapPanelsFigure, type PanelStats } from '../figures/map-panels.js';
import type { Figure } from '../figures/parts.js';
import { lineFigure, waypointLetters } from '../figures/line-figure.js';
import { cutSamples, waterSpan } from '../figures/section-panel.js';
import { sectionPanelsFigure } from '../figures/section-panels.js';
import { latLabel } from '../figures/typeset.js';
import { layerLabel, type LayerSpec } from '../regions/layers.js';
import type { MapProjection } from '../render/projections.js';
import type { VariableFigureData } from './figure-data.js';
import type { ReportSettings } from './report-settings.js';

export interface FigureContext {
  settings: ReportSettings;
  projection: MapProjection;
  coast: Float64Array[];
  referenceLabel: string;
  /** the region whose statistics go in the map panels' corners */
  cornerRegion: string;
  /** layers with skill rows (the recipe's and the report's) */
  layers: LayerSpec[];
  regions: string[];
  runs: string[];
}

export function slug(s: string): string {
  return s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'x';
}

/** How a layer is named in a title: "bottom layer", "0–100 m", "surface". */
export function layerTitle(l: LayerSpec): string {
  if (l.kind === 'interval') return `${l.top}–${l.bottom} m`;
  if (l.kind === 'bottom') return 'bottom layer (deepest compared cell of each column)';
  return l.kind === 'surface' ? 'surface level' : 'whole column';
}

export function statsOf(rows: SkillRow[], run: string, region: string, layer: string): PanelStats | null {
  const r = rows.find((x) => x.run === run && x.region === region && x.layer === layer);
  return r ? { bias: r.bias, rmse: r.rmse, corr: r.corr, n: r.n } : null;
}

export function* variableFigures(data: VariableFigureData, rows: SkillRow[], ctx: FigureContext): Generator<Figure> {
  const v = data.variable;
  const width = ctx.settings.figureWidth;
  const h = data.grid.horizontal;
  const fixed = ctx.settings.differenceLimits[v] ?? null;
  if (h.kind === 'rectilinear' && h.axes) {
    for (const m of data.maps) {
      const label = layerLabel(m.layer);
      yield mapPanelsFigure({
        name: `${slug(v)}-map-${slug(label)}`,
        title: `${v}, ${layerTitle(m.layer)}: reference, runs and run minus reference`,
        subtitle: m.layer.kind === 'interval' ? 'Thickness-weighted mean over the layer in each column.' : undefined,
        quantity: v,
        units: data.units,
        width,
        projection: ctx.projection,
        grid: { lonEdges: h.axes.lonEdges, latEdges: h.axes.latEdges },
        area: h.area,
        reference: { label: ctx.referenceLabel, values: m.reference },
        runs: m.runs.map((r) => ({ ...r, stats: statsOf(rows, r.label, ctx.cornerRegion, label) })),
        coast: ctx.coast,
        statsScope: `${ctx.cornerRegion}, ${label}`,
        fixedDifference: fixed,
      });
    }
  }
  const depthEdges = data.grid.vertical?.edges;
  if (depthEdges) {
    for (const z of data.zonal) {
      const seafloor = new Float64Array(z.lat.length);
      const ny = z.lat.length;
      const nz = depthEdges.length - 1;
      for (let j = 0; j < ny; j++) for (let k = 0; k < nz; k++) if (z.reference[k * ny + j] === z.reference[k * ny + j]) seafloor[j] = depthEdges[k + 1];
      // a basin spans only its latitudes: the rows without water at either end are left out (as on the screen)
      const [first, last] = waterSpan(seafloor) ?? [0, ny - 1];
      const cut = (a: Float32Array): Float32Array => cutSamples(a, ny, first, last);
      yield sectionPanelsFigure({
        name: `${slug(v)}-zonal-${slug(z.basin)}`,
        title: `${v}, zonal mean over the ${z.basin} basin: reference, runs and run minus reference`,
        subtitle: 'Area-weighted mean over the basin cells of each latitude row.',
        quantity: v,
        units: data.units,
        width,
        grid: { xEdges: z.latEdges.slice(first, last + 2), depthEdges },
        xLabel: 'Latitude (degrees)',
        formatX: latLabel,
        seafloor: seafloor.slice(first, last + 1),
        reference: { label: ctx.referenceLabel, values: cut(z.reference) },
        runs: z.runs.map((r) => ({ label: r.label, values: cut(r.values), difference: cut(r.difference) })),
        fixedDifference: fixed,
      });
    }
    for (const l of data.lines) {
      yield lineFigure({
        name: `${slug(v)}-line-${slug(l.name)}`,
        variable: v,
        units: data.units,
        lineName: l.name,
        width,
        spacingKm: l.line.spacingKm,
        method: 'bilinear',
        meansRange: null,
        distanceKm: l.line.distanceKm,
        depthEdges,
        seafloor: l.seafloor,
        reference: { label: ctx.referenceLabel, values: l.reference, columnMean: l.columnMeans[0].values },
        runs: l.runs.map((r, i) => ({ ...r, columnMean: l.columnMeans[i + 1].values })),
        fixedDifference: fixed,
        marks: l.line.kind === 'great-circle' ? waypointLetters(l.line.waypointKm) : undefined,
      });
    }
  }
  for (const layer of ctx.layers) {
    const label = layerLabel(layer);
    const lr = rows
      .filter((r) => r.layer === label && r.n > 0)
      .map((r) => ({ run: r.run, region: r.region, bias: r.bias ?? NaN, crmse: r.crmse ?? NaN, corr: r.corr ?? NaN, model_std: r.model_std ?? NaN, ref_std: r.ref_std ?? NaN }));
    yield diagramsFigure({
      name: `${slug(v)}-diagrams-${slug(label)}`,
      title: `${v}, ${layerTitle(layer)}: Taylor and target diagrams of every run and region`,
      subtitle: `Normalised by the standard deviation of ${ctx.referenceLabel} in each region.`,
      width,
      rows: lr,
      runs: ctx.runs,
      regions: ctx.regions,
      referenceLabel: `${ctx.referenceLabel} (reference)`,
    });
  }
}
