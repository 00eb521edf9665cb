/**
 * CF view of a data file for the screen: its grid, time axis and variables as `stillwater inspect` shows
 * them, optionally with each data variable's decoded min, max, mean and count (read level by level).
 */
import { z } from 'zod';
import { inspectFile, type InspectReport } from '../cf/inspect.js';
import { entry, type ServiceEntry } from './types.js';

export const cfServices: ServiceEntry[] = [
  entry({
    name: 'cf.inspect',
    summary: "A file's grid (kind, size, ranges), time axis (calendar, first and last dates) and variables; with stats, value ranges.",
    input: z.object({ path: z.string().min(1), stats: z.boolean().optional() }),
    heavy: true,
    async run(input, ctx): Promise<InspectReport> {
      return inspectFile(ctx.resolvePath(input.path), { stats: input.stats ?? false, progress: (f, m) => ctx.progress(f, m) });
    },
  }),
];
