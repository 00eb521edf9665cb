/**
 * Skill table writers. CSV per RFC 4180 (quotes doubled, CRLF); LaTeX special characters per the LaTeX manual
 * (common practice); undefined numbers print "—" in human tables, never NaN; text cells that a spreadsheet
 * would run as a formula are neutralised (common practice: OWASP "CSV Injection"); a line break in a label
 * keeps a Markdown row (CommonMark 0.31, §4.10 tables extension: a row is one line) and a LaTeX row whole.
 * The all-or-nothing writing is tested in tests/unit/output.
 */
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { ComparisonResult } from '../../../app/compare/run.js';
import { makeRow, NO_CELLS_NOTE } from '../../../app/compare/rows.js';
import { emptyMoments, pairMoments } from '../../../app/stats/moments.js';
import { consoleTable, skillCsv, skillLatex, skillMarkdown, texEscape, texUnits, writeSkillTables, type Provenance } from '../../../app/report/index.js';

const ctx = { run: 'Run "A", v2', variable: 'PO4', region: 'global', layer: '0-100 m', period: 'annual', units: 'umol kg-1', weightUnits: 'm3' };
const full = makeRow(ctx, { region: 0, layer: 0, moments: pairMoments(Float64Array.of(1, 2, 4), Float64Array.of(1.5, 2, 3), Float64Array.of(1, 1, 2)), refWeight: 8 });
const empty = makeRow({ ...ctx, region: 'arctic' }, { region: 1, layer: 0, moments: emptyMoments(), refWeight: 0 });
const result: ComparisonResult = {
  rows: [full, empty],
  costs: [{ run: 'Run "A", v2', cost: 0.25, terms: [{ variable: 'PO4', term: 0.25 }] }],
  variables: [{ variable: 'PO4', units: 'umol kg-1', grid: { nx: 1, ny: 1, nz: 1, kind: 'rectilinear' }, conversions: [], regridded: [] }],
  inputs: [],
};
const prov: Provenance = { tool: 'stillwater', version: '0.1.0', date: '2026-12-01T00:00:00Z', recipe: null, inputs: [], options: {}, regions: [], layers: [], variables: [] };

describe('skill tables', () => {
  it('an empty region is a row with n = 0, nulls and a note', () => {
    expect(empty).toMatchObject({ n: 0, bias: null, rmse: null, compared_fraction: null, note: NO_CELLS_NOTE });
    expect(full.compared_fraction).toBeCloseTo(4 / 8, 15);
  });

  it('CSV: header in DESIGN.md order, quotes doubled, empty field for undefined, CRLF line ends (RFC 4180)', () => {
    const csv = skillCsv(result.rows);
    const lines = csv.split('\r\n');
    expect(lines[0].split(',').slice(0, 16)).toEqual(['run', 'variable', 'region', 'layer', 'units', 'n', 'weight', 'model_mean', 'ref_mean', 'bias', 'rmse', 'crmse', 'corr', 'model_std', 'ref_std', 'std_ratio']);
    expect(lines[1].startsWith('"Run ""A"", v2",PO4,global,0-100 m,umol kg-1,3,4,')).toBe(true);
    expect(lines[2]).toMatch(/^"Run ""A"", v2",PO4,arctic,0-100 m,umol kg-1,0,0,,,,,/);
    expect(csv).not.toMatch(/NaN/);
  });

  it('Markdown and the console table print "—" for undefined numbers and never NaN', () => {
    const md = skillMarkdown(result, prov);
    expect(md).toMatch(/\| arctic \| 0-100 m \| 0 \| — \| — \|/);
    expect(md).toMatch(/arctic, 0-100 m: no compared cells/);
    expect(md).not.toMatch(/NaN/);
    const table = consoleTable(result.rows);
    expect(table.split('\n')).toHaveLength(3);
    expect(table).toMatch(/arctic\s+0-100 m\s+0\s+—/);
  });

  it('LaTeX: booktabs rules, special characters escaped, units with exponents', () => {
    expect(texEscape('a_b & 50% #1 {x} $')).toBe('a\\_b \\& 50\\% \\#1 \\{x\\} \\$');
    expect(texUnits('umol kg-1')).toBe('$\\mu$mol\\,kg$^{-1}$');
    expect(texUnits('mmol m-3')).toBe('mmol\\,m$^{-3}$');
    expect(texUnits('degC')).toBe('$^{\\circ}$C');
    const tex = skillLatex(result);
    expect(tex).toMatch(/\\begin\{longtable\}[\s\S]*\\toprule[\s\S]*\\midrule[\s\S]*\\bottomrule[\s\S]*\\end\{longtable\}/);
    expect(tex).toMatch(/Run "A", v2 & arctic & 0-100 m & 0 & --- & ---/);
    // braces balance
    const opens = (tex.match(/(?<!\\)\{/g) ?? []).length;
    const closes = (tex.match(/(?<!\\)\}/g) ?? []).length;
    expect(opens).toBe(closes);
  });

  it('LaTeX: says when units were converted with a nominal density, as the Markdown does', () => {
    const converted: ComparisonResult = {
      ...result,
      variables: [{ ...result.variables[0], conversions: [{ source: 'Run "A", v2', note: 'converted mmol m-3 to umol kg-1 with a nominal density of 1025 kg m-3' }] }],
    };
    const tex = skillLatex(converted);
    const md = skillMarkdown(converted, prov);
    expect(md).toContain('nominal density of 1025 kg m-3');
    expect(tex).toContain('with a nominal density of 1025 kg m$^{-3}$');
    expect(tex).toContain('converted mmol m$^{-3}$ to $\\mu$mol kg$^{-1}$');
    // the note comes before the variable's rows, inside the table, and braces still balance
    expect(tex.indexOf('nominal density')).toBeLessThan(tex.indexOf('arctic'));
    expect((tex.match(/(?<!\\)\{/g) ?? []).length).toBe((tex.match(/(?<!\\)\}/g) ?? []).length);
  });

  it('writes the four tables into a new folder', async () => {
    const dir = join(mkdtempSync(join(tmpdir(), 'sw-report-')), 'out');
    const files = await writeSkillTables(dir, result, prov);
    expect(readdirSync(dir).sort()).toEqual(['skill.csv', 'skill.json', 'skill.md', 'skill.tex']);
    const json = JSON.parse(readFileSync(files[0], 'utf8'));
    expect(json.rows[1].bias).toBeNull();
    expect(json.provenance.version).toBe('0.1.0');
  });

  describe('labels that other programs would misread', () => {
    const hostile: ComparisonResult = {
      ...result,
      rows: [makeRow({ ...ctx, run: '=HYPERLINK("http://x")\nsecond line', region: '@SUM(A1)', layer: '+1' }, { region: 0, layer: 0, moments: pairMoments(Float64Array.of(-3, 2), Float64Array.of(-1.5, 2), Float64Array.of(1, 1)), refWeight: 2 })],
      costs: [],
    };
    it('CSV: text cells beginning with = + - @ get an apostrophe; negative numbers stay numbers', () => {
      const lines = skillCsv(hostile.rows).split('\r\n');
      const cells = lines[1];
      expect(cells.startsWith(`"'=HYPERLINK(""http://x"")\nsecond line",PO4,'@SUM(A1),'+1,`)).toBe(true);
      // the means and the bias are negative numbers, written as numbers (model mean −0.5 − ref mean 0.25 = −0.75)
      expect(cells).toMatch(/,-0\.5,0\.25,-0\.75,/);
      expect(skillCsv([{ ...hostile.rows[0], run: '-2+3', region: 'atlantic', layer: 'all' }]).split('\r\n')[1]).toMatch(/^'-2\+3,PO4,atlantic,all,/);
    });
    it('Markdown: a line break in a run label stays inside its table row', () => {
      const md = skillMarkdown(hostile, prov);
      const row = md.split('\n').find((l) => l.includes('HYPERLINK'))!;
      expect(row).toMatch(/^\| =HYPERLINK\("http:\/\/x"\) second line \| @SUM\(A1\) \| \+1 \| 2 \|/);
      expect(row.split(' | ')).toHaveLength(14);
    });
    it('LaTeX: a line break becomes a space, so no blank line ends the row early', () => {
      expect(texEscape('a\n\nb_c')).toBe('a  b\\_c');
      const tex = skillLatex(hostile);
      expect(tex).not.toMatch(/\n\s*\n/);
      expect(tex).toMatch(/=HYPERLINK\("http:\/\/x"\) second line & @SUM\(A1\) & \+1 & 2 &/);
    });
  });
});
