/** The status line: what runs in the background, how far it is, and a button to stop it. */
import { cancelAll, onJobs, runningJobs } from '../service-client.js';
import { h } from '../elements.js';

export function statusLine(el: HTMLElement): { say(text: string, kind?: 'info' | 'error'): void } {
  el.classList.add('status-line');
  const text = h('span', { class: 'status-text', id: 'status-text', role: 'status' }, 'Ready.');
  const bar = h('progress', { class: 'status-progress', max: 1, value: 0, hidden: true, 'aria-label': 'Progress' });
  const stop = h('button', { type: 'button', id: 'status-cancel', disabled: true }, 'Cancel');
  stop.addEventListener('click', () => void cancelAll());
  const note = h('span', { class: 'status-note' }, 'All data stays on this machine.');
  el.append(text, bar, stop, note);
  let lastSaid = 'Ready.';
  let lastKind: 'info' | 'error' = 'info';
  const refresh = (): void => {
    const jobs = runningJobs();
    if (jobs.length === 0) {
      text.textContent = lastSaid;
      text.classList.toggle('error', lastKind === 'error');
      bar.hidden = true;
      stop.disabled = true;
      return;
    }
    const j = jobs[jobs.length - 1];
    text.classList.remove('error');
    text.textContent = `${j.label}${j.message ? ': ' + j.message : '…'}${jobs.length > 1 ? ` (+${jobs.length - 1} more)` : ''}`;
    bar.hidden = false;
    if (j.fraction > 0) bar.value = j.fraction;
    else bar.removeAttribute('value');
    stop.disabled = false;
  };
  onJobs(refresh);
  return {
    say(t, kind = 'info') {
      lastSaid = t;
      lastKind = kind;
      refresh();
    },
  };
}
