// Issue 11, Workbench: "Report…" writes the same report as `stillwater report` for the open recipe, as a job
// with progress and Cancel, into a folder that the one path guard allows, and says where it went. End to end
// in Debian's Chromium at 1600 × 1000. The recipe is the demo's phosphate alone with a one-figure report
// section, so that the report takes seconds; it lives in a folder of this test inside sample-data (the served
// root) and is removed afterwards.
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SAMPLE_DATA, canRunBrowser, prepare, readyWorkbench, type Workbench } from './harness.js';

const SLOW = 600_000;

describe.skipIf(!canRunBrowser)('Report… in the workbench', () => {
  let wb: Workbench;
  let page: Page;
  const here = join(SAMPLE_DATA, `.e2e-report-${process.pid}`);

  beforeAll(async () => {
    await prepare();
    mkdirSync(here, { recursive: true });
    const demo = JSON.parse(readFileSync(join(SAMPLE_DATA, 'demo-recipe.json'), 'utf8')) as {
      title: string;
      reference: { label: string; variables: Record<string, unknown> };
      runs: { label: string; variables: Record<string, { file: string; name: string }> }[];
    };
    const at = (v: { file: string; name: string }) => ({ file: `../${v.file}`, name: v.name });
    const recipe = {
      title: 'Phosphate of the demo, one-figure report',
      reference: { label: demo.reference.label, variables: { PO4: at(demo.reference.variables.PO4 as { file: string; name: string }) } },
      runs: demo.runs.map((r) => ({ label: r.label, variables: { PO4: at(r.variables.PO4) } })),
      report: { mapLayers: ['bottom'], lines: [], zonalBasins: [], spinup: false },
    };
    writeFileSync(join(here, 'recipe.json'), JSON.stringify(recipe, null, 2));
    ({ wb, page } = await readyWorkbench('.view-map [data-drawn]', SLOW, ['--root', SAMPLE_DATA, '--recipe', join(here, 'recipe.json')]));
  }, SLOW);
  afterAll(async () => {
    await wb?.close();
    rmSync(here, { recursive: true, force: true });
  });

  const write = async (folder: string): Promise<void> => {
    await page.fill('#report-path', folder);
    await page.click('#report-write');
  };

  it('refuses a folder outside the allowed folders in one sentence, and writes nothing', async () => {
    await page.click('#report-toggle summary');
    const outside = join(tmpdir(), `sw-report-outside-${process.pid}`);
    await write(outside);
    await page.waitForSelector('#report-result.error', { timeout: SLOW });
    const text = (await page.textContent('#report-result')) ?? '';
    expect(text).toMatch(/outside the folders this workbench may read/);
    expect(text.trim().split(/(?<=[.!?])\s+(?=[A-Z])/).length).toBe(1);
    expect(existsSync(outside)).toBe(false);
  }, SLOW);

  it('cancel leaves no folder behind', async () => {
    const folder = join(here, 'cancelled');
    await write(folder);
    await page.waitForSelector('#status-cancel:not([disabled])', { timeout: SLOW });
    await page.click('#status-cancel');
    await page.waitForSelector('#report-result.error', { timeout: SLOW });
    expect((await page.textContent('#report-result')) ?? '').toMatch(/cancel/i);
    expect(existsSync(folder)).toBe(false);
    // no staging folder of the report either (app/output: a set is complete or absent)
    expect(readdirSync(here).filter((n) => n.startsWith('.stillwater'))).toEqual([]);
  }, SLOW);

  it('writes the report of the open recipe and says where', async () => {
    const folder = join(here, 'report-po4');
    await write(folder);
    // either outcome ends the wait, so a refused report fails here with its sentence instead of timing out
    await page.waitForSelector('#report-written, #report-result.error', { timeout: SLOW });
    expect(await page.$('#report-result.error') ? await page.textContent('#report-result') : '').toBe('');
    const where = (await page.textContent('#report-written')) ?? '';
    expect(where).toBe(join(folder, 'report.html'));
    const html = readFileSync(where, 'utf8');
    // the same checks as the command line's report (issue 11): self-contained, figures inline
    expect(html).not.toMatch(/https?:|file:/);
    expect(html).toContain('<svg');
    const figures = readdirSync(join(folder, 'figures'));
    expect(figures.some((f) => f.endsWith('.svg'))).toBe(true);
    expect(figures.some((f) => f.endsWith('.png'))).toBe(true);
    for (const f of ['skill.json', 'skill.csv', 'skill.md', 'skill.tex', 'provenance.json']) expect(existsSync(join(folder, f))).toBe(true);
    const prov = JSON.parse(readFileSync(join(folder, 'provenance.json'), 'utf8')) as Record<string, unknown>;
    expect(JSON.stringify(prov)).toContain('recipe.json');
    // PNG signature and width (ISO/IEC 15948): 180 mm at 300 dpi is 2126 pixels
    const png = readFileSync(join(folder, 'figures', figures.find((f) => f.endsWith('.png'))!));
    expect(png.readUInt32BE(16)).toBe(2126);
    expect(wb.consoleErrors).toEqual([]);
    await wb.shot('report-written');
  }, SLOW);
});
