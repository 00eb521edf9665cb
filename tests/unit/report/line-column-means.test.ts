/**
 * The report's line figures compare column means the way `stillwater line` does (only the cells where the
 * reference and every run have values; tests/integration/line.test.ts holds that path against numpy on
 * tests/fixtures/lines/make_seamount.py), and the column-mean panel says so under its title.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openField } from '../../../app/cf/open-field.js';
import { COLUMN_MEAN_CAPTION, sectionPanelsFigure } from '../../../app/figures/section-panels.js';
import { serialise } from '../../../app/figures/svg-tree.js';
import { lineReport } from '../../../app/lines/line-report.js';
import { sampleLine } from '../../../app/lines/run-line.js';
import { VariableCollector } from '../../../app/report/figure-data.js';

const FIX = join(__dirname, '..', '..', 'fixtures', 'lines');
const SPEC = { kind: 'meridian' as const, lon: 15, lat0: -25, lat1: 25 };

describe('column means in the report figures over a seamount', () => {
  it('equal the line command\'s compared means, which differ from each source\'s own wet-cell means there', async () => {
    const ref = await openField(join(FIX, 'seamount_ref.nc'), 'po4');
    const run = await openField(join(FIX, 'seamount_run.nc'), 'po4');
    try {
      const collector = new VariableCollector('PO4', 'umol kg-1', ref.grid, { mapLayers: [], basins: [], lines: [{ name: 'm15', spec: SPEC }], bottomTolerance: null });
      const sink = collector.sinkFor({ run: 'run', variable: 'PO4', units: 'umol kg-1', grid: ref.grid });
      for (let k = 0; k < ref.grid.vertical!.nz; k++) {
        const r = await ref.readLevel(0, k);
        const m = await run.readLevel(0, k);
        const d = m.map((v, c) => v - r[c]);
        await sink.write(k, m, d, r);
      }
      const line = collector.result().lines[0];
      const direct = await lineReport({ label: 'reference', field: ref }, [{ label: 'run', field: run }], sampleLine(SPEC));
      expect(Array.from(line.columnMeans[0].values)).toEqual(Array.from(direct.reference.columnMean));
      expect(Array.from(line.columnMeans[1].values)).toEqual(Array.from(direct.runs[0].columnMean));
      // near 5°S the run's seamount removes 300-1000 m: the reference's mean there is that of 0-300 m only
      // (make_seamount.py: 1.25 at the cell centre, against 1.95 over the reference's own wet cells)
      const s = direct.line.lat.findIndex((lat) => Math.abs(lat + 5) < 0.5);
      expect(s).toBeGreaterThanOrEqual(0);
      expect(direct.reference.columnMean[s]).toBeLessThan(1.5);

      const fig = sectionPanelsFigure({
        name: 'x', title: 't', quantity: 'PO4', units: 'umol kg-1', width: 'double', xLabel: 'Distance along the line (km)',
        grid: { xEdges: Float64Array.from({ length: line.line.lon.length + 1 }, (_, i) => i), depthEdges: ref.grid.vertical!.edges },
        seafloor: line.seafloor, reference: { label: 'reference', values: line.reference }, runs: line.runs, columnMeans: line.columnMeans,
      });
      expect(serialise(fig.svg)).toContain(COLUMN_MEAN_CAPTION);
    } finally {
      await ref.close?.();
      await run.close?.();
    }
  });
});
