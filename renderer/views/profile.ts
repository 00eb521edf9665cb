/**
 * Profile view: the area-weighted mean profile of a region, the reference and every run, depth downwards, for
 * the period chosen in the bar; or, when the recipe has months, the monthly cycle of the region's mean over
 * the chosen depth as a month × depth section (app/figures/month-depth.ts).
 */
import { monthDepthFigure } from '../../app/figures/month-depth.js';
import { periodLabel } from '../../app/render/period-labels.js';
import type { ProfileCycleData, ProfileData } from '../../contract/view-types.js';
import { getProfile, getProfileCycle } from '../service-client.js';
import { figureElement, screenFigure } from '../plot/figure-element.js';
import { buttonGroup } from '../widgets/button-group.js';
import { profileFigure } from '../../app/figures/profile-figure.js';
import type { Figure } from '../../app/figures/parts.js';
import { h } from '../elements.js';
import { choose, currentVariable, state, type AppState } from '../state.js';
import { dataDownload } from '../widgets/data-download.js';
import { figureFrame } from '../widgets/figure-frame.js';
import { errorText, note, type ViewFactory } from './view.js';

/** The mean profile as app/figures draws it: the figure on the screen is the one the export writes. */
function figureOf(data: ProfileData, depthMax: number, refLabel: string, name: string): Figure {
  const when = data.period === 'annual' ? '' : `, ${periodLabel(data.period)}`;
  return profileFigure({
    name: 'profile',
    title: `${name}: mean profile, ${data.region}${when}`,
    subtitle: 'Area-weighted mean of each level; each run over the cells where it and the reference both have water.',
    width: 'double',
    quantity: data.variable,
    units: data.units,
    depthCentres: data.depthCentres,
    depthMax,
    reference: { label: refLabel, values: data.reference },
    runs: data.runs,
  });
}

export const profileView: ViewFactory = (el) => {
  const frame = figureFrame(el, { label: 'Profile options' });
  const { toolbar, stage } = frame;
  let depthMax: number | null = null;
  let last: ProfileData | null = null;
  let shown: Figure | null = null;
  let lastCycle: ProfileCycleData | null = null;
  let token = 0;
  const depth = h('select', { 'aria-label': 'Depth range', id: 'profile-depth' });
  for (const [v, label] of [
    ['', 'full depth'],
    ['1000', 'upper 1000 m'],
    ['2000', 'upper 2000 m'],
  ]) depth.append(h('option', { value: v }, label));
  depth.addEventListener('change', () => {
    depthMax = depth.value === '' ? null : Number(depth.value);
    void draw(state);
  });
  const depthLabel = h('span', { class: 'toolbar-label' }, 'Region and variable from the bar above. Depth range');
  const modeSlot = h('span', { class: 'profile-mode' });
  // the data of the mean profile shown (the monthly cycle exports as a figure only)
  const download = dataDownload('profile', 'profile', () =>
    last && state.session && !cycleMode(state) ? { service: 'view.export-profile', input: { session: state.session.session, variable: last.variable, region: last.region, period: last.period } } : null,
  );
  toolbar.append(modeSlot, depthLabel, depth, download);

  /** The choice between the mean profile and the monthly cycle; the cycle only where the recipe has months. */
  const drawMode = (st: AppState): void => {
    const monthly = (st.session?.periods.length ?? 0) > 1;
    const group = buttonGroup({
      label: 'What the profile shows',
      id: 'profile-mode',
      options: [['mean', 'Mean profile'], ['cycle', 'Monthly cycle']] as const,
      value: st.sel.profileCycle && monthly ? 'cycle' : 'mean',
      titles: { cycle: monthly ? 'The region\'s mean month by month over the depth chosen in the bar, for the run chosen there' : (st.session?.periodsNote ?? 'The recipe has no months.') },
      onPick: (v) => choose({ profileCycle: v === 'cycle' }),
    });
    const cycleButton = group.group.querySelectorAll('button')[1];
    if (cycleButton && !monthly) cycleButton.disabled = true;
    modeSlot.replaceChildren(group.el);
    const cycle = st.sel.profileCycle && monthly;
    depthLabel.hidden = cycle;
    depth.hidden = cycle;
    download.hidden = cycle;
  };

  const name = (): string => {
    const v = currentVariable();
    return v?.longName && v.longName !== v.key ? `${v.longName} (${v.key})` : state.sel.variable;
  };
  const fullDepth = (d: ProfileData): number => d.depthEdges[d.depthEdges.length - 1];
  const cycleMode = (st: AppState): boolean => st.sel.profileCycle && (st.session?.periods.length ?? 0) > 1;

  const drawCycle = async (st: AppState): Promise<void> => {
    const session = st.session!;
    const my = ++token;
    if (!lastCycle) note(stage, 'Reading the months level by level for the monthly cycle…', 'busy');
    let d: ProfileCycleData;
    try {
      d = await getProfileCycle(session.session, st.sel.variable, st.sel.run, st.sel.region, st.sel.layer);
    } catch (e) {
      if (my === token) note(stage, errorText(e), 'error');
      return;
    }
    if (my !== token) return;
    lastCycle = d;
    const fig = monthDepthFigure({ data: d, name: name(), referenceLabel: session.reference.label, width: 'double' });
    // as wide as the stage allows while the whole figure stays in view
    const w = Math.floor(stage.clientWidth || 900);
    const hgt = Math.floor(stage.clientHeight || 600);
    stage.replaceChildren(screenFigure(fig, Math.max(480, Math.min(w, (hgt * fig.widthPt) / fig.heightPt))));
    stage.dataset.drawn = `cycle|${d.variable}|${d.run}|${d.region}|${d.layer.id}`;
    delete stage.dataset.period;
  };

  const draw = async (st: AppState): Promise<void> => {
    drawMode(st);
    const session = st.session;
    if (!session || !st.sel.variable) return note(stage, 'Open a recipe to see profiles.');
    if (cycleMode(st)) return drawCycle(st);
    if (session.grid.nz < 2) return note(stage, 'This variable has no depth axis, so there is no profile to draw.');
    const my = ++token;
    if (!last) note(stage, 'Reading all levels for the profile…', 'busy');
    try {
      const d = await getProfile(session.session, st.sel.variable, st.sel.region, st.sel.period);
      if (my !== token) return;
      last = d;
    } catch (e) {
      if (my === token) note(stage, errorText(e), 'error');
      return;
    }
    shown = figureOf(last, depthMax ?? fullDepth(last), session.reference.label, name());
    stage.replaceChildren(screenFigure(shown, frame.width(480)));
    stage.dataset.drawn = `${last.variable}|${last.region}`;
    stage.dataset.period = last.period;
  };
  return {
    update(st, changed) {
      if (changed.size === 1 && changed.has('probe')) return;
      void draw(st);
    },
    async figure() {
      if (!state.session) return null;
      if (cycleMode(state)) return lastCycle ? figureElement(monthDepthFigure({ data: lastCycle, name: name(), referenceLabel: state.session.reference.label, width: 'double' })) : null;
      return shown ? figureElement(shown) : null;
    },
    fileBase: () =>
      (cycleMode(state) ? `stillwater-monthly-cycle-${state.sel.variable}-${state.sel.run}-${state.sel.region}-${state.sel.layer}` : `stillwater-profile-${state.sel.variable}-${state.sel.region}${state.sel.period === 'annual' ? '' : `-${state.sel.period}`}`).replace(/[^A-Za-z0-9._-]+/g, '_'),
    dispose() {
      token++;
    },
  };
};
