/**
 * The recipe: what to compare with what, where and how. It is also the saved state of a workbench
 * session. Unknown keys are rejected so that a typo is never silently ignored.
 */
import { z } from 'zod';
import { reportSectionSchema } from './report-schema.js';
import { screenSectionSchema } from './screen-schema.js';

const nonEmpty = z.string().min(1, { error: 'must not be empty' });

const calendarDate = z.string().regex(/^[+-]?\d{1,6}-\d{1,2}-\d{1,2}$/, { error: 'must be a date YYYY-MM-DD' });

/** A time window and/or a choice of calendar months; dates are read in the file's own calendar. */
export const timeWindowSchema = z
  .strictObject({
    from: calendarDate.optional(),
    to: calendarDate.optional(),
    months: z
      .array(z.number().int().min(1, { error: 'months are 1 (January) to 12 (December)' }).max(12, { error: 'months are 1 (January) to 12 (December)' }))
      .min(1, { error: 'must name at least one month' })
      .refine((a) => new Set(a).size === a.length, { error: 'names a month twice' })
      .optional(),
    monthly: z.literal(true).optional(),
  })
  .refine((w) => w.from !== undefined || w.to !== undefined || w.months !== undefined || w.monthly !== undefined, { error: 'must give from, to, months or monthly' })
  .refine((w) => !(w.months && w.monthly), { error: 'cannot take both "months" (one mean) and "monthly" (12 months)' });

/** One variable of a reference or run: which file, which variable in it, its units if the file lacks them. */
export const variableSourceSchema = z.strictObject({
  /** file holding the variable; falls back to the source's own `file` */
  file: nonEmpty.optional(),
  /** variable name in the file; defaults to the recipe's variable key */
  name: nonEmpty.optional(),
  /** units when the file has none or wrong ones */
  units: nonEmpty.optional(),
  /**
   * time: a step index (negative counts from the end), "last", "mean" over all steps, "monthly" (a climatology
   * of 12 calendar months), or {from, to, months, monthly} (app/time/select.ts); default: the only step, a
   * reference's 12 months with CF climatology bounds, else the mean (a monthly climatology when the recipe
   * asks for monthly rows)
   */
  time: z
    .union([z.number().int(), z.literal('mean'), z.literal('last'), z.literal('monthly'), timeWindowSchema], {
      error: 'must be a whole number, "mean", "last", "monthly" or {from, to, months, monthly}',
    })
    .optional(),
});

/** A variable given just by its name in the source's `file`, or in full. */
const variableEntry = z.union([nonEmpty, variableSourceSchema], { error: 'must be a variable name or an object {file, name, units}' });

const variablesSchema = z.record(nonEmpty, variableEntry);

export const referenceSchema = z.strictObject({
  label: nonEmpty,
  file: nonEmpty.optional(),
  variables: variablesSchema,
});

/**
 * One spin-up snapshot: a file and the model year it shows. Without a year the file's CF time axis gives it
 * (one snapshot per time step); a snapshot with neither is refused by the spin-up part, naming the file.
 */
export const snapshotSchema = z.strictObject({ file: nonEmpty, year: z.number().optional() });

export const runSchema = z.strictObject({
  label: nonEmpty,
  file: nonEmpty.optional(),
  variables: variablesSchema.default({}),
  /** snapshots over a spin-up (read by the spin-up part; the comparison ignores them) */
  snapshots: z.array(snapshotSchema).optional(),
});

const builtInRegion = z.enum(['global', 'atlantic', 'pacific', 'indian', 'southern', 'arctic'], {
  error: 'must be one of global, atlantic, pacific, indian, southern, arctic, or a {mask} or {geojson} region',
});

export const maskRegionSchema = z.strictObject({
  /** NetCDF file with an integer variable carrying flag_values / flag_meanings */
  mask: nonEmpty,
  variable: nonEmpty,
  /** flag meanings to use (default: all) */
  flags: z.array(nonEmpty).optional(),
});

export const geojsonRegionSchema = z.strictObject({
  geojson: nonEmpty,
  /** feature property that names a region (default "name") */
  property: nonEmpty.optional(),
  /** feature names to use (default: all) */
  features: z.array(nonEmpty).optional(),
});

export const regionSchema = z.union([builtInRegion, maskRegionSchema, geojsonRegionSchema], {
  error: 'must be a built-in region name (global, atlantic, pacific, indian, southern, arctic), {mask, variable} or {geojson}',
});

const depth = z.number().min(0, { error: 'depths are metres below the surface, 0 or more' });
export const layerSchema = z.union(
  [
    z.tuple([depth, depth]).refine((t) => t[1] > t[0], { error: 'the bottom of a layer must lie below its top' }),
    z.enum(['surface', 'bottom', 'all']),
  ],
  { error: 'must be [top, bottom] in metres, "surface", "bottom" or "all"' },
);

export const commonGridSchema = z.union(
  [
    z.literal('reference'),
    z.strictObject({
      regular: z.strictObject({
        dlon: z.number().positive().max(360),
        dlat: z.number().positive().max(180),
        /** western edge of the first column (default -180) */
        lon0: z.number().optional(),
      }),
      /** layer edges in metres (increasing, from the surface); default: the reference's levels */
      depthEdges: z.array(depth).min(2).optional(),
    }),
  ],
  { error: 'must be "reference" or {regular: {dlon, dlat}, depthEdges?}' },
);

export const densitySchema = z.union(
  [
    z.literal('nominal'),
    z.strictObject({
      /** keys of reference.variables holding temperature and salinity */
      fields: z.strictObject({ temperature: nonEmpty, salinity: nonEmpty }),
    }),
  ],
  { error: 'must be "nominal" or {fields: {temperature, salinity}}' },
);

export const derivedSchema = z.strictObject({
  /** expression over other variables of the same source (see app/ocean/expression.ts) */
  expression: nonEmpty,
  units: nonEmpty,
});

export const optionsSchema = z.strictObject({
  commonGrid: commonGridSchema.default('reference'),
  method: z.enum(['conservative', 'bilinear', 'nearest']).default('conservative'),
  /** least covered fraction of a common-grid cell for it to get a value */
  coverage: z.number().gt(0).max(1).default(0.5),
  density: densitySchema.default('nominal'),
  /** kg m-3, used when density is "nominal" */
  nominalDensity: z.number().positive().default(1025),
  /** units per variable for the tables (default: the reference's) */
  units: z.record(nonEmpty, nonEmpty).default({}),
  /** keep only bottom columns whose model and reference seafloor lie within this many metres */
  bottomTolerance: z.number().min(0).nullable().default(null),
  /** variables that also get statistics of log10 values */
  logStats: z.array(nonEmpty).default([]),
  /** rows per calendar month and/or per season (DJF, MAM, JJA, SON) besides the annual rows, and seasonal-cycle numbers */
  periods: z.array(z.enum(['months', 'seasons'], { error: 'must be "months" or "seasons"' })).default([]),
  /** derived variables, computed from other variables of each source */
  derived: z.record(nonEmpty, derivedSchema).default({}),
});

export const recipeSchema = z.strictObject({
  title: z.string().optional(),
  reference: referenceSchema,
  runs: z.array(runSchema).min(1, { error: 'needs at least one run' }),
  regions: z.array(regionSchema).min(1).default(['global', 'atlantic', 'pacific', 'indian', 'southern', 'arctic']),
  layers: z.array(layerSchema).min(1).default(['all']),
  options: optionsSchema.default(() => optionsSchema.parse({})),
  /** what `stillwater report` draws (app/recipe/report-schema.ts) */
  report: reportSectionSchema.optional(),
  /** what the workbench showed when the session was saved (app/recipe/screen-schema.ts) */
  screen: screenSectionSchema.optional(),
});

export type RecipeInput = z.input<typeof recipeSchema>;
export type ParsedRecipe = z.output<typeof recipeSchema>;
export type RegionEntry = z.output<typeof regionSchema>;
export type LayerEntry = z.output<typeof layerSchema>;
export type RecipeOptions = z.output<typeof optionsSchema>;
