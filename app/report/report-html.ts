/**
 * report.html: one self-contained page (inline SVG and CSS, no script, nothing fetched, no external
 * reference of any kind), opening with what was compared, then the figures and tables per variable, the
 * spin-up, the cautions in plain words and the provenance.
 */
import type { SkillRow } from '../compare/rows.js';
import { escapeXml } from '../figures/svg-tree.js';
import { shortNumber, typesetUnits } from '../figures/typeset.js';

export interface HtmlFigure {
  name: string;
  title: string;
  /** the SVG text of the figure; without it, writeReportHtml asks for it when it gets there */
  svg?: string;
}

export interface HtmlSection {
  heading: string;
  intro?: string;
  figures: HtmlFigure[];
  /** a table of skill rows after the figures */
  rows?: SkillRow[];
  /** extra plain-text table (e.g. the spin-up verdicts): header, then rows */
  table?: string[][];
}

export interface ReportPage {
  title: string;
  compared: [string, string][];
  sections: HtmlSection[];
  cautions: string[];
  provenance: [string, string][];
}

const CSS = `
body{font-family:'DejaVu Sans','Helvetica Neue',Arial,sans-serif;color:#1d2228;margin:0 auto;max-width:60rem;padding:1.5rem;line-height:1.45}
h1{font-size:1.6rem;margin:0 0 1rem}h2{font-size:1.3rem;margin:2rem 0 .6rem;border-bottom:1px solid #ccd1d6;padding-bottom:.2rem}
h3{font-size:1.05rem;margin:1.4rem 0 .4rem}
figure{margin:1rem 0 1.6rem}figure svg{width:100%;height:auto;display:block}
figcaption{font-size:.85rem;color:#4f5761;margin-top:.3rem}
table{border-collapse:collapse;font-size:.8rem;margin:.6rem 0 1.2rem}
th,td{border:1px solid #d5d9de;padding:.15rem .45rem;text-align:right}th{background:#f1f3f5}
td:first-child,th:first-child,td.text{text-align:left}
dl.facts{display:grid;grid-template-columns:max-content 1fr;gap:.2rem 1rem}dl.facts dt{font-weight:bold}dl.facts dd{margin:0}
ul.cautions li{margin:.3rem 0}
@media print{body{max-width:none}figure{break-inside:avoid}}
`;

/** SVG ready to sit inside HTML: no XML declaration, no namespace URI (HTML parsers supply it). */
export function inlineSvg(svg: string): string {
  return svg.replace(/^<\?xml[^>]*>\s*/, '').replace(/ xmlns="http:\/\/www\.w3\.org\/2000\/svg"/, '');
}

function facts(pairs: [string, string][]): string {
  return `<dl class="facts">${pairs.map(([k, v]) => `<dt>${escapeXml(k)}</dt><dd>${escapeXml(v)}</dd>`).join('')}</dl>`;
}

function rowsTable(rows: SkillRow[]): string {
  const head = ['run', 'region', 'layer', 'n', 'bias', 'RMSE', 'centred RMSE', 'r', 'σ model / σ ref', 'compared'];
  const body = rows.map((r) =>
    `<tr><td>${escapeXml(r.run)}</td><td class="text">${escapeXml(r.region)}</td><td class="text">${escapeXml(r.layer)}</td><td>${r.n}</td><td>${shortNumber(r.bias, 4)}</td><td>${shortNumber(r.rmse, 4)}</td><td>${shortNumber(r.crmse, 4)}</td><td>${shortNumber(r.corr, 4)}</td><td>${shortNumber(r.std_ratio, 3)}</td><td>${r.compared_fraction === null ? '—' : `${Math.round(r.compared_fraction * 100)} %`}</td></tr>`,
  );
  const units = rows[0] ? ` (bias, RMSE and centred RMSE in ${escapeXml(typesetUnits(rows[0].units))})` : '';
  return `<p>Skill rows${units}, the same numbers as skill.csv:</p><table><thead><tr>${head.map((h) => `<th>${h}</th>`).join('')}</tr></thead><tbody>${body.join('')}</tbody></table>`;
}

function plainTable(t: string[][]): string {
  const [head, ...rows] = t;
  return `<table><thead><tr>${head.map((h) => `<th>${escapeXml(h)}</th>`).join('')}</tr></thead><tbody>${rows.map((r) => `<tr>${r.map((c) => `<td class="text">${escapeXml(c)}</td>`).join('')}</tr>`).join('')}</tbody></table>`;
}

/** The page as text pieces with the figures left in place, so a writer can fetch each figure's SVG when it gets there. */
function htmlPieces(page: ReportPage): (string | HtmlFigure)[] {
  const parts: (string | HtmlFigure)[] = [];
  parts.push('<!DOCTYPE html>', '<html lang="en"><head><meta charset="utf-8">', `<title>${escapeXml(page.title)}</title>`);
  parts.push('<meta name="viewport" content="width=device-width, initial-scale=1">', `<style>${CSS}</style></head><body>`);
  parts.push(`<h1>${escapeXml(page.title)}</h1>`, '<h2 id="compared">What was compared</h2>', facts(page.compared));
  for (const s of page.sections) {
    parts.push(`<h2 id="${escapeXml(s.heading.toLowerCase().replace(/[^a-z0-9]+/g, '-'))}">${escapeXml(s.heading)}</h2>`);
    if (s.intro) parts.push(`<p>${escapeXml(s.intro)}</p>`);
    for (const f of s.figures) parts.push(f);
    if (s.table) parts.push(plainTable(s.table));
    if (s.rows) parts.push(rowsTable(s.rows));
  }
  parts.push('<h2 id="cautions">Cautions</h2>');
  parts.push(page.cautions.length ? `<ul class="cautions">${page.cautions.map((c) => `<li>${escapeXml(c)}</li>`).join('')}</ul>` : '<p>None of the usual cautions applies.</p>');
  parts.push('<h2 id="provenance">Provenance</h2>', facts(page.provenance), '<p>Every input with its size and SHA-256 is in provenance.json beside this file.</p>');
  parts.push('</body></html>\n');
  return parts;
}

function figureHtml(f: HtmlFigure, svg: string): string {
  return `<figure id="${escapeXml(f.name)}">${inlineSvg(svg)}<figcaption>${escapeXml(f.title)} (figures/${escapeXml(f.name)}.svg, .png)</figcaption></figure>`;
}

export function reportHtml(page: ReportPage): string {
  return htmlPieces(page).map((p) => (typeof p === 'string' ? p : figureHtml(p, p.svg ?? ''))).join('\n');
}

/**
 * The same page written piece by piece: each figure's SVG is fetched (`svgOf`) only when its turn comes, so
 * the report never holds every figure's text at once.
 */
export async function writeReportHtml(page: ReportPage, append: (text: string) => Promise<void>, svgOf: (f: HtmlFigure) => Promise<string>): Promise<void> {
  const pieces = htmlPieces(page);
  let buffered: string[] = [];
  for (let i = 0; i < pieces.length; i++) {
    const p = pieces[i];
    buffered.push(typeof p === 'string' ? p : figureHtml(p, p.svg ?? (await svgOf(p))));
    if (typeof p !== 'string' || i === pieces.length - 1) {
      await append(buffered.join('\n') + (i === pieces.length - 1 ? '' : '\n'));
      buffered = [];
    }
  }
}
