/**
 * The workbench's state: the open session, what is chosen in the comparison bar, and what the probe
 * points at. Views subscribe and redraw; nothing else holds state.
 */
import type { ProjectionId } from '../app/render/projections.js';
import type { SectionKind, SessionInfo } from '../contract/view-types.js';

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
  /** fixed colour range (null: automatic) per view kind */
  fieldRange: [number, number] | null;
  diffRange: [number, number] | null;
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
    fieldRange: null,
    diffRange: null,
  },
  probe: null,
};

export function subscribe(l: Listener): () => void {
  listeners.add(l);
  return () => listeners.delete(l);
}

function notify(changed: Set<string>): void {
  for (const l of [...listeners]) l(state, changed);
}

/** Change part of the selection; listeners hear which keys changed. */
export function choose(patch: Partial<Selection>): void {
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
  if (changed.size) notify(changed);
}

export function setSession(session: SessionInfo): void {
  const previous = state.sel;
  state.session = session;
  const vars = session.variables;
  const variable = vars.some((v) => v.key === previous.variable) ? previous.variable : (vars[0]?.key ?? '');
  const runs = vars.find((v) => v.key === variable)?.runs ?? [];
  const run = runs.includes(previous.run) ? previous.run : (runs[0] ?? '');
  const layer = session.layers.some((l) => l.id === previous.layer) ? previous.layer : (session.layers[0]?.id ?? 'k:0');
  const region = session.regions.includes(previous.region) ? previous.region : (session.regions[0] ?? 'global');
  state.sel = { ...previous, variable, run, layer, region, fieldRange: null, diffRange: null };
  notify(new Set(['session', 'variable', 'run', 'layer', 'region']));
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
