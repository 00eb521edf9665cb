/**
 * The `screen` section of a recipe: what the workbench showed when the session was saved (the open view, the
 * variable, run, depth or layer, region, projection, colour choices, the map's window, the line), restored when
 * the recipe is opened again. Every key is optional; the command line ignores the section.
 */
import { z } from 'zod';
import type { ScreenSection } from '../../contract/view-types.js';
import { ALL_PERIODS, type Period } from '../time/periods.js';

const range = z.tuple([z.number().finite(), z.number().finite()]).refine((r) => r[1] > r[0], { error: 'the maximum must be above the minimum' });
const window = z.strictObject({ xmin: z.number().finite(), xmax: z.number().finite(), ymin: z.number().finite(), ymax: z.number().finite() });

export const screenSectionSchema = z.strictObject({
  view: z.enum(['map', 'difference', 'section', 'profile', 'diagram', 'scores', 'spinup', 'line']).optional(),
  variable: z.string().min(1).optional(),
  run: z.string().min(1).optional(),
  region: z.string().min(1).optional(),
  /** a depth choice of the workbench ("k:5", "layer:0-100", "bottom") */
  layer: z.string().min(1).optional(),
  projection: z.enum(['plate', 'equal-earth', 'north-polar', 'south-polar']).optional(),
  mapField: z.enum(['model', 'reference']).optional(),
  fieldRange: range.nullable().optional(),
  diffRange: range.nullable().optional(),
  fieldScale: z.string().min(1).optional(),
  diffScale: z.string().min(1).optional(),
  logColour: z.boolean().optional(),
  lockRange: z.boolean().optional(),
  contours: z.boolean().optional(),
  mapWindow: window.nullable().optional(),
  cropToRegion: z.boolean().optional(),
  sectionKind: z.enum(['meridian', 'parallel', 'zonal']).optional(),
  sectionAt: z.number().finite().optional(),
  sectionField: z.enum(['model', 'reference', 'difference']).optional(),
  sectionDepth: z.number().positive().nullable().optional(),
  diagram: z.enum(['taylor', 'target']).optional(),
  period: z.enum(ALL_PERIODS as [Period, ...Period[]]).optional(),
  profileCycle: z.boolean().optional(),
  line: z
    .strictObject({
      points: z.array(z.tuple([z.number().min(-180).max(360), z.number().min(-90).max(90)])).min(2),
      spacingKm: z.number().positive().max(5000),
      /** no longer used (the Line view shows every field at once); accepted so that recipes saved before still open */
      field: z.number().int().min(0).optional(),
      stretch: z.boolean(),
    })
    .optional(),
});

export type { ScreenSection };

// the schema and the contract's type describe the same section: each must fit the other
const fitsContract = (s: z.infer<typeof screenSectionSchema>): ScreenSection => s;
const fitsSchema = (s: Required<ScreenSection>): z.infer<typeof screenSectionSchema> => s;
void fitsContract;
void fitsSchema;
