/**
 * `stillwater report` end to end on small committed fixtures: the folder's parts, the figures' rules (XML,
 * title, units, 7 pt, 2126 px at 300 dpi), no external reference in report.html, panel statistics equal to
 * the skill rows, and bad input refused in one sentence with nothing left behind.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';

const ROOT = join(__dirname, '..', '..');
const FIX = join(ROOT, 'tests', 'fixtures', 'compare');
let dir: string;

function stillwater(args: string[]) {
  return spawnSync(process.execPath, [join(ROOT, 'main', 'launch.mjs'), ...args], { encoding: 'utf8', cwd: ROOT, timeout: 300_000 });
}

function recipe(report: unknown): string {
  const path = join(dir, `r-${Math.random().toString(36).slice(2, 7)}.json`);
  const json = {
    reference: { label: 'Reference', variables: { PO4: { file: join(FIX, 'ref.nc'), name: 'p_mean' } } },
    runs: [{ label: 'Run A', variables: { PO4: { file: join(FIX, 'run_same.nc'), name: 'PO4' } } }],
    regions: ['global', 'atlantic'],
    layers: ['bottom'],
    report,
  };
  writeFileSync(path, JSON.stringify(json));
  return path;
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'sw-report-'));
});

describe('stillwater report', () => {
  it('writes a complete, self-contained report', () => {
    const out = join(dir, 'out');
    const r = stillwater(['report', '--recipe', recipe({ mapLayers: ['bottom'], lines: [], zonalBasins: ['atlantic'] }), '--out', out]);
    expect(r.stderr).toMatch(/figure 1: /);
    expect(r.status).toBe(0);
    for (const f of ['report.html', 'provenance.json', 'skill.json', 'skill.csv', 'skill.md', 'skill.tex']) expect(existsSync(join(out, f))).toBe(true);
    const html = readFileSync(join(out, 'report.html'), 'utf8');
    expect(html).not.toMatch(/https?:|file:/);
    expect(html).not.toMatch(/<script/);
    const figs = readdirSync(join(out, 'figures'));
    const svgs = figs.filter((f) => f.endsWith('.svg'));
    expect(svgs.length).toBeGreaterThanOrEqual(3);
    for (const s of svgs) expect(figs).toContain(s.replace(/\.svg$/, '.png'));
    // every SVG parses as XML (Python's expat) and has a title; every colour bar and axis label has units
    const py = spawnSync('/usr/bin/python3', ['-c', [
      'import sys, json, re', 'import xml.etree.ElementTree as ET', 'from PIL import Image', 'res = {}',
      'for f in sys.argv[1:]:',
      '    t = ET.parse(f).getroot(); ns = "{http://www.w3.org/2000/svg}"',
      '    labels = [e.text for e in t.iter(ns + "text") if e.get("class") in ("colour-bar-label", "axis-label")]',
      '    im = Image.open(f[:-4] + ".png")',
      '    res[f] = {"title": (t.find(ns + "title").text or ""), "labels": labels, "png": im.size, "dpi": im.info.get("dpi")}',
      'print(json.dumps(res))',
    ].join('\n'), ...svgs.map((s) => join(out, 'figures', s))], { encoding: 'utf8' });
    expect(py.stderr).toBe('');
    const res = JSON.parse(py.stdout) as Record<string, { title: string; labels: string[]; png: number[]; dpi: number[] }>;
    for (const [f, v] of Object.entries(res)) {
      expect(v.title.length, f).toBeGreaterThan(5);
      for (const l of v.labels) expect(l, f).toMatch(/\(.+\)/);
      // 180 mm at 300 dpi: 180 / 25.4 × 300 = 2125.98 → 2126 px
      expect(v.png[0], f).toBe(2126);
      expect(v.dpi[0], f).toBeCloseTo(300, 2);
    }
    const prov = JSON.parse(readFileSync(join(out, 'provenance.json'), 'utf8')) as { recipe: { sha256: string }; inputs: { sha256: string; size: number }[] };
    expect(prov.recipe.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(prov.inputs.length).toBeGreaterThanOrEqual(2);
    // the panel statistics equal the skill table's rows (global, bottom)
    const rows = (JSON.parse(readFileSync(join(out, 'skill.json'), 'utf8')) as { rows: { run: string; region: string; layer: string; bias: number; rmse: number }[] }).rows;
    const row = rows.find((x) => x.run === 'Run A' && x.region === 'global' && x.layer === 'bottom')!;
    const map = readFileSync(join(out, 'figures', svgs.find((s) => /map-bottom/.test(s))!), 'utf8');
    const stats = /<g class="panel-stats">(.*?)<\/g>/.exec(map)![1];
    const num = (label: string) => Number(new RegExp(`${label} (\\S+)`).exec(stats)![1].replace('−', '-'));
    expect(num('bias')).toBe(Number(row.bias.toPrecision(3)));
    expect(num('RMSE')).toBe(Number(row.rmse.toPrecision(3)));
  });

  it.each([
    [{ variables: ['NOPE'] }, /report\.variables\[0\]: no such variable 'NOPE'/],
    [{ lines: ['arctic-ridge'] }, /report\.lines\[0\]: no built-in line 'arctic-ridge'/],
    [{ zonalBasins: ['mediterranean'] }, /report\.zonalBasins\[0\]: no basin or recipe region named 'mediterranean'/],
  ])('refuses %j in one sentence, exit 2, nothing written', (report, message) => {
    const out = join(dir, `bad-${Math.random().toString(36).slice(2, 7)}`);
    const r = stillwater(['report', '--recipe', recipe(report), '--out', out]);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(message);
    expect(existsSync(out)).toBe(false);
    expect(readdirSync(dir).filter((f) => f.includes('partial'))).toEqual([]);
  });

  it('an output path that is a file is refused in one sentence', () => {
    const file = join(dir, 'a-file');
    writeFileSync(file, 'x');
    const r = stillwater(['report', '--recipe', recipe({}), '--out', file]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/is not a folder/);
    expect(readFileSync(file, 'utf8')).toBe('x');
  });

  it('an output folder that cannot be made (a file stands where its parent should be) is refused in one sentence before any work', () => {
    const file = join(dir, 'not-a-folder');
    writeFileSync(file, 'x');
    const r = stillwater(['report', '--recipe', recipe({}), '--out', join(file, 'report')]);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/not-a-folder\/report: the output folder cannot be written/);
    expect(r.stderr).not.toMatch(/figure/);
    expect(readFileSync(file, 'utf8')).toBe('x');
  });

  it('a layer without compared cells says so in its panels instead of drawing empty frames', () => {
    const out = join(dir, 'empty-layer');
    // the fixture's ocean is far shallower than 20 km
    const r = stillwater(['report', '--recipe', recipe({ mapLayers: [[20000, 30000]], lines: [], zonalBasins: [] }), '--out', out]);
    expect(r.status).toBe(0);
    const map = readFileSync(join(out, 'figures', readdirSync(join(out, 'figures')).find((f) => /map-20000-30000-m\.svg$/.test(f))!), 'utf8');
    expect(map).toMatch(/class="no-data">No compared cells here/);
    expect(map).toMatch(/global, 20000.30000 m: no compared cells/);
    expect(map).not.toMatch(/<image/);
    const html = readFileSync(join(out, 'report.html'), 'utf8');
    expect(html).toMatch(/no compared cells at all; their panels and table rows say so/);
  });
});
