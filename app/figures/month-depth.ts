/**
 * The monthly cycle of a region's mean as a month × depth section (months along x, depth down): the
 * reference, the run, and the run minus the reference, drawn as depth sections (section-panels.ts) whose
 * samples are the 12 months, each month centred on its index (January at 0).
 */
import type { ProfileCycleData } from '../../contract/view-types.js';
import type { FigureWidth } from './page.js';
import type { Figure } from './parts.js';
import { sectionPanelsFigure } from './section-panels.js';

const MONTH_SHORT = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** The month centred on x (x = 0 is January); empty between months. */
export function monthAt(x: number): string {
  const m = Math.round(x);
  return Math.abs(x - m) < 1e-6 && m >= 0 && m < 12 ? MONTH_SHORT[m] : '';
}

export interface MonthDepthSpec {
  data: ProfileCycleData;
  /** the variable as people read it, e.g. "Phosphate (PO4)" */
  name: string;
  referenceLabel: string;
  width: FigureWidth;
}

export function monthDepthFigure(spec: MonthDepthSpec): Figure {
  const d = spec.data;
  const nk = d.depthEdges.length - 1;
  const xEdges = Float64Array.from({ length: 13 }, (_, i) => i - 0.5);
  // each month's deepest level where the reference or the run has a value: the section's floor
  const floor = new Float64Array(12);
  for (let m = 0; m < 12; m++) {
    for (let k = 0; k < nk; k++) {
      if (Number.isFinite(d.reference[k * 12 + m]) || Number.isFinite(d.model[k * 12 + m])) floor[m] = d.depthEdges[k + 1];
    }
  }
  return sectionPanelsFigure({
    name: `monthly-cycle-${d.variable}-${d.region}`,
    title: `${spec.name}: monthly cycle, ${d.region}, ${d.layer.label}`,
    subtitle: `Area-weighted mean of each level and month; ${d.run} over the cells where it and ${spec.referenceLabel} both have values`,
    quantity: d.variable,
    units: d.units,
    width: spec.width,
    grid: { xEdges, depthEdges: d.depthEdges },
    xLabel: 'Month',
    formatX: monthAt,
    seafloor: floor,
    reference: { label: spec.referenceLabel, values: Float32Array.from(d.reference) },
    runs: [{ label: d.run, values: Float32Array.from(d.model), difference: Float32Array.from(d.difference) }],
  });
}
