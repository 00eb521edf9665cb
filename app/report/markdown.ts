/** skill.md: a readable table per variable, the run costs, and the notes. */
import type { ComparisonResult } from '../compare/run.js';
import { formatCount as fmtCount, formatNumber as fmtNumber, formatPercent as fmtPercent, MISSING } from '../output/number-format.js';
import type { Provenance } from './types.js';

const HEAD = ['run', 'region', 'layer', 'n', 'model mean', 'ref mean', 'bias', 'RMSE', "E'", 'r', 'σm/σr', 'Taylor S', 'NSE', 'compared'];

/** Text in a table cell: a pipe would end the cell and a line break the row. */
function esc(s: string): string {
  return s.replace(/\|/g, '\\|').replace(/\r\n|[\r\n\u2028\u2029]/g, ' ');
}

export function skillMarkdown(result: ComparisonResult, prov: Provenance, title = 'Skill'): string {
  const withPeriod = result.rows.some((r) => (r.period ?? 'annual') !== 'annual');
  const head = withPeriod ? [...HEAD.slice(0, 3), 'period', ...HEAD.slice(3)] : HEAD;
  const textCols = withPeriod ? 4 : 3;
  const out: string[] = [`# ${esc(title)}`, ''];
  out.push(`Compared on ${esc(prov.date)} by ${esc(prov.tool)} ${esc(prov.version)}. Bias = model − reference; RMSE and centred RMS difference E' in the variable's units; r weighted Pearson correlation; Taylor S from Taylor (2001) eq. 4 with R0 = 1; NSE after Nash & Sutcliffe (1970); weights are cell volumes (cell areas for the bottom layer and 2-D fields). "${MISSING}" marks a value that is undefined.`, '');
  for (const v of result.variables) {
    const rows = result.rows.filter((r) => r.variable === v.variable);
    out.push(`## ${esc(v.variable)} (${esc(v.units)})`, '');
    for (const c of v.conversions) out.push(`- ${esc(c.source)}: ${esc(c.note)}`);
    if (v.regridded.length) out.push(`- regridded to the common grid (${v.grid.nx} × ${v.grid.ny} × ${v.grid.nz}): ${v.regridded.map(esc).join(', ')}`);
    for (const t of v.time ?? []) out.push(`- ${esc(t.source)}: ${esc(t.note)}`);
    if (v.conversions.length || v.regridded.length || v.time?.length) out.push('');
    out.push(`| ${head.join(' | ')} |`, `|${head.map((_, i) => (i < textCols ? ' --- ' : ' ---: ')).join('|')}|`);
    for (const r of rows) {
      const cells = [
        esc(r.run), esc(r.region), esc(r.layer), ...(withPeriod ? [esc(r.period ?? 'annual')] : []), fmtCount(r.n), fmtNumber(r.model_mean), fmtNumber(r.ref_mean), fmtNumber(r.bias),
        fmtNumber(r.rmse), fmtNumber(r.crmse), fmtNumber(r.corr, 3), fmtNumber(r.std_ratio, 3), fmtNumber(r.taylor_skill, 3), fmtNumber(r.nse, 3),
        fmtPercent(r.compared_fraction),
      ];
      out.push(`| ${cells.join(' | ')} |`);
    }
    const notes = rows.filter((r) => r.note);
    if (notes.length) {
      out.push('');
      for (const r of notes) out.push(`- ${esc(r.run)}, ${esc(r.region)}, ${esc(r.layer)}${withPeriod ? `, ${esc(r.period ?? 'annual')}` : ''}: ${esc(r.note!)}`);
    }
    out.push('');
    const cycles = (result.cycles ?? []).filter((c) => c.variable === v.variable);
    if (cycles.length) {
      out.push(`### ${esc(v.variable)}: seasonal cycle`, '');
      out.push('Range = max − min of the weighted mean monthly cycle; phases in months, positive when the run peaks later (of the maximum, and of the first harmonic); r cells = volume-weighted mean over cells of the correlation of their 12-month cycles.', '');
      const ch = ['run', 'region', 'layer', 'run range', 'ref range', 'ratio', 'Δ max (months)', 'Δ harmonic (months)', 'r cells', 'cells'];
      out.push(`| ${ch.join(' | ')} |`, `|${ch.map((_, i) => (i < 3 ? ' --- ' : ' ---: ')).join('|')}|`);
      for (const c of cycles) {
        const cells = [
          esc(c.run), esc(c.region), esc(c.layer), fmtNumber(c.model_range), fmtNumber(c.ref_range), fmtNumber(c.range_ratio, 3),
          fmtNumber(c.max_phase_months, 3), fmtNumber(c.harmonic_phase_months, 3), fmtNumber(c.cell_corr_mean, 3), fmtCount(c.cell_corr_cells),
        ];
        out.push(`| ${cells.join(' | ')} |`);
      }
      out.push('');
    }
  }
  out.push('## Multi-tracer cost', '', 'Σ over variables of the global, full-depth RMSE divided by the reference\'s global mean (smaller is better).', '');
  out.push('| run | cost | terms |', '| --- | ---: | --- |');
  for (const c of result.costs) out.push(`| ${esc(c.run)} | ${fmtNumber(c.cost)} | ${c.terms.map((t) => `${esc(t.variable)} ${fmtNumber(t.term, 3)}`).join(', ')} |`);
  out.push('');
  return out.join('\n');
}
