/**
 * Messages of one HDF5 object header, version 1 or 2, following continuation blocks
 * (HDF5 File Format Specification, section IV.A). Only what the chunk reader needs.
 */
import type { ByteSource } from '../byte-source.js';
import { readUint, type Superblock } from './superblock.js';

export interface HeaderMessage {
  type: number;
  data: DataView;
}

export const MSG_FILL_VALUE_OLD = 0x0004;
export const MSG_FILL_VALUE = 0x0005;
export const MSG_LAYOUT = 0x0008;
export const MSG_FILTER_PIPELINE = 0x000b;
const MSG_CONTINUATION = 0x0010;
/** More continuation blocks than any healthy header has: a damaged chain (or one that loops) stops here. */
const MAX_BLOCKS = 256;

export async function readObjectHeader(source: ByteSource, sb: Superblock, address: number): Promise<HeaderMessage[]> {
  const at = sb.baseAddress + address;
  const first = await source.read(at, Math.min(16, source.size - at));
  const messages: HeaderMessage[] = [];
  const blocks: { at: number; length: number }[] = [];
  let v2 = false;
  let trackOrder = false;
  if (first[0] === 0x4f && first[1] === 0x48 && first[2] === 0x44 && first[3] === 0x52) {
    // "OHDR": version 2
    v2 = true;
    const flags = first[5];
    let p = 6;
    if (flags & 0x20) p += 16;
    if (flags & 0x10) p += 4;
    const sizeBytes = 1 << (flags & 3);
    const head = await source.read(at, p + sizeBytes);
    const chunk0 = readUint(new DataView(head.buffer, head.byteOffset, head.byteLength), p, sizeBytes);
    trackOrder = (flags & 0x04) !== 0;
    blocks.push({ at: at + p + sizeBytes, length: chunk0 });
  } else if (first[0] === 1) {
    const v = new DataView(first.buffer, first.byteOffset, first.byteLength);
    blocks.push({ at: at + 16, length: v.getUint32(8, true) });
  } else {
    throw new Error(`object header at ${address} has unknown version ${first[0]}`);
  }

  const seen = new Set<number>();
  for (let b = 0; b < blocks.length; b++) {
    if (b >= MAX_BLOCKS) throw new Error(`object header at ${address} has more than ${MAX_BLOCKS} continuation blocks`);
    if (seen.has(blocks[b].at)) throw new Error(`object header at ${address} continues into a block it already read`);
    seen.add(blocks[b].at);
    const { at: blockAt, length } = blocks[b];
    const bytes = await source.read(blockAt, length);
    const v = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    let p = 0;
    let end = length;
    if (v2) {
      end -= 4; // checksum
      if (b > 0) p += 4; // "OCHK"
    }
    const msgHeader = v2 ? 4 + (trackOrder ? 2 : 0) : 8;
    while (p + msgHeader <= end) {
      const type = v2 ? v.getUint8(p) : v.getUint16(p, true);
      const size = v2 ? v.getUint16(p + 1, true) : v.getUint16(p + 2, true);
      p += msgHeader;
      if (p + size > end) break;
      const data = new DataView(bytes.buffer, bytes.byteOffset + p, size);
      if (type === MSG_CONTINUATION) {
        const off = readUint(data, 0, sb.sizeOfOffsets);
        const len = readUint(data, sb.sizeOfOffsets, sb.sizeOfLengths);
        blocks.push({ at: sb.baseAddress + off, length: len });
      } else if (type !== 0) {
        messages.push({ type, data });
      }
      p += size;
    }
  }
  return messages;
}
