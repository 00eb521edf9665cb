/**
 * A field's grid as its file stores it: the coordinate variables (and their CF bounds) with their names,
 * dimensions, stored types, attributes and raw values, and the map from the grid's order (increasing
 * latitude, longitudes rotated to increase, depth increasing downward) back to the file's order.
 * What writes data onto another file's grid uses it to write that grid as the file has it.
 */
import { attrString, findVariable, type DType, type RawArray, type RawDataset, type RawVariable } from '../io/types.js';

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
    if (b) add(findVariable(ds, b.trim()));
  }
  const variables: StoredVariable[] = [];
  for (const v of chosen) {
    variables.push({ name: v.name, dims: v.dims, dtype: v.dtype, attrs: v.attrs, ...(v.attrTypes ? { attrTypes: v.attrTypes } : {}), data: await ds.read(v.name) });
  }
  const names = new Set(variables.flatMap((v) => v.dims));
  const dimensions = ds.dimensions.filter((d) => names.has(d.name)).map((d) => ({ name: d.name, size: d.size }));
  return { ...layout, dimensions, variables };
}
