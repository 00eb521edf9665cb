/** A region of the common grid: a name and the indices of its cells (row-major, longitude fastest). */
export interface Region {
  name: string;
  cells: Int32Array;
  /** where it came from: 'built-in', or the file it was read from */
  source: string;
}

/** Indices where `test` holds. */
export function cellsWhere(n: number, test: (c: number) => boolean): Int32Array {
  const tmp = new Int32Array(n);
  let m = 0;
  for (let c = 0; c < n; c++) if (test(c)) tmp[m++] = c;
  return tmp.slice(0, m);
}
