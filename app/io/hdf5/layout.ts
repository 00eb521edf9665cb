/**
 * Data layout, fill value and filter pipeline messages (HDF5 File Format Specification IV.A.2.i, e, f, l).
 */
import { MSG_FILL_VALUE, MSG_FILL_VALUE_OLD, MSG_FILTER_PIPELINE, MSG_LAYOUT, type HeaderMessage } from './object-header.js';
import { readUint, type Superblock } from './superblock.js';

export type ChunkIndexKind = 'btree1' | 'single' | 'implicit' | 'fixed-array' | 'extensible-array' | 'btree2';

export type Layout =
  | { kind: 'compact' }
  | { kind: 'contiguous'; address: number; size: number }
  | {
      kind: 'chunked';
      /** chunk shape in elements (without the element-size dimension) */
      chunk: number[];
      index: ChunkIndexKind;
      address: number;
      /** single-chunk index with filters: stored size and filter mask */
      singleSize?: number;
      singleMask?: number;
    };

export interface FilterStep {
  id: number;
  clientData: number[];
}

export interface StorageInfo {
  layout: Layout;
  filters: FilterStep[];
  /** fill value bytes as stored (undefined: zeros) */
  fill?: Uint8Array;
}

const INDEX_KINDS: Record<number, ChunkIndexKind> = { 1: 'single', 2: 'implicit', 3: 'fixed-array', 4: 'extensible-array', 5: 'btree2' };

export function decodeStorage(messages: HeaderMessage[], sb: Superblock, rank: number): StorageInfo {
  const layoutMsg = messages.find((m) => m.type === MSG_LAYOUT);
  if (!layoutMsg) throw new Error('no data layout message');
  const layout = decodeLayout(layoutMsg.data, sb, rank);
  const pipe = messages.find((m) => m.type === MSG_FILTER_PIPELINE);
  const filters = pipe ? decodePipeline(pipe.data) : [];
  const fillMsg = messages.find((m) => m.type === MSG_FILL_VALUE) ?? messages.find((m) => m.type === MSG_FILL_VALUE_OLD);
  const fill = fillMsg ? decodeFill(fillMsg) : undefined;
  return { layout, filters, fill };
}

function decodeLayout(d: DataView, sb: Superblock, rank: number): Layout {
  const O = sb.sizeOfOffsets;
  const L = sb.sizeOfLengths;
  const version = d.getUint8(0);
  if (version === 1 || version === 2) {
    const ndims = d.getUint8(1);
    const cls = d.getUint8(2);
    let p = 8;
    if (cls === 0) return { kind: 'compact' };
    const address = readUint(d, p, O);
    p += O;
    const dims: number[] = [];
    for (let i = 0; i < ndims; i++) dims.push(d.getUint32(p + 4 * i, true));
    if (cls === 1) return { kind: 'contiguous', address, size: dims.reduce((a, b) => a * b, 1) };
    return { kind: 'chunked', chunk: dims.slice(0, rank), index: 'btree1', address };
  }
  const cls = d.getUint8(1);
  if (cls === 0) return { kind: 'compact' };
  if (cls === 1) return { kind: 'contiguous', address: readUint(d, 2, O), size: readUint(d, 2 + O, L) };
  if (cls !== 2) throw new Error(`layout class ${cls} is not read`);
  if (version === 3) {
    const ndims = d.getUint8(2);
    const address = readUint(d, 3, O);
    const chunk: number[] = [];
    for (let i = 0; i < ndims; i++) chunk.push(d.getUint32(3 + O + 4 * i, true));
    return { kind: 'chunked', chunk: chunk.slice(0, rank), index: 'btree1', address };
  }
  // version 4
  const flags = d.getUint8(2);
  const ndims = d.getUint8(3);
  const enc = d.getUint8(4);
  let p = 5;
  const chunk: number[] = [];
  for (let i = 0; i < ndims; i++, p += enc) chunk.push(readUint(d, p, enc));
  const index = INDEX_KINDS[d.getUint8(p++)];
  if (!index) throw new Error('unknown chunk index type');
  let singleSize: number | undefined;
  let singleMask: number | undefined;
  if (index === 'single' && flags & 0x02) {
    singleSize = readUint(d, p, L);
    singleMask = d.getUint32(p + L, true);
    p += L + 4;
  } else if (index === 'fixed-array') p += 1;
  else if (index === 'extensible-array') p += 5;
  else if (index === 'btree2') p += 6;
  const address = readUint(d, p, O);
  return { kind: 'chunked', chunk: chunk.slice(0, rank), index, address, singleSize, singleMask };
}

function decodePipeline(d: DataView): FilterStep[] {
  const version = d.getUint8(0);
  const n = d.getUint8(1);
  let p = version === 1 ? 8 : 2;
  const out: FilterStep[] = [];
  for (let i = 0; i < n; i++) {
    const id = d.getUint16(p, true);
    let nameLength = 0;
    if (version === 1 || id >= 256) {
      nameLength = d.getUint16(p + 2, true);
      p += 2;
    }
    const nValues = d.getUint16(p + 4, true);
    p += 6;
    p += version === 1 ? Math.ceil(nameLength / 8) * 8 : nameLength;
    const clientData: number[] = [];
    for (let k = 0; k < nValues; k++) clientData.push(d.getUint32(p + 4 * k, true));
    p += 4 * nValues;
    if (version === 1 && nValues % 2 === 1) p += 4;
    out.push({ id, clientData });
  }
  return out;
}

function decodeFill(m: HeaderMessage): Uint8Array | undefined {
  const d = m.data;
  const bytes = (at: number, n: number): Uint8Array => new Uint8Array(d.buffer, d.byteOffset + at, n).slice();
  if (m.type === MSG_FILL_VALUE_OLD) {
    const n = d.getUint32(0, true);
    return n > 0 ? bytes(4, n) : undefined;
  }
  const version = d.getUint8(0);
  if (version === 1 || version === 2) {
    const defined = d.getUint8(3);
    if (version === 2 && !defined) return undefined;
    const n = d.getUint32(4, true);
    return n > 0 ? bytes(8, n) : undefined;
  }
  const flags = d.getUint8(1);
  if (!(flags & 0x20)) return undefined;
  const n = d.getUint32(2, true);
  return n > 0 ? bytes(6, n) : undefined;
}
