import { StillwaterError } from '../../app/errors.js';
import { MISSING } from '../../app/output/number-format.js';
import { inspectFile, type GridSummary, type InspectReport, type VariableSummary } from '../../app/cf/inspect.js';
import { allowOnly, parseArgs } from '../args.js';
import type { Command } from '../command.js';
import { err, out } from '../command.js';

const usage = `stillwater inspect FILE [--json] [--stats]

Shows what a NetCDF (classic, 64-bit offset, CDF-5, NetCDF-4) or GeoTIFF file holds, CF-decoded:
its dimensions; each variable's dimensions, shape, units, standard_name and long_name; the grid of
its data variables (rectilinear or curvilinear, size, longitude, latitude and depth ranges); and its
time axis (calendar, units, first and last dates, number of steps).

  --stats   also each data variable's decoded minimum, maximum, mean and number of valid values
            (missing values, fill values and packing handled as CF says; read one level at a time)
  --json    print {file, format, dimensions, grid, time, groups, notes, variables} as JSON instead of text

Variables inside NetCDF-4 groups are listed, and named everywhere, by their path (/bgc/chl).`;

const FORMAT_NAMES: Record<string, string> = {
  'netcdf3-classic': 'NetCDF classic (CDF-1)',
  'netcdf3-64bit-offset': 'NetCDF 64-bit offset (CDF-2)',
  'netcdf3-cdf5': 'NetCDF CDF-5',
  'netcdf4-hdf5': 'NetCDF-4 (HDF5)',
  geotiff: 'GeoTIFF',
  memory: 'in memory',
};

/** A number for people: up to 5 significant digits, no trailing zeros. */
export function formatNumber(x: number | null): string {
  if (x === null || Number.isNaN(x)) return MISSING;
  if (!Number.isFinite(x)) return String(x);
  if (x !== 0 && (Math.abs(x) >= 1e6 || Math.abs(x) < 1e-3)) return x.toExponential(3).replace(/\.?0+e/, 'e');
  return String(Number(x.toPrecision(5)));
}

function rangeText(r: [number, number], unit: string): string {
  return r[0] === r[1] ? `${formatNumber(r[0])} ${unit}` : `${formatNumber(r[0])} … ${formatNumber(r[1])} ${unit}`;
}

function table(rows: string[][], indent = '  '): string[] {
  const widths: number[] = [];
  for (const r of rows) r.forEach((c, i) => (widths[i] = Math.max(widths[i] ?? 0, [...c].length)));
  return rows.map((r) => indent + r.map((c, i) => (i === r.length - 1 ? c : c + ' '.repeat(widths[i] - [...c].length))).join('  ').trimEnd());
}

function gridLines(g: GridSummary, title: string): string[] {
  const size = g.nz > 1 ? `${g.nx} × ${g.ny} cells × ${g.nz} levels` : `${g.nx} × ${g.ny} cells`;
  const notes = [g.periodic ? 'wraps around the globe' : '', g.boundsDerived ? 'cell bounds derived from centres' : 'cell bounds from the file'].filter(Boolean).join(', ');
  const lines = [`${title}: ${g.kind}, ${size}  (${notes})`];
  const rows = [
    ['longitude', rangeText(g.lon, '°E')],
    ['latitude', rangeText(g.lat, '°N')],
  ];
  if (g.depth) rows.push(['depth', rangeText(g.depth, 'm (level centres)')]);
  rows.push(['used by', g.variables.join(', ')]);
  return [...lines, ...table(rows)];
}

function describeVariable(v: VariableSummary): string {
  const names = [v.standard_name, v.long_name].filter((x): x is string => !!x);
  return names.join(' — ');
}

export function formatReport(r: InspectReport): string {
  const lines: string[] = [];
  lines.push(`${r.file}`);
  lines.push(`  ${FORMAT_NAMES[r.format] ?? r.format}`);
  const groups = r.groups.filter((g) => g !== '/');
  if (groups.length) {
    const shown = groups.length > 12 ? `${groups.slice(0, 12).join(', ')} and ${groups.length - 12} more` : groups.join(', ');
    lines.push(`  groups: ${shown} (variables inside them are named by path)`);
  }
  lines.push('');
  lines.push('Dimensions');
  lines.push(...table(r.dimensions.map((d) => [d.name, String(d.size), d.unlimited ? '(unlimited)' : ''])));
  lines.push('');
  if (r.grid) {
    lines.push(...gridLines(r.grid, 'Grid'));
    for (const g of r.otherGrids) lines.push(...gridLines(g, 'Another grid'));
  } else {
    lines.push('Grid: none (no data variable with two or more dimensions)');
  }
  lines.push('');
  if (r.time) {
    lines.push(`Time: ${r.time.count} step${r.time.count === 1 ? '' : 's'}, calendar ${r.time.calendar}, '${r.time.units}'`);
    lines.push(r.time.count === 1 ? `  ${r.time.first}` : `  ${r.time.first} … ${r.time.last}`);
  } else {
    lines.push('Time: none');
  }
  for (const role of ['data', 'coordinate'] as const) {
    const vars = r.variables.filter((v) => v.role === role);
    if (!vars.length) continue;
    lines.push('');
    lines.push(role === 'data' ? 'Data variables' : 'Coordinates and bounds');
    const rows = vars.map((v) => [v.name, `(${v.dims.join(', ')})`, v.shape.join(' × ') || 'scalar', v.units ?? '', describeVariable(v)]);
    const rendered = table(rows);
    vars.forEach((v, i) => {
      lines.push(rendered[i]);
      if (v.problem) lines.push(`      ! not usable as a field: ${v.problem.replace(`${r.file}, variable '${v.name}': `, '')}`);
      if (v.stats) {
        const s = v.stats;
        lines.push(
          s.count === 0
            ? `      no valid values (${s.total} missing)`
            : `      min ${formatNumber(s.min)}   max ${formatNumber(s.max)}   mean ${formatNumber(s.mean)}   valid ${s.count} of ${s.total}`,
        );
      }
    });
  }
  if (r.notes.length) {
    lines.push('');
    lines.push('Notes');
    for (const note of r.notes) lines.push(`  ${note}`);
  }
  return lines.join('\n');
}

/** The JSON shape the issue asks for: {file, format, dimensions, grid, time, variables}. */
export function reportJson(r: InspectReport): unknown {
  return {
    file: r.file,
    format: r.format,
    dimensions: r.dimensions,
    grid: r.grid,
    other_grids: r.otherGrids,
    time: r.time,
    groups: r.groups,
    notes: r.notes,
    variables: r.variables.map((v) => ({
      name: v.name,
      dims: v.dims,
      shape: v.shape,
      dtype: v.dtype,
      role: v.role,
      units: v.units,
      standard_name: v.standard_name,
      long_name: v.long_name,
      problem: v.problem ?? null,
      stats: v.stats ?? null,
    })),
  };
}

export const inspectCommand: Command = {
  name: 'inspect',
  summary: 'what a NetCDF or GeoTIFF file holds: dimensions, variables, grid, time axis, value ranges',
  usage,
  async run(argv: string[]): Promise<number> {
    const args = parseArgs(argv, ['json', 'stats']);
    allowOnly(args, 'inspect', ['json', 'stats']);
    if (args.positional.length !== 1) throw new StillwaterError('E_INPUT', `give exactly one FILE to inspect (usage: stillwater inspect FILE [--json] [--stats]).`);
    const file = args.positional[0];
    const stats = args.switches.has('stats');
    const report = await inspectFile(file, {
      stats,
      progress: stats && process.stderr.isTTY ? (f, m) => err(`${Math.round(f * 100)}% ${m}`) : undefined,
    });
    out(args.switches.has('json') ? JSON.stringify(reportJson(report), null, 2) : formatReport(report));
    return 0;
  },
};
