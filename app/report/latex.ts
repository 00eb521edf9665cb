/** skill.tex: a booktabs table (needs \usepackage{booktabs}) with units, one block per variable. */
import type { ComparisonResult } from '../compare/run.js';
import { DASH, fmtCount, fmtNumber } from './format.js';

const SPECIAL: Record<string, string> = {
  '\\': '\\textbackslash{}', '&': '\\&', '%': '\\%', $: '\\$', '#': '\\#', _: '\\_', '{': '\\{', '}': '\\}', '~': '\\textasciitilde{}', '^': '\\textasciicircum{}',
};

export function texEscape(s: string): string {
  return s.replace(/[\\&%$#_{}~^]/g, (c) => SPECIAL[c]).replace(/[µμ]/g, '$\\mu$').replace(/—/g, '---').replace(/−/g, '$-$');
}

/** "umol kg-1" → "$\mu$mol\,kg$^{-1}$" */
export function texUnits(u: string): string {
  return u
    .trim()
    .split(/\s+/)
    .map((tok) => {
      const m = /^([A-Za-zµμ°]+)(-?\d+)?$/.exec(tok);
      if (!m) return texEscape(tok);
      let base = m[1].replace(/^u(mol|M|g|m)$/, 'µ$1');
      base = texEscape(base);
      return m[2] ? `${base}$^{${m[2]}}$` : base;
    })
    .join('\\,');
}

function num(x: number | null | undefined, digits = 4): string {
  const s = fmtNumber(x, digits);
  return s === DASH ? '---' : `$${s.replace(/e([+-]?)(\d+)/, (_m, sign, d) => `\\times 10^{${sign === '-' ? '-' : ''}${d}}`)}$`;
}

export function skillLatex(result: ComparisonResult, caption = 'Skill of the model runs against the reference'): string {
  const out: string[] = [
    '% Written by stillwater. Needs \\usepackage{booktabs}.',
    '\\begin{table}',
    '\\centering',
    `\\caption{${texEscape(caption)}. Bias = model $-$ reference; $E'$ the centred RMS difference; $r$ the weighted correlation; $S$ the Taylor (2001) skill score.}`,
    '\\begin{tabular}{lllrrrrrrr}',
    '\\toprule',
    "Run & Region & Layer & $n$ & Bias & RMSE & $E'$ & $r$ & $\\sigma_m/\\sigma_r$ & $S$ \\\\",
  ];
  for (const v of result.variables) {
    out.push('\\midrule', `\\multicolumn{10}{l}{\\textbf{${texEscape(v.variable)}} (${texUnits(v.units)})} \\\\`, '\\midrule');
    for (const r of result.rows.filter((x) => x.variable === v.variable)) {
      out.push(
        [texEscape(r.run), texEscape(r.region), texEscape(r.layer), fmtCount(r.n), num(r.bias), num(r.rmse), num(r.crmse), num(r.corr, 3), num(r.std_ratio, 3), num(r.taylor_skill, 3)].join(' & ') +
          ' \\\\',
      );
    }
  }
  out.push('\\bottomrule', '\\end{tabular}', '\\end{table}', '');
  return out.join('\n');
}
