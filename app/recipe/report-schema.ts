/**
 * The recipe's `report` section: what `stillwater report` draws. Every key is optional; report-settings.ts
 * fills the defaults and checks the names against the rest of the recipe.
 */
import { z } from 'zod';

const nonEmpty = z.string().min(1, { error: 'must not be empty' });
const depth = z.number().min(0, { error: 'depths are metres below the surface, 0 or more' });
const lon = z.number().min(-360).max(360);
const lat = z.number().min(-90).max(90);

export const reportLayerSchema = z.union(
  [z.tuple([depth, depth]).refine((t) => t[1] > t[0], { error: 'the bottom of a layer must lie below its top' }), z.enum(['surface', 'bottom'])],
  { error: 'must be [top, bottom] in metres, "surface" or "bottom"' },
);

/** A line: one of the built-in meridians by name, or drawn by the recipe. */
export const reportLineSchema = z.union(
  [
    nonEmpty,
    z.strictObject({ name: nonEmpty, meridian: lon, latRange: z.tuple([lat, lat]).optional() }),
    z.strictObject({ name: nonEmpty, parallel: lat, lonRange: z.tuple([lon, lon]).optional() }),
    z.strictObject({ name: nonEmpty, waypoints: z.array(z.tuple([lon, lat])).min(2, { error: 'needs at least two [lon, lat] points' }) }),
  ],
  { error: 'must be a built-in line name, or {name, meridian}, {name, parallel} or {name, waypoints}' },
);

export const reportSectionSchema = z.strictObject({
  /** variables to draw (default: all compared ones) */
  variables: z.array(nonEmpty).optional(),
  /** map layers: default the bottom and three depth layers */
  mapLayers: z.array(reportLayerSchema).min(1).optional(),
  /** lines for transects: default one meridian per ocean basin */
  lines: z.array(reportLineSchema).optional(),
  /** basins for zonal-mean sections (built-in basins or recipe regions): default all basins */
  zonalBasins: z.array(nonEmpty).optional(),
  /** a fixed ± colour limit for the differences of a variable (default: pooled 98th percentile) */
  differenceLimits: z.record(nonEmpty, z.number().positive({ error: 'must be a positive number' })).optional(),
  /** figure width: one column (90 mm) or two (180 mm, default) */
  figureWidth: z.enum(['single', 'double']).optional(),
  /** map projection of the map figures (default equirectangular) */
  projection: z.enum(['plate', 'equal-earth', 'north-polar', 'south-polar']).optional(),
  /** station observations for a model-against-observation scatter */
  stations: z.array(z.strictObject({ file: nonEmpty, variable: nonEmpty })).optional(),
  /** spin-up section for runs with snapshots (default true) */
  spinup: z.boolean().optional(),
});

export type ReportSectionInput = z.output<typeof reportSectionSchema>;
