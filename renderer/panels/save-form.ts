/** The form that saves the session (its pairings and the view) as a recipe file. */
import type { SessionInfo } from '../../contract/view-types.js';
import { call } from '../bridge.js';
import { h } from '../elements.js';
import { screenOf, setSession, state } from '../state.js';
import type { Say } from './pair-form.js';

export function saveForm(s: SessionInfo, say: Say): HTMLElement {
  const dir = s.recipePath.replace(/[\\/][^\\/]*$/, '');
  const input = h('input', { type: 'text', value: `${dir}/session-recipe.json`, 'aria-label': 'Save the recipe as', class: 'wide', id: 'save-path' });
  const b = h('button', { type: 'submit' }, 'Save');
  const form = h('form', { class: 'save-form' }, h('label', { class: 'field' }, h('span', { class: 'field-label' }, 'Save session as recipe'), input), b);
  form.addEventListener('submit', async (ev) => {
    ev.preventDefault();
    try {
      const r = await call<{ path: string }>('view.save', { session: s.session, path: input.value.trim(), screen: screenOf(state.sel) });
      if (state.session) setSession({ ...state.session, recipePath: r.path, modified: false });
      say(`Saved the recipe to ${r.path}.`);
    } catch (e) {
      say(e instanceof Error ? e.message : String(e), 'error');
    }
  });
  return form;
}
