/**
 * The report for the workbench: `stillwater report` run on a session's recipe, on the worker thread that holds
 * the session (the comparison, the figures and their PNGs are heavy), with progress and cancel like every job.
 * The output folder passes ctx.resolvePath, the one path guard: browser mode writes only inside the folders
 * named at start. The folder is complete or absent (app/report/output-folder.ts).
 */
import { join } from 'node:path';
import { z } from 'zod';
import { StillwaterError } from '../errors.js';
import { toolVersion } from '../package-root.js';
import { landRings, svgToPng } from '../report/report-tools.js';
import { runReport } from '../report/run-report.js';
import { sessionStore } from '../session/store.js';
import type { ReportWritten } from '../../contract/view-types.js';
import { entry, type ServiceEntry } from './types.js';

export const reportServices: ServiceEntry[] = [
  entry({
    name: 'report.write',
    summary: "Write the report of a session's recipe (report.html, figures as SVG and PNG, skill tables, provenance) into a new folder.",
    input: z.object({ session: z.string().min(1), out: z.string().min(1) }),
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<ReportWritten> {
      const s = sessionStore.get(input.session);
      if (s.info.modified) {
        throw new StillwaterError('E_INPUT', `The session's recipe has changes that are not saved: save it first (Save as recipe…), so that the report's provenance names the recipe it compared.`, { path: s.recipePath });
      }
      const outDir = ctx.resolvePath(input.out);
      const result = await runReport(s.recipe, {
        recipePath: s.recipePath,
        outDir,
        version: toolVersion(),
        land: landRings(),
        toPng: svgToPng,
        cacheDir: ctx.cacheDir,
        signal: ctx.signal,
        onProgress: (f, m) => ctx.progress(f, m),
      });
      return { outDir: result.outDir, html: join(result.outDir, 'report.html'), figures: result.figures.length };
    },
  }),
];
