/**
 * The one CSV writer (RFC 4180: fields separated by commas, records ended by CRLF, a field holding a comma,
 * quote or line break enclosed in double quotes with its quotes doubled).
 * Text that a spreadsheet would take for a formula (beginning with =, +, -, @, a tab or a carriage return) is
 * prefixed with an apostrophe (common practice: OWASP "CSV Injection"). Numbers are written as numbers, so
 * a negative value stays a number; a missing number is an empty field.
 */
import { dataNumber } from './number-format.js';

export type CsvCell = string | number | boolean | null | undefined;

export const CSV_EOL = '\r\n';

const FORMULA_START = /^[=+\-@\t\r]/;

/** One text field, neutralised and quoted as needed. */
export function csvText(s: string): string {
  const safe = FORMULA_START.test(s) ? `'${s}` : s;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** One field: numbers at the given significant digits (full precision when omitted), text neutralised. */
export function csvCell(v: CsvCell, digits?: number): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') {
    const n = dataNumber(v, digits);
    return n === null ? '' : String(n);
  }
  if (typeof v === 'boolean') return String(v);
  return csvText(v);
}

/** A whole table: the header, then one record per row, every record ending in CRLF. */
export function csvTable(header: readonly string[], rows: Iterable<readonly CsvCell[]>, digits?: number): string {
  const out: string[] = [header.map(csvText).join(',')];
  for (const r of rows) out.push(r.map((c) => csvCell(c, digits)).join(','));
  return out.join(CSV_EOL) + CSV_EOL;
}
