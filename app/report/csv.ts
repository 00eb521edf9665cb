/** skill.csv (RFC 4180): every row column at full precision; an undefined number is an empty field. */
import { LOG_COLUMNS, ROW_COLUMNS, type SkillRow } from '../compare/rows.js';

function cell(v: unknown): string {
  if (v === null || v === undefined) return '';
  const s = typeof v === 'number' ? (Number.isFinite(v) ? String(v) : '') : String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function skillCsv(rows: SkillRow[]): string {
  const hasLog = rows.some((r) => r.log10_n !== undefined);
  const cols: string[] = [...ROW_COLUMNS, ...(hasLog ? LOG_COLUMNS : []), 'note'];
  const lines = [cols.join(',')];
  for (const r of rows) lines.push(cols.map((c) => cell((r as unknown as Record<string, unknown>)[c])).join(','));
  return lines.join('\r\n') + '\r\n';
}
