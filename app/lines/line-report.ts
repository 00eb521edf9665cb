/**
 * A line through the common grid: the reference and every run sampled along it, the differences
 * (run minus reference), the seafloor outline and the column means over a depth range.
 * All fields must already be on the same (common) grid and in the same units.
 */
import type { FieldSource } from '../cf/field-source.js';
import { StillwaterError } from '../errors.js';
import type { VerticalAxis } from '../grid/types.js';
import { skillStats, type SkillNumbers } from '../stats/weighted.js';
import { checkDepthRange, comparedColumnMeans, wholeColumn, type DepthRange } from './column-mean.js';
import { pointWeights, type PointMethod } from './location-weights.js';
import type { SampledLine } from './sample-path.js';
import { sampleSection, seafloorOutline } from './section.js';

export interface NamedField {
  label: string;
  field: FieldSource;
}

export interface LineOptions {
  method?: PointMethod;
  coverage?: number;
  /** depth range of the column means (default: the whole column) */
  range?: DepthRange;
  t?: number;
  progress?: (fraction: number, message: string) => void;
}

export interface SectionOf {
  label: string;
  /** level-major, values[k * n + s] */
  values: Float32Array;
  /** column mean over the range, per sample, over the cells where the reference and every run have values */
  columnMean: Float64Array;
}

export interface LineResult {
  variable: string;
  units: string;
  line: SampledLine;
  method: PointMethod;
  depth: { centres: Float64Array; edges: Float64Array };
  /** bottom edge of the deepest wet layer of the reference, per sample, m (0 on land) */
  seafloorM: Float64Array;
  range: DepthRange;
  /** thickness inside the range per sample where the reference and every run have values (what the column means use), m */
  rangeThicknessM: Float64Array;
  reference: SectionOf;
  runs: SectionOf[];
  /** run minus reference, in the order of runs */
  differences: SectionOf[];
  /** each run against the reference over the section, weighted by layer thickness × along-line length */
  skill: ({ label: string } & SkillNumbers)[];
}

/** Along-line length each sample stands for: half the distance to each neighbour, km. */
export function sampleLengths(distanceKm: Float64Array): Float64Array {
  const n = distanceKm.length;
  const len = new Float64Array(n);
  for (let s = 0; s < n; s++) {
    const a = s > 0 ? distanceKm[s - 1] : distanceKm[s];
    const b = s + 1 < n ? distanceKm[s + 1] : distanceKm[s];
    len[s] = 0.5 * (b - a);
  }
  return len;
}

/** Weights of the section cells (level-major): thickness (m) × along-line length (km). */
function sectionWeights(axis: VerticalAxis, distanceKm: Float64Array): Float64Array {
  const len = sampleLengths(distanceKm);
  const n = len.length;
  const w = new Float64Array(axis.nz * n);
  for (let k = 0; k < axis.nz; k++) for (let s = 0; s < n; s++) w[k * n + s] = axis.thickness[k] * len[s];
  return w;
}

/** A 2-D field is one layer of unknown thickness: give it a nominal axis so columns are that one value. */
const ONE_LAYER: VerticalAxis = { nz: 1, centres: Float64Array.of(0), edges: Float64Array.of(0, 1), thickness: Float64Array.of(1), boundsDerived: true };

function sameAxis(a: VerticalAxis | null, b: VerticalAxis | null): boolean {
  if (a === null || b === null) return a === b;
  return a.nz === b.nz && a.edges.every((e, k) => Math.abs(e - b.edges[k]) < 1e-6);
}

export async function lineReport(reference: NamedField, runs: NamedField[], line: SampledLine, opts: LineOptions = {}): Promise<LineResult> {
  const grid = reference.field.grid;
  for (const r of runs) {
    const g = r.field.grid;
    if (g.horizontal.nx !== grid.horizontal.nx || g.horizontal.ny !== grid.horizontal.ny || !sameAxis(g.vertical, grid.vertical)) {
      throw new StillwaterError('E_GRID', `Run '${r.label}' is not on the common grid of the reference; regrid it first.`, { file: r.field.file, variable: r.field.variable });
    }
  }
  const axis = grid.vertical ?? ONE_LAYER;
  const range = opts.range ?? wholeColumn(axis);
  if (grid.vertical) checkDepthRange(range, axis);
  const method = opts.method ?? 'bilinear';
  const weights = pointWeights(grid.horizontal, line.lon, line.lat, method);
  const n = line.lon.length;
  const all = [reference, ...runs];
  const sections: SectionOf[] = [];
  for (let f = 0; f < all.length; f++) {
    const values = await sampleSection(all[f].field, weights, {
      t: opts.t,
      coverage: opts.coverage,
      progress: (x) => opts.progress?.((f + x) / all.length, `sampling ${all[f].label} along the line`),
    });
    sections.push({ label: all[f].label, values, columnMean: new Float64Array(n) });
  }
  // compared means: only the cells where the reference and every run have values (COMPARED_CELLS)
  const compared = comparedColumnMeans(sections.map((s) => s.values), n, axis, range);
  sections.forEach((s, f) => (s.columnMean = compared.means[f]));
  const ref = sections[0];
  const differences = sections.slice(1).map((s) => {
    const d = new Float32Array(s.values.length);
    for (let i = 0; i < d.length; i++) d[i] = s.values[i] - ref.values[i];
    const cm = new Float64Array(n);
    for (let i = 0; i < n; i++) cm[i] = s.columnMean[i] - ref.columnMean[i];
    return { label: `${s.label} minus reference`, values: d, columnMean: cm };
  });
  const cellWeights = sectionWeights(axis, line.distanceKm);
  const skill = sections.slice(1).map((s) => ({ label: s.label, ...skillStats(s.values, ref.values, cellWeights) }));
  return {
    variable: reference.field.variable,
    units: reference.field.units.text,
    line,
    method,
    depth: { centres: axis.centres, edges: axis.edges },
    seafloorM: seafloorOutline(ref.values, n, axis),
    range,
    rangeThicknessM: compared.thickness,
    reference: ref,
    runs: sections.slice(1),
    differences,
    skill,
  };
}
