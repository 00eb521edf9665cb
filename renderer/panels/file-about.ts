/**
 * "About this file": what a data file holds, before it goes into a comparison. Its header first (format,
 * size, title, dimensions, variables, global attributes: the files.describe service), then the CF view of it
 * (grid, time axis, which variables a comparison can use and why not: cf.inspect), and on request the value
 * ranges of each data variable (cf.inspect with stats, read level by level in a worker, with progress).
 */
import type { InspectReport } from '../../app/cf/inspect.js';
import type { FileDescription } from '../../app/services/files.js';
import { typesetUnits } from '../../app/figures/typeset.js';
import { formatNumber } from '../../app/output/number-format.js';
import { call } from '../bridge.js';
import { h } from '../elements.js';
import { tracked } from '../service-client.js';

/** Open the dialog for `path`; it closes with Escape or its Close button. */
export function showFileAbout(path: string): void {
  const dialog = h('dialog', { class: 'file-about', 'aria-label': `About ${baseName(path)}` });
  const header = h('section', { class: 'about-header' }, h('p', { class: 'muted' }, 'Reading the header…'));
  const cf = h('section', { class: 'about-cf' });
  const close = h('button', { type: 'button' }, 'Close');
  dialog.append(h('h2', {}, baseName(path)), h('p', { class: 'muted small path' }, path), header, cf, h('div', { class: 'picker-actions' }, close));
  document.body.append(dialog);
  const done = (): void => {
    dialog.close();
    dialog.remove();
  };
  close.addEventListener('click', done);
  dialog.addEventListener('cancel', done);
  dialog.showModal();
  close.focus();

  void call<FileDescription>('files.describe', { path }).then(
    (d) => header.replaceChildren(...headerParts(d)),
    (e) => header.replaceChildren(refusal(e)),
  );
  const inspect = async (stats: boolean): Promise<void> => {
    try {
      const r = stats ? await tracked<InspectReport>(`Value ranges of ${baseName(path)}`, 'cf.inspect', { path, stats }) : await call<InspectReport>('cf.inspect', { path });
      cf.replaceChildren(...cfParts(r, stats ? null : () => void inspect(true)));
    } catch (e) {
      cf.replaceChildren(refusal(e));
    }
  };
  void inspect(false);
}

function headerParts(d: FileDescription): Node[] {
  const attrs = Object.entries(d.attributes);
  return [
    h('p', {}, `${d.format}, ${sizeText(d.size)}${d.title ? ` — ${d.title}` : ''}`),
    h('p', { class: 'small' }, 'Dimensions: ', d.dimensions.map((x) => `${x.name} = ${x.size}${x.unlimited ? ' (unlimited)' : ''}`).join(', ') || 'none'),
    attrs.length
      ? h('details', {}, h('summary', {}, `Global attributes (${attrs.length})`), h('dl', { class: 'about-attrs small' }, ...attrs.flatMap(([k, v]) => [h('dt', {}, k), h('dd', {}, String(v))])))
      : h('p', { class: 'muted small' }, 'No global attributes.'),
  ];
}

function cfParts(r: InspectReport, askStats: (() => void) | null): Node[] {
  const out: Node[] = [];
  for (const g of r.grid ? [r.grid, ...r.otherGrids] : []) {
    const depth = g.depth ? `, ${g.nz} levels ${formatNumber(g.depth[0])}–${formatNumber(g.depth[1])} m` : '';
    out.push(
      h('p', { class: 'about-grid' }, `Grid of ${g.variables.join(', ')}: ${g.kind}, ${g.nx} × ${g.ny}${depth}; longitude ${formatNumber(g.lon[0])}…${formatNumber(g.lon[1])}, latitude ${formatNumber(g.lat[0])}…${formatNumber(g.lat[1])}${g.periodic ? ', periodic in longitude' : ''}${g.boundsDerived ? ' (cell bounds derived from the centres)' : ''}.`),
    );
  }
  if (!r.grid) out.push(h('p', { class: 'muted' }, 'No data variable sits on a grid this workbench can build.'));
  out.push(h('p', { class: 'about-time' }, r.time ? `Time (${r.time.variable}): ${r.time.count} step${r.time.count === 1 ? '' : 's'}, ${r.time.first} to ${r.time.last}, calendar ${r.time.calendar}.` : 'No time axis.'));
  const data = r.variables.filter((v) => v.role === 'data');
  const head = ['Variable', 'Units', 'Shape', ...(askStats ? [] : ['Min', 'Max', 'Mean', 'Valid'])];
  const rows = data.map((v) =>
    h(
      'tr',
      { class: v.problem ? 'unusable' : '' },
      h('td', { title: v.long_name ?? v.standard_name ?? '' }, v.name),
      h('td', {}, v.units ? typesetUnits(v.units) : '—'),
      h('td', {}, v.problem ? h('span', { class: 'bad' }, v.problem) : v.shape.join(' × ')),
      ...(askStats ? [] : [v.stats?.min, v.stats?.max, v.stats?.mean].map((x) => h('td', { class: 'num' }, x == null ? '—' : formatNumber(x)))),
      ...(askStats ? [] : [h('td', { class: 'num' }, v.stats ? `${v.stats.count} of ${v.stats.total}` : '—')]),
    ),
  );
  out.push(h('table', { class: 'about-vars small' }, h('thead', {}, h('tr', {}, ...head.map((x) => h('th', {}, x)))), h('tbody', {}, ...rows)));
  if (askStats) {
    const b = h('button', { type: 'button', class: 'about-stats' }, 'Value ranges (reads every value)');
    b.addEventListener('click', askStats);
    out.push(b);
  }
  for (const n of r.notes) out.push(h('p', { class: 'muted small' }, n));
  return out;
}

function refusal(e: unknown): HTMLElement {
  return h('p', { class: 'bad', role: 'alert' }, e instanceof Error ? e.message : String(e));
}

function baseName(p: string): string {
  return p.split(/[\\/]/).pop() ?? p;
}

function sizeText(bytes: number): string {
  return bytes < 1024 * 1024 ? `${(bytes / 1024).toFixed(1)} KiB` : `${(bytes / 1024 / 1024).toFixed(1)} MiB`;
}
