/**
 * The readout over a section figure of app/figures: where the pointer is over a panel's plot area, the value of
 * that panel's field in the cell below it, with its position and depth. A thin handler on the inserted figure;
 * the figure itself is the one the export writes.
 */
import { depthScale } from '../../app/figures/section-panel.js';
import type { SectionGrid } from '../../app/figures/section-raster.js';
import { typesetUnits } from '../../app/figures/typeset.js';
import { findInterval } from '../../app/render/pixel-lookup.js';
import { h } from '../elements.js';

export interface ReadoutSpec {
  grid: SectionGrid;
  depthMax: number;
  stretch?: boolean;
  /** the values of a panel (data-panel of its plot area), level-major [k * n + s], or null */
  valuesOf(panel: string): ArrayLike<number> | null;
  /** a panel's name for the readout */
  nameOf(panel: string): string;
  /** the x position as text: "30°S", "1250 km" */
  formatX(x: number): string;
  units: string;
}

/** Hook the readout to `svg`; returns the element that shows it (role status, for screen readers too). */
export function sectionReadout(svg: SVGSVGElement, spec: ReadoutSpec): HTMLElement {
  const out = h('p', { class: 'section-readout', role: 'status', 'aria-live': 'polite' }, 'Point at a section to read its values.');
  const n = spec.grid.xEdges.length - 1;
  const nz = spec.grid.depthEdges.length - 1;
  const areas = [...svg.querySelectorAll<SVGRectElement>('rect.panel-area[data-panel]')];
  svg.addEventListener('mousemove', (ev) => {
    const m = svg.getScreenCTM();
    if (!m) return;
    const p = new DOMPoint(ev.clientX, ev.clientY).matrixTransform(m.inverse());
    for (const a of areas) {
      const x = Number(a.getAttribute('x'));
      const y = Number(a.getAttribute('y'));
      const w = Number(a.getAttribute('width'));
      const hh = Number(a.getAttribute('height'));
      if (p.x < x || p.x > x + w || p.y < y || p.y > y + hh) continue;
      const panel = a.dataset.panel ?? '';
      const at = spec.grid.xEdges[0] + ((p.x - x) / w) * (spec.grid.xEdges[n] - spec.grid.xEdges[0]);
      const depth = depthScale(spec.depthMax, [y, y + hh], spec.stretch).invert(p.y);
      const s = findInterval(spec.grid.xEdges, at);
      const k = findInterval(spec.grid.depthEdges, depth);
      const values = spec.valuesOf(panel);
      const v = values && s >= 0 && k >= 0 && k < nz ? values[k * n + s] : NaN;
      const where = `${spec.formatX(at)}, ${Math.round(depth)} m`;
      out.textContent = `${spec.nameOf(panel)} at ${where}: ${Number.isFinite(v) ? `${String(Number(v.toPrecision(4))).replace(/^-/, "−")} ${typesetUnits(spec.units)}` : 'no value (below the seafloor or not compared)'}`;
      out.dataset.panel = panel;
      out.dataset.cell = s >= 0 && k >= 0 ? `${k},${s}` : '';
      out.dataset.value = Number.isFinite(v) ? String(v) : '';
      return;
    }
  });
  return out;
}
