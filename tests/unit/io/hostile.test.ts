/**
 * Damage found by fuzzing (issue 16, items 2-4), built from the fuzzing seeds (tests/fixtures/fuzz, written by
 * netCDF4-python and GDAL) by changing the one structure named in each test, at offsets found by the structure's
 * signature as the specifications define it (HDF5 File Format Specification III.A.1; TIFF 6.0 section 2;
 * GeoTIFF 1.1 section 7.1; NetCDF classic format specification). Each must be one E_FORMAT sentence naming the file.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { StillwaterError } from '../../../app/errors.js';
import { openDataset } from '../../../app/io/open.js';

const dir = mkdtempSync(join(tmpdir(), 'sw-hostile-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const seed = (name: string): Buffer => readFileSync(join(__dirname, '../../fixtures/fuzz', name));

function write(name: string, bytes: Uint8Array): string {
  const p = join(dir, name);
  writeFileSync(p, bytes);
  return p;
}

/** Open and read every variable's first level; the StillwaterError raised, or undefined. */
async function readAll(path: string): Promise<StillwaterError | undefined> {
  try {
    const ds = await openDataset(path);
    try {
      for (const v of ds.variables) {
        const rank = v.shape.length;
        await ds.read(v.name, new Array(rank).fill(0), v.shape.map((n, i) => (i >= rank - 2 ? n : Math.min(n, 1))));
      }
    } finally {
      await ds.close();
    }
  } catch (e) {
    if (e instanceof StillwaterError) return e;
    throw e;
  }
  return undefined;
}

/** Offsets of the version-1 B-tree nodes ("TREE") for chunks (node type 1) at `level`. */
function btreeNodes(bytes: Buffer, level: number): number[] {
  const out: number[] = [];
  for (let at = bytes.indexOf('TREE'); at >= 0; at = bytes.indexOf('TREE', at + 1)) if (bytes[at + 4] === 1 && bytes[at + 5] === level) out.push(at);
  return out;
}

const RANK = 4; // o2(time, depth, lat, lon)
const KEY = 8 + 8 * (RANK + 1); // chunk size, filter mask, RANK + 1 offsets
const HEAD = 8 + 2 * 8; // signature, type, level, entries, two sibling addresses (8-byte offsets)

describe('NetCDF-4 chunk index', () => {
  it('a B-tree node that points back at itself is refused instead of looping', async () => {
    const bytes = Buffer.from(seed('fuzz_nc4.nc'));
    const [node] = btreeNodes(bytes, 1);
    expect(node).toBeGreaterThan(0);
    bytes.writeBigUInt64LE(BigInt(node), node + HEAD + KEY); // first child := the node itself
    const path = write('btree-loop.nc', bytes);
    const e = await readAll(path);
    expect(e?.code).toBe('E_FORMAT');
    expect(e?.message).toMatch(/chunk index is damaged \(the chunk B-tree reaches node \d+ twice\)/);
    expect(e?.message.startsWith(path)).toBe(true);
  });

  it('a stored chunk larger than its data can be is refused before it is allocated', async () => {
    const bytes = Buffer.from(seed('fuzz_nc4.nc'));
    const [leaf] = btreeNodes(bytes, 0);
    bytes.writeUInt32LE(0x7fffffff, leaf + HEAD); // size of the first chunk: 2 GiB for 16 bytes of data
    const e = await readAll(write('chunk-size.nc', bytes));
    expect(e?.code).toBe('E_FORMAT');
    expect(e?.message).toMatch(/a stored chunk of 2147483647 bytes is larger than its \d+ bytes of data can be/);
  });
});

describe('NetCDF classic dimensions', () => {
  it('a CDF-5 dimension of length 2^32 is refused as inconsistent with the file size', async () => {
    const bytes = Buffer.from(seed('fuzz_cdf5.nc'));
    // dim_list of CDF-5: NC_DIMENSION, 64-bit count, then per dimension a name (64-bit length, padded) and a 64-bit length
    const lat = bytes.indexOf('lat\0', 0);
    bytes.writeBigUInt64BE(2n ** 32n, lat + 4); // "lat" padded to 4 bytes, then its length
    const e = await readAll(write('dim-2-32.nc', bytes));
    expect(e?.code).toBe('E_FORMAT');
    expect(e?.message).toMatch(/truncated/);
  });
});

describe('GeoTIFF tags', () => {
  /** The 12-byte IFD entry of `tag` (little-endian TIFF). */
  function entry(bytes: Buffer, tag: number): number {
    const ifd = bytes.readUInt32LE(4);
    const n = bytes.readUInt16LE(ifd);
    for (let i = 0; i < n; i++) if (bytes.readUInt16LE(ifd + 2 + 12 * i) === tag) return ifd + 2 + 12 * i;
    throw new Error(`no tag ${tag}`);
  }

  it('a GeoKey whose value lives in a tag the file does not have is refused', async () => {
    const bytes = Buffer.from(seed('fuzz_tiled.tif'));
    const dirAt = bytes.readUInt32LE(entry(bytes, 34735) + 8); // GeoKeyDirectoryTag: header, then 4 shorts per key
    bytes.writeUInt16LE(34737 + 100, dirAt + 8 + 2); // first key's TIFFTagLocation -> a tag that is not there
    const path = write('geokey.tif', bytes);
    const e = await readAll(path);
    expect(e?.code).toBe('E_FORMAT');
    expect(e?.message).toBe(`${path}: its GeoTIFF key directory is damaged (a key points at a value that is not there).`);
  });

  it('a GDAL_NODATA tag of a numeric type instead of ASCII is refused', async () => {
    const bytes = Buffer.from(seed('fuzz_tiled.tif'));
    const at = entry(bytes, 42113);
    bytes.writeUInt16LE(1, at + 2); // type BYTE instead of ASCII
    const e = await readAll(write('nodata-type.tif', bytes));
    expect(e?.code).toBe('E_FORMAT');
    expect(e?.message).toMatch(/GDAL_NODATA tag is not text/);
  });
});
