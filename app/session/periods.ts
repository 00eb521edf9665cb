/**
 * The periods of the year a session's views can show. They are the periods its skill rows have
 * (options.periods), so a map, a section or a profile of a month always sits beside that month's rows.
 */
import { StillwaterError } from '../errors.js';
import type { Recipe } from '../recipe/types.js';
import { periodsFor, type Period } from '../time/periods.js';
import type { ViewPeriod } from '../../contract/view-types.js';

// the contract's names and app/time's are the same set: each must fit the other
const fitsContract = (p: Period): ViewPeriod => p;
const fitsTime = (p: ViewPeriod): Period => p;
void fitsContract;
void fitsTime;

/** The recipe compares months or seasons: its sources are read as 12 months each. */
export function recipeIsMonthly(recipe: Recipe): boolean {
  return recipe.options.periods.length > 0;
}

export function sessionPeriods(recipe: Recipe): { periods: ViewPeriod[]; periodsNote?: string } {
  if (!recipeIsMonthly(recipe)) {
    return { periods: ['annual'], periodsNote: 'The recipe compares the year only: add "periods": ["months", "seasons"] to its options to see months and seasons.' };
  }
  return { periods: periodsFor(recipe.options.periods) };
}

/** One sentence when the session has no data for the period asked for. */
export function checkPeriod(recipe: Recipe, period: Period): void {
  if (period === 'annual') return;
  const { periods, periodsNote } = sessionPeriods(recipe);
  if (periods.includes(period)) return;
  const asked = recipe.options.periods.map((p) => `"${p}"`).join(' and ');
  throw new StillwaterError('E_INPUT', periodsNote ? `There is no ${period} to show. ${periodsNote}` : `There is no ${period} to show: the recipe's options.periods asks for ${asked} only.`, { path: 'options.periods' });
}
