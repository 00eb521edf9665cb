/**
 * Every call into the HDF5 library (h5wasm) goes through this table: opening a file for its NetCDF-4
 * metadata, the library's own hyperslab reads, closing. By default the calls run on this thread; the
 * command line and the worker threads install an implementation that runs them on a thread of their own
 * with a deadline (main/hdf5-off-thread.ts), because the library can loop forever on a damaged file and
 * code inside WebAssembly cannot be interrupted.
 */
import { resolve } from 'node:path';
import type { Dataset, File as H5File } from 'h5wasm/node';
import { fileError, StillwaterError } from '../errors.js';
import { loadH5wasm, type H5wasm } from './h5wasm-module.js';
import { readNetcdf4Metadata, type Netcdf4Metadata } from './netcdf4-metadata.js';

export interface Hdf5Opened {
  handle: number;
  meta: Netcdf4Metadata;
  /** object header address of each variable's dataset (by HDF5 path), where the library gives one */
  addresses: Record<string, number | undefined>;
}

/** Hyperslab as [start, end) per dimension; null reads a scalar dataset whole. */
export type Hdf5Ranges = [number, number][] | null;

export interface Hdf5Library {
  open(path: string): Promise<Hdf5Opened>;
  slice(handle: number, h5path: string, ranges: Hdf5Ranges, subject: { file: string; variable: string }): Promise<unknown>;
  close(handle: number): Promise<void>;
}

let current: Hdf5Library | undefined;

/** The HDF5 library calls of this thread (in-process unless another was installed). */
export function hdf5Library(): Hdf5Library {
  current ??= new InProcessHdf5();
  return current;
}

export function useHdf5Library(lib: Hdf5Library): void {
  current = lib;
}

/** The library on this thread: what a worker runs, and what tests use directly. */
export class InProcessHdf5 implements Hdf5Library {
  private readonly files = new Map<number, H5File>();
  private next = 1;

  async open(path: string): Promise<Hdf5Opened> {
    const h5wasm = await loadH5wasm();
    const Module = await h5wasm.ready;
    // HDF5 errors become exceptions (never a trace printed on stderr); their text is the library's
    // diagnostic stack, which no message repeats
    Module.activate_throwing_error_handler();
    let file: H5File;
    try {
      file = new h5wasm.File(resolve(path), 'r');
      if (!file.file_id || file.file_id < 0n) throw new Error('not opened');
    } catch {
      throw fileError('E_FORMAT', path, 'the HDF5 file is damaged or truncated (the HDF5 library cannot open it).');
    }
    try {
      const meta = readNetcdf4Metadata(file);
      const addresses: Record<string, number | undefined> = Object.create(null);
      for (const v of meta.variables) addresses[v.h5path] = objectAddress(Module, file, v.h5path);
      const handle = this.next++;
      this.files.set(handle, file);
      return { handle, meta, addresses };
    } catch (e) {
      file.close();
      if (e instanceof StillwaterError) throw e;
      throw fileError('E_FORMAT', path, 'the HDF5 file is damaged (the HDF5 library cannot read its list of variables).');
    }
  }

  async slice(handle: number, h5path: string, ranges: Hdf5Ranges, subject: { file: string; variable: string }): Promise<unknown> {
    const file = this.files.get(handle);
    if (!file) throw new StillwaterError('E_INTERNAL', `HDF5 file handle ${handle} is not open.`);
    try {
      const ds = file.get(h5path) as Dataset;
      return ranges === null ? ds.value : ds.slice(ranges);
    } catch {
      throw fileError('E_FORMAT', subject.file, 'its data cannot be read (the HDF5 library reports the stored data as damaged).', subject.variable);
    }
  }

  async close(handle: number): Promise<void> {
    const file = this.files.get(handle);
    this.files.delete(handle);
    try {
      file?.close();
    } catch {
      // closing a damaged file can fail; nothing is left to release that a retry would
    }
  }

  /** Bytes of the library's WebAssembly memory: it grows with what a file needed and never shrinks. */
  async heapBytes(): Promise<number> {
    return (await (await loadH5wasm()).ready).HEAPU8.length;
  }
}

type H5Module = Awaited<H5wasm['ready']>;

/** An HDF5 object reference (H5R_OBJECT) is the object header's address, 8 bytes little-endian. */
function objectAddress(Module: H5Module, file: H5File, h5path: string): number | undefined {
  try {
    const ref = Uint8Array.from(Module.create_object_reference(file.file_id, h5path) as ArrayLike<number>);
    if (ref.byteLength < 8) return undefined;
    return Number(new DataView(ref.buffer).getBigUint64(0, true));
  } catch {
    return undefined;
  }
}
