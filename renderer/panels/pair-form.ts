/** The form that pairs a variable of a model file with a reference variable, adding a run when asked. */
import type { SessionInfo } from '../../contract/view-types.js';
import { call } from '../bridge.js';
import { clearCaches, tracked } from '../service-client.js';
import { h, select } from '../elements.js';
import { setSession } from '../state.js';
import { showFileAbout } from './file-about.js';
import { pickFile } from './file-picker.js';

export type Say = (t: string, kind?: 'info' | 'error') => void;

export function pairForm(s: SessionInfo, say: Say): HTMLElement {
  const form = h('form', { class: 'pair-form', 'aria-label': 'Pair a variable' });
  let file = '';
  let names: { name: string; units: string; longName: string }[] = [];
  let refKey = s.variables[0]?.key ?? '';
  let runLabel = s.runs[0]?.label ?? '';
  let name = '';
  const newRun = h('input', { type: 'text', placeholder: 'or a new run label', 'aria-label': 'New run label', class: 'wide' });
  const fileText = h('span', { class: 'muted small picked-file' }, 'no file chosen');
  const nameBox = h('span', {});
  const units = h('input', { type: 'text', placeholder: 'units (if the file lacks them)', 'aria-label': 'Units override', class: 'wide' });
  const choose = h('button', { type: 'button' }, 'Choose file…');
  const submit = h('button', { type: 'submit', class: 'primary' }, 'Pair');
  const about = h('button', { type: 'button', class: 'about-file', hidden: true }, 'About this file…');
  about.addEventListener('click', () => file && showFileAbout(file));
  const drawNames = (): void => {
    nameBox.replaceChildren(
      names.length
        ? select('Variable in file', names.map((n) => ({ value: n.name, label: `${n.name}${n.units ? ` (${n.units})` : ''}` })), name, (v) => (name = v))
        : h('span', {}),
    );
  };
  choose.addEventListener('click', async () => {
    const p = await pickFile('Choose a model file', (e) => e.kind === 'dataset', ['nc', 'nc4', 'h5', 'tif', 'tiff']);
    if (!p) return;
    file = p;
    fileText.textContent = p.split(/[\\/]/).pop() ?? p;
    fileText.title = p;
    about.hidden = false;
    try {
      names = await call('view.variables', { file: p });
      name = names[0]?.name ?? '';
    } catch (e) {
      names = [];
      say(e instanceof Error ? e.message : String(e), 'error');
    }
    drawNames();
  });
  form.append(
    select('Reference variable', s.variables.map((v) => ({ value: v.key, label: v.key })), refKey, (v) => (refKey = v)),
    select('Run', s.runs.map((r) => ({ value: r.label, label: r.label })), runLabel, (v) => (runLabel = v)),
    newRun,
    h('div', { class: 'row' }, choose, fileText, about),
    nameBox,
    units,
    h('div', { class: 'row' }, submit),
  );
  form.addEventListener('submit', async (ev) => {
    ev.preventDefault();
    if (!file || !name) {
      say('Choose a file and a variable in it first.', 'error');
      return;
    }
    try {
      const next = await tracked<SessionInfo>('Pairing', 'view.pair', {
        session: s.session,
        run: newRun.value.trim() || runLabel,
        variable: refKey,
        file,
        name,
        ...(units.value.trim() ? { units: units.value.trim() } : {}),
      });
      clearCaches();
      setSession(next);
      say(`Paired ${name} with ${refKey}.`);
    } catch (e) {
      say(e instanceof Error ? e.message : String(e), 'error');
    }
  });
  return form;
}
