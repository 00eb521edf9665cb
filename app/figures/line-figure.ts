/**
 * The figure of a line (a transect through waypoints): the reference, each run and each run minus the reference
 * along the line, and the column means below, as the report draws it and as the workbench's Line view shows
 * and exports it (one builder, so the screen and the report cannot drift apart).
 */
import type { FigureWidth } from './page.js';
import type { Figure } from './parts.js';
import { sectionPanelsFigure } from './section-panels.js';
import type { SectionMark } from './section-panel.js';

export interface LineFigureSpec {
  name: string;
  /** the quantity, e.g. "PO4" */
  variable: string;
  units: string;
  /** what the line is called in the title: "atlantic", "A → B → C" */
  lineName: string;
  width: FigureWidth;
  spacingKm: number;
  /** how the fields were sampled between cell centres */
  method: string;
  /** depth range of the column means (m), or null for the whole water column */
  meansRange: [number, number] | null;
  distanceKm: ArrayLike<number>;
  depthEdges: ArrayLike<number>;
  seafloor: ArrayLike<number>;
  reference: { label: string; values: Float32Array; columnMean: ArrayLike<number> };
  runs: { label: string; values: Float32Array; difference: Float32Array; columnMean: ArrayLike<number> }[];
  fixedDifference?: number | null;
  marks?: SectionMark[];
  stretch?: boolean;
}

/** Edges halfway between sample positions, the outer ones half a step beyond the ends. */
export function sampleEdges(d: ArrayLike<number>): Float64Array {
  const n = d.length;
  const e = new Float64Array(n + 1);
  for (let s = 1; s < n; s++) e[s] = (d[s - 1] + d[s]) / 2;
  e[0] = d[0] - (n > 1 ? (d[1] - d[0]) / 2 : 1);
  e[n] = d[n - 1] + (n > 1 ? (d[n - 1] - d[n - 2]) / 2 : 1);
  return e;
}

/** Waypoints as marks on the top axis: A, B, C… at their distance along the line. */
export function waypointLetters(distanceKm: ArrayLike<number>): SectionMark[] {
  return Array.from(distanceKm, (at, i) => ({ at, label: waypointLetter(i) }));
}

/** A, B, … Z, then AA, AB, … */
export function waypointLetter(i: number): string {
  return i < 26 ? String.fromCharCode(65 + i) : waypointLetter(Math.floor(i / 26) - 1) + String.fromCharCode(65 + (i % 26));
}

export function lineFigure(spec: LineFigureSpec): Figure {
  const means = spec.meansRange ? `column means thickness-weighted over ${spec.meansRange[0]}–${spec.meansRange[1]} m` : 'column means thickness-weighted over the whole water column';
  return sectionPanelsFigure({
    name: spec.name,
    title: `${spec.variable} along ${spec.lineName}: section and column means`,
    subtitle: `Sampled every ${spec.spacingKm} km (${spec.method} between wet cell centres); ${means}, over the cells where the reference and every run have values.`,
    quantity: spec.variable,
    units: spec.units,
    width: spec.width,
    grid: { xEdges: sampleEdges(spec.distanceKm), depthEdges: spec.depthEdges },
    xLabel: 'Distance along the line (km)',
    seafloor: spec.seafloor,
    reference: { label: spec.reference.label, values: spec.reference.values },
    runs: spec.runs.map((r) => ({ label: r.label, values: r.values, difference: r.difference })),
    fixedDifference: spec.fixedDifference,
    stretch: spec.stretch,
    marks: spec.marks,
    columnMeans: [{ label: spec.reference.label, values: spec.reference.columnMean }, ...spec.runs.map((r) => ({ label: r.label, values: r.columnMean }))],
  });
}
