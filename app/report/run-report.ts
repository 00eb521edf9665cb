/**
 * `report`: a recipe in, a report folder out. The comparison streams every level once; while it does, the
 * figure data are gathered (figure-data.ts), and as soon as a variable's skill rows are complete its figures
 * are drawn, written (SVG, and PNG through the rasteriser the caller hands in) and their data dropped. Then
 * the spin-up, the skill tables, provenance.json and report.html. Everything goes to a staging folder that is
 * put in place at the end: the report folder is complete or absent.
 */
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { readFile, stat } from 'node:fs/promises';
import { StillwaterError } from '../errors.js';
import type { FieldSinkInfo, LevelSink } from '../compare/field-sink.js';
import { loadRegions } from '../compare/load-regions.js';
import type { SkillRow } from '../compare/rows.js';
import { runComparison, type ComparisonResult } from '../compare/run.js';
import { COLUMN_MM, pixelsFor, PRINT_DPI } from '../figures/page.js';
import type { Figure } from '../figures/parts.js';
import { withResolution } from '../figures/png.js';
import { spinupDriftFigure } from '../figures/spinup-drift.js';
import { serialise } from '../figures/svg-tree.js';
import { typesetUnits } from '../figures/typeset.js';
import type { Grid } from '../grid/types.js';
import { recipeToJson } from '../recipe/to-json.js';
import type { Recipe, ResolvedRegion } from '../recipe/types.js';
import { BUILT_IN_REGIONS } from '../regions/basins.js';
import { layerLabel } from '../regions/layers.js';
import { projectRings, type Ring } from '../render/coastline.js';
import { makeProjection } from '../render/projections.js';
import { spinupFromRecipe } from '../spinup/run-spinup.js';
import type { SpinupResult } from '../spinup/types.js';
import { skillCsv } from './skill-csv.js';
import { VariableCollector } from './figure-data.js';
import { skillJson } from './skill-json.js';
import { skillLatex } from './latex.js';
import { skillMarkdown } from './markdown.js';
import { openOutputFolder } from './output-folder.js';
import { writeReportHtml, type HtmlFigure, type HtmlSection, type ReportPage } from './report-html.js';
import { reportSettings, type ReportSettings } from './report-settings.js';
import { checkStationFiles, stationSections } from './station-section.js';
import type { Provenance } from './types.js';
import { slug, variableFigures, type FigureContext } from './variable-figures.js';

export interface ReportOptions {
  /** the recipe file as given (for its SHA-256 and the provenance) */
  recipePath: string;
  outDir: string;
  version: string;
  /** Natural Earth land rings (lon/lat) for the coastlines */
  land: Ring[];
  /** SVG text → PNG bytes `widthPx` wide (the caller's rasteriser; the core stays free of native code) */
  toPng: (svg: string, widthPx: number) => Uint8Array | Promise<Uint8Array>;
  /** how many figures `toPng` may rasterise at once (its threads): the comparison goes on meanwhile */
  pngParallel?: number;
  cacheDir?: string;
  signal?: AbortSignal;
  onProgress?: (fraction: number, message: string) => void;
  /** after each figure is written: its name and how many so far */
  onFigure?: (name: string, count: number) => void;
}

export interface ReportResult {
  outDir: string;
  figures: string[];
  rows: SkillRow[];
  costs: ComparisonResult['costs'];
}

/** The recipe as the report compares it: its layers plus the map layers, its regions plus "global" (for the panels' corners). */
export function reportRecipe(recipe: Recipe, settings: ReportSettings): Recipe {
  const layers = [...recipe.layers];
  for (const l of settings.mapLayers) if (!layers.some((x) => layerLabel(x) === layerLabel(l))) layers.push(l);
  const regions: ResolvedRegion[] = recipe.regions.some((r) => r.kind === 'built-in' && r.name === 'global') ? recipe.regions : [{ kind: 'built-in', name: 'global' }, ...recipe.regions];
  return { ...recipe, layers, regions };
}

async function sha256File(path: string): Promise<string> {
  const h = createHash('sha256');
  for await (const chunk of createReadStream(path)) h.update(chunk as Buffer);
  return h.digest('hex');
}

function checkCancelled(signal?: AbortSignal): void {
  if (signal?.aborted) throw new StillwaterError('E_CANCELLED', 'The report was cancelled; nothing was written.');
}

/** names a recipe's own regions announce (flags, features) for the check of zonal basins */
function ownRegionNames(recipe: Recipe): string[] {
  return recipe.regions.flatMap((r) => (r.kind === 'mask' ? (r.flags ?? []) : r.kind === 'geojson' ? (r.features ?? []) : []));
}

export async function runReport(recipe: Recipe, opts: ReportOptions): Promise<ReportResult> {
  const settings = reportSettings(recipe, ownRegionNames(recipe));
  const compared = reportRecipe(recipe, settings);
  const projection = makeProjection(settings.projection);
  const coast = projectRings(projection, opts.land);
  const widthMm = COLUMN_MM[settings.figureWidth];
  await checkStationFiles(settings);
  const folder = await openOutputFolder(opts.outDir);
  const written: HtmlSection[] = [];
  const figureNames: string[] = [];
  // PNGs are made while the comparison goes on; a few wait at most, so memory stays bounded
  const rasterising: Promise<void>[] = [];
  const maxWaiting = Math.max(1, opts.pngParallel ?? 1) * 2;
  let drawn = 0;
  try {
    const writeFigure = async (f: Figure): Promise<HtmlFigure> => {
      checkCancelled(opts.signal);
      const name = figureNames.includes(f.name) ? `${f.name}-${figureNames.length}` : f.name;
      figureNames.push(name);
      const svg = serialise(f.svg);
      await folder.write(`figures/${name}.svg`, `<?xml version="1.0" encoding="UTF-8"?>\n${svg}\n`);
      const png = Promise.resolve(opts.toPng(svg, pixelsFor(widthMm))).then(async (bytes) => {
        await folder.write(`figures/${name}.png`, withResolution(bytes, PRINT_DPI));
        opts.onFigure?.(name, ++drawn);
      });
      png.catch(() => undefined); // awaited below; never an unhandled rejection meanwhile
      rasterising.push(png);
      while (rasterising.length >= maxWaiting) await rasterising.shift();
      return { name, title: f.title };
    };
    // basin masks per common grid, for the zonal means
    const masks: { grid: Grid; basins: { name: string; mask: Uint8Array }[] }[] = [];
    const basinsFor = async (grid: Grid) => {
      let hit = masks.find((m) => m.grid.horizontal === grid.horizontal);
      if (!hit) {
        const builtIn = settings.zonalBasins.filter((b) => (BUILT_IN_REGIONS as readonly string[]).includes(b));
        const own = builtIn.length < settings.zonalBasins.length ? compared.regions.filter((r) => r.kind !== 'built-in') : [];
        const specs: ResolvedRegion[] = [...builtIn.map((name): ResolvedRegion => ({ kind: 'built-in', name })), ...own];
        const regions = await loadRegions(specs, grid.horizontal);
        const basins = settings.zonalBasins.map((name, i) => {
          const region = regions.find((r) => r.name === name);
          if (!region) throw new StillwaterError('E_RECIPE', `report.zonalBasins[${i}]: no basin or recipe region named '${name}' (there are: ${[...BUILT_IN_REGIONS, ...regions.map((r) => r.name)].join(', ')}).`, { path: `report.zonalBasins[${i}]` });
          const mask = new Uint8Array(grid.horizontal.nx * grid.horizontal.ny);
          for (const c of region.cells) mask[c] = 1;
          return { name, mask };
        });
        hit = { grid, basins };
        masks.push(hit);
      }
      return hit.basins;
    };

    const collectors = new Map<string, VariableCollector>();
    const noop: LevelSink = { write: async () => undefined, close: async () => undefined, abort: async () => undefined };
    const keepFields = async (info: FieldSinkInfo): Promise<LevelSink> => {
      if (!settings.variables.includes(info.variable)) return noop;
      let c = collectors.get(info.variable);
      if (!c) {
        c = new VariableCollector(info.variable, info.units, info.grid, {
          mapLayers: settings.mapLayers,
          basins: await basinsFor(info.grid),
          lines: settings.lines.map((l) => ({ name: l.name, spec: l.spec })),
          bottomTolerance: compared.options.bottomTolerance,
        });
        collectors.set(info.variable, c);
      }
      return c.sinkFor(info);
    };
    const ctxBase: Omit<FigureContext, 'layers'> = {
      settings,
      projection,
      coast,
      referenceLabel: recipe.reference.label,
      cornerRegion: 'global',
      regions: [],
      runs: recipe.runs.map((r) => r.label),
    };
    const result = await runComparison(compared, {
      cacheDir: opts.cacheDir,
      signal: opts.signal,
      onProgress: opts.onProgress,
      keepFields,
      onVariable: async (info, rows) => {
        const c = collectors.get(info.variable);
        if (!c) return;
        collectors.delete(info.variable);
        const data = c.result();
        const regions = [...new Set(rows.map((r) => r.region))];
        const section: HtmlSection = { heading: `${info.variable} (${typesetUnits(info.units)})`, figures: [], rows };
        if (info.conversions.length) section.intro = `Conversions: ${info.conversions.map((x) => `${x.source}: ${x.note}`).join('; ')}.`;
        for (const f of variableFigures(data, rows, { ...ctxBase, regions, layers: compared.layers })) section.figures.push(await writeFigure(f));
        written.push(section);
      },
    });

    // station comparisons, each right after its variable's section
    for await (const st of stationSections(recipe, settings, { cacheDir: opts.cacheDir, onProgress: opts.onProgress })) {
      checkCancelled(opts.signal);
      let after = -1;
      written.forEach((w, i) => {
        if (w.heading.startsWith(`${st.variable} (`) || w.heading.startsWith(`${st.variable} at stations:`)) after = i;
      });
      const section: HtmlSection = { heading: st.heading, intro: st.intro || undefined, figures: [await writeFigure(st.figure)], table: st.table };
      written.splice(after < 0 ? written.length : after + 1, 0, section);
    }

    let spin: SpinupResult | null = null;
    if (settings.spinup && recipe.runs.some((r) => r.snapshots?.length)) {
      checkCancelled(opts.signal);
      opts.onProgress?.(1, 'spin-up: reading the snapshots');
      spin = await spinupFromRecipe(recipe, { cacheDir: opts.cacheDir, signal: opts.signal, skill: false });
      const region = spin.regions.includes('global') ? 'global' : spin.regions[0];
      const fig = spinupDriftFigure({
        name: `spinup-${slug(spin.run)}`,
        title: `Spin-up of ${spin.run}: drift of the ${region} mean of each tracer`,
        subtitle: `Change of the volume-weighted mean since the first snapshot, per depth layer; ${spin.summary.sentence}`,
        width: settings.figureWidth,
        years: spin.years,
        panels: spin.tracers.map((t) => ({
          tracer: t.name,
          units: t.units,
          series: spin!.tracks.filter((k) => k.tracer === t.name && k.region === region).map((k) => ({ label: k.layer, values: k.meanDeviation })),
        })),
      });
      const table = [['tracer', 'region', 'layer', 'verdict', 'in plain words'], ...spin.tracks.filter((k) => k.region === region).map((k) => [k.tracer, k.region, k.layer, k.verdict.status, k.verdict.sentence])];
      written.push({ heading: `Spin-up of ${spin.run}`, intro: spin.notes.join(' '), figures: [await writeFigure(fig)], table });
    }

    while (rasterising.length) await rasterising.shift();
    checkCancelled(opts.signal);
    const recipeBytes = await readFile(opts.recipePath);
    const recipeSha = createHash('sha256').update(recipeBytes).digest('hex');
    const files = new Set<string>([...result.inputs.map((i) => i.path)]);
    if (spin) for (const s of spin.snapshots) files.add(s.file);
    const inputs: { path: string; size: number; sha256: string }[] = [];
    for (const f of files) inputs.push({ path: f, size: (await stat(f)).size, sha256: await sha256File(f) });
    const date = new Date().toISOString();
    const recipeJson = recipeToJson(compared);
    const prov: Provenance = {
      tool: 'stillwater',
      version: opts.version,
      date,
      recipe: opts.recipePath,
      inputs: result.inputs,
      options: recipeJson.options,
      regions: [...new Set(result.rows.map((r) => r.region))],
      layers: compared.layers.map(layerLabel),
      variables: result.variables,
    };
    await folder.write('skill.json', skillJson(result, prov));
    await folder.write('skill.csv', skillCsv(result.rows));
    await folder.write('skill.md', skillMarkdown(result, prov, recipe.title));
    await folder.write('skill.tex', skillLatex(result, recipe.title));
    const provenance = {
      tool: 'stillwater',
      version: opts.version,
      date,
      recipe: { path: opts.recipePath, sha256: recipeSha, size: recipeBytes.length, content: JSON.parse(recipeBytes.toString('utf8')) as unknown },
      inputs,
      options: recipeJson.options,
      report: settingsJson(settings),
      figures: figureNames,
    };
    await folder.write('provenance.json', JSON.stringify(provenance, null, 1) + '\n');

    const v0 = result.variables[0];
    const page: ReportPage = {
      title: recipe.title ?? 'Model runs against the reference',
      compared: [
        ['Reference', recipe.reference.label],
        ['Runs', recipe.runs.map((r) => r.label).join('; ')],
        ['Variables', result.variables.map((v) => `${v.variable} (${typesetUnits(v.units)})`).join(', ')],
        ['Common grid', v0 ? `${v0.grid.kind}, ${v0.grid.nx} × ${v0.grid.ny} cells, ${v0.grid.nz} levels (${typeof recipe.options.commonGrid === 'string' ? "the reference's grid" : 'a regular grid set by the recipe'}), ${recipe.options.method} regridding` : '—'],
        ['Density', recipe.options.density === 'nominal' ? `nominal, ${recipe.options.nominalDensity} kg m⁻³` : `TEOS-10 from ${recipe.options.density.fields.temperature} and ${recipe.options.density.fields.salinity}`],
        ['Coverage threshold', `a common-grid cell gets a value when at least ${Math.round(recipe.options.coverage * 100)} % of it is covered`],
        ['Regions', prov.regions.join(', ')],
        ['Layers', prov.layers.join(', ')],
      ],
      sections: written,
      cautions: cautions(recipe, result, spin),
      provenance: [
        ['Program', `stillwater ${opts.version}`],
        ['Date', date],
        ['Recipe', `${opts.recipePath} (SHA-256 ${recipeSha})`],
        ['Inputs', `${inputs.length} files, ${inputs.reduce((n, i) => n + i.size, 0)} bytes in all`],
      ],
    };
    // the figures' SVG is read back from the staged folder one at a time rather than kept in memory
    await writeReportHtml(page, (text) => folder.append('report.html', text), async (f) => (await folder.readText(`figures/${f.name}.svg`)).replace(/^<\?xml[^>]*>\s*/, '').trimEnd());
    checkCancelled(opts.signal);
    await folder.commit();
    return { outDir: opts.outDir, figures: figureNames, rows: result.rows, costs: result.costs };
  } catch (e) {
    await Promise.allSettled(rasterising);
    await folder.discard();
    throw e;
  }
}

function settingsJson(s: ReportSettings) {
  return { ...s, mapLayers: s.mapLayers.map(layerLabel), lines: s.lines.map((l) => ({ name: l.name, ...l.spec })) };
}

/** The cautions that apply, in plain words. */
export function cautions(recipe: Recipe, result: ComparisonResult, spin: SpinupResult | null): string[] {
  const out: string[] = [];
  if (spin && !spin.summary.settled) out.push(`${spin.run} has not settled: ${spin.summary.sentence} Its skill partly reflects the spin-up, not only the model's physics and biology.`);
  if (spin?.summary.shortForDeep) out.push(`${spin.run} ran ${spin.summary.lastYear} model years, shorter than the deep ocean takes to ventilate (more than a thousand years in the deep North Pacific); its deep layers cannot have reached equilibrium.`);
  const converted = result.variables.filter((v) => v.conversions.some((c) => /nominal|1025|density/i.test(c.note)));
  if (recipe.options.density === 'nominal' && converted.length) {
    out.push(`Units of ${converted.map((v) => v.variable).join(', ')} were converted with a nominal seawater density of ${recipe.options.nominalDensity} kg m⁻³, which can be off by about 1 %; name temperature and salinity fields in the recipe for TEOS-10 density.`);
  }
  const regridded = [...new Set(result.variables.flatMap((v) => v.regridded))];
  if (regridded.length) out.push(`${regridded.join(', ')} ${regridded.length > 1 ? 'were' : 'was'} regridded (${recipe.options.method}) onto the common grid; features narrower than a common-grid cell, such as boundary currents and shelf seas, are smoothed out, and differences there say little.`);
  const low = result.rows.filter((r) => r.compared_fraction !== null && r.compared_fraction < 0.8 && r.n > 0);
  if (low.length) out.push(`In ${low.length} region × layer rows less than 80 % of the reference's cells were compared (coverage threshold ${recipe.options.coverage}, or the model and reference seafloors differ); those rows describe only part of the region.`);
  const empty = result.rows.filter((r) => r.n === 0);
  if (empty.length) out.push(`${empty.length} region × layer rows have no compared cells at all; their panels and table rows say so.`);
  return out;
}
