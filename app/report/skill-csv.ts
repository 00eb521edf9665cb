/** skill.csv (app/output/csv.ts): every row column at full precision; an undefined number is an empty field. */
import { CYCLE_COLUMNS, LOG_COLUMNS, ROW_COLUMNS, type CycleRow, type SkillRow } from '../compare/rows.js';
import { csvTable, type CsvCell } from '../output/csv.js';

export function skillCsv(rows: SkillRow[]): string {
  const hasLog = rows.some((r) => r.log10_n !== undefined);
  const cols: string[] = [...ROW_COLUMNS, ...(hasLog ? LOG_COLUMNS : []), 'note'];
  return csvTable(cols, rows.map((r) => cols.map((c) => (r as unknown as Record<string, CsvCell>)[c])));
}

/** seasonal-cycle.csv: one line per run × variable × region × layer. */
export function cycleCsv(rows: CycleRow[]): string {
  const cols: string[] = [...CYCLE_COLUMNS, 'note'];
  return csvTable(cols, rows.map((r) => cols.map((c) => (r as unknown as Record<string, CsvCell>)[c])));
}
