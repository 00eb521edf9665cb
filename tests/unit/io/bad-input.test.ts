/**
 * Bad input to openDataset: one clear sentence naming the file, a StillwaterError with a code,
 * never a crash or a hang. Damaged files are cut from the real fixtures (ncgen / netCDF4-python).
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { openDataset } from '../../../app/io/open.js';
import { StillwaterError } from '../../../app/errors.js';
import { fixture } from './expected.js';

const dir = mkdtempSync(join(tmpdir(), 'sw-io-bad-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function write(name: string, bytes: Uint8Array): string {
  const p = join(dir, name);
  writeFileSync(p, bytes);
  return p;
}

async function failure(path: string): Promise<StillwaterError> {
  try {
    const ds = await openDataset(path);
    await ds.close();
  } catch (e) {
    expect(e).toBeInstanceOf(StillwaterError);
    const err = e as StillwaterError;
    expect(err.message).toContain(path);
    expect(err.message.trim().split(/\.\s+[A-Z]/).length).toBe(1); // one sentence
    expect(err.subject.file).toBe(path);
    return err;
  }
  throw new Error(`${path} opened although it is bad input`);
}

describe('openDataset on bad input', () => {
  it('a path that does not exist: E_FILE', async () => {
    const err = await failure(join(dir, 'nowhere.nc'));
    expect(err.code).toBe('E_FILE');
    expect(err.message).toMatch(/no such file/);
  });

  it('a folder: E_FILE', async () => {
    expect((await failure(dir)).code).toBe('E_FILE');
  });

  it('an empty file: E_FORMAT, says empty', async () => {
    const err = await failure(write('empty.nc', new Uint8Array(0)));
    expect(err.code).toBe('E_FORMAT');
    expect(err.message).toMatch(/empty/);
  });

  it('random bytes: E_FORMAT, names the formats we read', async () => {
    const bytes = new Uint8Array(4096);
    let x = 12345;
    for (let i = 0; i < bytes.length; i++) bytes[i] = (x = (x * 1103515245 + 12345) >>> 0) >>> 24;
    const err = await failure(write('random.nc', bytes));
    expect(err.code).toBe('E_FORMAT');
    expect(err.message).toMatch(/not a NetCDF, HDF5 or GeoTIFF file/);
  });

  it('a classic file cut inside its header: E_FORMAT, truncated', async () => {
    const whole = readFileSync(fixture('classic_cdf1.nc'));
    const err = await failure(write('cut-header.nc', whole.subarray(0, 200)));
    expect(err.code).toBe('E_FORMAT');
    expect(err.message).toMatch(/truncated/);
  });

  it('a classic file cut inside its data: E_FORMAT at open, truncated', async () => {
    const whole = readFileSync(fixture('offset64_cdf2.nc'));
    const err = await failure(write('cut-data.nc', whole.subarray(0, whole.length - 10)));
    expect(err.code).toBe('E_FORMAT');
    expect(err.message).toMatch(/truncated/);
  });

  it('the magic number alone: E_FORMAT', async () => {
    const err = await failure(write('magic-only.nc', new Uint8Array([0x43, 0x44, 0x46, 1])));
    expect(err.code).toBe('E_FORMAT');
  });

  it('a classic header with a damaged list tag: E_FORMAT, damaged', async () => {
    const bytes = new Uint8Array(readFileSync(fixture('classic_cdf1.nc')));
    bytes[11] = 0x0d; // the NC_DIMENSION tag becomes something else
    const err = await failure(write('bad-tag.nc', bytes));
    expect(err.code).toBe('E_FORMAT');
    expect(err.message).toMatch(/damaged/);
  });

  it('a NetCDF-4 file cut in half: E_FORMAT', async () => {
    const whole = readFileSync(fixture('python_nc4.nc'));
    const err = await failure(write('cut-nc4.nc', whole.subarray(0, whole.length >> 1)));
    expect(err.code).toBe('E_FORMAT');
  });

  it('the HDF5 signature followed by random bytes: E_FORMAT, damaged', async () => {
    const bytes = new Uint8Array(2048);
    let x = 777;
    for (let i = 0; i < bytes.length; i++) bytes[i] = (x = (x * 1103515245 + 12345) >>> 0) >>> 24;
    bytes.set([0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a]);
    const err = await failure(write('fake.h5', bytes));
    expect(err.code).toBe('E_FORMAT');
    expect(err.message).toMatch(/damaged/);
  });

  it('a GeoTIFF cut short: E_FORMAT', async () => {
    const whole = readFileSync(fixture('grid.tif'));
    const path = write('cut.tif', whole.subarray(0, 200));
    let err: unknown;
    try {
      const ds = await openDataset(path);
      await ds.read('raster');
      await ds.close();
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(StillwaterError);
    expect((err as StillwaterError).code).toBe('E_FORMAT');
    expect((err as StillwaterError).message).toContain(path);
  });

  it('inputs are never modified', async () => {
    const before = readFileSync(fixture('classic_cdf1.nc'));
    const ds = await openDataset(fixture('classic_cdf1.nc'));
    await ds.read('temp');
    await ds.close();
    expect(readFileSync(fixture('classic_cdf1.nc')).equals(before)).toBe(true);
  });
});

describe('damaged data inside a NetCDF-4 file whose metadata are intact', () => {
  /** Byte ranges of the chunks of o2 in python_nc4.nc, as our reader found them. */
  async function o2Chunks(path: string): Promise<{ address: number; size: number }[]> {
    const ds = (await openDataset(path)) as unknown as {
      planFor(v: unknown): Promise<{ kind: string; chunked?: { chunks: Map<string, { address: number; size: number }> } }>;
      h5vars: { name: string }[];
      close(): Promise<void>;
    };
    const plan = await ds.planFor(ds.h5vars.find((v) => v.name === 'o2'));
    await ds.close();
    return [...(plan.chunked?.chunks.values() ?? [])];
  }

  it('a deflated chunk overwritten with other bytes: E_FORMAT naming file and variable', async () => {
    const bytes = new Uint8Array(readFileSync(fixture('python_nc4.nc')));
    const [first] = await o2Chunks(fixture('python_nc4.nc'));
    bytes.fill(0xa5, first.address, first.address + first.size);
    const path = write('bad-chunk.nc', bytes);
    const ds = await openDataset(path);
    const err = await ds.read('o2').then(() => undefined, (e: unknown) => e);
    await ds.close();
    expect(err).toBeInstanceOf(StillwaterError);
    expect((err as StillwaterError).code).toBe('E_FORMAT');
    expect((err as StillwaterError).message).toContain(`${path}, variable 'o2'`);
    expect((err as StillwaterError).message).toMatch(/damaged/);
  });
});
