import { readFile } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { StillwaterError } from '../errors.js';
import { checkParsingHere } from '../io/parsing-thread.js';
import type { Recipe } from './types.js';
import { validateRecipe, type ValidateOptions } from './validate.js';

/** Read, parse and validate a recipe file; relative paths in it resolve against its folder. */
export async function loadRecipe(path: string, opts: ValidateOptions = {}): Promise<Recipe> {
  const abs = resolve(path);
  checkParsingHere(abs);
  let text: string;
  try {
    text = await readFile(abs, 'utf8');
  } catch {
    throw new StillwaterError('E_FILE', `${abs}: cannot read the recipe (no such file, or not readable).`, { file: abs });
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    throw new StillwaterError('E_RECIPE', `${abs}: the recipe is not valid JSON (${(e as Error).message}).`, { file: abs });
  }
  try {
    return validateRecipe(json, dirname(abs), opts);
  } catch (e) {
    if (e instanceof StillwaterError) throw new StillwaterError(e.code, `${abs}: ${e.message}`, { ...e.subject, file: abs });
    throw e;
  }
}
