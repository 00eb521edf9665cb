/**
 * Browsing the folders the workbench may read: the allowed roots, the entries of one folder, and a file's
 * variables. Every path goes through ctx.resolvePath, so nothing outside the allowed folders is ever listed.
 */
import { readdir, stat } from 'node:fs/promises';
import { basename, dirname, extname, join } from 'node:path';
import { z } from 'zod';
import { StillwaterError } from '../errors.js';
import { openDataset } from '../io/open.js';
import { attrString, type AttrValue, type DType } from '../io/types.js';
import { entry, type ServiceContext, type ServiceEntry } from './types.js';

/** What kind of thing a file is, by its name; the readers still check the bytes. */
const KINDS: Record<string, FileKind> = {
  '.nc': 'dataset',
  '.nc4': 'dataset',
  '.cdf': 'dataset',
  '.h5': 'dataset',
  '.hdf5': 'dataset',
  '.tif': 'dataset',
  '.tiff': 'dataset',
  '.csv': 'table',
  '.json': 'recipe',
  '.geojson': 'shapes',
};

export type FileKind = 'dataset' | 'table' | 'recipe' | 'shapes' | 'other';

export interface FolderEntry {
  name: string;
  /** absolute path, to pass back to other services */
  path: string;
  type: 'folder' | 'file';
  kind: FileKind | 'folder';
  size: number;
  modified: string;
}

export interface FolderListing {
  /** absolute path of the folder listed */
  folder: string;
  /** the folder above, when it is still allowed; null at a root */
  parent: string | null;
  entries: FolderEntry[];
}

/** What a file holds, as its header says: for the sources panel and the folder browser. */
export interface FileDescription {
  path: string;
  format: string;
  size: number;
  title: string;
  dimensions: { name: string; size: number; unlimited: boolean }[];
  variables: {
    name: string;
    dims: string[];
    shape: number[];
    dtype: DType;
    units: string;
    longName: string;
    standardName: string;
    /** a coordinate variable (named like its only dimension) or a bounds variable */
    coordinate: boolean;
  }[];
  /** global attributes, long texts cut to 500 characters */
  attributes: Record<string, AttrValue>;
}

const listInput = z.object({
  /** absent: the allowed roots themselves */
  folder: z.string().min(1).optional(),
  /** include names starting with a dot */
  hidden: z.boolean().optional(),
});

async function describeEntry(path: string, name: string): Promise<FolderEntry | undefined> {
  try {
    const s = await stat(path);
    const folder = s.isDirectory();
    return {
      name,
      path,
      type: folder ? 'folder' : 'file',
      kind: folder ? 'folder' : (KINDS[extname(name).toLowerCase()] ?? 'other'),
      size: folder ? 0 : s.size,
      modified: s.mtime.toISOString(),
    };
  } catch {
    return undefined; // a dangling link or a file removed meanwhile is simply not shown
  }
}

/** The allowed folders that exist, as entries (the picker's first page). */
async function rootEntries(ctx: ServiceContext): Promise<FolderEntry[]> {
  const roots = await Promise.all(ctx.roots.map((r) => describeEntry(r, basename(r) || r)));
  return roots.filter((e): e is FolderEntry => e !== undefined);
}

export const filesServices: ServiceEntry[] = [
  entry({
    name: 'files.roots',
    summary: 'The folders this workbench may read.',
    input: z.object({}).optional(),
    async run(_input, ctx): Promise<FolderEntry[]> {
      return rootEntries(ctx);
    },
  }),
  entry({
    name: 'files.describe',
    summary: "A data file's format, dimensions, variables (with units and names) and global attributes, from its header.",
    input: z.object({ path: z.string().min(1) }),
    // a header of an untrusted file: on a worker thread, stopped when a damaged file makes the reader loop
    heavy: true,
    deadlineSeconds: 20,
    async run(input, ctx): Promise<FileDescription> {
      const path = ctx.resolvePath(input.path);
      const size = (await stat(path).catch(() => {
        throw new StillwaterError('E_FILE', `${input.path}: no such file.`, { file: input.path });
      })).size;
      const ds = await openDataset(path);
      try {
        const bounds = new Set(ds.variables.map((v) => attrString(v.attrs, 'bounds')).filter((b): b is string => !!b));
        const attributes: Record<string, AttrValue> = {};
        for (const [k, v] of Object.entries(ds.attrs)) attributes[k] = typeof v === 'string' && v.length > 500 ? v.slice(0, 500) + '…' : v;
        return {
          path,
          format: ds.format,
          size,
          title: attrString(ds.attrs, 'title') ?? '',
          dimensions: ds.dimensions.map((d) => ({ name: d.name, size: d.size, unlimited: d.unlimited })),
          variables: ds.variables.map((v) => ({
            name: v.name,
            dims: v.dims,
            shape: v.shape,
            dtype: v.dtype,
            units: attrString(v.attrs, 'units') ?? '',
            longName: attrString(v.attrs, 'long_name') ?? '',
            standardName: attrString(v.attrs, 'standard_name') ?? '',
            coordinate: (v.dims.length === 1 && v.dims[0] === v.name) || bounds.has(v.name),
          })),
          attributes,
        };
      } finally {
        await ds.close();
      }
    },
  }),
  entry({
    name: 'files.list',
    summary: 'Folders and files inside one allowed folder, folders first.',
    input: listInput,
    async run(input, ctx): Promise<FolderListing> {
      if (!input.folder) {
        return { folder: '', parent: null, entries: await rootEntries(ctx) };
      }
      const folder = ctx.resolvePath(input.folder);
      let names: string[];
      try {
        const s = await stat(folder);
        if (!s.isDirectory()) throw new StillwaterError('E_FILE', `${input.folder}: not a folder.`, { file: input.folder });
        names = await readdir(folder);
      } catch (e) {
        if (e instanceof StillwaterError) throw e;
        throw new StillwaterError('E_FILE', `${input.folder}: no such folder, or it cannot be read.`, { file: input.folder });
      }
      const shown = names.filter((n) => input.hidden || !n.startsWith('.')).sort((a, b) => a.localeCompare(b));
      const entries = (await Promise.all(shown.map((n) => describeEntry(join(folder, n), n)))).filter((e): e is FolderEntry => e !== undefined);
      entries.sort((a, b) => (a.type === b.type ? 0 : a.type === 'folder' ? -1 : 1));
      let parent: string | null = null;
      if (!ctx.roots.includes(folder)) {
        try {
          parent = ctx.resolvePath(dirname(folder));
        } catch {
          parent = null;
        }
      }
      return { folder, parent, entries };
    },
  }),
];
