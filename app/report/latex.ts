/**
 * skill.tex: a booktabs table with units, one block per variable, as a longtable so that a table of hundreds
 * of rows breaks across pages (needs \usepackage{booktabs,longtable}).
 */
import type { ComparisonResult } from '../compare/run.js';
import { formatCount as fmtCount, formatNumber as fmtNumber, MISSING } from '../output/number-format.js';

const SPECIAL: Record<string, string> = {
  '\\': '\\textbackslash{}', '&': '\\&', '%': '\\%', $: '\\$', '#': '\\#', _: '\\_', '{': '\\{', '}': '\\}', '~': '\\textasciitilde{}', '^': '\\textasciicircum{}',
};

/** Text for LaTeX: special characters escaped; a line break (a blank line ends a table row) becomes a space. */
export function texEscape(s: string): string {
  return s.replace(/\r\n|[\r\n\u2028\u2029]/g, ' ').replace(/[\\&%$#_{}~^]/g, (c) => SPECIAL[c]).replace(/[µμ]/g, '$\\mu$').replace(/—/g, '---').replace(/−/g, '$-$');
}

/** "umol kg-1" → "$\mu$mol\,kg$^{-1}$" */
export function texUnits(u: string): string {
  const t = u.trim();
  if (t === 'degC') return '$^{\\circ}$C';
  if (t === '1e-3') return '$10^{-3}$';
  return t
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

/** A sentence with UDUNITS factors ("kg m-3"): each factor with an exponent or a micro prefix as TeX units. */
function noteText(note: string): string {
  return note
    .split(' ')
    .map((w) => (/^(?:[kmuµ]?(?:g|mol|L|l)|m|s|J|W|K)-?\d+$|^u(?:mol|g|M|L)$/.test(w) ? texUnits(w) : texEscape(w)))
    .join(' ');
}

function num(x: number | null | undefined, digits = 4): string {
  const s = fmtNumber(x, digits);
  return s === MISSING ? '---' : `$${s.replace(/e([+-]?)(\d+)/, (_m, sign, d) => `\\times 10^{${sign === '-' ? '-' : ''}${d}}`)}$`;
}

export function skillLatex(result: ComparisonResult, caption = 'Skill of the model runs against the reference'): string {
  const withPeriod = result.rows.some((r) => (r.period ?? 'annual') !== 'annual');
  const head = `Run & Region & Layer & ${withPeriod ? 'Period & ' : ''}$n$ & Bias & RMSE & $E'$ & $r$ & $\\sigma_m/\\sigma_r$ & $S$ \\\\`;
  const ncol = withPeriod ? 11 : 10;
  const out: string[] = [
    '% Written by stillwater. Needs \\usepackage{booktabs,longtable}.',
    `\\begin{longtable}{${withPeriod ? 'llll' : 'lll'}rrrrrrr}`,
    `\\caption{${texEscape(caption)}. Bias = model $-$ reference; $E'$ the centred RMS difference; $r$ the weighted correlation; $S$ the Taylor (2001) skill score.} \\\\`,
    '\\toprule',
    head,
    '\\midrule',
    '\\endfirsthead',
    '\\toprule',
    head,
    '\\midrule',
    '\\endhead',
    '\\bottomrule',
    '\\endlastfoot',
  ];
  result.variables.forEach((v, i) => {
    if (i > 0) out.push('\\midrule');
    out.push(`\\multicolumn{${ncol}}{l}{\\textbf{${texEscape(v.variable)}} (${texUnits(v.units)})} \\\\`);
    // how units were brought together (a nominal density is an approximation the reader must know of)
    for (const c of v.conversions) out.push(`\\multicolumn{${ncol}}{p{0.95\\linewidth}}{\\footnotesize ${texEscape(c.source)}: ${noteText(c.note)}} \\\\`);
    out.push('\\midrule');
    for (const r of result.rows.filter((x) => x.variable === v.variable)) {
      out.push(
        [texEscape(r.run), texEscape(r.region), texEscape(r.layer), ...(withPeriod ? [r.period ?? 'annual'] : []), texEscape(fmtCount(r.n)), num(r.bias), num(r.rmse), num(r.crmse), num(r.corr, 3), num(r.std_ratio, 3), num(r.taylor_skill, 3)].join(' & ') +
          ' \\\\',
      );
    }
  });
  out.push('\\end{longtable}', '');
  return out.join('\n');
}
