/**
 * The map's options: which field, the colour range (refused at the field when it makes no sense), the colour
 * scale and its stretch, a range shared by every run, contour lines, and zoom.
 */
import { DIFF_SCALES, FIELD_SCALES } from '../../app/render/named-scales.js';
import { h } from '../elements.js';
import { choose, type AppState } from '../state.js';
import { buttonGroup } from '../widgets/button-group.js';
import { accept, readNumber, refuse } from '../widgets/field-check.js';
import type { MapChoice } from './map-paint.js';

export interface MapToolbar {
  /** show the state and the drawn range */
  show(st: AppState, choice: MapChoice | null): void;
}

export function mapToolbar(toolbar: HTMLElement, difference: boolean, st: AppState, zoom: (factor: number | null) => void, download: (format: 'csv' | 'netcdf') => void, panels: (format: 'svg' | 'png') => void): MapToolbar {
  const fieldGroup = difference
    ? null
    : buttonGroup({ label: 'Field shown', options: [['model', 'Run'], ['reference', 'Reference']] as const, value: st.sel.mapField, onPick: (v) => choose({ mapField: v }) });
  if (fieldGroup) toolbar.append(fieldGroup.el);

  const id = difference ? 'diff' : 'field';
  const minIn = h('input', { type: 'number', step: 'any', 'aria-label': 'Colour range minimum', class: 'range-input', id: `${id}-range-min` });
  const maxIn = h('input', { type: 'number', step: 'any', 'aria-label': 'Colour range maximum', class: 'range-input', id: `${id}-range-max` });
  const applyRange = (): void => {
    const a = readNumber(minIn, 'The colour range minimum');
    const b = readNumber(maxIn, 'The colour range maximum');
    if (typeof a === 'string') return refuse(minIn, a);
    accept(minIn);
    if (typeof b === 'string') return refuse(maxIn, b);
    if (!(b > a)) return refuse(maxIn, `The colour range maximum ${b} must be above the minimum ${a}; the range was not changed.`);
    if (st.sel.logColour && !difference && !(a > 0)) return refuse(minIn, `A logarithmic colour scale needs a minimum above zero; ${a} is not.`);
    accept(maxIn);
    choose(difference ? { diffRange: [a, b] } : { fieldRange: [a, b] });
  };
  minIn.addEventListener('change', applyRange);
  maxIn.addEventListener('change', applyRange);
  const auto = h('button', { type: 'button', title: 'Range from the 2nd to the 98th percentile of this level' }, 'Auto range');
  auto.addEventListener('click', () => {
    accept(minIn);
    accept(maxIn);
    choose(difference ? { diffRange: null } : { fieldRange: null });
  });
  const lock = h('input', { type: 'checkbox', id: `${id}-lock-range` });
  lock.addEventListener('change', () => choose({ lockRange: lock.checked }));
  const lockLabel = h('label', { class: 'toolbar-label', title: 'One automatic range over the reference and every run, so that maps of different runs compare by colour' }, lock, ' same for all runs');

  const scales = difference ? DIFF_SCALES : FIELD_SCALES;
  const scaleSel = h('select', { 'aria-label': 'Colour scale', id: `${id}-colour-scale` });
  for (const sc of scales) scaleSel.append(h('option', { value: sc.id }, sc.label));
  scaleSel.addEventListener('change', () => choose(difference ? { diffScale: scaleSel.value } : { fieldScale: scaleSel.value }));
  const log = h('input', { type: 'checkbox', id: 'field-log-colour' });
  log.addEventListener('change', () => choose({ logColour: log.checked, fieldRange: null }));
  const logLabel = difference ? null : h('label', { class: 'toolbar-label', title: 'Colour by the logarithm of the values, for fields that span decades (nutrients, chlorophyll); values at or below zero take the lowest colour' }, log, ' log');
  const contours = h('input', { type: 'checkbox', id: `${id}-contours` });
  contours.addEventListener('change', () => choose({ contours: contours.checked }));
  const contourLabel = h('label', { class: 'toolbar-label', title: 'Contour lines at the colour bar\'s ticks, labelled' }, contours, ' contours');
  const crop = h('input', { type: 'checkbox', id: `${id}-crop-region` });
  crop.addEventListener('change', () => choose({ cropToRegion: crop.checked }));
  const cropLabel = h('label', { class: 'toolbar-label', title: 'Show only the region chosen above' + (difference ? ', with its bias, RMSE and correlation' : '') }, crop, ' crop to region');

  const zoomIn = h('button', { type: 'button', id: 'map-zoom-in', title: 'Zoom in (+ on the map; or the mouse wheel)', 'aria-label': 'Zoom in' }, '+');
  const zoomOut = h('button', { type: 'button', id: 'map-zoom-out', title: 'Zoom out (− on the map)', 'aria-label': 'Zoom out' }, '−');
  const reset = h('button', { type: 'button', id: 'map-zoom-reset', title: 'The whole map again (0 on the map)' }, 'Whole map');
  zoomIn.addEventListener('click', () => zoom(2));
  zoomOut.addEventListener('click', () => zoom(0.5));
  reset.addEventListener('click', () => zoom(null));

  toolbar.append(
    h('span', { class: 'toolbar-label' }, 'Colour range'),
    h('span', { class: 'field-with-message' }, minIn),
    h('span', { class: 'toolbar-sep' }, 'to'),
    h('span', { class: 'field-with-message' }, maxIn),
    auto,
    lockLabel,
    h('label', { class: 'toolbar-label' }, 'Scale ', scaleSel),
    ...(logLabel ? [logLabel] : []),
    contourLabel,
    cropLabel,
    h('span', { class: 'segmented', role: 'group', 'aria-label': 'Zoom' }, zoomIn, zoomOut, reset),
    h(
      'span',
      { class: 'segmented', role: 'group', 'aria-label': 'Download the field shown' },
      h('button', { type: 'button', id: `${id}-download-csv`, title: 'The field shown, one row a cell (centre, bounds, value)', onclick: () => download('csv') }, 'CSV'),
      h('button', { type: 'button', id: `${id}-download-netcdf`, title: 'The field shown as CF NetCDF on the common grid', onclick: () => download('netcdf') }, 'NetCDF'),
    ),
    h(
      'span',
      { class: 'segmented', role: 'group', 'aria-label': 'Export the reference, every run and every difference as one figure' },
      h('button', { type: 'button', id: `${id}-panels-svg`, title: 'Reference | each run | each run minus reference, one shared colour scale and one shared difference scale, with the region’s bias, RMSE and r in each difference panel: SVG, 180 mm', onclick: () => panels('svg') }, 'Panels SVG'),
      h('button', { type: 'button', id: `${id}-panels-png`, title: 'The same panels as PNG, 180 mm at 300 dpi', onclick: () => panels('png') }, 'Panels PNG'),
    ),
    h('span', { class: 'toolbar-hint' }, 'Point to probe, click to pin; drag to pan, wheel to zoom; on the focused map, arrows move the probe.'),
  );

  return {
    show(s, choice) {
      fieldGroup?.set(s.sel.mapField);
      if (choice && minIn.getAttribute('aria-invalid') !== 'true' && maxIn.getAttribute('aria-invalid') !== 'true') {
        minIn.value = String(Number(choice.min.toPrecision(4)));
        maxIn.value = String(Number(choice.max.toPrecision(4)));
      }
      lock.checked = s.sel.lockRange;
      scaleSel.value = difference ? s.sel.diffScale : s.sel.fieldScale;
      log.checked = s.sel.logColour;
      contours.checked = s.sel.contours;
      crop.checked = s.sel.cropToRegion;
      reset.disabled = !s.sel.mapWindow;
      zoomOut.disabled = !s.sel.mapWindow;
    },
  };
}
