/**
 * The multi-panel map of the Map and Difference views (issue 11): reference | each run | each run minus
 * reference for one variable at one depth choice, with ONE colour scale for the fields and ONE symmetric
 * diverging scale for the differences, drawn by the report's own builder (app/figures/map-panels.ts). The levels
 * are gathered on the worker that holds the session; the corner numbers are the skill rows of the region and
 * layer (a recipe layer or the bottom), or for a single level (which has no rows) the same weighted numbers over
 * the region's cells (app/render/region-skill.ts). SVG as text, PNG by the report's rasteriser at 300 dpi.
 */
import { z } from 'zod';
import { mapPanelsFigure, type PanelStats } from '../figures/map-panels.js';
import { COLUMN_MM, pixelsFor, PRINT_DPI } from '../figures/page.js';
import { withResolution } from '../figures/png.js';
import { serialise } from '../figures/svg-tree.js';
import { StillwaterError } from '../errors.js';
import { projectRings } from '../render/coastline.js';
import { windowed } from '../render/map-window.js';
import { DIFF_SCALES, FIELD_SCALES, namedScale } from '../render/named-scales.js';
import { makeProjection, PROJECTIONS, type ProjectionId } from '../render/projections.js';
import { regionSkill } from '../render/region-skill.js';
import { landRings, svgToPng } from '../report/report-tools.js';
import { levelData } from '../session/level-data.js';
import { regionNamed } from '../session/sources.js';
import { sessionStore } from '../session/store.js';
import type { Session } from '../session/session.js';
import type { LayerChoice, LevelData } from '../../contract/view-types.js';
import { ALL_PERIODS, type Period } from '../time/periods.js';
import type { ExportedFile } from './view-export.js';
import { entry, type ServiceEntry } from './types.js';

const extent = z.object({ xmin: z.number().finite(), xmax: z.number().finite(), ymin: z.number().finite(), ymax: z.number().finite() }).refine((e) => e.xmax > e.xmin && e.ymax > e.ymin, { message: 'must span a positive width and height' });

const panelsInput = z.object({
  session: z.string().min(1),
  variable: z.string().min(1),
  layer: z.string().min(1),
  /** the region whose bias, RMSE and correlation go in each difference panel's corner */
  region: z.string().min(1).default('global'),
  projection: z.enum(PROJECTIONS.map((p) => p.id) as [ProjectionId, ...ProjectionId[]]),
  /** the screen's zoom window (projected metres), or null for the whole map */
  window: extent.nullable().default(null),
  format: z.enum(['svg', 'png']),
  width: z.enum(['single', 'double']).default('double'),
  fieldScale: z.string().max(40).optional(),
  differenceScale: z.string().max(40).optional(),
  log: z.boolean().default(false),
  period: z.enum(ALL_PERIODS as [Period, ...Period[]]).default('annual'),
});

export type MapPanelsInput = z.input<typeof panelsInput>;

/** The skill-row name of a depth choice (app/regions/layers.ts layerLabel), or null for a single level. */
function rowLayer(l: LayerChoice): string | null {
  if (l.kind === 'interval') return `${Math.round(l.top! * 1000) / 1000}-${Math.round(l.bottom! * 1000) / 1000} m`;
  if (l.kind === 'level') return null;
  return l.kind;
}

async function cornerStats(s: Session, levels: LevelData[], region: string, layer: LayerChoice, period: Period, signal: AbortSignal | undefined): Promise<(PanelStats | null)[]> {
  const name = rowLayer(layer);
  if (name !== null) {
    const rows = (await s.skill(levels[0].variable, { signal })).rows;
    return levels.map((d) => {
      const r = rows.find((x) => x.run === d.run && x.region === region && x.layer === name && (x.period ?? 'annual') === period);
      return r ? { bias: r.bias, rmse: r.rmse, corr: r.corr, n: r.n } : null;
    });
  }
  const cells = Int32Array.from((await regionNamed(s, region)).cells);
  return levels.map((d) => {
    const k = regionSkill(d.model, d.reference, s.info.grid.area, d.thickness, cells);
    return { bias: k.bias, rmse: k.rmse, corr: k.corr, n: k.n };
  });
}

export const mapPanelsServices: ServiceEntry[] = [
  entry({
    name: 'view.map-panels',
    summary: 'The multi-panel map (reference, each run, each run minus reference; shared colour scales; regional statistics in the corners) as SVG or PNG at 300 dpi.',
    input: panelsInput,
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<ExportedFile> {
      const s = sessionStore.get(input.session);
      const v = s.info.variables.find((x) => x.key === input.variable);
      if (!v) throw new StillwaterError('E_INPUT', `The session compares no variable '${input.variable}'.`, { variable: input.variable });
      if (v.runs.length === 0) throw new StillwaterError('E_INPUT', `No run of the session has the variable '${input.variable}' to draw beside the reference.`, { variable: input.variable });
      const levels: LevelData[] = [];
      for (const run of v.runs) {
        ctx.progress(levels.length / (v.runs.length + 1), `Reading ${input.variable} of ${run}…`);
        levels.push(await levelData(s, input.variable, run, input.layer, ctx, input.period));
      }
      const stats = await cornerStats(s, levels, input.region, levels[0].layer, input.period, ctx.signal);
      ctx.progress(v.runs.length / (v.runs.length + 1), 'Drawing the panels…');
      const full = makeProjection(input.projection);
      const projection = windowed(full, input.window);
      const grid = s.info.grid;
      const name = v.longName && v.longName !== v.key ? `${v.longName} (${v.key})` : v.key;
      const fig = mapPanelsFigure({
        name: `${input.variable}-${levels[0].layer.id}-panels`.replace(/[^A-Za-z0-9._-]+/g, '_'),
        title: `${name}, ${levels[0].layer.label}: reference, runs and run minus reference`,
        subtitle: `${full.info.label}${input.window ? ', zoomed' : ''}${input.period !== 'annual' ? `; ${input.period}` : ''}`,
        quantity: input.variable,
        units: levels[0].units,
        width: input.width,
        projection,
        grid,
        area: grid.area,
        reference: { label: s.info.reference.label, values: levels[0].reference },
        runs: levels.map((d, i) => ({ label: d.run, values: d.model, difference: d.difference, stats: stats[i] })),
        coast: projectRings(full, landRings()),
        statsScope: `${input.region}, ${levels[0].layer.label}`,
        fieldScale: input.fieldScale ? namedScale(FIELD_SCALES, input.fieldScale) : undefined,
        differenceScale: input.differenceScale ? namedScale(DIFF_SCALES, input.differenceScale) : undefined,
        log: input.log,
        zoom: input.window ? (full.extent.xmax - full.extent.xmin) / (input.window.xmax - input.window.xmin) : 1,
      });
      const svg = serialise(fig.svg);
      if (input.format === 'svg') return { fileName: `${fig.name}.svg`, mime: 'image/svg+xml', data: new TextEncoder().encode(`<?xml version="1.0" encoding="UTF-8"?>\n${svg}\n`) };
      const png = withResolution(svgToPng(svg, pixelsFor(COLUMN_MM[input.width])), PRINT_DPI);
      return { fileName: `${fig.name}.png`, mime: 'image/png', data: png };
    },
  }),
];
