/**
 * Noticing level-by-level reading: a slab with the same count as the previous one, its start moved along
 * one dimension by exactly that count (the next slab), or by the same stride as the move before (every
 * twelfth step of a monthly run: a month's steps). Readers use it to fetch the slabs ahead.
 */
export interface SlabRecord {
  start: number[];
  count: number[];
  /** how this slab's start moved from the one before, along one dimension (absent: no such move) */
  move?: { dim: number; by: number };
}

/** How `start` moved from `last` along one dimension (forward, counts unchanged), or undefined. */
function moveOf(last: SlabRecord | undefined, start: number[], count: number[]): { dim: number; by: number } | undefined {
  if (!last || last.count.length !== count.length) return undefined;
  let move: { dim: number; by: number } | undefined;
  for (let i = 0; i < count.length; i++) {
    if (last.count[i] !== count[i]) return undefined;
    if (last.start[i] === start[i]) continue;
    if (move || start[i] < last.start[i] + count[i]) return undefined;
    move = { dim: i, by: start[i] - last.start[i] };
  }
  return move;
}

/** The record of this slab, for the next call. */
export function slabRecord(last: SlabRecord | undefined, start: number[], count: number[]): SlabRecord {
  const move = moveOf(last, start, count);
  return { start: start.slice(), count: count.slice(), ...(move ? { move } : {}) };
}

/**
 * The steady move that `record` continues, or undefined: the next slab (a move by the count) at once, a
 * longer stride once it has been seen twice in a row.
 */
export function steadyMove(last: SlabRecord | undefined, record: SlabRecord): { dim: number; by: number } | undefined {
  const m = record.move;
  if (!m) return undefined;
  if (m.by === record.count[m.dim]) return m;
  return last?.move && last.move.dim === m.dim && last.move.by === m.by ? m : undefined;
}

/** The slab `k` moves further along `dim` (by `by`, default the count), or undefined past the end of `shape`. */
export function slabAhead(start: number[], count: number[], dim: number, k: number, shape: number[], by = count[dim]): number[] | undefined {
  const next = start.slice();
  next[dim] += k * by;
  return next[dim] + count[dim] <= shape[dim] ? next : undefined;
}
