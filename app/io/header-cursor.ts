import { fileError } from '../errors.js';
import type { ByteSource } from './byte-source.js';

/**
 * Reads a file header front to back in growing chunks, so a header of a few
 * kilobytes costs one small read and a multi-gigabyte file is never read whole.
 */
export class HeaderCursor {
  private buf: Uint8Array = new Uint8Array(0);
  private view: DataView = new DataView(new ArrayBuffer(0));
  private bufStart = 0;
  pos = 0;
  private chunk = 64 * 1024;

  constructor(private readonly source: ByteSource, private readonly what: string) {}

  /** Make sure `n` bytes from the current position are buffered. */
  async need(n: number): Promise<void> {
    const end = this.pos + n;
    if (end <= this.bufStart + this.buf.byteLength) return;
    if (end > this.source.size) {
      throw fileError('E_FORMAT', this.source.name, `the ${this.what} is truncated or damaged (it runs past the end of the file at byte ${this.source.size}).`);
    }
    const len = Math.min(this.source.size - this.pos, Math.max(n, this.chunk));
    this.chunk *= 2;
    const fresh = await this.source.read(this.pos, len);
    this.buf = fresh;
    this.view = new DataView(fresh.buffer, fresh.byteOffset, fresh.byteLength);
    this.bufStart = this.pos;
  }

  private at(n: number): number {
    const o = this.pos - this.bufStart;
    this.pos += n;
    return o;
  }

  async u32(): Promise<number> {
    await this.need(4);
    return this.view.getUint32(this.at(4), false);
  }

  async i32(): Promise<number> {
    await this.need(4);
    return this.view.getInt32(this.at(4), false);
  }

  /** Big-endian unsigned 64-bit as a number; throws when it exceeds 2^53. */
  async u64(): Promise<number> {
    await this.need(8);
    const v = this.view.getBigUint64(this.at(8), false);
    if (v > BigInt(Number.MAX_SAFE_INTEGER)) this.damaged(`a 64-bit size ${v} is too large`);
    return Number(v);
  }

  async bytes(n: number): Promise<Uint8Array> {
    await this.need(n);
    const o = this.at(n);
    return this.buf.slice(o, o + n);
  }

  async skip(n: number): Promise<void> {
    await this.need(n);
    this.pos += n;
  }

  damaged(what: string): never {
    throw fileError('E_FORMAT', this.source.name, `the ${this.what} is damaged (${what}).`);
  }
}
