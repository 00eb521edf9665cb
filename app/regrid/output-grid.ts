/**
 * The grid a regridded file is written on. Onto a target file's grid, the grid is written as that file has
 * it: its dimension and coordinate names, its order (descending latitude, longitudes −180…180 or 0…360,
 * depth up or down), its coordinate values, bounds, stored types and attributes, so that the output can be
 * differenced against the target cell by cell. Without the target file's coordinates (a grid built in
 * memory), our own CF lat/lon/depth coordinates in increasing order.
 */
import type { FileGrid, StoredVariable } from '../cf/file-grid.js';
import type { Grid, VerticalAxis } from '../grid/types.js';
import type { NetcdfWriter, WritableDType, WriteVariable } from '../io/netcdf-writer.js';
import type { DType, RawArray } from '../io/types.js';

export interface OutputGrid {
  yDim: string;
  xDim: string;
  /** the vertical dimension's name (null: no depth) */
  zDim: string | null;
  dimensions: { name: string; size: number }[];
  variables: WriteVariable[];
  /** the `coordinates` attribute data variables need (curvilinear grids), or undefined */
  coordinates?: string;
  writeCoordinates(w: NetcdfWriter): Promise<void>;
  /** a level in the grid's order → the file's order */
  toFileOrder(level: Float32Array): Float32Array;
  /** grid level k → the level's index in the file */
  levelIndex(k: number): number;
}

/** Types the classic writer stores; others widen to one that holds every value exactly. */
const WRITABLE: Record<DType, WritableDType | null> = {
  i1: 'i1', u1: 'i2', i2: 'i2', u2: 'i4', i4: 'i4', u4: 'f8', i8: 'f8', u8: 'f8', f4: 'f4', f8: 'f8', char: 'char', string: null,
};

function writableData(v: StoredVariable, t: WritableDType): Int8Array | Int16Array | Int32Array | Float32Array | Float64Array | Uint8Array {
  const d: RawArray = v.data;
  if (t === 'char') return d as Uint8Array;
  const ctor = { i1: Int8Array, i2: Int16Array, i4: Int32Array, f4: Float32Array, f8: Float64Array }[t];
  if (d instanceof ctor) return d;
  const out = new ctor(d.length);
  for (let i = 0; i < d.length; i++) out[i] = Number(d[i]);
  return out;
}

export function outputGridFromFile(fg: FileGrid, target: Grid, vertical: VerticalAxis | null): OutputGrid | null {
  const h = target.horizontal;
  const size = (name: string): number | undefined => fg.dimensions.find((d) => d.name === name)?.size;
  if (size(fg.yDim) !== h.ny || size(fg.xDim) !== h.nx) return null;
  const useVertical = !!vertical && !!fg.vertical && size(fg.vertical.dim) === vertical.nz;
  const stored = fg.variables.filter((v) => WRITABLE[v.dtype] && (useVertical || !fg.vertical || !v.dims.includes(fg.vertical.dim)));
  const variables: WriteVariable[] = stored.map((v) => {
    const attrTypes: Record<string, WritableDType> = {};
    for (const [k, t] of Object.entries(v.attrTypes ?? {})) {
      const w = WRITABLE[t];
      if (w) attrTypes[k] = w;
    }
    return { name: v.name, dims: v.dims, dtype: WRITABLE[v.dtype]!, attrs: v.attrs, attrTypes };
  });
  const used = new Set(variables.flatMap((v) => v.dims));
  const dimensions = fg.dimensions.filter((d) => used.has(d.name));
  // coordinates without bounds in the target get the cell edges the regridding used, in the file's order
  const added = addMissingBounds(fg, target, useVertical ? vertical : null, variables, stored, dimensions);
  // levels the target file does not have (a 3-D source onto a 2-D target keeps the source's): our own depth
  const ownDepth = vertical && !useVertical ? ownDepthCoordinates(vertical, new Set([...used, ...variables.map((v) => v.name)])) : null;
  if (ownDepth) {
    dimensions.push(...ownDepth.dimensions);
    variables.push(...ownDepth.variables);
  }
  const curvilinear = h.kind === 'curvilinear';
  const names = stored.filter((v) => v.dims.length === 2 && v.dims[0] === fg.yDim && v.dims[1] === fg.xDim).map((v) => v.name);
  const { rows, cols } = fg;
  return {
    yDim: fg.yDim,
    xDim: fg.xDim,
    zDim: useVertical ? fg.vertical!.dim : ownDepth ? ownDepth.dim : null,
    dimensions,
    variables,
    ...(curvilinear && names.length ? { coordinates: names.join(' ') } : {}),
    async writeCoordinates(w) {
      for (let i = 0; i < stored.length; i++) await w.write(stored[i].name, writableData(stored[i], variables[i].dtype));
      for (const a of added) await w.write(a.name, a.data);
      if (ownDepth) await ownDepth.write(w);
    },
    toFileOrder(level) {
      if (!rows && !cols) return level;
      const out = new Float32Array(level.length);
      const nx = h.nx;
      for (let j = 0; j < h.ny; j++) {
        const fj = rows ? rows[j] : j;
        for (let i = 0; i < nx; i++) out[fj * nx + (cols ? cols[i] : i)] = level[j * nx + i];
      }
      return out;
    },
    levelIndex: (k) => (useVertical ? fg.vertical!.fileIndex[k] : k),
  };
}

/** Our own CF coordinates: lat/lon (or y/x with 2-D lat/lon) and depth, increasing, with bounds. */
export function ownOutputGrid(target: Grid, vertical: VerticalAxis | null): OutputGrid {
  const h = target.horizontal;
  const rect = h.kind === 'rectilinear' && !!h.axes;
  const yDim = rect ? 'lat' : 'y';
  const xDim = rect ? 'lon' : 'x';
  const dimensions = [
    ...(vertical ? [{ name: 'depth', size: vertical.nz }] : []),
    { name: yDim, size: h.ny },
    { name: xDim, size: h.nx },
    { name: 'nv', size: 2 },
    ...(rect ? [] : [{ name: 'nv4', size: 4 }]),
  ];
  const variables: WriteVariable[] = [];
  if (vertical) {
    variables.push({ name: 'depth', dims: ['depth'], dtype: 'f8', attrs: { standard_name: 'depth', units: 'm', positive: 'down', axis: 'Z', bounds: 'depth_bnds' } });
    variables.push({ name: 'depth_bnds', dims: ['depth', 'nv'], dtype: 'f8', attrs: { units: 'm' } });
  }
  if (rect) {
    variables.push({ name: 'lat', dims: ['lat'], dtype: 'f8', attrs: { standard_name: 'latitude', units: 'degrees_north', axis: 'Y', bounds: 'lat_bnds' } });
    variables.push({ name: 'lat_bnds', dims: ['lat', 'nv'], dtype: 'f8', attrs: { units: 'degrees_north' } });
    variables.push({ name: 'lon', dims: ['lon'], dtype: 'f8', attrs: { standard_name: 'longitude', units: 'degrees_east', axis: 'X', bounds: 'lon_bnds' } });
    variables.push({ name: 'lon_bnds', dims: ['lon', 'nv'], dtype: 'f8', attrs: { units: 'degrees_east' } });
  } else {
    variables.push({ name: 'lat', dims: ['y', 'x'], dtype: 'f8', attrs: { standard_name: 'latitude', units: 'degrees_north', bounds: 'lat_bnds' } });
    variables.push({ name: 'lat_bnds', dims: ['y', 'x', 'nv4'], dtype: 'f8', attrs: { units: 'degrees_north' } });
    variables.push({ name: 'lon', dims: ['y', 'x'], dtype: 'f8', attrs: { standard_name: 'longitude', units: 'degrees_east', bounds: 'lon_bnds' } });
    variables.push({ name: 'lon_bnds', dims: ['y', 'x', 'nv4'], dtype: 'f8', attrs: { units: 'degrees_east' } });
  }
  return {
    yDim,
    xDim,
    zDim: vertical ? 'depth' : null,
    dimensions,
    variables,
    ...(rect ? {} : { coordinates: 'lat lon' }),
    async writeCoordinates(w) {
      if (vertical) {
        await w.write('depth', vertical.centres);
        await w.write('depth_bnds', pairs(vertical.edges));
      }
      if (rect) {
        const ax = h.axes!;
        await w.write('lat', ax.lat);
        await w.write('lon', ax.lon);
        await w.write('lat_bnds', pairs(ax.latEdges));
        await w.write('lon_bnds', pairs(ax.lonEdges));
      } else {
        await w.write('lat', h.lat);
        await w.write('lon', h.lon);
        await w.write('lat_bnds', h.cornerLat);
        await w.write('lon_bnds', h.cornerLon);
      }
    },
    toFileOrder: (level) => level,
    levelIndex: (k) => k,
  };
}

/** Bounds variables for the target's coordinates that have none; `variables` gain them and a `bounds` attribute. */
function addMissingBounds(
  fg: FileGrid, target: Grid, vertical: VerticalAxis | null, variables: WriteVariable[], stored: StoredVariable[], dimensions: { name: string; size: number }[],
): { name: string; data: Float64Array }[] {
  const h = target.horizontal;
  const taken = new Set([...variables.map((v) => v.name), ...dimensions.map((d) => d.name)]);
  const free = (name: string): string => {
    let n = name;
    while (taken.has(n)) n += '_';
    taken.add(n);
    return n;
  };
  const added: { name: string; data: Float64Array }[] = [];
  let nv: string | undefined;
  let nv4: string | undefined;
  const add = (coord: string, data: Float64Array, per: 2 | 4): void => {
    const i = stored.findIndex((v) => v.name === coord);
    if (i < 0 || typeof stored[i].attrs.bounds === 'string') return;
    const dim = per === 2 ? (nv ??= free('nv')) : (nv4 ??= free('nv4'));
    if (!dimensions.some((d) => d.name === dim)) dimensions.push({ name: dim, size: per });
    const name = free(`${coord}_bnds`);
    const units = stored[i].attrs.units;
    variables.push({ name, dims: [...stored[i].dims, dim], dtype: 'f8', attrs: typeof units === 'string' ? { units } : {} });
    variables[i] = { ...variables[i], attrs: { ...variables[i].attrs, bounds: name } };
    added.push({ name, data });
  };
  const pairsInFileOrder = (edges: Float64Array, fileIndex: Int32Array | null): Float64Array => {
    const n = edges.length - 1;
    const out = new Float64Array(2 * n);
    for (let g = 0; g < n; g++) {
      const f = fileIndex ? fileIndex[g] : g;
      [out[2 * f], out[2 * f + 1]] = [edges[g], edges[g + 1]];
    }
    return out;
  };
  if (h.kind === 'rectilinear' && h.axes) {
    add(fg.roles.lat, pairsInFileOrder(h.axes.latEdges, fg.rows), 2);
    add(fg.roles.lon, pairsInFileOrder(h.axes.lonEdges, fg.cols), 2);
  } else {
    add(fg.roles.lat, h.cornerLat, 4);
    add(fg.roles.lon, h.cornerLon, 4);
  }
  if (vertical && fg.roles.vertical && fg.vertical) {
    // edges are metres positive down; only a coordinate stored that way can take them as its bounds
    const i = stored.findIndex((v) => v.name === fg.roles.vertical);
    const units = i >= 0 ? stored[i].attrs.units : undefined;
    const positive = i >= 0 ? stored[i].attrs.positive : undefined;
    if ((units === 'm' || units === undefined) && (positive === undefined || String(positive).toLowerCase() === 'down')) {
      add(fg.roles.vertical, pairsInFileOrder(vertical.edges, fg.vertical.fileIndex), 2);
    }
  }
  return added;
}

function ownDepthCoordinates(vertical: VerticalAxis, taken: Set<string>) {
  const free = (name: string): string => {
    let n = name;
    while (taken.has(n)) n += '_';
    taken.add(n);
    return n;
  };
  const dim = free('depth');
  const bounds = free(`${dim}_bnds`);
  const nv = free('nv');
  return {
    dim,
    dimensions: [{ name: dim, size: vertical.nz }, { name: nv, size: 2 }],
    variables: [
      { name: dim, dims: [dim], dtype: 'f8', attrs: { standard_name: 'depth', units: 'm', positive: 'down', axis: 'Z', bounds } },
      { name: bounds, dims: [dim, nv], dtype: 'f8', attrs: { units: 'm' } },
    ] as WriteVariable[],
    async write(w: NetcdfWriter): Promise<void> {
      await w.write(dim, vertical.centres);
      await w.write(bounds, pairs(vertical.edges));
    },
  };
}

function pairs(edges: Float64Array): Float64Array {
  const n = edges.length - 1;
  const out = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) [out[2 * i], out[2 * i + 1]] = [edges[i], edges[i + 1]];
  return out;
}
