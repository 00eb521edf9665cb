/**
 * A line asked for by the screen (waypoints, a meridian or a parallel) sampled through the recipe's fields:
 * shared by 'line.sample' (the Line view's figure) and 'view.export-line' (its data as a file), so the download
 * is the very line on the screen. The last few results of a session's recipe are kept on its thread.
 */
import { z } from 'zod';
import { PromiseCache } from '../promise-cache.js';
import { runLine, type LineRun, type LineSpec } from '../lines/run-line.js';
import { parseWaypoints } from '../lines/waypoints.js';
import type { Recipe } from '../recipe/index.js';
import { recipeOfCall } from './recipe-guard.js';
import type { ServiceContext } from './types.js';
import { prepareFields } from '../lines/recipe-fields.js';
import { sessionLineFields } from '../session/line-fields.js';
import { sessionStore } from '../session/store.js';

/** An open workbench session (its recipe is used, on its thread), or a recipe as JSON with its folder. */
export const recipeJson = { session: z.string().min(1).optional(), recipe: z.unknown().optional(), baseDir: z.string().min(1).optional() };
const lonLat = z.object({ lon: z.number().finite(), lat: z.number().finite() });

export const lineInput = z.object({
  ...recipeJson,
  variable: z.string().min(1),
  /** waypoints as a list, or typed as "lon,lat;lon,lat" */
  line: z.union([
    z.object({ kind: z.literal('waypoints'), points: z.union([z.array(lonLat), z.string().min(1)]) }),
    z.object({ kind: z.literal('meridian'), lon: z.number().finite(), lat0: z.number().finite().optional(), lat1: z.number().finite().optional() }),
    z.object({ kind: z.literal('parallel'), lat: z.number().finite(), lon0: z.number().finite().optional(), lon1: z.number().finite().optional() }),
  ]),
  spacingKm: z.number().positive().finite().optional(),
  depthRange: z.tuple([z.number().finite(), z.number().finite()]).optional(),
  method: z.enum(['bilinear', 'nearest']).optional(),
});

export type LineInput = z.infer<typeof lineInput>;

/** per recipe object (a paired variable makes a new one): the last lines sampled */
const kept = new WeakMap<Recipe, PromiseCache<LineRun>>();

export function sampleLineOfCall(input: LineInput, ctx: ServiceContext): Promise<LineRun> {
  const recipe = recipeOfCall(input, ctx);
  const spec: LineSpec =
    input.line.kind === 'waypoints'
      ? { kind: 'waypoints', points: typeof input.line.points === 'string' ? parseWaypoints(input.line.points, 'waypoints') : input.line.points }
      : input.line;
  const make = () =>
    runLine(recipe, {
      variable: input.variable,
      line: spec,
      spacingKm: input.spacingKm,
      depthRange: input.depthRange ? { top: input.depthRange[0], bottom: input.depthRange[1] } : undefined,
      method: input.method,
      cacheDir: ctx.cacheDir,
      progress: (f, m) => ctx.progress(f, m),
      // in a session: the pair it has open and the levels it has read (the map's, or read ahead)
      ...(input.session !== undefined ? { fields: async () => (await sessionLineFields(sessionStore.get(input.session!), input.variable)) ?? prepareFields(recipe, input.variable, { cacheDir: ctx.cacheDir }) } : {}),
    });
  if (input.session === undefined) return make();
  let cache = kept.get(recipe);
  if (!cache) kept.set(recipe, (cache = new PromiseCache<LineRun>(3)));
  return cache.get(JSON.stringify([input.variable, spec, input.spacingKm ?? null, input.depthRange ?? null, input.method ?? null]), make);
}
