/**
 * Recipes and comparisons for the workbench: load, check and save a recipe (the saved state of a session),
 * run a comparison (heavy: in a worker), and the built-in regions with their boundary outlines.
 * Thin over app/recipe, app/compare and app/regions; every file a recipe names passes ctx.resolvePath.
 */
import { dirname } from 'node:path';
import { z } from 'zod';
import { runComparison, type ComparisonResult } from '../compare/run.js';
import { isStillwaterError } from '../errors.js';
import { loadRecipe } from '../recipe/load.js';
import { recipeToJson } from '../recipe/to-json.js';
import { ARCTIC_LIMIT, ATLANTIC_OUTLINE, BUILT_IN_REGIONS, HUDSON_BOX, INDIAN_OUTLINE, SOUTHERN_LIMIT } from '../regions/basins.js';
import { checkOutputFile } from '../output/output-target.js';
import { writeOutputFile } from '../output/output-set.js';
import { recipeFiles } from '../recipe/recipe-files.js';
import { guardedRecipe, guardRecipe } from './recipe-guard.js';
import { entry, type ServiceEntry } from './types.js';


const recipeInput = z.object({
  /** the recipe as JSON (an object) */
  recipe: z.unknown(),
  /** folder that relative paths in the recipe are taken from */
  baseDir: z.string(),
});

export const compareServices: ServiceEntry[] = [
  entry({
    name: 'recipe.load',
    summary: 'Read and check a recipe file; returns it with absolute paths and defaults filled in.',
    input: z.object({ path: z.string() }),
    // a file from outside: parsed on a worker thread, never on the one that serves the screen
    heavy: true,
    async run(input, ctx) {
      const recipe = guardRecipe(await loadRecipe(ctx.resolvePath(input.path), { confine: ctx.resolvePath }), ctx);
      return { recipe: recipeToJson(recipe), baseDir: recipe.baseDir, variables: recipe.variables };
    },
  }),
  entry({
    name: 'recipe.validate',
    summary: 'Check a recipe without running it: ok, or the one sentence with the path of the first problem.',
    input: recipeInput,
    async run(input, ctx) {
      try {
        const recipe = guardedRecipe(input, ctx);
        return { ok: true as const, variables: recipe.variables };
      } catch (e) {
        if (isStillwaterError(e) && e.isBadInput) return { ok: false as const, message: e.message, path: e.subject.path ?? null };
        throw e;
      }
    },
  }),
  entry({
    name: 'recipe.save',
    summary: 'Save a recipe (the state of a session) to a .json file, with paths relative to its folder; never over a file the recipe reads.',
    input: z.object({ path: z.string(), recipe: z.unknown(), baseDir: z.string() }),
    async run(input, ctx) {
      const path = ctx.resolvePath(input.path);
      const recipe = guardedRecipe(input, ctx);
      checkOutputFile(path, { extension: '.json', inputs: recipeFiles(recipe).map((f) => f.file) });
      await writeOutputFile(path, JSON.stringify(recipeToJson(recipe, dirname(path)), null, 2) + '\n');
      return { path };
    },
  }),
  entry({
    name: 'compare.run',
    summary: 'Run the comparison of a recipe: skill rows per run × variable × region × layer, and run costs.',
    input: recipeInput,
    heavy: true,
    async run(input, ctx): Promise<ComparisonResult> {
      const recipe = guardedRecipe(input, ctx);
      return runComparison(recipe, { cacheDir: ctx.cacheDir, signal: ctx.signal, onProgress: (f, m) => ctx.progress(f, m) });
    },
  }),
  entry({
    name: 'regions.list',
    summary: 'The built-in regions and the lines that bound them (for drawing on a map).',
    input: z.object({}),
    async run() {
      return {
        regions: [...BUILT_IN_REGIONS],
        lines: { southernLimit: SOUTHERN_LIMIT, arcticLimit: ARCTIC_LIMIT, hudsonBox: [...HUDSON_BOX], atlantic: ATLANTIC_OUTLINE, indian: INDIAN_OUTLINE },
      };
    },
  }),
];
