/**
 * "Report…": the report of the open recipe (`stillwater report`, the same code) written into a folder the
 * person names, as a job with progress and Cancel in the status line; where it went is said beside the form.
 */
import type { ReportWritten, SessionInfo } from '../../contract/view-types.js';
import { h } from '../elements.js';
import { tracked } from '../service-client.js';
import type { Say } from './pair-form.js';

export function reportForm(s: SessionInfo, say: Say): HTMLElement {
  const dir = s.recipePath.replace(/[\\/][^\\/]*$/, '');
  const base = (s.recipePath.replace(/^.*[\\/]/, '').replace(/\.json$/i, '') || 'recipe').replace(/[^A-Za-z0-9._-]+/g, '-');
  const input = h('input', { type: 'text', value: `${dir}/report-${base}`, 'aria-label': 'Write the report into the folder', class: 'wide', id: 'report-path' });
  const b = h('button', { type: 'submit', id: 'report-write' }, 'Write report');
  const result = h('p', { class: 'report-result small', id: 'report-result', role: 'status' });
  const form = h(
    'form',
    { class: 'report-form' },
    h('label', { class: 'field' }, h('span', { class: 'field-label' }, 'Report folder (new; complete or not written at all)'), input),
    b,
    result,
  );
  form.addEventListener('submit', async (ev) => {
    ev.preventDefault();
    b.disabled = true;
    result.className = 'report-result small busy';
    result.textContent = 'Writing the report (progress and Cancel in the status line)…';
    try {
      const r = await tracked<ReportWritten>('Report', 'report.write', { session: s.session, out: input.value.trim() });
      result.className = 'report-result small done';
      result.replaceChildren('Written: ', h('code', { id: 'report-written' }, r.html), ` (${r.figures} figures, SVG and PNG, in ${r.outDir}/figures).`);
      say(`Wrote the report to ${r.outDir}.`);
    } catch (e) {
      const text = e instanceof Error ? e.message : String(e);
      result.className = 'report-result small error';
      result.setAttribute('role', 'alert');
      result.textContent = text;
      say(text, 'error');
    } finally {
      b.disabled = false;
    }
  });
  return form;
}
