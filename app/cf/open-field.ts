/**
 * A CF-decoded field on its grid, read lazily one horizontal level at a time. Decoding is mask then unpack
 * (app/cf/decode.ts); geometry comes from the discovered coordinates (app/cf/coords.ts) and their bounds.
 * The grid's rectilinear axes increase: descending latitudes flip rows, wrapped longitudes rotate columns,
 * and readLevel hands out values in that order.
 */
import { StillwaterError, fileError, isStillwaterError } from '../errors.js';
import { openDataset } from '../io/open.js';
import { attrString, findVariable, type RawDataset, type RawVariable } from '../io/types.js';
import { findReferenced, missingVariableText } from '../io/variable-path.js';
import { makeRectilinearGrid } from '../grid/rectilinear.js';
import { makeCurvilinearGrid, nearLongitude, type Corners } from '../grid/curvilinear.js';
import type { CornerLattice } from '../grid/corners.js';
import { LatticeBuilder } from '../grid/lattice-builder.js';
import { edgesFromCentres, makeVerticalAxis } from '../grid/vertical.js';
import type { HorizontalGrid, VerticalAxis } from '../grid/types.js';
import type { FieldSource, TimeAxis } from './field-source.js';
import { discoverCoordinates } from './coords.js';
import { decodeCoordinate, decodeValues } from './decode.js';
import { decodedType } from './unpack.js';
import { readFileGrid } from './file-grid.js';
import { NotMonotonic, deriveEdges, edgesFromBounds, orderLongitudes, orderMonotonic, type OrderedAxis } from './coordinate-axis.js';
import { parseUnits, type ParsedUnits } from './units.js';
import { decodeTimeAxis } from './time.js';

export interface OpenFieldOptions {
  /** units to use instead of the file's `units` attribute */
  units?: string;
}

export async function openField(path: string, variable: string, opts: OpenFieldOptions = {}): Promise<FieldSource> {
  const ds = await openDataset(path);
  try {
    const field = await fieldFromDataset(ds, variable, opts);
    field.close = () => ds.close();
    return field;
  } catch (e) {
    await ds.close().catch(() => undefined);
    throw e;
  }
}

/** How the horizontal part of the data's slab maps onto the grid. */
interface HorizontalLayout {
  grid: HorizontalGrid;
  yDim: string;
  xDim: string;
  /** grid row → file row, grid column → file column (null: identity) */
  rows: Int32Array | null;
  cols: Int32Array | null;
}

export async function fieldFromDataset(ds: RawDataset, variable: string, opts: OpenFieldOptions = {}): Promise<FieldSource> {
  const file = ds.path;
  const v = findVariable(ds, variable);
  if (!v) throw fileError('E_VARIABLE', file, missingVariableText(variable, ds.variables, ds.groups), variable);
  if (v.dtype === 'char' || v.dtype === 'string') throw fileError('E_VARIABLE', file, 'holds text, not numbers.', variable);
  const units = fieldUnits(file, v, opts.units);
  const coords = discoverCoordinates(ds, v);
  if (!coords.lon || !coords.lat) {
    throw fileError(
      'E_COORDS',
      file,
      `has no longitude and latitude coordinates (dimensions: ${v.dims.join(', ') || 'none'}); CF asks for coordinate variables or a 'coordinates' attribute.`,
      variable,
    );
  }
  const layout = await horizontalLayout(ds, v, coords.lon, coords.lat);
  const vertical = coords.vertical ? await verticalAxis(ds, v, coords.vertical) : null;
  const time = coords.time ? await timeAxis(ds, v, coords.time) : null;

  // every other dimension must be a singleton
  const known = new Set([layout.yDim, layout.xDim, vertical?.dim, time?.dim].filter((d): d is string => !!d));
  v.dims.forEach((d, i) => {
    if (!known.has(d) && v.shape[i] !== 1) {
      throw fileError('E_COORDS', file, `has a dimension '${d}' of size ${v.shape[i]} that is neither time, depth, latitude nor longitude.`, variable);
    }
  });

  const nt = time ? time.size : 1;
  const nz = vertical ? vertical.axis.nz : 1;
  const { grid } = layout;
  const yPos = v.dims.indexOf(layout.yDim);
  const xPos = v.dims.indexOf(layout.xDim);
  const fileNy = v.shape[yPos];
  const fileNx = v.shape[xPos];
  const yFirst = yPos < xPos;

  const field: FieldSource = {
    file,
    variable,
    units,
    standardName: attrString(v.attrs, 'standard_name'),
    longName: attrString(v.attrs, 'long_name'),
    grid: { horizontal: grid, vertical: vertical ? vertical.axis : null },
    nt,
    time: time ? time.axis : null,
    dtype: decodedType(v),
    async readLevel(t: number, k: number): Promise<Float32Array> {
      const decoded = await readDecoded(t, k);
      return decoded instanceof Float32Array ? decoded : Float32Array.from(decoded);
    },
    readLevelExact: (t: number, k: number) => readDecoded(t, k),
    fileGrid: () =>
      readFileGrid(ds, [coords.lat!, coords.lon!, ...(vertical ? [coords.vertical!] : [])], {
        yDim: layout.yDim,
        xDim: layout.xDim,
        rows: layout.rows,
        cols: layout.cols,
        vertical: vertical ? { dim: vertical.dim, fileIndex: vertical.order.fileIndex } : null,
        roles: { lat: coords.lat!.name, lon: coords.lon!.name, ...(vertical ? { vertical: coords.vertical!.name } : {}) },
      }),
  };
  async function readDecoded(t: number, k: number): Promise<Float32Array | Float64Array> {
    if (!Number.isInteger(t) || t < 0 || t >= nt) throw fileError('E_INPUT', file, `has no time step ${t} (there are ${nt}).`, variable);
    if (!Number.isInteger(k) || k < 0 || k >= nz) throw fileError('E_INPUT', file, `has no level ${k} (there are ${nz}).`, variable);
    const start = v!.dims.map(() => 0);
    const count = v!.dims.map(() => 1);
    start[yPos] = 0;
    count[yPos] = fileNy;
    start[xPos] = 0;
    count[xPos] = fileNx;
    if (time) start[v!.dims.indexOf(time.dim)] = t;
    if (vertical) start[v!.dims.indexOf(vertical.dim)] = vertical.order.fileIndex[k];
    const raw = await ds.read(v!.name, start, count);
    const decoded = decodeValues(v!, raw);
    if (yFirst && !layout.rows && !layout.cols) return decoded;
    return remap(decoded, grid.nx, grid.ny, fileNx, fileNy, yFirst, layout.rows, layout.cols);
  }
  return field;
}

function remap<T extends Float32Array | Float64Array>(src: T, nx: number, ny: number, fileNx: number, fileNy: number, yFirst: boolean, rows: Int32Array | null, cols: Int32Array | null): T {
  const out = new (src.constructor as new (n: number) => T)(nx * ny);
  for (let j = 0; j < ny; j++) {
    const fj = rows ? rows[j] : j;
    for (let i = 0; i < nx; i++) {
      const fi = cols ? cols[i] : i;
      out[j * nx + i] = yFirst ? src[fj * fileNx + fi] : src[fi * fileNy + fj];
    }
  }
  return out;
}

function fieldUnits(file: string, v: RawVariable, override?: string): ParsedUnits {
  const text = override ?? attrString(v.attrs, 'units') ?? '';
  try {
    return parseUnits(text);
  } catch (e) {
    if (isStillwaterError(e)) throw fileError('E_UNITS', file, e.message, v.name);
    throw e;
  }
}

async function readCoordinate(ds: RawDataset, c: RawVariable): Promise<Float64Array> {
  return decodeCoordinate(c, await ds.read(c.name));
}

function notMonotonic(file: string, variable: string, what: string, c: RawVariable, e: unknown): never {
  if (e instanceof NotMonotonic && e.missing) {
    throw fileError('E_COORDS', file, `its ${what} '${c.name}' has a missing value at index ${e.index}.`, variable);
  }
  if (e instanceof NotMonotonic) {
    throw fileError('E_COORDS', file, `its ${what} '${c.name}' is not monotonic (it breaks at index ${e.index}).`, variable);
  }
  throw e;
}

function boundsVariable(ds: RawDataset, c: RawVariable): RawVariable | undefined {
  const name = attrString(c.attrs, 'bounds');
  return name ? findReferenced(ds.variables, c, name) : undefined;
}

async function horizontalLayout(ds: RawDataset, v: RawVariable, lon: RawVariable, lat: RawVariable): Promise<HorizontalLayout> {
  const file = ds.path;
  if (lon.dims.length === 1 && lat.dims.length === 1 && lon.dims[0] !== lat.dims[0]) {
    const lonValues = await readCoordinate(ds, lon);
    const latValues = await readCoordinate(ds, lat);
    let lonAxis: OrderedAxis;
    let latAxis: OrderedAxis;
    try {
      lonAxis = orderLongitudes(lonValues);
    } catch (e) {
      notMonotonic(file, v.name, 'longitude', lon, e);
    }
    try {
      latAxis = orderMonotonic(latValues);
    } catch (e) {
      notMonotonic(file, v.name, 'latitude', lat, e);
    }
    for (const x of latAxis.values) {
      if (x < -90 || x > 90) throw fileError('E_COORDS', file, `its latitude '${lat.name}' has a value ${x} outside −90..90.`, v.name);
    }
    const lonB = boundsVariable(ds, lon);
    const latB = boundsVariable(ds, lat);
    const lonEdges = lonB && lonB.shape.length === 2 && lonB.shape[1] === 2 && lonB.shape[0] === lonValues.length
      ? edgesFromBounds(unwrapAround(await readCoordinate(ds, lonB), lonValues), lonAxis)
      : null;
    const latEdges = latB && latB.shape.length === 2 && latB.shape[1] === 2 && latB.shape[0] === latValues.length
      ? edgesFromBounds(await readCoordinate(ds, latB), latAxis, [-90, 90])
      : null;
    let grid: HorizontalGrid;
    try {
      grid = makeRectilinearGrid(lonEdges ?? deriveEdges(lonAxis.values), latEdges ?? deriveEdges(latAxis.values, [-90, 90]), !lonEdges || !latEdges);
    } catch (e) {
      if (isStillwaterError(e)) throw fileError('E_COORDS', file, `its coordinate bounds do not make a grid: ${lowerFirst(e.message)}`, v.name);
      throw e;
    }
    // keep the file's centres (bounds need not be centred on them)
    grid.axes!.lon.set(lonAxis.values);
    grid.axes!.lat.set(latAxis.values);
    for (let j = 0; j < grid.ny; j++) {
      for (let i = 0; i < grid.nx; i++) {
        grid.lon[j * grid.nx + i] = lonAxis.values[i];
        grid.lat[j * grid.nx + i] = latAxis.values[j];
      }
    }
    return {
      grid,
      yDim: lat.dims[0],
      xDim: lon.dims[0],
      rows: latAxis.identity ? null : latAxis.fileIndex,
      cols: lonAxis.identity ? null : lonAxis.fileIndex,
    };
  }
  if (lon.dims.length === 2 && lat.dims.length === 2 && new Set([...lon.dims, ...lat.dims]).size === 2) {
    const [yDim, xDim] = lon.dims;
    const ny = lon.shape[0];
    const nx = lon.shape[1];
    const lon2 = await readCoordinate(ds, lon);
    let lat2 = await readCoordinate(ds, lat);
    if (lat.dims[0] !== yDim) lat2 = transpose(lat2, lat.shape[0], lat.shape[1]);
    for (let c = 0; c < nx * ny; c++) {
      if (!Number.isFinite(lon2[c]) || !Number.isFinite(lat2[c])) {
        throw fileError('E_COORDS', file, `its 2-D coordinates '${lon.name}'/'${lat.name}' have a missing value at (${Math.floor(c / nx)}, ${c % nx}).`, v.name);
      }
    }
    const corners = await cornersFromBounds(ds, lon, lat, lon2, ny, nx, yDim);
    const grid = makeCurvilinearGrid(lon2, lat2, nx, ny, corners ?? undefined);
    return { grid, yDim, xDim, rows: null, cols: null };
  }
  throw fileError('E_COORDS', file, `its longitude '${lon.name}' and latitude '${lat.name}' do not make a grid (dimensions ${lon.dims.join(',')} and ${lat.dims.join(',')}).`, v.name);
}

/** Bounds of a longitude moved by whole turns next to the cell's centre (a cell never spans the seam twice). */
function unwrapAround(bounds: Float64Array, centres: Float64Array): Float64Array {
  const per = bounds.length / centres.length;
  const out = new Float64Array(bounds.length);
  for (let i = 0; i < centres.length; i++) {
    for (let q = 0; q < per; q++) {
      const b = bounds[i * per + q];
      out[i * per + q] = b - 360 * Math.round((b - centres[i]) / 360);
    }
  }
  return out;
}

function transpose(a: Float64Array, rows: number, cols: number): Float64Array {
  const out = new Float64Array(a.length);
  for (let r = 0; r < rows; r++) for (let c = 0; c < cols; c++) out[c * rows + r] = a[r * cols + c];
  return out;
}

/**
 * CF 2-D bounds (ny, nx, 4), vertices counter-clockwise from (j-½, i-½) (CF 1.10 §7.1), longitudes unwrapped
 * next to each cell's centre. Read in bands of rows: when neighbouring cells share their corners (the same
 * doubles once unwrapped), each corner is kept once, on the (ny + 1) × (nx + 1) lattice; else 4 per cell.
 */
async function cornersFromBounds(
  ds: RawDataset, lon: RawVariable, lat: RawVariable, lon2: Float64Array, ny: number, nx: number, yDim: string,
): Promise<Corners | { lattice: CornerLattice } | null> {
  const lonB = boundsVariable(ds, lon);
  const latB = boundsVariable(ds, lat);
  const fits = (b: RawVariable | undefined): b is RawVariable =>
    !!b && b.shape.length === 3 && b.shape[2] === 4 && b.dims[0] === yDim && b.shape[0] === ny && b.shape[1] === nx;
  if (!fits(lonB) || !fits(latB)) return null;
  const lattice = new LatticeBuilder(lon2, nx, ny);
  const band = Math.max(1, Math.floor(BOUNDS_BAND_VALUES / (4 * nx)));
  for (let j0 = 0; j0 < ny && lattice.shared; j0 += band) {
    const rows = Math.min(band, ny - j0);
    const cLon = decodeCoordinate(lonB, await ds.read(lonB.name, [j0, 0, 0], [rows, nx, 4]));
    const cLat = decodeCoordinate(latB, await ds.read(latB.name, [j0, 0, 0], [rows, nx, 4]));
    lattice.addRows(j0, cLon, cLat);
  }
  if (lattice.shared) return { lattice: lattice.result() };
  const cLon = await readCoordinate(ds, lonB);
  const cLat = await readCoordinate(ds, latB);
  for (let c = 0; c < nx * ny; c++) for (let q = 0; q < 4; q++) cLon[c * 4 + q] = nearLongitude(cLon[c * 4 + q], lon2[c]);
  return { lon: cLon, lat: cLat };
}

/** Bounds values read at a time (a band of rows of one bounds variable): 16 MB of doubles. */
const BOUNDS_BAND_VALUES = 2 * 1024 * 1024;

function lowerFirst(s: string): string {
  return s.charAt(0).toLowerCase() + s.slice(1);
}

interface VerticalInfo {
  dim: string;
  axis: VerticalAxis;
  order: OrderedAxis;
}

/** Depth in metres, positive down, from a vertical coordinate's units and `positive`. */
function depthConversion(file: string, variable: string, c: RawVariable): (x: number) => number {
  const unitsText = attrString(c.attrs, 'units') ?? 'm';
  let factor = 1;
  try {
    const u = parseUnits(unitsText);
    if (u.kind !== 'length') throw new StillwaterError('E_UNITS', `units '${unitsText}' are not a length`);
    factor = u.factor;
  } catch (e) {
    if (isStillwaterError(e)) {
      throw fileError('E_UNITS', file, `its vertical coordinate '${c.name}' has units '${unitsText}', which are not a length (m, cm, km).`, variable);
    }
    throw e;
  }
  const positive = (attrString(c.attrs, 'positive') ?? '').trim().toLowerCase();
  const standard = (attrString(c.attrs, 'standard_name') ?? '').trim().toLowerCase();
  const up = positive === 'up' || (positive === '' && (standard === 'height' || standard === 'altitude'));
  return up ? (x) => 0 - x * factor : (x) => x * factor;
}

async function verticalAxis(ds: RawDataset, v: RawVariable, c: RawVariable): Promise<VerticalInfo> {
  const file = ds.path;
  const convert = depthConversion(file, v.name, c);
  const depth = (await readCoordinate(ds, c)).map(convert);
  let order: OrderedAxis;
  try {
    order = orderMonotonic(depth);
  } catch (e) {
    notMonotonic(file, v.name, 'vertical coordinate', c, e);
  }
  const b = boundsVariable(ds, c);
  let edges: Float64Array | null = null;
  if (b && b.shape.length === 2 && b.shape[1] === 2 && b.shape[0] === depth.length) {
    edges = edgesFromBounds((await readCoordinate(ds, b)).map(convert), order);
  }
  try {
    const axis = makeVerticalAxis(edges ?? edgesFromCentres(order.values), !edges, order.values);
    return { dim: c.dims[0], axis, order };
  } catch (e) {
    if (isStillwaterError(e)) throw fileError('E_COORDS', file, `its vertical coordinate '${c.name}' does not make layers: ${lowerFirst(e.message)}`, v.name);
    throw e;
  }
}

async function timeAxis(ds: RawDataset, v: RawVariable, c: RawVariable): Promise<{ dim: string; axis: TimeAxis; size: number }> {
  const values = await readCoordinate(ds, c);
  const units = attrString(c.attrs, 'units') ?? '';
  try {
    const axis = decodeTimeAxis(c.name, values, units, attrString(c.attrs, 'calendar'));
    // CF 1.10 §7.4: a climatological time axis names its bounds by `climatology` instead of `bounds`
    const climName = attrString(c.attrs, 'climatology')?.trim();
    const b = climName ? findReferenced(ds.variables, c, climName) : boundsVariable(ds, c);
    if (b && b.shape.length === 2 && b.shape[0] === values.length && b.shape[1] === 2) {
      axis.bounds = await readCoordinate(ds, b);
      if (climName) axis.climatology = true;
    }
    return { dim: c.dims[0], axis, size: values.length };
  } catch (e) {
    if (isStillwaterError(e)) throw fileError(e.code, ds.path, `its time coordinate '${c.name}': ${e.message}`, v.name);
    throw e;
  }
}
