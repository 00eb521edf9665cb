// view.map-panels (issue 11): the Map and Difference views' multi-panel export, drawn on the session's worker by
// the report's builder. Checked on the demo scenario: the file parses as XML (Python's expat), the corner numbers
// of a recipe layer are the skill rows of that region and layer, a single level's corners carry numbers, the PNG
// is 2126 px wide (180 mm at 300 dpi) with its resolution in the file (ISO/IEC 15948 pHYs); bad input refused in
// one sentence.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve, sep } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SkillRow } from '../../../app/compare/rows.js';
import { StillwaterError } from '../../../app/errors.js';
import { shortNumber } from '../../../app/figures/typeset.js';
import { mapPanelsServices } from '../../../app/services/map-panels.js';
import type { ServiceContext } from '../../../app/services/types.js';
import type { ExportedFile } from '../../../app/services/view-export.js';
import { viewsServices } from '../../../app/services/views.js';
import type { SessionInfo } from '../../../contract/view-types.js';
import { ensureDemo } from '../../../sample-data/generator/generate.js';

const SAMPLE = resolve('sample-data');
const RECIPE = join(SAMPLE, 'demo-recipe.json');
const work = mkdtempSync(join(tmpdir(), 'sw-map-panels-'));

const ctx: ServiceContext = {
  roots: [SAMPLE, work],
  cacheDir: join(work, 'cache'),
  signal: new AbortController().signal,
  progress: () => undefined,
  resolvePath(p) {
    const abs = resolve(p);
    if (![SAMPLE, work].some((r) => abs === r || abs.startsWith(r + sep))) throw new StillwaterError('E_FILE', `${p}: outside the folders this workbench may read.`, { file: p });
    return abs;
  },
};

function call<T>(name: string, input: unknown): Promise<T> {
  const e = [...viewsServices, ...mapPanelsServices].find((x) => x.name === name);
  if (!e) throw new Error(`no service ${name}`);
  return e.run(e.input.parse(input), ctx) as Promise<T>;
}

/** Panel titles and corner texts as Python's expat reads them. */
function readSvg(bytes: Uint8Array): { panels: string[]; bars: string[]; stats: string[] } {
  const py = spawnSync('/usr/bin/python3', ['-c', [
    'import sys, json, xml.etree.ElementTree as ET',
    'root = ET.fromstring(sys.stdin.buffer.read())',
    "ns = '{http://www.w3.org/2000/svg}'",
    "t = lambda e: ''.join(e.itertext())",
    "print(json.dumps({'panels': [t(x) for x in root.iter(ns + 'text') if x.get('class') == 'panel-title'],",
    "  'bars': [t(x) for x in root.iter(ns + 'text') if x.get('class') == 'colour-bar-label'],",
    "  'stats': ['\\n'.join(t(x) for x in g.iter(ns + 'text')) for g in root.iter(ns + 'g') if g.get('class') == 'panel-stats']}))",
  ].join('\n')], { input: Buffer.from(bytes), encoding: 'utf8', maxBuffer: 1 << 28 });
  if (py.status !== 0) throw new Error(py.stderr);
  return JSON.parse(py.stdout) as { panels: string[]; bars: string[]; stats: string[] };
}

let info: SessionInfo;
beforeAll(async () => {
  await ensureDemo(SAMPLE);
  info = await call<SessionInfo>('view.open', { recipe: RECIPE });
}, 240_000);
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('view.map-panels', () => {
  it('a recipe layer: the corners are the skill rows of the region and layer', async () => {
    const f = await call<ExportedFile>('view.map-panels', { session: info.session, variable: 'O2', layer: 'bottom', region: 'atlantic', projection: 'equal-earth', format: 'svg' });
    expect(f.mime).toBe('image/svg+xml');
    const svg = readSvg(f.data);
    const runs = info.variables.find((v) => v.key === 'O2')!.runs;
    expect(svg.panels).toEqual([`${info.reference.label} (reference)`, ...runs.flatMap((r) => [r, `${r} minus reference`])]);
    expect(svg.bars).toHaveLength(2);
    const rows = (await call<{ rows: SkillRow[] }>('view.skill', { session: info.session, variable: 'O2' })).rows;
    runs.forEach((run, i) => {
      const row = rows.find((x) => x.run === run && x.region === 'atlantic' && x.layer === 'bottom' && (x.period ?? 'annual') === 'annual')!;
      expect(svg.stats[i]).toContain(`bias ${shortNumber(row.bias)} `);
      expect(svg.stats[i]).toContain(`RMSE ${shortNumber(row.rmse)} `);
      expect(svg.stats[i]).toContain(`r ${shortNumber(row.corr)}`);
    });
  }, 240_000);

  it('a single level (no skill rows) still gets numbers in every corner, and the PNG says 300 dpi', async () => {
    const f = await call<ExportedFile>('view.map-panels', { session: info.session, variable: 'T', layer: 'k:3', projection: 'plate', format: 'png', window: null });
    const png = Buffer.from(f.data);
    expect(png.readUInt32BE(16)).toBe(2126);
    const phys = png.indexOf(Buffer.from('pHYs'));
    expect(png.readUInt32BE(phys + 4)).toBe(11811); // 300 dpi = 11811 pixels per metre
    const svg = readSvg((await call<ExportedFile>('view.map-panels', { session: info.session, variable: 'T', layer: 'k:3', projection: 'plate', format: 'svg' })).data);
    for (const s of svg.stats) expect(s).toMatch(/bias −?\d/);
  }, 240_000);

  it('refuses what it cannot draw, in one sentence', async () => {
    await expect(call('view.map-panels', { session: info.session, variable: 'CO2', layer: 'bottom', projection: 'plate', format: 'svg' })).rejects.toThrow(/^The session compares no variable 'CO2'\.$/);
    expect(() => mapPanelsServices[0].input.parse({ session: info.session, variable: 'T', layer: 'bottom', projection: 'mercator', format: 'svg' })).toThrow();
    expect(() => mapPanelsServices[0].input.parse({ session: info.session, variable: 'T', layer: 'bottom', projection: 'plate', format: 'svg', window: { xmin: 5, xmax: 1, ymin: 0, ymax: 1 } })).toThrow(/positive width/);
  }, 60_000);
});
