/**
 * Files of a station comparison: points.csv (one row per station: observed, and per source the model
 * value, model minus observed, status and the depth the value stands for), points-skill.csv (statistics
 * per source) and points.json (both, with notes). NaN is an empty CSV field or JSON null.
 */
import { csvTable, type CsvCell } from '../output/csv.js';
import { dataNumber } from '../output/number-format.js';
import type { SkillNumbers } from '../stats/weighted.js';
import type { PointsResult } from './run-points.js';

export function pointsCsv(r: PointsResult): string {
  const st = r.stations;
  const head = ['id', 'line', 'lon', 'lat', 'depth_m', 'time', 'observed'];
  for (const s of r.sources) head.push(s.label, `${s.label} minus observed`, `${s.label} status`, `${s.label} depth_m`);
  const rows: CsvCell[][] = [];
  for (let i = 0; i < st.n; i++) {
    const row: CsvCell[] = [st.id[i], st.line[i], dataNumber(st.lon[i], 9), dataNumber(st.lat[i], 9), st.seafloor[i] ? 'seafloor' : dataNumber(st.depth[i], 7), st.time[i], dataNumber(st.value[i], 7)];
    for (const s of r.sources) {
      const m = s.samples.model[i];
      row.push(dataNumber(m, 7), dataNumber(m - st.value[i], 7), s.samples.status[i], dataNumber(s.samples.modelDepthM[i], 7));
    }
    rows.push(row);
  }
  return csvTable(head, rows);
}

const STAT_KEYS: (keyof SkillNumbers)[] = ['n', 'bias', 'rmse', 'crmse', 'corr', 'model_mean', 'ref_mean', 'model_std', 'ref_std', 'std_ratio', 'nse'];
/** compare's names, with "ref" read as "observed" */
const statName = (k: string) => k.replace('ref_', 'obs_');

export function pointsSkillCsv(r: PointsResult): string {
  const head = ['source', 'role', 'variable', 'units', 'ok', 'from_neighbour', 'on_land', 'below_seafloor', 'outside_grid', ...STAT_KEYS.map(statName), ...STAT_KEYS.map((k) => `log10_${statName(k)}`)];
  const rows: CsvCell[][] = [];
  for (const s of r.sources) {
    const c = s.skill.counts;
    const num = (v: number | null) => dataNumber(v, 7);
    rows.push(
      [
        s.label,
        s.role,
        r.variable,
        r.units,
        c.ok,
        c.from_neighbour,
        c.on_land,
        c.below_seafloor,
        c.outside_grid,
        ...STAT_KEYS.map((k) => num(s.skill.stats[k])),
        ...STAT_KEYS.map((k) => num(s.skill.log10[k])),
      ],
    );
  }
  return csvTable(head, rows);
}

export function pointsJson(r: PointsResult): Record<string, unknown> {
  const st = r.stations;
  return {
    variable: r.variable,
    units: r.units,
    method: r.method,
    stations_file: st.file,
    spans_decades: r.spansDecades,
    skill: r.sources.map((s) => ({ source: s.label, role: s.role, counts: s.skill.counts, stats: s.skill.stats, log10: s.skill.log10 })),
    stations: {
      id: st.id,
      line: Array.from(st.line),
      lon: Array.from(st.lon),
      lat: Array.from(st.lat),
      depth_m: Array.from(st.depth, (v, i) => (st.seafloor[i] ? 'seafloor' : dataNumber(v, 7))),
      time: st.time,
      observed: Array.from(st.value),
    },
    sources: r.sources.map((s) => ({
      label: s.label,
      role: s.role,
      model: Array.from(s.samples.model, (v) => dataNumber(v, 7)),
      status: s.samples.status,
      model_depth_m: Array.from(s.samples.modelDepthM, (v) => dataNumber(v, 7)),
      seafloor_m: Array.from(s.samples.seafloorM, (v) => dataNumber(v, 7)),
    })),
    notes: r.notes,
  };
}
