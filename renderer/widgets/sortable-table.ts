/**
 * A table whose column heads sort it (click again to reverse); missing values sort last in both directions.
 * Each column says how to read a row's value for sorting and how to draw its cell.
 */
import { h, MISSING } from '../elements.js';

export type SortValue = number | string | null | undefined;

export interface Column<Row, K extends string = string> {
  key: K;
  label: string;
  /** hover text of the head */
  title: string;
  /** text columns align left */
  text?: boolean;
  value(row: Row): SortValue;
  /** the cell; plain text of the value when absent */
  cell?(row: Row): HTMLTableCellElement | string;
  /** sort by size whatever the sign */
  byMagnitude?: boolean;
}

export interface SortState<K extends string> {
  key: K;
  up: boolean;
}

export interface SortableTableSpec<Row, K extends string> {
  id: string;
  className?: string;
  columns: Column<Row, K>[];
  sort: SortState<K>;
  /** rows drawn after a row (notes under it) */
  after?(row: Row): HTMLTableRowElement | null;
  rowClass?: string;
  rowTitle?(row: Row): string;
  /** a numeric column sorts largest first when first chosen (the largest drift is the news) */
  numbersLargestFirst?: boolean;
  /** told when the sort changes (to remember it) */
  onSort?(sort: SortState<K>): void;
}

export interface SortableTable<Row> {
  el: HTMLTableElement;
  /** draw these rows in the current order */
  show(rows: Row[]): void;
  /** these rows in the order the table shows them (what an export writes) */
  order(rows: Row[]): Row[];
}

/** Compare two sort values; missing ones last whichever the direction. */
export function compareValues(x: SortValue, y: SortValue, up: boolean, byMagnitude = false): number {
  const missing = (v: SortValue): boolean => v === null || v === undefined || (typeof v === 'number' && Number.isNaN(v));
  if (missing(x)) return missing(y) ? 0 : 1;
  if (missing(y)) return -1;
  const sign = up ? 1 : -1;
  if (typeof x === 'number' && typeof y === 'number') return sign * (byMagnitude ? Math.abs(x) - Math.abs(y) : x - y);
  return sign * String(x).localeCompare(String(y), undefined, { numeric: true });
}

export function sortableTable<Row, K extends string>(spec: SortableTableSpec<Row, K>): SortableTable<Row> {
  const sort = { ...spec.sort };
  const table = h('table', { class: spec.className ?? 'scores', id: spec.id });
  let last: Row[] = [];
  let focusKey: K | null = null;

  const head = (): HTMLTableSectionElement => {
    const tr = h('tr', {});
    for (const c of spec.columns) {
      const on = sort.key === c.key;
      const b = h('button', { type: 'button', title: `${c.title}; sort by this column`, 'data-key': c.key }, c.label, on ? (sort.up ? ' ▲' : ' ▼') : '');
      b.addEventListener('click', () => {
        if (sort.key === c.key) sort.up = !sort.up;
        else {
          sort.key = c.key;
          sort.up = !!c.text || !spec.numbersLargestFirst;
        }
        spec.onSort?.({ ...sort });
        // the button is drawn anew: keep the keyboard where it was
        focusKey = c.key;
        show(last);
      });
      tr.append(h('th', { class: c.text ? 'text' : '', scope: 'col', 'aria-sort': on ? (sort.up ? 'ascending' : 'descending') : 'none' }, b));
    }
    return h('thead', {}, tr);
  };

  const order = (rows: Row[]): Row[] => {
    const col = spec.columns.find((c) => c.key === sort.key) ?? spec.columns[0];
    return [...rows].sort((a, b) => compareValues(col.value(a), col.value(b), sort.up, col.byMagnitude));
  };

  const show = (rows: Row[]): void => {
    last = rows;
    const sorted = order(rows);
    const body = h('tbody', {});
    for (const r of sorted) {
      const tr = h('tr', { class: spec.rowClass, title: spec.rowTitle?.(r) || undefined });
      for (const c of spec.columns) {
        const cell = c.cell ? c.cell(r) : String(c.value(r) ?? MISSING);
        tr.append(typeof cell === 'string' ? h('td', { class: c.text ? 'text' : '' }, cell) : cell);
      }
      body.append(tr);
      const extra = spec.after?.(r);
      if (extra) body.append(extra);
    }
    table.replaceChildren(head(), body);
    if (focusKey !== null) {
      table.querySelector<HTMLButtonElement>(`th button[data-key="${focusKey}"]`)?.focus();
      focusKey = null;
    }
  };
  return { el: table, show, order };
}
