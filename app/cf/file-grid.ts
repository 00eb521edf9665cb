/**
 * A field's grid as its file stores it: the coordinate variables (and their CF bounds) with their names,
 * dimensions, stored types, attributes and raw values, and the map from the grid's order (increasing
 * latitude, longitudes rotated to increase, depth increasing downward) back to the file's order.
 * What writes data onto another file's grid uses it to write that grid as the file has it.
 */
import { attrString, type DType, type RawArray, type RawDataset, type RawVariable } from '../io/types.js';
import { baseName, findReferenced } from '../io/variable-path.js';

export interface StoredVariable {
  name: string;
  dims: string[];
  dtype: DType;
  attrs: RawVariable['attrs'];
  attrTypes?: Record<string, DType>;
  data: RawArray;
}

export interface FileGrid {
  /** the file's horizontal dimensions (rows, then columns) */
  yDim: string;
  xDim: string;
  /** grid row → file row, grid column → file column (null: the same order) */
  rows: Int32Array | null;
  cols: Int32Array | null;
  /** the vertical dimension and grid level → file level, when the field has depth */
  vertical: { dim: string; fileIndex: Int32Array } | null;
  /** names of the latitude, longitude and vertical coordinate variables */
  roles: { lat: string; lon: string; vertical?: string };
  /** sizes of every dimension the variables below use */
  dimensions: { name: string; size: number }[];
  /** coordinate variables and their bounds, in the file's order and types */
  variables: StoredVariable[];
}

/** Read the stored coordinate variables named (and the variables their `bounds` attributes name). */
export async function readFileGrid(
  ds: RawDataset,
  coords: RawVariable[],
  layout: Omit<FileGrid, 'dimensions' | 'variables'>,
): Promise<FileGrid> {
  const chosen: RawVariable[] = [];
  const add = (v: RawVariable | undefined): void => {
    if (v && !chosen.some((c) => c.name === v.name)) chosen.push(v);
  };
  for (const c of coords) {
    add(c);
    const b = attrString(c.attrs, 'bounds');
    if (b) add(findReferenced(ds.variables, c, b));
  }
  const variables: StoredVariable[] = [];
  for (const v of chosen) {
    variables.push({ name: v.name, dims: v.dims, dtype: v.dtype, attrs: v.attrs, ...(v.attrTypes ? { attrTypes: v.attrTypes } : {}), data: await ds.read(v.name) });
  }
  const names = new Set(variables.flatMap((v) => v.dims));
  const dimensions = ds.dimensions.filter((d) => names.has(d.name)).map((d) => ({ name: d.name, size: d.size }));
  return flatten({ ...layout, dimensions, variables });
}

/**
 * Coordinates inside NetCDF-4 groups carry paths (`/bgc/depth`); the files written onto this grid are
 * flat, so each takes its name within its group (made unique with a suffix where two groups share it).
 * Attributes such as `bounds` already hold names within the group, as the file wrote them.
 */
function flatten(fg: FileGrid): FileGrid {
  const all = [...fg.dimensions.map((d) => d.name), ...fg.variables.map((v) => v.name)];
  if (!all.some((n) => n.includes('/'))) return fg;
  const taken = new Set(all.filter((n) => !n.includes('/')));
  const flat = new Map<string, string>();
  for (const n of all) {
    if (!n.includes('/') || flat.has(n)) continue;
    let name = baseName(n);
    for (let i = 2; taken.has(name); i++) name = `${baseName(n)}_${i}`;
    taken.add(name);
    flat.set(n, name);
  }
  const to = (n: string): string => flat.get(n) ?? n;
  return {
    ...fg,
    yDim: to(fg.yDim),
    xDim: to(fg.xDim),
    vertical: fg.vertical ? { ...fg.vertical, dim: to(fg.vertical.dim) } : null,
    roles: { lat: to(fg.roles.lat), lon: to(fg.roles.lon), ...(fg.roles.vertical ? { vertical: to(fg.roles.vertical) } : {}) },
    dimensions: fg.dimensions.map((d) => ({ ...d, name: to(d.name) })),
    variables: fg.variables.map((v) => ({ ...v, name: to(v.name), dims: v.dims.map(to) })),
  };
}
