/** Checks every figure must pass, shared by the figure tests and the report test. */
import { spawnSync } from 'node:child_process';
import { MM_PER_PT, MIN_FONT_PT } from '../../../app/figures/page.js';
import type { Figure } from '../../../app/figures/parts.js';
import { serialise, type SvgNode } from '../../../app/figures/svg-tree.js';

export interface FigureCheck {
  problems: string[];
  colourBarLabels: string[];
  axisLabels: string[];
  panelTitles: string[];
  panelStats: string[];
  noDataNotes: string[];
}

function fontOf(node: SvgNode, inherited: number): number {
  const f = node.getAttribute('font-size');
  return f === null ? inherited : Number(f);
}

/**
 * Title present; every text at least 7 pt on paper (the figure's width attribute in mm against its viewBox);
 * every colour bar and axis label carries units in parentheses.
 */
export function checkFigure(f: Figure): FigureCheck {
  const problems: string[] = [];
  const svg = f.svg;
  const widthMm = Number((svg.getAttribute('width') ?? '').replace('mm', ''));
  const vb = (svg.getAttribute('viewBox') ?? '').split(' ').map(Number);
  const ptPerUnit = widthMm / MM_PER_PT / vb[2];
  const titleNode = svg.children.find((c) => typeof c !== 'string' && c.tag === 'title');
  if (!titleNode || typeof titleNode === 'string' || !titleNode.textContent().trim()) problems.push('no <title>');
  const out: FigureCheck = { problems, colourBarLabels: [], axisLabels: [], panelTitles: [], panelStats: [], noDataNotes: [] };
  const visit = (n: SvgNode, font: number): void => {
    const size = fontOf(n, font);
    if (n.tag === 'text') {
      if (size * ptPerUnit < MIN_FONT_PT - 0.005) problems.push(`text '${n.textContent()}' is ${(size * ptPerUnit).toFixed(2)} pt`);
      const cls = n.getAttribute('class');
      const t = n.textContent();
      if (cls === 'colour-bar-label') out.colourBarLabels.push(t);
      if (cls === 'axis-label') out.axisLabels.push(t);
      if (cls === 'panel-title') out.panelTitles.push(t);
      if (cls === 'no-data') out.noDataNotes.push(t);
      if ((cls === 'colour-bar-label' || cls === 'axis-label') && !/\(.+\)/.test(t)) problems.push(`label '${t}' has no units`);
    }
    if (n.getAttribute('class') === 'panel-stats') out.panelStats.push(n.children.filter((c) => typeof c !== 'string' && c.tag === 'text').map((c) => (c as SvgNode).textContent()).join('\n'));
    for (const c of n.children) if (typeof c !== 'string') visit(c, size);
  };
  visit(svg, 16);
  return out;
}

/** Whether Python's XML parser (xml.etree.ElementTree, expat) reads each figure's text. */
export function parsesAsXml(figs: Figure[]): boolean[] {
  const texts = figs.map((f) => serialise(f.svg));
  const py = spawnSync('/usr/bin/python3', ['-c', [
    'import sys, json',
    'import xml.etree.ElementTree as ET',
    'docs = json.load(sys.stdin)',
    'res = []',
    'for d in docs:',
    '    try:',
    '        r = ET.fromstring(d); res.append(r.tag == "{http://www.w3.org/2000/svg}svg")',
    '    except ET.ParseError:',
    '        res.append(False)',
    'print(json.dumps(res))',
  ].join('\n')], { input: JSON.stringify(texts), encoding: 'utf8', maxBuffer: 1 << 28 });
  if (py.status !== 0) throw new Error(py.stderr);
  return JSON.parse(py.stdout) as boolean[];
}
