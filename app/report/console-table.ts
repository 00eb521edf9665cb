/** The compact table the compare command prints on stdout. */
import type { SkillRow } from '../compare/rows.js';
import { formatCount as fmtCount, formatNumber as fmtNumber } from '../output/number-format.js';

const COLS: [string, (r: SkillRow) => string][] = [
  ['run', (r) => r.run],
  ['variable', (r) => r.variable],
  ['region', (r) => r.region],
  ['layer', (r) => r.layer],
  ['n', (r) => fmtCount(r.n)],
  ['bias', (r) => fmtNumber(r.bias)],
  ['rmse', (r) => fmtNumber(r.rmse)],
  ['crmse', (r) => fmtNumber(r.crmse)],
  ['corr', (r) => fmtNumber(r.corr, 3)],
  ['std_ratio', (r) => fmtNumber(r.std_ratio, 3)],
  ['nse', (r) => fmtNumber(r.nse, 3)],
  ['units', (r) => r.units],
];

/** The period column appears when a row is not annual. */
export function consoleTable(rows: SkillRow[]): string {
  const withPeriod = rows.some((r) => (r.period ?? 'annual') !== 'annual');
  const cols: typeof COLS = withPeriod ? [...COLS.slice(0, 4), ['period', (r) => r.period ?? 'annual'], ...COLS.slice(4)] : COLS;
  const textCols = withPeriod ? 5 : 4;
  const cells = rows.map((r) => cols.map(([, f]) => f(r)));
  const width = cols.map(([h], i) => Math.max([...h].length, ...cells.map((c) => [...c[i]].length)));
  const pad = (s: string, i: number) => (i < textCols || i === cols.length - 1 ? s + ' '.repeat(width[i] - [...s].length) : ' '.repeat(width[i] - [...s].length) + s);
  const lines = [cols.map(([h], i) => pad(h, i)).join('  ')];
  for (const c of cells) lines.push(c.map(pad).join('  ').trimEnd());
  return lines.join('\n');
}
