/**
 * The data behind the Section, Profile and Line figures as data sets (app/output/data-set.ts) to download as CSV
 * or CF NetCDF (issue 14, "data out"): the same arrays the figures are drawn from, with their coordinates, bounds
 * and units, and header lines that say what, which period and where.
 */
import type { ProfileData, SectionData } from '../../contract/view-types.js';
import { lonLabel, latLabel } from '../figures/typeset.js';
import type { LineResult } from '../lines/line-report.js';
import type { DataCoord, DataField, DataSet } from '../output/data-set.js';
import { slug } from '../report/fields-netcdf.js';

const centresOf = (e: ArrayLike<number>): Float64Array => Float64Array.from({ length: e.length - 1 }, (_, i) => 0.5 * (e[i] + e[i + 1]));

function depthCoord(edges: ArrayLike<number>, centres?: ArrayLike<number>): DataCoord {
  return {
    name: 'depth',
    dims: ['depth'],
    values: centres ? Float64Array.from(centres) : centresOf(edges),
    edges,
    attrs: { standard_name: 'depth', long_name: 'depth below the sea surface', units: 'm', positive: 'down', axis: 'Z' },
    csv: 'depth (m)',
  };
}

const LON_ATTRS = { standard_name: 'longitude', units: 'degrees_east' };
const LAT_ATTRS = { standard_name: 'latitude', units: 'degrees_north' };

/** A field over (depth, x) for each source, named VARIABLE_reference, VARIABLE_run1… and VARIABLE_run1_minus_reference… */
function sourceFields(variable: string, units: string, dims: string[], sources: { key: string; label: string; values: ArrayLike<number> }[]): DataField[] {
  return sources.map((s) => ({ name: `${slug(variable)}_${s.key}`, dims, values: s.values, units, longName: `${variable}: ${s.label}`, csv: `${s.label} (${units})` }));
}

export interface SectionWhere {
  /** the grid column (meridian) or row (parallel) the section runs along: its edges, degrees */
  atEdges: [number, number] | null;
  referenceLabel: string;
}

/** A meridian, parallel or zonal-mean section: the run, the reference and their difference over (depth, latitude or longitude). */
export function sectionDataSet(d: SectionData, where: SectionWhere): DataSet {
  const n = d.edges.length - 1;
  const nz = d.depthEdges.length - 1;
  const x = d.axis === 'latitude' ? 'lat' : 'lon';
  const place =
    d.kind === 'zonal'
      ? `zonal mean over ${d.region}, area-weighted over the cells of each latitude row where run and reference both have water`
      : d.kind === 'meridian'
        ? `meridian section along ${lonLabel(d.atGrid!)} (grid column nearest to ${lonLabel(d.at!)})`
        : `parallel section along ${latLabel(d.atGrid!)} (grid row nearest to ${latLabel(d.at!)})`;
  const coords: DataCoord[] = [
    depthCoord(d.depthEdges),
    { name: x, dims: [x], values: centresOf(d.edges), edges: d.edges, attrs: { ...(x === 'lat' ? LAT_ATTRS : LON_ATTRS), axis: x === 'lat' ? 'Y' : 'X' }, csv: x === 'lat' ? 'lat (degrees_north)' : 'lon (degrees_east)' },
    { name: 'seafloor_depth', dims: [x], values: Float64Array.from(d.seafloor), attrs: { standard_name: 'sea_floor_depth_below_sea_surface', long_name: 'depth of the deepest water (the seafloor of the section)', units: 'm', positive: 'down' }, csv: 'seafloor_depth (m)' },
  ];
  if (d.kind !== 'zonal' && d.atGrid !== null) {
    const other = x === 'lat' ? 'lon' : 'lat';
    coords.push({ name: other, dims: [], values: Float64Array.of(d.atGrid), edges: where.atEdges ?? undefined, attrs: other === 'lat' ? LAT_ATTRS : LON_ATTRS, csv: other });
  }
  return {
    title: `${d.variable} along a section: ${d.run}, ${where.referenceLabel} and their difference`,
    header: [
      ['variable', d.variable],
      ['units', d.units],
      ['period', d.period],
      ['section', place],
      ['run', d.run],
      ['reference', where.referenceLabel],
    ],
    dimensions: [
      { name: 'depth', size: nz },
      { name: x, size: n },
    ],
    coords,
    fields: sourceFields(d.variable, d.units, ['depth', x], [
      { key: 'run', label: d.run, values: d.model },
      { key: 'reference', label: `${where.referenceLabel} (reference)`, values: d.reference },
      { key: 'run_minus_reference', label: `${d.run} minus reference`, values: d.difference },
    ]),
    table: ['depth', x],
  };
}

/** The mean profile of a region: the reference and every run over depth. */
export function profileDataSet(d: ProfileData, referenceLabel: string): DataSet {
  return {
    title: `${d.variable}: area-weighted mean profile over ${d.region}`,
    header: [
      ['variable', d.variable],
      ['units', d.units],
      ['period', d.period],
      ['region', `${d.region} (area-weighted mean of each level; each run over the cells where it and the reference both have water)`],
      ['reference', referenceLabel],
      ['runs', d.runs.map((r) => r.label).join('; ')],
    ],
    dimensions: [{ name: 'depth', size: d.depthCentres.length }],
    coords: [depthCoord(d.depthEdges, d.depthCentres)],
    fields: sourceFields(d.variable, d.units, ['depth'], [
      { key: 'reference', label: `${referenceLabel} (reference)`, values: d.reference },
      ...d.runs.map((r, i) => ({ key: `run${i + 1}`, label: r.label, values: r.values })),
    ]),
    table: ['depth'],
  };
}

/** A line: every source and difference over (depth, distance along the line), the column means over distance. */
export function lineDataSet(r: LineResult, referenceLabel: string): DataSet {
  const n = r.line.lon.length;
  const nz = r.depth.centres.length;
  const d = r.line.distanceKm;
  const edges = new Float64Array(n + 1);
  for (let s = 1; s < n; s++) edges[s] = (d[s - 1] + d[s]) / 2;
  edges[0] = d[0];
  edges[n] = d[n - 1];
  const waypoints = r.line.waypoints.map((p, i) => `${String.fromCharCode(65 + (i % 26))} ${lonLabel(p.lon)} ${latLabel(p.lat)} at ${Number(r.line.waypointKm[i].toFixed(3))} km`).join('; ');
  const sources = [
    { key: 'reference', label: `${referenceLabel} (reference)`, s: r.reference },
    ...r.runs.map((s, i) => ({ key: `run${i + 1}`, label: s.label, s })),
    ...r.differences.map((s, i) => ({ key: `run${i + 1}_minus_reference`, label: s.label, s })),
  ];
  const means: DataField[] = sources.map((x) => ({
    name: `${slug(r.variable)}_${x.key}_column_mean`,
    dims: ['distance'],
    values: x.s.columnMean,
    units: r.units,
    longName: `${r.variable}: ${x.label}, thickness-weighted column mean over ${r.range.top}–${r.range.bottom} m (cells where the reference and every run have values)`,
    csv: null,
  }));
  return {
    title: `${r.variable} along a line: reference, runs and run minus reference`,
    header: [
      ['variable', r.variable],
      ['units', r.units],
      ['period', 'annual'],
      ['line', `${r.line.kind} through ${waypoints}; sampled every ${r.line.spacingKm} km (${r.method} between wet cell centres)`],
      ['reference', referenceLabel],
      ['runs', r.runs.map((s) => s.label).join('; ')],
    ],
    dimensions: [
      { name: 'depth', size: nz },
      { name: 'distance', size: n },
    ],
    coords: [
      depthCoord(r.depth.edges, r.depth.centres),
      { name: 'distance', dims: ['distance'], values: Float64Array.from(d), edges, attrs: { long_name: 'distance along the line from its first waypoint', units: 'km' }, csv: 'distance (km)' },
      { name: 'lon', dims: ['distance'], values: Float64Array.from(r.line.lon), attrs: LON_ATTRS, csv: 'lon (degrees_east)' },
      { name: 'lat', dims: ['distance'], values: Float64Array.from(r.line.lat), attrs: LAT_ATTRS, csv: 'lat (degrees_north)' },
      { name: 'seafloor_depth', dims: ['distance'], values: Float64Array.from(r.seafloorM), attrs: { standard_name: 'sea_floor_depth_below_sea_surface', long_name: 'bottom of the deepest wet level of the reference (0 on land)', units: 'm', positive: 'down' }, csv: 'seafloor_depth (m)' },
    ],
    fields: [...sourceFields(r.variable, r.units, ['depth', 'distance'], sources.map((x) => ({ key: x.key, label: x.label, values: x.s.values }))), ...means],
    table: ['depth', 'distance'],
  };
}
