// The screen's field download (service view.export-slice): the CSV has one row a cell with a value; input that does
// not describe a field is refused with one sentence (E_INPUT). The NetCDF bytes are read back by netCDF4-python in
// tests/e2e/screen-look.test.ts.
import { describe, expect, it } from 'vitest';
import { StillwaterError } from '../../../app/errors.js';
import { sliceCsv, viewExportServices } from '../../../app/services/view-export.js';

const slice = { format: 'csv' as const, variable: 'T', label: 'run', units: 'degC', lonEdges: Float64Array.of(0, 1, 2), latEdges: Float64Array.of(-1, 0), depth: null, depthLabel: 'bottom', values: Float32Array.of(4.5, NaN) };

describe('field download', () => {
  it('writes one CSV row a cell with a value: centre, bounds, value (RFC 4180 line ends)', () => {
    expect(sliceCsv(slice)).toBe('lon,lat,lon_min,lon_max,lat_min,lat_max,T (degC)\r\n0.5,-0.5,0,1,-1,0,4.5\r\n');
  });
  it('refuses values that do not fit the grid, in one sentence', () => {
    let e: unknown;
    try {
      sliceCsv({ ...slice, values: Float32Array.of(1, 2, 3) });
    } catch (x) {
      e = x;
    }
    expect(e).toBeInstanceOf(StillwaterError);
    expect((e as StillwaterError).code).toBe('E_INPUT');
    expect((e as Error).message).toBe('The field to export has 3 values for 2 × 1 cells.');
  });
  it('takes JSON arrays with null for missing values, as the browser sends them', () => {
    const input = viewExportServices[0].input.parse({ ...slice, lonEdges: [0, 1, 2], latEdges: [-1, 0], values: [4.5, null] }) as typeof slice;
    expect(Number.isNaN(input.values[1])).toBe(true);
    expect(input.lonEdges).toBeInstanceOf(Float64Array);
  });
});
