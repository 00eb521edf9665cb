/** The banner above the scores table: whether each scored run has settled, asked for in the background. */
import type { SpinupSummary } from '../../app/spinup/types.js';
import { tracked } from '../service-client.js';
import { h } from '../elements.js';
import { state, type AppState } from '../state.js';
import { errorText } from './view.js';

/** Verdicts asked for by the scores view, per session and run (a failed request is asked again next time). */
const verdicts = new Map<string, Promise<SpinupSummary | null>>();

/**
 * The banner above the scores table: for every run that lists spin-up snapshots, whether it has settled
 * ('spinup.verdict', heavy, so in the background: the table never waits for it); one plain line for the runs
 * without snapshots, whose settling is unknown.
 */
export function spinupBanner(el: HTMLElement, st: AppState): void {
  const session = st.session;
  if (!session) {
    el.replaceChildren();
    return;
  }
  const withSnapshots = session.runs.filter((r) => r.snapshots?.length).map((r) => r.label);
  const without = session.runs.filter((r) => !r.snapshots?.length).map((r) => r.label);
  const unknown = (): HTMLElement | null =>
    without.length
      ? h('p', { class: 'unknown' }, `Whether ${without.join(', ')} ${without.length > 1 ? 'have' : 'has'} settled is unknown: ${without.length > 1 ? 'they list' : 'it lists'} no spin-up snapshots (runs[i].snapshots).`)
      : null;
  if (!withSnapshots.length) {
    el.className = 'scores-spinup-banner busy';
    el.replaceChildren(...[unknown()].filter((x): x is HTMLElement => !!x));
    return;
  }
  el.className = 'scores-spinup-banner busy';
  el.replaceChildren(h('p', {}, `Checking whether ${withSnapshots.join(', ')} ${withSnapshots.length > 1 ? 'have' : 'has'} settled (in the background)…`));
  const asked = session.session;
  void Promise.all(
    withSnapshots.map((run) => {
      const key = `${asked}|${run}`;
      let p = verdicts.get(key);
      if (!p) {
        p = tracked<SpinupSummary | null>(`Has ${run} settled?`, 'spinup.verdict', { session: asked, run });
        verdicts.set(key, p);
        p.catch(() => verdicts.delete(key));
      }
      return p.then(
        (v) => ({ run, v, error: '' }),
        (e: unknown) => ({ run, v: null, error: errorText(e) }),
      );
    }),
  ).then((answers) => {
    if (state.session?.session !== asked || !el.isConnected) return;
    const lines: HTMLElement[] = [];
    let drifting = false;
    for (const a of answers) {
      if (a.v) {
        drifting ||= !a.v.settled;
        lines.push(h('p', { class: a.v.settled ? 'settled' : 'drifting', 'data-run': a.run }, a.v.sentence));
      } else if (a.error) lines.push(h('p', { class: 'unknown' }, `Whether ${a.run} has settled could not be checked: ${a.error}`));
    }
    const u = unknown();
    if (u) lines.push(u);
    el.className = `scores-spinup-banner${drifting ? ' drifting' : ' busy'}`;
    el.replaceChildren(...lines);
  });
}
