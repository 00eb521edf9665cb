/**
 * The Line view's own small map (equirectangular): click to add a waypoint, drag one to move it, right-click it
 * or press Delete on it to remove it; arrow keys move a focused waypoint by one degree. The great-circle path
 * the line samples is drawn through them. Changes go through the state (undo takes them back).
 */
import { greatCirclePath } from '../../app/render/line-path.js';
import { s } from '../elements.js';
import { coastlines } from '../plot/coast.js';
import { waypointLetter } from '../../app/figures/line-figure.js';
import { INK } from '../../app/figures/page.js';
import { choose, commitPreview, preview, state, type LineChoice } from '../state.js';
import { projectionOf } from './map-paint.js';

const W = 440;
const H = 220;

const toX = (lon: number): number => ((lon + 180) / 360) * W;
const toY = (lat: number): number => ((90 - lat) / 180) * H;
const round2 = (v: number): number => Math.round(v * 100) / 100;

export interface LineMap {
  el: SVGSVGElement;
  show(line: LineChoice): void;
}

export function lineMap(): LineMap {
  const label = 'Waypoints of the line: click to add, drag to move, right-click or Delete to remove';
  const svg = s('svg', { xmlns: 'http://www.w3.org/2000/svg', viewBox: `0 0 ${W} ${H}`, width: W, height: H, role: 'img', 'aria-label': label, class: 'figure-svg' }, s('title', {}, label));
  svg.classList.add('line-map');
  svg.setAttribute('id', 'line-map');
  svg.append(s('rect', { x: 0, y: 0, width: W, height: H, fill: '#eef3f7' }));
  const coast = s('path', { fill: 'none', stroke: '#5b636d', 'stroke-width': 0.6 });
  const path = s('g', { class: 'line-path', fill: 'none', stroke: '#c0392b', 'stroke-width': 1.6 });
  const marks = s('g', { class: 'waypoints' });
  svg.append(coast, path, marks);
  // coastlines of the equirectangular map are in projected metres: back to degrees through its extent
  const plate = projectionOf('plate');
  void coastlines('plate').then((lines) => {
    const e = plate.extent;
    let d = '';
    for (const line of lines) {
      for (let i = 0; i < line.length; i += 2) {
        const x = ((line[i] - e.xmin) / (e.xmax - e.xmin)) * W;
        const y = ((e.ymax - line[i + 1]) / (e.ymax - e.ymin)) * H;
        d += `${i === 0 ? 'M' : 'L'}${x.toFixed(1)},${y.toFixed(1)}`;
      }
    }
    coast.setAttribute('d', d);
  }).catch(() => undefined);

  const degreesAt = (ev: MouseEvent): [number, number] => {
    const r = svg.getBoundingClientRect();
    const lon = ((ev.clientX - r.left) / r.width) * 360 - 180;
    const lat = 90 - ((ev.clientY - r.top) / r.height) * 180;
    return [round2(Math.max(-180, Math.min(180, lon))), round2(Math.max(-89.99, Math.min(89.99, lat)))];
  };
  const setPoints = (points: [number, number][], during = false): void => {
    const line = { ...state.sel.line, points };
    if (during) preview({ line });
    else choose({ line });
  };

  let dragging: number | null = null;
  let focusAfter: number | null = null;
  svg.addEventListener('mousedown', (ev) => {
    if (ev.button !== 0) return;
    const t = ev.target as Element;
    const i = t.getAttribute('data-index');
    if (i !== null) {
      dragging = Number(i);
      ev.preventDefault();
      return;
    }
    setPoints([...state.sel.line.points, degreesAt(ev)]);
  });
  svg.addEventListener('mousemove', (ev) => {
    if (dragging === null) return;
    const pts = state.sel.line.points.map((p) => [...p] as [number, number]);
    pts[dragging] = degreesAt(ev);
    setPoints(pts, true);
  });
  const endDrag = (): void => {
    if (dragging === null) return;
    dragging = null;
    commitPreview();
  };
  svg.addEventListener('mouseup', endDrag);
  svg.addEventListener('mouseleave', endDrag);
  svg.addEventListener('contextmenu', (ev) => {
    const i = (ev.target as Element).getAttribute('data-index');
    if (i === null) return;
    ev.preventDefault();
    setPoints(state.sel.line.points.filter((_, k) => k !== Number(i)));
  });
  svg.addEventListener('keydown', (ev) => {
    const i = (ev.target as Element).getAttribute('data-index');
    if (i === null) return;
    const k = Number(i);
    const pts = state.sel.line.points.map((p) => [...p] as [number, number]);
    const moves: Record<string, [number, number]> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, 1], ArrowDown: [0, -1] };
    if (ev.key === 'Delete' || ev.key === 'Backspace') {
      ev.preventDefault();
      focusAfter = Math.min(k, pts.length - 2);
      setPoints(pts.filter((_, q) => q !== k));
    } else if (moves[ev.key]) {
      ev.preventDefault();
      pts[k] = [round2(Math.max(-180, Math.min(180, pts[k][0] + moves[ev.key][0]))), round2(Math.max(-89.99, Math.min(89.99, pts[k][1] + moves[ev.key][1])))];
      focusAfter = k;
      setPoints(pts);
    }
  });

  return {
    el: svg,
    show(line) {
      path.replaceChildren(
        ...greatCirclePath(line.points).map((piece) => s('path', { d: piece.map(([lon, lat], q) => `${q ? 'L' : 'M'}${toX(lon).toFixed(1)},${toY(lat).toFixed(1)}`).join('') })),
      );
      const refocus = focusAfter;
      focusAfter = null;
      marks.replaceChildren(
        ...line.points.map(([lon, lat], i) => {
          const g = s('g', {});
          const c = s('circle', { cx: toX(lon), cy: toY(lat), r: 6, fill: '#ffffff', stroke: INK, 'stroke-width': 1.5, 'data-index': i, tabindex: 0, role: 'button', 'aria-label': `Waypoint ${letter(i)} at ${lon}° E, ${lat}° N: arrows move it, Delete removes it`, class: 'waypoint' });
          g.append(c, s('text', { x: toX(lon) + 8, y: toY(lat) - 6, 'font-size': 11, 'font-weight': 600, 'pointer-events': 'none' }, letter(i)));
          return g;
        }),
      );
      if (refocus !== null && refocus >= 0) (marks.querySelector(`[data-index="${refocus}"]`) as SVGElement | null)?.focus();
    },
  };
}

/** Waypoints are named A, B, C… on the small map and along the section's top axis (one naming, app/figures). */
export const letter = waypointLetter;
