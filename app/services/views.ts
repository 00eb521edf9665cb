/**
 * What the workbench's views draw, as thin service entries over app/session: open a recipe as a session, then
 * slices of its fields on the common grid (levels, layer means, the bottom, sections, zonal means, profiles)
 * and the skill rows of a variable. Every entry that names a session runs on the worker thread that opened it
 * (`session: 'use'`); the files are read there, never on the thread that serves the screen.
 */
import { dirname } from 'node:path';
import { z } from 'zod';
import type { ComparisonResult } from '../compare/run.js';
import { skillCsv, skillJson, skillLatex, skillMarkdown, type Provenance } from '../report/index.js';
import { StillwaterError } from '../errors.js';
import { openDataset } from '../io/open.js';
import { attrString } from '../io/types.js';
import { loadRecipe, recipeToJson, validateRecipe } from '../recipe/index.js';
import { checkOutputFile } from '../output/output-target.js';
import { writeOutputFile } from '../output/output-set.js';
import { recipeFiles } from '../recipe/recipe-files.js';
import { screenSectionSchema } from '../recipe/screen-schema.js';
import { regionNamed } from '../session/sources.js';
import { guardRecipe } from './recipe-guard.js';
import { levelData } from '../session/level-data.js';
import { profileData } from '../session/profile-data.js';
import { sectionData } from '../session/section-data.js';
import { openSession, type Session } from '../session/session.js';
import { spinupAhead } from './spinup.js';
import { sessionStore } from '../session/store.js';
import type { LevelData, ProfileCycleData, ProfileData, SectionData, SessionInfo, TableText } from '../../contract/view-types.js';
import { entry, type ServiceEntry } from './types.js';
import { profileCycleData } from '../session/profile-cycle.js';
import { ALL_PERIODS, type Period } from '../time/periods.js';

const sessionInput = z.object({ session: z.string().min(1) });

/** A period of the year (annual, a month, a season); the year when left out. */
const periodInput = z.enum(ALL_PERIODS as [Period, ...Period[]]).default('annual');

/** Seconds that reading headers may take before the worker is stopped (damaged files can make a library loop). */
const HEADER_DEADLINE_S = 20;

const aheadStarted = new WeakSet<Session>();

/**
 * Once the screen has its first map, the session computes ahead, between requests: the skill rows of the
 * variable shown, then of the others (Scores, Diagram), then the spin-up of runs with snapshots (its banner and view).
 */
function computeAhead(s: Session, cacheDir: string, variable: string): void {
  if (aheadStarted.has(s)) return;
  aheadStarted.add(s);
  s.startAhead(variable);
  spinupAhead(s, cacheDir);
}

export const viewsServices: ServiceEntry[] = [
  entry({
    name: 'view.open',
    summary: 'Open a recipe as a workbench session: sources, variables and units, regions, depth choices, the common grid.',
    input: z.object({ recipe: z.string().min(1) }),
    heavy: true,
    session: 'open',
    deadlineSeconds: HEADER_DEADLINE_S,
    async run(input, ctx): Promise<SessionInfo> {
      const path = ctx.resolvePath(input.recipe);
      const recipe = await loadRecipe(path, { confine: ctx.resolvePath });
      guardRecipe(recipe, ctx);
      const s = await openSession(recipe, path, ctx.cacheDir);
      await sessionStore.put(s);
      return s.info;
    },
  }),
  entry({
    name: 'view.pair',
    summary: 'Pair a variable of a run (a file and a variable in it) with a reference variable; adds the run when it is new.',
    input: z.object({
      session: z.string().min(1),
      run: z.string().min(1),
      variable: z.string().min(1),
      file: z.string().min(1),
      name: z.string().min(1),
      units: z.string().min(1).optional(),
    }),
    heavy: true,
    session: 'use',
    deadlineSeconds: HEADER_DEADLINE_S,
    async run(input, ctx): Promise<SessionInfo> {
      const s = sessionStore.get(input.session);
      const file = ctx.resolvePath(input.file);
      if (!s.recipe.reference.variables[input.variable]) {
        throw new StillwaterError('E_INPUT', `The reference has no variable '${input.variable}' to pair with.`, { variable: input.variable });
      }
      const json = recipeToJson(s.recipe) as { runs: { label: string; variables: Record<string, unknown> }[] };
      let run = json.runs.find((r) => r.label === input.run);
      if (!run) {
        run = { label: input.run, variables: {} };
        json.runs.push(run);
      }
      run.variables[input.variable] = { file, name: input.name, ...(input.units ? { units: input.units } : {}) };
      const recipe = validateRecipe(json, s.recipe.baseDir, { confine: ctx.resolvePath });
      guardRecipe(recipe, ctx);
      // the levels already read stay valid for the other variables
      const next = await s.reopen(recipe, input.variable);
      await sessionStore.put(next);
      return next.info;
    },
  }),
  entry({
    name: 'view.variables',
    summary: 'The data variables of a file (two or more dimensions), with their units and long names, for pairing.',
    input: z.object({ file: z.string().min(1) }),
    heavy: true,
    deadlineSeconds: HEADER_DEADLINE_S,
    async run(input, ctx): Promise<{ name: string; units: string; longName: string; dims: string[] }[]> {
      const ds = await openDataset(ctx.resolvePath(input.file));
      try {
        const coords = new Set(ds.dimensions.map((d) => d.name));
        return ds.variables
          .filter((v) => v.dims.length >= 2 && !coords.has(v.name) && v.dtype !== 'char')
          .map((v) => ({ name: v.name, units: attrString(v.attrs, 'units') ?? '', longName: attrString(v.attrs, 'long_name') ?? attrString(v.attrs, 'standard_name') ?? '', dims: v.dims }));
      } finally {
        await ds.close();
      }
    },
  }),
  entry({
    name: 'view.save',
    summary: 'Save the session as a recipe .json file (app/output: complete or unchanged), never over a file it reads.',
    input: z.object({ session: z.string().min(1), path: z.string().min(1), screen: screenSectionSchema.optional() }),
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<{ path: string }> {
      const s = sessionStore.get(input.session);
      if (input.screen) s.recipe = { ...s.recipe, screen: input.screen };
      const path = ctx.resolvePath(input.path);
      checkOutputFile(path, { extension: '.json', inputs: recipeFiles(s.recipe).map((f) => f.file) });
      await writeOutputFile(path, JSON.stringify(recipeToJson(s.recipe, dirname(path)), null, 2) + '\n');
      s.recipePath = path;
      s.info = { ...s.info, recipePath: path, modified: false, ...(input.screen ? { screen: input.screen } : {}) };
      return { path };
    },
  }),
  entry({
    name: 'view.level',
    summary: 'Model, reference and difference on the common grid for one level, layer mean, or the bottom.',
    input: z.object({ session: z.string().min(1), variable: z.string().min(1), run: z.string().min(1), layer: z.string().min(1), period: periodInput }),
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<LevelData> {
      const s = sessionStore.get(input.session);
      const data = await levelData(s, input.variable, input.run, input.layer, ctx, input.period);
      computeAhead(s, ctx.cacheDir, input.variable);
      if (data.layer.kind === 'level') s.readAhead(input.variable, input.run, data.layer.k ?? 0, input.period);
      return data;
    },
  }),
  entry({
    name: 'view.region',
    summary: "The cells of the common grid (j * nx + i) that belong to one of the session's regions.",
    input: z.object({ session: z.string().min(1), region: z.string().min(1) }),
    heavy: true,
    session: 'use',
    async run(input): Promise<{ region: string; cells: Int32Array }> {
      const r = await regionNamed(sessionStore.get(input.session), input.region);
      return { region: r.name, cells: Int32Array.from(r.cells) };
    },
  }),
  entry({
    name: 'view.section',
    summary: 'A section along a meridian or a parallel, or the zonal mean of a region, with the seafloor.',
    input: z.object({
      session: z.string().min(1),
      variable: z.string().min(1),
      run: z.string().min(1),
      kind: z.enum(['meridian', 'parallel', 'zonal']),
      at: z.number().finite().nullable().default(null),
      region: z.string().min(1).nullable().default(null),
      period: periodInput,
    }),
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<SectionData> {
      return sectionData(sessionStore.get(input.session), input, ctx);
    },
  }),
  entry({
    name: 'view.profile',
    summary: 'Area-weighted mean profile of a region: the reference and every run.',
    input: z.object({ session: z.string().min(1), variable: z.string().min(1), region: z.string().min(1), period: periodInput }),
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<ProfileData> {
      return profileData(sessionStore.get(input.session), input.variable, input.region, ctx, input.period);
    },
  }),
  entry({
    name: 'view.profileCycle',
    summary: "The monthly cycle of a region's mean over a depth choice's levels (month × depth): the reference, a run and their difference.",
    input: z.object({ session: z.string().min(1), variable: z.string().min(1), run: z.string().min(1), region: z.string().min(1), layer: z.string().min(1) }),
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<ProfileCycleData> {
      return profileCycleData(sessionStore.get(input.session), input, ctx);
    },
  }),
  entry({
    name: 'view.skill',
    summary: "Skill rows of a session for one variable (or every variable when it is null), computed once per session state and shared by the views.",
    input: z.object({ session: z.string().min(1), variable: z.string().min(1).nullable().default(null) }),
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<ComparisonResult> {
      return sessionStore.get(input.session).skill(input.variable, { signal: ctx.signal, onProgress: ctx.progress });
    },
  }),
  entry({
    name: 'view.close',
    summary: 'Close a session (the page went away): its files are closed and its levels forgotten.',
    input: sessionInput,
    heavy: true,
    session: 'close',
    async run(input): Promise<{ closed: boolean }> {
      return { closed: await sessionStore.close(input.session) };
    },
  }),
  entry({
    name: 'view.table',
    summary: 'Skill rows (a comparison result, perhaps filtered) as CSV, Markdown, LaTeX or JSON text, by the report writers.',
    input: z.object({
      result: z.object({ rows: z.array(z.record(z.string(), z.unknown())), costs: z.array(z.unknown()), variables: z.array(z.unknown()), inputs: z.array(z.unknown()) }),
      recipePath: z.string().nullable().default(null),
      format: z.enum(['csv', 'markdown', 'latex', 'json']),
    }),
    async run(input): Promise<TableText> {
      const result = input.result as unknown as ComparisonResult;
      const prov: Provenance = {
        tool: 'Stillwater workbench',
        version: 'session',
        date: new Date().toISOString(),
        recipe: input.recipePath,
        inputs: result.inputs,
        options: null,
        regions: [...new Set(result.rows.map((r) => r.region))],
        layers: [...new Set(result.rows.map((r) => r.layer))],
        variables: result.variables,
      };
      switch (input.format) {
        case 'csv':
          return { format: 'csv', fileName: 'skill.csv', mime: 'text/csv', text: skillCsv(result.rows) };
        case 'markdown':
          return { format: 'markdown', fileName: 'skill.md', mime: 'text/markdown', text: skillMarkdown(result, prov) };
        case 'latex':
          return { format: 'latex', fileName: 'skill.tex', mime: 'application/x-tex', text: skillLatex(result) };
        default:
          return { format: 'json', fileName: 'skill.json', mime: 'application/json', text: skillJson(result, prov) };
      }
    },
  }),
];

/** For tests: close every session of this thread. */
export function closeAllViewSessions(): Promise<void> {
  return sessionStore.closeAll();
}
