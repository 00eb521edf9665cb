/**
 * The workbench's state: the open session, what is chosen in the comparison bar, and what the probe
 * points at. Views subscribe and redraw; nothing else holds state.
 */
import type { ProjectionId } from '../app/render/projections.js';
import { DEFAULT_DIFF_SCALE, DEFAULT_FIELD_SCALE } from '../app/render/named-scales.js';
import { periodLabel } from '../app/render/period-labels.js';
import type { ScreenSection, SectionKind, SessionInfo, ViewPeriod } from '../contract/view-types.js';

export type ViewId = 'map' | 'difference' | 'section' | 'profile' | 'diagram' | 'scores' | 'spinup' | 'line';

export const VIEWS: { id: ViewId; label: string; key: string }[] = [
  { id: 'map', label: 'Map', key: '1' },
  { id: 'difference', label: 'Difference', key: '2' },
  { id: 'section', label: 'Section', key: '3' },
  { id: 'profile', label: 'Profile', key: '4' },
  { id: 'diagram', label: 'Diagram', key: '5' },
  { id: 'scores', label: 'Scores', key: '6' },
  { id: 'spinup', label: 'Spin-up', key: '7' },
  { id: 'line', label: 'Line', key: '8' },
];

export interface Selection {
  view: ViewId;
  variable: string;
  run: string;
  region: string;
  /** LayerChoice id */
  layer: string;
  projection: ProjectionId;
  /** which field the Map view shows */
  mapField: 'model' | 'reference';
  sectionKind: SectionKind;
  /** longitude of a meridian section or latitude of a parallel section */
  sectionAt: number;
  /** which field the Section view shows, and how deep it reaches (null: full depth) */
  sectionField: 'model' | 'reference' | 'difference';
  sectionDepth: number | null;
  diagram: 'taylor' | 'target';
  /** the period of the year the views show (annual, a month, a season) */
  period: ViewPeriod;
  /** the Profile view shows the monthly cycle of the region (month × depth) instead of the mean profile */
  profileCycle: boolean;
  /** fixed colour range (null: automatic) per view kind */
  fieldRange: [number, number] | null;
  diffRange: [number, number] | null;
  /** names of the colour scales (see app/render/named-scales.ts) for fields and for differences */
  fieldScale: string;
  diffScale: string;
  /** fields coloured by the logarithm of their values (nutrients, chlorophyll-like fields) */
  logColour: boolean;
  /** one automatic range over the reference and every run, so that maps of different runs compare by colour */
  lockRange: boolean;
  /** labelled contour lines over maps */
  contours: boolean;
  /** the map's window in projected metres when zoomed or panned; null: the whole projection */
  mapWindow: MapWindow | null;
  /** maps show only the chosen region, and the difference map gives that region's statistics */
  cropToRegion: boolean;
  /** the Line view's transect, kept for the session */
  line: LineChoice;
}

export interface MapWindow {
  xmin: number;
  xmax: number;
  ymin: number;
  ymax: number;
}

export interface LineChoice {
  /** waypoints as [lon, lat] */
  points: [number, number][];
  spacingKm: number;
  /** depth axis stretched over the upper ocean */
  stretch: boolean;
}

export interface ProbePoint {
  lon: number;
  lat: number;
  /** a pinned probe stays where it is when the pointer moves on */
  pinned?: boolean;
}

export interface AppState {
  session: SessionInfo | null;
  sel: Selection;
  probe: ProbePoint | null;
  /** the sentence saying why a period was refused (a saved view asked for a period the recipe has no data for) */
  periodRefused: string | null;
}

type Listener = (state: AppState, changed: Set<string>) => void;

const listeners = new Set<Listener>();

export const state: AppState = {
  session: null,
  sel: {
    view: 'map',
    variable: '',
    run: '',
    region: 'global',
    layer: 'k:0',
    projection: 'equal-earth',
    mapField: 'model',
    sectionKind: 'meridian',
    sectionAt: -25,
    sectionField: 'model',
    sectionDepth: null,
    diagram: 'taylor',
    period: 'annual',
    profileCycle: false,
    fieldRange: null,
    diffRange: null,
    fieldScale: DEFAULT_FIELD_SCALE,
    diffScale: DEFAULT_DIFF_SCALE,
    logColour: false,
    lockRange: false,
    contours: false,
    mapWindow: null,
    cropToRegion: false,
    line: { points: [[-30, -60], [-30, 0], [-20, 60]], spacingKm: 100, stretch: false },
  },
  probe: null,
  periodRefused: null,
};

export function subscribe(l: Listener): () => void {
  listeners.add(l);
  return () => listeners.delete(l);
}

function notify(changed: Set<string>): void {
  for (const l of [...listeners]) l(state, changed);
}

/** Changes of these keys can be undone (Ctrl+Z) and redone (Ctrl+Y or Ctrl+Shift+Z). */
const UNDOABLE: (keyof Selection)[] = ['variable', 'run', 'layer', 'region', 'period', 'profileCycle', 'projection', 'mapField', 'fieldRange', 'diffRange', 'fieldScale', 'diffScale', 'logColour', 'lockRange', 'contours', 'mapWindow', 'cropToRegion', 'line', 'sectionKind', 'sectionAt', 'sectionField', 'sectionDepth', 'diagram'];
const HISTORY_LIMIT = 100;
const undoStack: Selection[] = [];
const redoStack: Selection[] = [];

const copy = (sel: Selection): Selection => JSON.parse(JSON.stringify(sel)) as Selection;

/** Change part of the selection; listeners hear which keys changed. */
export function choose(patch: Partial<Selection>): void {
  const before = copy(state.sel);
  const changed = new Set<string>();
  for (const [k, v] of Object.entries(patch) as [keyof Selection, unknown][]) {
    if (JSON.stringify(state.sel[k]) !== JSON.stringify(v)) {
      (state.sel as unknown as Record<string, unknown>)[k] = v;
      changed.add(k);
    }
  }
  // a new variable or layer brings its own automatic colour range
  if ((changed.has('variable') || changed.has('layer')) && !('fieldRange' in patch)) {
    state.sel.fieldRange = null;
    state.sel.diffRange = null;
  }
  // a period chosen by hand answers an earlier refusal
  if (changed.has('period')) state.periodRefused = null;
  // another projection has other metres: the zoom starts again
  if (changed.has('projection') && !('mapWindow' in patch)) state.sel.mapWindow = null;
  if (!changed.size) return;
  if (UNDOABLE.some((k) => changed.has(k))) {
    undoStack.push(before);
    if (undoStack.length > HISTORY_LIMIT) undoStack.shift();
    redoStack.length = 0;
  }
  notify(changed);
}

/** A change in progress (a drag): shown at once, recorded for undo once, by commitPreview. */
let previewBefore: Selection | null = null;

export function preview(patch: Partial<Selection>): void {
  previewBefore ??= copy(state.sel);
  const changed = new Set<string>();
  for (const [k, v] of Object.entries(patch) as [keyof Selection, unknown][]) {
    if (JSON.stringify(state.sel[k]) !== JSON.stringify(v)) {
      (state.sel as unknown as Record<string, unknown>)[k] = v;
      changed.add(k);
    }
  }
  if (changed.size) notify(changed);
}

/** The end of a drag: one step of history for all of it. */
export function commitPreview(): void {
  if (!previewBefore) return;
  if (JSON.stringify(previewBefore) !== JSON.stringify(state.sel)) {
    undoStack.push(previewBefore);
    redoStack.length = 0;
  }
  previewBefore = null;
}

function restore(to: Selection): void {
  const changed = new Set<string>();
  for (const k of Object.keys(to) as (keyof Selection)[]) if (JSON.stringify(state.sel[k]) !== JSON.stringify(to[k])) changed.add(k);
  // undo never moves between views: it takes back what was changed in them
  state.sel = { ...to, view: state.sel.view };
  changed.delete('view');
  if (changed.size) notify(changed);
}

/** Take back the last change of the view; false when there is none. */
export function undo(): boolean {
  const prev = undoStack.pop();
  if (!prev) return false;
  redoStack.push(copy(state.sel));
  restore(prev);
  return true;
}

/** Do again what undo took back; false when there is nothing to redo. */
export function redo(): boolean {
  const next = redoStack.pop();
  if (!next) return false;
  undoStack.push(copy(state.sel));
  restore(next);
  return true;
}

export function setSession(session: SessionInfo): void {
  const previousSession = state.session?.session;
  // a recipe opened anew brings the view saved in it (its `screen` section)
  const previous = previousSession !== session.session && session.screen ? { ...state.sel, ...restorable(session.screen) } : state.sel;
  state.session = session;
  const vars = session.variables;
  const variable = vars.some((v) => v.key === previous.variable) ? previous.variable : (vars[0]?.key ?? '');
  const runs = vars.find((v) => v.key === variable)?.runs ?? [];
  const run = runs.includes(previous.run) ? previous.run : (runs[0] ?? '');
  const layer = session.layers.some((l) => l.id === previous.layer) ? previous.layer : (session.layers[0]?.id ?? 'k:0');
  const region = session.regions.includes(previous.region) ? previous.region : (session.regions[0] ?? 'global');
  const keepRanges = previous !== state.sel;
  // a period the recipe has no data for is refused with a sentence, and the views show the year
  const periods = session.periods ?? ['annual'];
  const period = periods.includes(previous.period) ? previous.period : 'annual';
  state.periodRefused = period === previous.period ? null : periodRefusal(previous.period, session);
  state.sel = { ...previous, variable, run, layer, region, period, fieldRange: keepRanges ? previous.fieldRange : null, diffRange: keepRanges ? previous.diffRange : null };
  // another recipe starts a new history; a saved or extended session keeps it
  if (previousSession !== session.session) {
    undoStack.length = 0;
    redoStack.length = 0;
  }
  notify(new Set(['session', 'variable', 'run', 'layer', 'region', 'period', ...(keepRanges ? ['view'] : [])]));
}

/** Why the session cannot show a period: one sentence. */
export function periodRefusal(p: ViewPeriod, session: SessionInfo): string {
  if (session.periodsNote) return `${periodLabel(p)} cannot be shown because ${session.periodsNote.charAt(0).toLowerCase()}${session.periodsNote.slice(1)}`;
  return `${periodLabel(p)} cannot be shown because the recipe's options.periods gives ${session.periods.filter((x) => x !== 'annual').join(', ')} besides the year.`;
}

export function setProbe(p: ProbePoint | null): void {
  state.probe = p;
  notify(new Set(['probe']));
}

/** The chosen layer's description. */
export function currentLayer(): SessionInfo['layers'][number] | undefined {
  return state.session?.layers.find((l) => l.id === state.sel.layer);
}

export function currentVariable(): SessionInfo['variables'][number] | undefined {
  return state.session?.variables.find((v) => v.key === state.sel.variable);
}

/** The keys of the selection that the recipe's `screen` section keeps. */
const SCREEN_KEYS = ['view', 'variable', 'run', 'region', 'layer', 'projection', 'mapField', 'fieldRange', 'diffRange', 'fieldScale', 'diffScale', 'logColour', 'lockRange', 'contours', 'mapWindow', 'cropToRegion', 'sectionKind', 'sectionAt', 'sectionField', 'sectionDepth', 'diagram', 'period', 'profileCycle', 'line'] as const satisfies readonly (keyof Selection & keyof ScreenSection)[];

/** What the recipe keeps of the view (saved with the session). */
export function screenOf(sel: Selection): ScreenSection {
  const out: Record<string, unknown> = {};
  for (const k of SCREEN_KEYS) out[k] = JSON.parse(JSON.stringify(sel[k]));
  return out as ScreenSection;
}

function restorable(screen: ScreenSection): Partial<Selection> {
  const out: Record<string, unknown> = {};
  for (const k of SCREEN_KEYS) if (screen[k] !== undefined) out[k] = screen[k];
  // a line saved when the Line view showed one field at a time: the field is no longer chosen
  if (screen.line) {
    const { field: _field, ...line } = screen.line;
    out.line = line;
  }
  return out as Partial<Selection>;
}
