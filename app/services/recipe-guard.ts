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
import { sessionStore } from '../session/store.js';
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

/** What a recipe-based service takes: an open session, or a recipe sent as JSON with its folder (the command line, tests). */
export interface RecipeOfCall {
  /** a workbench session: its recipe, as opened and edited, is used (the call runs on the session's thread) */
  session?: string;
  recipe?: unknown;
  baseDir?: string;
}

/** The recipe a call names, every file it names guarded (a session's recipe was guarded when opened or edited; the extra files are guarded here). */
export function recipeOfCall(input: RecipeOfCall, ctx: ServiceContext, extra: NamedFile[] = []): Recipe {
  if (input.session !== undefined) return guardRecipe(sessionStore.get(input.session).recipe, ctx, extra);
  if (input.recipe === undefined || input.baseDir === undefined) {
    throw new StillwaterError('E_INPUT', 'Name an open session, or send a recipe with the folder its relative paths are taken from (recipe and baseDir).');
  }
  return guardedRecipe({ recipe: input.recipe, baseDir: input.baseDir }, ctx, extra);
}

/** A file named beside a recipe (stations, say): a relative path is taken from the recipe's folder. */
export function besideRecipe(recipe: Recipe, file: string): string {
  return isAbsolute(file) ? file : resolve(recipe.baseDir, file);
}
