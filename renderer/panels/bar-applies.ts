/**
 * Which controls of the comparison bar act on which view. A control that does nothing in the open view is
 * disabled and says why on hover.
 */
import type { ViewId } from '../state.js';

export type BarControl = 'variable' | 'run' | 'region' | 'layer' | 'period' | 'projection';

/** Why a control does nothing in a view; absent: it acts. */
export const NOT_HERE: Record<ViewId, Partial<Record<BarControl, string>>> = {
  map: { region: 'The map shows the whole grid; tick "crop to region" on the map to use the region.' },
  difference: { region: 'The difference map shows the whole grid; tick "crop to region" on the map to use the region.' },
  section: { layer: 'A section shows every depth.', projection: 'Sections are drawn against latitude or longitude, not on a map projection.' },
  profile: { run: 'The profile shows every run at once.', layer: 'A profile shows every depth.', projection: 'Profiles have no map projection.' },
  diagram: { run: 'The diagram shows every run at once.', region: 'The diagram shows every region at once.', layer: 'The diagram has its own layer menu (the layers of the skill rows).', projection: 'Diagrams have no map projection.' },
  scores: { run: 'The table lists every run; filter it by typing a run name.', region: 'The table lists every region; filter it by typing a region name.', layer: 'The table lists every layer of the skill rows.', projection: 'Tables have no map projection.' },
  spinup: { variable: 'The spin-up view has its own choice of tracers.', run: 'The spin-up view has its own run menu (runs with snapshots).', region: 'The spin-up view has its own choice of regions.', layer: 'The spin-up view has its own layer menu.', projection: 'Spin-up figures have no map projection.', period: 'The spin-up view follows the snapshots through the years.' },
  line: { run: 'The line shows the reference and every run.', region: 'A line runs through its waypoints, whatever the region.', layer: 'A line shows every depth along it.', projection: 'The line\'s own map is equirectangular.', period: 'The line shows the year.' },
};
