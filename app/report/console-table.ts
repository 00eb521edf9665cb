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

export function consoleTable(rows: SkillRow[]): string {
  const cells = rows.map((r) => COLS.map(([, f]) => f(r)));
  const width = COLS.map(([h], i) => Math.max([...h].length, ...cells.map((c) => [...c[i]].length)));
  const pad = (s: string, i: number) => (i < 4 || i === COLS.length - 1 ? s + ' '.repeat(width[i] - [...s].length) : ' '.repeat(width[i] - [...s].length) + s);
  const lines = [COLS.map(([h], i) => pad(h, i)).join('  ')];
  for (const c of cells) lines.push(c.map(pad).join('  ').trimEnd());
  return lines.join('\n');
}
