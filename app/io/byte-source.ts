import { readSync } from 'node:fs';
import { open, stat, type FileHandle } from 'node:fs/promises';
import { fileError, StillwaterError } from '../errors.js';
import { checkParsingHere } from './parsing-thread.js';

/**
 * Readers ask a ByteSource for ranges, so the same format code serves local files,
 * bytes held in memory (tests), and ranged remote storage later.
 */
export interface ByteSource {
  readonly name: string;
  readonly size: number;
  /** Read exactly `length` bytes at `offset`; throws E_FORMAT when the source is shorter. */
  read(offset: number, length: number): Promise<Uint8Array>;
  /**
   * Optional: read exactly `into.byteLength` bytes at `offset` straight into `into`
   * (no intermediate copy; readers use it to fill a typed array in one call).
   */
  readInto?(offset: number, into: Uint8Array): Promise<void>;
  close(): Promise<void>;
}

/** Fill `into` from `source` at `offset`, without a copy where the source allows it. */
export async function readIntoFrom(source: ByteSource, offset: number, into: Uint8Array): Promise<void> {
  if (source.readInto) return source.readInto(offset, into);
  into.set(await source.read(offset, into.byteLength));
}

export class MemorySource implements ByteSource {
  readonly size: number;
  constructor(readonly name: string, private readonly bytes: Uint8Array) {
    this.size = bytes.byteLength;
  }
  async read(offset: number, length: number): Promise<Uint8Array> {
    if (offset < 0 || offset + length > this.size) throw truncated(this.name, offset, length, this.size);
    return this.bytes.subarray(offset, offset + length);
  }
  async readInto(offset: number, into: Uint8Array): Promise<void> {
    into.set(await this.read(offset, into.byteLength));
  }
  async close(): Promise<void> {}
}

export class FileSource implements ByteSource {
  private constructor(readonly name: string, readonly size: number, private readonly handle: FileHandle) {}

  static async open(path: string): Promise<FileSource> {
    checkParsingHere(path);
    let size: number;
    try {
      const s = await stat(path);
      if (!s.isFile()) throw fileError('E_FILE', path, 'is not a regular file.');
      size = s.size;
    } catch (e) {
      if (e instanceof StillwaterError) throw e;
      throw fileError('E_FILE', path, 'no such file.');
    }
    const handle = await open(path, 'r');
    return new FileSource(path, size, handle);
  }

  async read(offset: number, length: number): Promise<Uint8Array> {
    if (offset < 0 || offset + length > this.size) throw truncated(this.name, offset, length, this.size);
    const buf = new Uint8Array(length);
    let done = 0;
    while (done < length) {
      const { bytesRead } = await this.handle.read(buf, done, length - done, offset + done);
      if (bytesRead === 0) throw truncated(this.name, offset, length, this.size);
      done += bytesRead;
    }
    return buf;
  }

  /**
   * A synchronous pread: a level of a few hundred kilobytes comes from the page cache in tens of
   * microseconds, less than a round trip through the thread pool. Heavy reading runs in workers.
   */
  async readInto(offset: number, into: Uint8Array): Promise<void> {
    const length = into.byteLength;
    if (offset < 0 || offset + length > this.size) throw truncated(this.name, offset, length, this.size);
    let done = 0;
    while (done < length) {
      const bytesRead = readSync(this.handle.fd, into, done, length - done, offset + done);
      if (bytesRead === 0) throw truncated(this.name, offset, length, this.size);
      done += bytesRead;
    }
  }

  async close(): Promise<void> {
    await this.handle.close();
  }
}

function truncated(name: string, offset: number, length: number, size: number): StillwaterError {
  return fileError('E_FORMAT', name, `the file is truncated or damaged (needed bytes ${offset}..${offset + length}, the file has ${size}).`);
}
