/**
 * The sources panel: the recipe, the reference and the runs with their variables and units; open a
 * recipe, pair a run's variable with a reference variable (adding a run), save the session as a recipe.
 */
import type { SessionInfo, SourceInfo } from '../../contract/view-types.js';
import { call } from '../bridge.js';
import { clearCaches, openSession, tracked } from '../data.js';
import { h, select } from '../dom.js';
import { setSession, state, subscribe } from '../state.js';
import { pickFile } from './file-picker.js';

export function sourcesPanel(el: HTMLElement, say: (t: string, kind?: 'info' | 'error') => void): void {
  el.classList.add('sources');

  const open = async (): Promise<void> => {
    const path = await pickFile('Open a recipe', (e) => e.kind === 'recipe', ['json']);
    if (!path) return;
    try {
      setSession(await openSession(path));
      say(`Opened ${path}.`);
    } catch (e) {
      say(e instanceof Error ? e.message : String(e), 'error');
    }
  };

  const sourceBlock = (src: SourceInfo, kind: 'reference' | 'run'): HTMLElement => {
    const vars = h('ul', { class: 'var-list' });
    for (const v of src.variables) {
      vars.append(
        h(
          'li',
          { title: `${v.name} in ${v.file}${v.longName ? '\n' + v.longName : ''}` },
          h('span', { class: 'var-key' }, v.key),
          h('span', { class: 'var-name' }, v.name),
          h('span', { class: `var-units${v.units === '?' ? ' bad' : ''}` }, v.units || 'no units'),
        ),
      );
    }
    const snaps = src.snapshots?.length ? h('p', { class: 'muted small' }, `${src.snapshots.length} spin-up snapshots, years ${src.snapshots[0].year ?? '?'}–${src.snapshots[src.snapshots.length - 1].year ?? '?'}`) : null;
    return h('section', { class: `source ${kind}` }, h('h3', {}, h('span', { class: 'source-kind' }, kind === 'reference' ? 'Reference' : 'Run'), src.label), vars, snaps);
  };

  const pairForm = (s: SessionInfo): HTMLElement => {
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
      h('div', { class: 'row' }, choose, fileText),
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
  };

  const saveForm = (s: SessionInfo): HTMLElement => {
    const dir = s.recipePath.replace(/[\\/][^\\/]*$/, '');
    const input = h('input', { type: 'text', value: `${dir}/session-recipe.json`, 'aria-label': 'Save the recipe as', class: 'wide', id: 'save-path' });
    const b = h('button', { type: 'submit' }, 'Save');
    const form = h('form', { class: 'save-form' }, h('label', { class: 'field' }, h('span', { class: 'field-label' }, 'Save session as recipe'), input), b);
    form.addEventListener('submit', async (ev) => {
      ev.preventDefault();
      try {
        const r = await call<{ path: string }>('view.save', { session: s.session, path: input.value.trim() });
        if (state.session) setSession({ ...state.session, recipePath: r.path, modified: false });
        say(`Saved the recipe to ${r.path}.`);
      } catch (e) {
        say(e instanceof Error ? e.message : String(e), 'error');
      }
    });
    return form;
  };

  const render = (): void => {
    const s = state.session;
    const openButton = h('button', { type: 'button', id: 'open-recipe' }, 'Open recipe…');
    openButton.addEventListener('click', () => void open());
    if (!s) {
      el.replaceChildren(h('h2', {}, 'Sources'), openButton);
      return;
    }
    const pairToggle = h('details', { class: 'pair' }, h('summary', {}, 'Pair a variable or add a run…'), pairForm(s));
    const saveToggle = h('details', { class: 'save' }, h('summary', {}, 'Save as recipe…'), saveForm(s));
    el.replaceChildren(
      h('h2', {}, 'Sources'),
      h('div', { class: 'recipe-line' }, h('strong', {}, s.title), s.modified ? h('span', { class: 'badge' }, 'changed') : null),
      h('p', { class: 'muted small path', title: s.recipePath }, s.recipePath),
      h('div', { class: 'row' }, openButton),
      sourceBlock(s.reference, 'reference'),
      ...s.runs.map((r) => sourceBlock(r, 'run')),
      h('p', { class: 'muted small' }, `Common grid: ${s.grid.nx} × ${s.grid.ny} cells, ${s.grid.nz} levels to ${Math.round(s.grid.depthEdges[s.grid.nz])} m.`),
      pairToggle,
      saveToggle,
    );
  };
  subscribe((_st, changed) => {
    if (changed.has('session')) render();
  });
  render();
}
