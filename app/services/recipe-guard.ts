/**
 * The one path guard for recipes: every file a recipe names (app/recipe/recipe-files.ts), and any file a
 * request adds beside it (stations, report outputs), must pass ctx.resolvePath, which in browser mode
 * follows symbolic links and refuses anything outside the allowed folders. A refusal names the recipe path.
 */
import { isAbsolute, resolve } from 'node:path';
import { StillwaterError } from '../errors.js';
import { recipeFiles, type NamedFile } from '../recipe/recipe-files.js';
import type { Recipe } from '../recipe/types.js';
import { validateRecipe } from '../recipe/validate.js';
import type { ServiceContext } from './types.js';

/** Check one named file; returns the path the handler may use. */
export function guardFile(f: NamedFile, ctx: ServiceContext): string {
  try {
    return ctx.resolvePath(f.file);
  } catch (e) {
    if (e instanceof StillwaterError) throw new StillwaterError(e.code, `${f.path}: ${e.message}`, { ...e.subject, path: f.path });
    throw e;
  }
}

/** Check every file of the recipe and the extra ones; returns the recipe. */
export function guardRecipe(recipe: Recipe, ctx: ServiceContext, extra: NamedFile[] = []): Recipe {
  for (const f of [...recipeFiles(recipe), ...extra]) guardFile(f, ctx);
  return recipe;
}

/** Validate a recipe sent by the screen (its folder checked first, each path confined before the disk is asked), then guard every file it names. */
export function guardedRecipe(input: { recipe: unknown; baseDir: string }, ctx: ServiceContext, extra: NamedFile[] = []): Recipe {
  return guardRecipe(validateRecipe(input.recipe, ctx.resolvePath(input.baseDir), { confine: ctx.resolvePath }), ctx, extra);
}

/** A file named beside a recipe (stations, say): a relative path is taken from the recipe's folder. */
export function besideRecipe(recipe: Recipe, file: string): string {
  return isAbsolute(file) ? file : resolve(recipe.baseDir, file);
}
