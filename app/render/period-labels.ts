/** The periods of the year as the screen names them (the same ids as the skill rows' `period`). */
import type { ViewPeriod } from '../../contract/view-types.js';

/** Every period in the order the period menu lists them. */
export const VIEW_PERIODS: readonly ViewPeriod[] = ['annual', 'JAN', 'FEB', 'MAR', 'APR', 'MAY', 'JUN', 'JUL', 'AUG', 'SEP', 'OCT', 'NOV', 'DEC', 'DJF', 'MAM', 'JJA', 'SON'];

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];
const SEASON_WORDS: Record<string, string> = { DJF: 'December to February', MAM: 'March to May', JJA: 'June to August', SON: 'September to November' };

/** "annual mean", "January", "DJF (December to February)". */
export function periodLabel(p: ViewPeriod): string {
  if (p === 'annual') return 'annual mean';
  const m = VIEW_PERIODS.indexOf(p) - 1;
  if (m >= 0 && m < 12) return MONTHS[m];
  return `${p} (${SEASON_WORDS[p]})`;
}

/** The one-letter month initials of a month axis, January first. */
export const MONTH_INITIALS = ['J', 'F', 'M', 'A', 'M', 'J', 'J', 'A', 'S', 'O', 'N', 'D'] as const;
