/**
 * Which snapshots form the tail where the drift rate is measured. By default the last 10 % of the series
 * in model years, but never fewer than 3 snapshots (a slope from 2 points cannot tell drift from noise);
 * a person may give the tail length in model years instead.
 */
export interface TailWindow {
  /** index of the first snapshot in the tail */
  start: number;
  /** how the window was chosen, in words */
  description: string;
}

export const DEFAULT_TAIL_FRACTION = 0.1;
export const MIN_TAIL_SNAPSHOTS = 3;

export function chooseTail(years: ArrayLike<number>, tailYears?: number): TailWindow {
  const n = years.length;
  const last = years[n - 1];
  if (tailYears !== undefined) {
    let start = n - 1;
    while (start > 0 && years[start - 1] >= last - tailYears) start--;
    if (n - start < 2) {
      start = Math.max(0, n - 2);
      return { start, description: `last 2 snapshots (the last ${tailYears} model years hold fewer)` };
    }
    return { start, description: `last ${tailYears} model years (${n - start} snapshots)` };
  }
  const span = last - years[0];
  let start = n - 1;
  while (start > 0 && years[start - 1] >= last - DEFAULT_TAIL_FRACTION * span) start--;
  const inFraction = n - start;
  if (inFraction < MIN_TAIL_SNAPSHOTS) {
    start = Math.max(0, n - MIN_TAIL_SNAPSHOTS);
    return { start, description: `last ${n - start} snapshots (the last 10 % of the series holds fewer)` };
  }
  return { start, description: `last 10 % of the series (${inFraction} snapshots)` };
}
