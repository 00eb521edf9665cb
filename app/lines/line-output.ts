/**
 * Files of a line: section.csv / section.json (every level at every sample) and
 * column-means.csv / column-means.json (one value per sample, over the cells where the reference and every run
 * have values, said in a '# ' line and a `cells` field). NaN is an empty CSV field or JSON null.
 */
import type { LineResult, SectionOf } from './line-report.js';
import { CSV_EOL, csvTable, type CsvCell } from '../output/csv.js';
import { COMPARED_CELLS } from './column-mean.js';
import { dataNumber } from '../output/number-format.js';

function columns(r: LineResult): { label: string; role: string; s: SectionOf }[] {
  return [
    { label: r.reference.label, role: 'reference', s: r.reference },
    ...r.runs.map((s) => ({ label: s.label, role: 'run', s })),
    ...r.differences.map((s) => ({ label: s.label, role: 'difference', s })),
  ];
}

export function sectionCsv(r: LineResult): string {
  const n = r.line.lon.length;
  const nz = r.depth.centres.length;
  const cols = columns(r);
  const rows: CsvCell[][] = [];
  for (let s = 0; s < n; s++) {
    for (let k = 0; k < nz; k++) {
      const i = k * n + s;
      // rows below the seafloor of every field carry nothing: leave them out
      if (!cols.some((c) => c.s.values[i] === c.s.values[i])) continue;
      rows.push([
        dataNumber(r.line.distanceKm[s], 9),
        dataNumber(r.line.lon[s], 9),
        dataNumber(r.line.lat[s], 9),
        dataNumber(r.depth.centres[k], 7),
        dataNumber(r.seafloorM[s], 7),
        ...cols.map((c) => dataNumber(c.s.values[i], 7)),
      ]);
    }
  }
  return csvTable(['distance_km', 'lon', 'lat', 'depth_m', 'seafloor_m', ...cols.map((c) => c.label)], rows);
}

export function columnMeansCsv(r: LineResult): string {
  const n = r.line.lon.length;
  const cols = columns(r);
  const rows: CsvCell[][] = [];
  for (let s = 0; s < n; s++) {
    rows.push([
      dataNumber(r.line.distanceKm[s], 9),
      dataNumber(r.line.lon[s], 9),
      dataNumber(r.line.lat[s], 9),
      dataNumber(r.seafloorM[s], 7),
      dataNumber(r.rangeThicknessM[s], 7),
      ...cols.map((c) => dataNumber(c.s.columnMean[s], 7)),
    ]);
  }
  // the comment line says which cells the means use (station CSVs carry '# ' lines the same way)
  return `# ${COMPARED_CELLS}; wet_thickness_m is the thickness they use.${CSV_EOL}` + csvTable(['distance_km', 'lon', 'lat', 'seafloor_m', 'wet_thickness_m', ...cols.map((c) => c.label)], rows);
}

function lineHeader(r: LineResult): Record<string, unknown> {
  return {
    variable: r.variable,
    units: r.units,
    kind: r.line.kind,
    method: r.method,
    spacing_km: r.line.spacingKm,
    waypoints: r.line.waypoints.map((p, i) => ({ lon: p.lon, lat: p.lat, distance_km: dataNumber(r.line.waypointKm[i], 9) })),
    distance_km: Array.from(r.line.distanceKm, (v) => dataNumber(v, 9)),
    lon: Array.from(r.line.lon, (v) => dataNumber(v, 9)),
    lat: Array.from(r.line.lat, (v) => dataNumber(v, 9)),
    seafloor_m: Array.from(r.seafloorM, (v) => dataNumber(v, 7)),
  };
}

/** section.json: values[level][sample] per field, depth axis downwards. */
export function sectionJson(r: LineResult): Record<string, unknown> {
  const n = r.line.lon.length;
  const nz = r.depth.centres.length;
  return {
    ...lineHeader(r),
    depth_m: Array.from(r.depth.centres),
    depth_edges_m: Array.from(r.depth.edges),
    fields: columns(r).map((c) => ({
      label: c.label,
      role: c.role,
      values: Array.from({ length: nz }, (_, k) => Array.from(c.s.values.subarray(k * n, (k + 1) * n), (v) => dataNumber(v, 7))),
    })),
  };
}

/** column-means.json: one thickness-weighted mean per sample and field. */
export function columnMeansJson(r: LineResult): Record<string, unknown> {
  return {
    ...lineHeader(r),
    depth_range_m: [r.range.top, r.range.bottom],
    cells: `${COMPARED_CELLS[0].toUpperCase()}${COMPARED_CELLS.slice(1)}.`,
    wet_thickness_m: Array.from(r.rangeThicknessM, (v) => dataNumber(v, 7)),
    fields: columns(r).map((c) => ({ label: c.label, role: c.role, values: Array.from(c.s.columnMean, (v) => dataNumber(v, 7)) })),
  };
}
