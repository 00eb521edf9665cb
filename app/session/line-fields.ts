/**
 * A session's fields of one variable for sampling along a line (app/lines/run-line.ts): the pair the session
 * has open, its levels served from the session's cache (those the map read, or read ahead), so that a line
 * does not open and regrid the files again. The same readers as prepareFields would open, hence the same values;
 * the notes in the order prepareFields gives them (the reference, then the runs in recipe order).
 * A recipe that compares months reads its sources as 12 months: there a line opens its own fields (null).
 */
import { levelsField, type PreparedFields } from '../lines/recipe-fields.js';
import { recipeIsMonthly } from './periods.js';
import type { Session, Source } from './session.js';

export async function sessionLineFields(s: Session, variable: string): Promise<PreparedFields | null> {
  if (recipeIsMonthly(s.recipe)) return null;
  const pair = await s.pair(variable);
  const ref: Source = { label: s.recipe.reference.label, role: 'ref', levels: pair.reference };
  const runs: Source[] = [];
  for (const slot of pair.runs) runs.push({ label: slot.label, role: 'run', levels: await slot.open() });
  const named = (src: Source) => ({ label: src.label, field: levelsField(src.levels, pair.units, variable, (k) => s.level(pair, src, k)) });
  const notes = [ref, ...runs].flatMap((src) => pair.notes.filter((n) => n.startsWith(`${src.label}: `)));
  return {
    variable,
    units: pair.units,
    grid: pair.grid,
    reference: named(ref),
    runs: runs.map(named),
    notes,
    // the session closes its pairs
    close: async () => undefined,
  };
}
