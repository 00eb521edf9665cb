/**
 * The data behind the Section, Profile and Line views as files to download (issue 14, "data out"): CSV with '# '
 * header lines, or CF NetCDF. The screen sends what it asks the figure for (the same inputs as 'view.section',
 * 'view.profile' and 'line.sample'); the data are computed again on the session's worker thread, from the levels
 * it keeps, never taken from what the browser sends.
 */
import { z } from 'zod';
import { StillwaterError } from '../errors.js';
import { dataSetCsv, dataSetNetcdf, type DataSet } from '../output/data-set.js';
import { findInterval } from '../render/pixel-lookup.js';
import { slug } from '../report/fields-netcdf.js';
import { lineDataSet, profileDataSet, sectionDataSet } from '../session/data-out.js';
import { profileData } from '../session/profile-data.js';
import { sectionData } from '../session/section-data.js';
import { sessionStore } from '../session/store.js';
import { ALL_PERIODS, type Period } from '../time/periods.js';
import { lineInput, sampleLineOfCall } from './line-sampling.js';
import { entry, type ServiceEntry } from './types.js';
import type { ExportedFile } from './view-export.js';

const format = z.enum(['csv', 'netcdf']);
const period = z.enum(ALL_PERIODS as [Period, ...Period[]]).default('annual');

async function fileOf(ds: DataSet, base: string, fmt: 'csv' | 'netcdf'): Promise<ExportedFile> {
  if (fmt === 'csv') return { fileName: `${base}.csv`, mime: 'text/csv', data: new TextEncoder().encode(dataSetCsv(ds)) };
  return { fileName: `${base}.nc`, mime: 'application/x-netcdf', data: await dataSetNetcdf(ds) };
}

export const viewDataServices: ServiceEntry[] = [
  entry({
    name: 'view.export-section',
    summary: 'The section on the screen (run, reference, difference over depth) as CSV or CF NetCDF bytes to download.',
    input: z.object({
      session: z.string().min(1),
      format,
      variable: z.string().min(1),
      run: z.string().min(1),
      kind: z.enum(['meridian', 'parallel', 'zonal']),
      at: z.number().finite().nullable().default(null),
      region: z.string().min(1).nullable().default(null),
      period,
    }),
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<ExportedFile> {
      const s = sessionStore.get(input.session);
      const d = await sectionData(s, input, ctx);
      const g = s.info.grid;
      let atEdges: [number, number] | null = null;
      if (d.atGrid !== null) {
        const edges = d.kind === 'meridian' ? g.lonEdges : g.latEdges;
        const i = findInterval(edges, d.atGrid);
        if (i >= 0) atEdges = [edges[i], edges[i + 1]];
      }
      const ds = sectionDataSet(d, { atEdges, referenceLabel: s.recipe.reference.label });
      const where = d.kind === 'zonal' ? `zonal-${d.region}` : `${d.kind}-${d.atGrid}`;
      return fileOf(ds, `stillwater-section-${slug(d.variable)}-${slug(d.run)}-${slug(where)}-${d.period}`, input.format);
    },
  }),
  entry({
    name: 'view.export-profile',
    summary: "The region's mean profile on the screen (the reference and every run) as CSV or CF NetCDF bytes to download.",
    input: z.object({ session: z.string().min(1), format, variable: z.string().min(1), region: z.string().min(1), period }),
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<ExportedFile> {
      const s = sessionStore.get(input.session);
      const d = await profileData(s, input.variable, input.region, ctx, input.period);
      return fileOf(profileDataSet(d, s.recipe.reference.label), `stillwater-profile-${slug(d.variable)}-${slug(d.region)}-${d.period}`, input.format);
    },
  }),
  entry({
    name: 'view.export-line',
    summary: 'The line on the screen (reference, runs, differences over depth and distance; NetCDF adds the column means) as CSV or CF NetCDF bytes.',
    input: lineInput.extend({ session: z.string().min(1), format }),
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<ExportedFile> {
      const s = sessionStore.get(input.session);
      const r = await sampleLineOfCall(input, ctx);
      if (r.line.lon.length < 2) throw new StillwaterError('E_INPUT', 'The line has fewer than two samples; there is nothing to export.');
      return fileOf(lineDataSet(r, s.recipe.reference.label), `stillwater-line-${slug(r.variable)}-${r.line.waypoints.length}-waypoints`, input.format);
    },
  }),
];
