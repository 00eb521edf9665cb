/**
 * Every problem of a recipe that opening it can find without reading data (issue 14): files that cannot be read as
 * datasets, variables that are not in their file, units that do not parse, and run units that cannot be converted
 * to the table's. Each names its recipe path; the screen lists them all, so that a broken recipe never looks fine.
 */
import { parseUnits, type ParsedUnits } from '../cf/units.js';
import { canConvert } from '../ocean/convert.js';
import type { Recipe } from '../recipe/types.js';
import type { RecipeProblem, SourceInfo } from '../../contract/view-types.js';

function parsed(text: string): ParsedUnits | string {
  try {
    return parseUnits(text);
  } catch (e) {
    return e instanceof Error ? e.message : String(e);
  }
}

/** Problems of the variables as describeSource found them (`problem` set), and of their units. */
export function recipeProblems(recipe: Recipe, reference: SourceInfo, runs: SourceInfo[]): RecipeProblem[] {
  const out: RecipeProblem[] = [];
  const specs = [recipe.reference, ...recipe.runs];
  const table = new Map<string, ParsedUnits>();
  [reference, ...runs].forEach((src, s) => {
    for (const v of src.variables) {
      const path = specs[s].variables[v.key]?.path ?? `${s === 0 ? 'reference' : `runs[${s - 1}]`}.variables.${v.key}`;
      if (v.problem) {
        out.push({ path, sentence: v.problem });
        continue;
      }
      if (!v.units) {
        out.push({ path, sentence: `${v.name} in ${v.file} has no units: give them as ${path}.units.` });
        continue;
      }
      const u = parsed(v.units);
      if (typeof u === 'string') {
        out.push({ path: specs[s].variables[v.key]?.units ? `${path}.units` : path, sentence: u });
        continue;
      }
      if (s === 0) {
        const wanted = recipe.options.units[v.key];
        const t = wanted ? parsed(wanted) : u;
        if (typeof t === 'string') out.push({ path: `options.units.${v.key}`, sentence: t });
        else table.set(v.key, t);
        continue;
      }
      const t = table.get(v.key);
      // amount per mass and per volume convert through density; oxygen volumes through the molar volume
      if (t && !canConvert(u, t, /^o2$|oxygen/i.test(v.key))) out.push({ path: `${path}`, sentence: `units '${v.units}' cannot be converted to the table's '${t.text}'.` });
    }
  });
  return out;
}
