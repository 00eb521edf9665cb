/**
 * The periods a comparison can report: the year, each calendar month, and the meteorological seasons
 * (DJF, MAM, JJA, SON; common practice). A season's value is the day-weighted mean of its months.
 */
export const MONTH_NAMES = ['JAN', 'FEB', 'MAR', 'APR', 'MAY', 'JUN', 'JUL', 'AUG', 'SEP', 'OCT', 'NOV', 'DEC'] as const;
export const SEASONS = { DJF: [12, 1, 2], MAM: [3, 4, 5], JJA: [6, 7, 8], SON: [9, 10, 11] } as const;
export type SeasonName = keyof typeof SEASONS;
export type Period = 'annual' | (typeof MONTH_NAMES)[number] | SeasonName;

/** Every period in table order. */
export const ALL_PERIODS: readonly Period[] = ['annual', ...MONTH_NAMES, ...(Object.keys(SEASONS) as SeasonName[])];

/** The calendar months (1..12) of a period. */
export function periodMonths(p: Period): number[] {
  if (p === 'annual') return [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];
  const m = MONTH_NAMES.indexOf(p as (typeof MONTH_NAMES)[number]);
  if (m >= 0) return [m + 1];
  return [...SEASONS[p as SeasonName]];
}

/** The periods a recipe's `options.periods` asks for: the year always, then months and/or seasons. */
export function periodsFor(asked: readonly ('months' | 'seasons')[]): Period[] {
  const out: Period[] = ['annual'];
  if (asked.includes('months')) out.push(...MONTH_NAMES);
  if (asked.includes('seasons')) out.push(...(Object.keys(SEASONS) as SeasonName[]));
  return out;
}

/**
 * One period's level from the 12 months of a climatology: Σ W_m·x_m / Σ W_m over the period's months,
 * where W_m is month m's total length in days. A cell missing in any of those months is missing.
 */
export function periodLevel(months: readonly Float32Array[], weights: ArrayLike<number>, p: Period, out?: Float32Array): Float32Array {
  const list = periodMonths(p);
  if (list.length === 1) return months[list[0] - 1];
  const n = months[0].length;
  const res = out ?? new Float32Array(n);
  let wsum = 0;
  for (const m of list) wsum += weights[m - 1];
  const acc = new Float64Array(n);
  for (const m of list) {
    const w = weights[m - 1] / wsum;
    const x = months[m - 1];
    for (let c = 0; c < n; c++) acc[c] += w * x[c];
  }
  for (let c = 0; c < n; c++) res[c] = acc[c];
  return res;
}
