// The section, line and profile figures of app/figures (the Section, Line and Profile views draw these and export
// the same ones; the report draws the line figure): structure, units, the stretched upper-ocean depth axis and
// the waypoint marks. The fields are synthetic: the checks are about geometry and labelling, not about values.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { lineFigure, sampleEdges, waypointLetter } from '../../../app/figures/line-figure.js';
import { profileFigure } from '../../../app/figures/profile-figure.js';
import { sectionFigure } from '../../../app/figures/section-figure.js';
import { paintSection } from '../../../app/figures/section-raster.js';
import { cutSamples, waterSpan } from '../../../app/figures/section-panel.js';
import { stretchedDepth } from '../../../app/figures/scale.js';
import type { SvgNode } from '../../../app/figures/svg-tree.js';
import { SEQUENTIAL } from '../../../app/render/colour-scales.js';
import { checkFigure, parsesAsXml } from './figure-checks.js';

const depthEdges = Float64Array.of(0, 50, 100, 200, 500, 1000, 2000, 3000, 4000, 5000);
const nz = depthEdges.length - 1;
const n = 40;
const distanceKm = Float64Array.from({ length: n }, (_, s) => 100 * s);
const seafloor = Float64Array.from({ length: n }, (_, s) => (s < 3 ? 0 : s < 20 ? 5000 : 3000));
const field = (shift: number): Float32Array =>
  Float32Array.from({ length: nz * n }, (_, i) => {
    const k = Math.floor(i / n);
    const s = i % n;
    return (depthEdges[k + 1] <= seafloor[s] ? 1 + k * 0.3 + shift * Math.sin(s / 5) : NaN);
  });
const ref = field(0);
const runA = field(0.2);
const runB = field(-0.4);
const minus = (a: Float32Array) => a.map((v, i) => v - ref[i]);
const meanOf = (a: Float32Array) => Float64Array.from({ length: n }, (_, s) => a[s]);

/** text nodes with a class, and the <line> just before each tick text, as they sit in the tree */
function texts(root: SvgNode, cls?: string): SvgNode[] {
  return [...root.walk()].filter((x) => x.tag === 'text' && (cls === undefined || x.getAttribute('class') === cls));
}

function panelRect(root: SvgNode): { x: number; y: number; w: number; h: number } {
  const img = [...root.walk()].find((x) => x.tag === 'image')!;
  return { x: Number(img.getAttribute('x')), y: Number(img.getAttribute('y')), w: Number(img.getAttribute('width')), h: Number(img.getAttribute('height')) };
}

function line(stretch = false, marks = true) {
  return lineFigure({
    name: 'po4-line',
    variable: 'PO4',
    units: 'umol kg-1',
    lineName: 'A → B → C',
    width: 'double',
    spacingKm: 100,
    method: 'bilinear',
    meansRange: [0, 5000],
    distanceKm,
    depthEdges,
    seafloor,
    reference: { label: 'Climatology', values: ref, columnMean: meanOf(ref) },
    runs: [
      { label: 'Run A', values: runA, difference: minus(runA), columnMean: meanOf(runA) },
      { label: 'Run B', values: runB, difference: minus(runB), columnMean: meanOf(runB) },
    ],
    marks: marks ? [0, 1500, 3900].map((at, i) => ({ at, label: waypointLetter(i) })) : undefined,
    stretch,
  });
}

describe('the line figure (section panels and column means, as the report and the Line view draw it)', () => {
  it('parses as XML, has a title, text of at least 7 pt at 180 mm and units on every axis and colour bar', () => {
    const f = line();
    expect(f.svg.getAttribute('width')).toBe('180mm');
    const c = checkFigure(f);
    expect(c.problems).toEqual([]);
    expect(c.colourBarLabels).toEqual(['PO4 (µmol kg⁻¹)', 'Run minus reference (µmol kg⁻¹)']);
    expect(c.axisLabels).toContain('PO4 (µmol kg⁻¹)');
    expect(c.axisLabels).toContain('Distance along the line (km)');
    expect(parsesAsXml([f])).toEqual([true]);
  });

  it('names every panel: reference, each run, each run minus reference, then the column means', () => {
    const c = checkFigure(line());
    expect(c.panelTitles.slice(0, 5)).toEqual(['Climatology (reference)', 'Run A', 'Run A minus reference', 'Run B', 'Run B minus reference']);
    expect(c.panelTitles[5]).toMatch(/^Column means along the line/);
  });

  it('marks the waypoints A, B, C on the top axis of every panel, at their distance along the line', () => {
    const f = line();
    const groups = [...f.svg.walk()].filter((x) => x.getAttribute('class') === 'waypoint-marks');
    expect(groups).toHaveLength(6); // five section panels and the column means
    const first = groups[0];
    const labels = texts(first, 'waypoint-label');
    expect(labels.map((t) => t.textContent())).toEqual(['A', 'B', 'C']);
    // x of a mark = left edge + (distance − first edge) / (last edge − first edge) × width
    const r = panelRect(f.svg);
    const e = sampleEdges(distanceKm);
    [0, 1500, 3900].forEach((at, i) => expect(Number(labels[i].getAttribute('x'))).toBeCloseTo(r.x + ((at - e[0]) / (e[n] - e[0])) * r.w, 1));
    // marks sit above the frame, not over the panel title
    for (const t of labels) expect(Number(t.getAttribute('y'))).toBeLessThan(r.y);
    expect(checkFigure(line(false, false)).panelTitles).toHaveLength(6);
    expect([...line(false, false).svg.walk()].some((x) => x.getAttribute('class') === 'waypoint-marks')).toBe(false);
  });

  it('stretches the upper 1000 m over half the depth axis when asked, and says so on the axis', () => {
    const plain = line(false);
    const stretched = line(true);
    const r = panelRect(stretched.svg);
    const tickY = (f: typeof plain, label: string): number => {
      const t = texts(f.svg).find((x) => x.textContent() === label && x.getAttribute('text-anchor') === 'end')!;
      return Number(t.getAttribute('y')) - 7 * 0.35;
    };
    // linear: 2000 m at 2000/5000 of the height; stretched: 1000 m at one half and 3000 m at
    // 1/2 + (2000/4000)/2 (the stretched axis as defined: two linear parts meeting at 1000 m)
    expect(tickY(plain, '2000')).toBeCloseTo(r.y + 0.4 * r.h, 1);
    expect(tickY(stretched, '1000')).toBeCloseTo(r.y + 0.5 * r.h, 1);
    expect(tickY(stretched, '3000')).toBeCloseTo(r.y + 0.75 * r.h, 1);
    expect(checkFigure(stretched).axisLabels).toContain('Depth (m), upper 1000 m stretched');
    expect(checkFigure(plain).axisLabels).toContain('Depth (m)');
  });

  it('gives every difference the same symmetric colour bar', () => {
    const bars = [...line().svg.walk()].filter((x) => x.getAttribute('class') === 'colour-bar-label');
    expect(bars).toHaveLength(2);
  });
});

describe('the section raster follows the depth axis', () => {
  it('paints each row with the level that holds the depth at that row, linear or stretched (read back with Pillow)', () => {
    const grid = { xEdges: Float64Array.of(0, 1), depthEdges };
    const values = Float32Array.from({ length: nz }, (_, k) => k); // one sample, value = level index
    const height = 100;
    const dir = mkdtempSync(join(tmpdir(), 'sw-section-'));
    try {
      const read = (url: string): number[] => {
        const file = join(dir, 'p.png');
        writeFileSync(file, Buffer.from(url.replace(/^data:image\/png;base64,/, ''), 'base64'));
        const py = spawnSync('/usr/bin/python3', ['-c', 'import sys, json\nfrom PIL import Image\nim = Image.open(sys.argv[1]).convert("RGB")\nprint(json.dumps([list(im.getpixel((0, y))) for y in range(im.size[1])]))', file], { encoding: 'utf8' });
        expect(py.status, py.stderr).toBe(0);
        return (JSON.parse(py.stdout) as number[][]).map((p) => p[0] * 65536 + p[1] * 256 + p[2]);
      };
      // the colour of level k: its bin of the palette, floor(t × n) as app/render/recolour.ts bins values
      const colourOf = (k: number) => {
        const c = Math.min(SEQUENTIAL.packed.length - 1, Math.floor((k / (nz - 1)) * SEQUENTIAL.packed.length));
        return SEQUENTIAL.rgb[c * 3] * 65536 + SEQUENTIAL.rgb[c * 3 + 1] * 256 + SEQUENTIAL.rgb[c * 3 + 2];
      };
      const S = stretchedDepth(5000, [0, height]);
      const linearRows = read(paintSection(grid, values, SEQUENTIAL, 0, nz - 1, (f) => f * 5000, 1, height));
      const stretchedRows = read(paintSection(grid, values, SEQUENTIAL, 0, nz - 1, (f) => S.invert(f * height), 1, height));
      // row 10 of 100 (centre 10.5 %): linear 525 m (level 4, 500–1000 m); stretched 210 m (level 3, 200–500 m)
      expect(linearRows[10]).toBe(colourOf(4));
      expect(stretchedRows[10]).toBe(colourOf(3));
      // row 60: linear 3025 m (level 7); stretched 1000 + 0.21 × 4000 = 1840 m (level 5, 1000–2000 m)
      expect(linearRows[60]).toBe(colourOf(7));
      expect(stretchedRows[60]).toBe(colourOf(5));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('the one-field section figure (Section view)', () => {
  it('has a title, units on its colour bar and axes, the seafloor, and text of at least 7 pt', () => {
    const f = sectionFigure({
      name: 'section',
      title: 'Phosphate (PO4): Run A',
      subtitle: 'Section along 150°W',
      width: 'double',
      grid: { xEdges: sampleEdges(distanceKm), depthEdges },
      values: runA,
      seafloor,
      scale: SEQUENTIAL,
      limits: [1, 3.5],
      quantity: 'PO4',
      units: 'umol kg-1',
      xLabel: 'Latitude (degrees north)',
      depthMax: 5000,
    });
    const c = checkFigure(f);
    expect(c.problems).toEqual([]);
    expect(c.colourBarLabels).toEqual(['PO4 (µmol kg⁻¹)']);
    expect([...f.svg.walk()].filter((x) => x.getAttribute('class') === 'seafloor')).toHaveLength(1);
    expect(parsesAsXml([f])).toEqual([true]);
  });
});

describe('the profile figure (Profile view)', () => {
  it('draws the reference and every run against depth with units and a legend', () => {
    const centres = Float64Array.from({ length: nz }, (_, k) => (depthEdges[k] + depthEdges[k + 1]) / 2);
    const f = profileFigure({
      name: 'profile',
      title: 'PO4: mean profile, atlantic',
      width: 'double',
      quantity: 'PO4',
      units: 'umol kg-1',
      depthCentres: centres,
      depthMax: 5000,
      reference: { label: 'Climatology', values: Float64Array.from(centres, (z) => 1 + z / 2000) },
      runs: [{ label: 'Run A', values: Float64Array.from(centres, (z) => 1.1 + z / 2100) }],
    });
    const c = checkFigure(f);
    expect(c.problems).toEqual([]);
    expect(c.axisLabels).toEqual(['PO4 (µmol kg⁻¹)', 'Depth (m)']);
    const lines = [...f.svg.walk()].filter((x) => x.getAttribute('class') === 'series-line');
    expect(lines.map((l) => l.getAttribute('data-label'))).toEqual(['Run A', 'Climatology']);
    // depth downwards: the path's last point (deepest level) lies below its first
    const ys = (lines[1].getAttribute('d') ?? '').split(/[ML]/).filter(Boolean).map((p) => Number(p.split(',')[1]));
    expect(ys[ys.length - 1]).toBeGreaterThan(ys[0]);
    expect(texts(f.svg).map((t) => t.textContent())).toContain('Climatology (reference)');
  });
});

describe('a section spans its water (a basin zonal mean leaves out the dry rows at either end)', () => {
  it('finds the first and last samples with water and cuts level-major values to them', () => {
    expect(waterSpan(Float64Array.of(0, NaN, 300, 0, 4000, 0))).toEqual([2, 4]);
    expect(waterSpan(Float64Array.of(0, NaN))).toBeNull();
    // two levels of five samples: level k, sample s holds 10k + s
    const v = Float32Array.from({ length: 10 }, (_, i) => 10 * Math.floor(i / 5) + (i % 5));
    expect(Array.from(cutSamples(v, 5, 1, 3))).toEqual([1, 2, 3, 11, 12, 13]);
  });
});
