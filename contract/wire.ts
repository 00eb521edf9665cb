/**
 * The wire format of service results in browser mode: JSON for the shape, raw bytes for typed arrays,
 * and non-finite numbers kept (JSON alone would turn NaN into null and a Float32Array into an object).
 * Electron IPC needs none of this: structured clone keeps both.
 *
 * Layout: "SWB1" | uint32 LE header length | header JSON (UTF-8) | zero padding to 8 | buffers, each 8-aligned.
 * In the header a typed array is {"$typed": "<ctor>", "at": <byte offset in the buffer area>, "n": <length>}
 * and a non-finite number is {"$num": "NaN" | "Infinity" | "-Infinity"}.
 * Pure: no DOM, no Node, no imports; used by main/http.ts (encode) and renderer/bridge.ts (decode).
 */

const MAGIC = [0x53, 0x57, 0x42, 0x31]; // "SWB1"
export const WIRE_CONTENT_TYPE = 'application/x-stillwater-wire';

type TypedCtor =
  | Int8ArrayConstructor
  | Uint8ArrayConstructor
  | Int16ArrayConstructor
  | Uint16ArrayConstructor
  | Int32ArrayConstructor
  | Uint32ArrayConstructor
  | Float32ArrayConstructor
  | Float64ArrayConstructor
  | BigInt64ArrayConstructor
  | BigUint64ArrayConstructor;

const CTORS: Record<string, TypedCtor> = {
  Int8Array,
  Uint8Array,
  Int16Array,
  Uint16Array,
  Int32Array,
  Uint32Array,
  Float32Array,
  Float64Array,
  BigInt64Array,
  BigUint64Array,
};

type AnyTyped = InstanceType<TypedCtor>;

function typedName(v: unknown): string | undefined {
  if (!ArrayBuffer.isView(v) || v instanceof DataView) return undefined;
  const name = (v as AnyTyped).constructor.name;
  return name in CTORS ? name : undefined;
}

const align8 = (n: number): number => (n + 7) & ~7;

/** Encode a result (plain data + typed arrays) into one byte buffer. */
export function encodeWire(value: unknown): Uint8Array {
  const chunks: Uint8Array[] = [];
  let offset = 0;
  const walk = (v: unknown): unknown => {
    if (typeof v === 'number') return Number.isFinite(v) ? v : { $num: String(v) };
    if (typeof v === 'bigint') return { $num: v.toString(), big: true };
    if (v === null || typeof v !== 'object') return v;
    const name = typedName(v);
    if (name) {
      const t = v as AnyTyped;
      const bytes = new Uint8Array(t.buffer, t.byteOffset, t.byteLength);
      const at = offset;
      chunks.push(bytes);
      offset = align8(offset + bytes.byteLength);
      return { $typed: name, at, n: t.length };
    }
    if (v instanceof ArrayBuffer) return walk(new Uint8Array(v));
    if (Array.isArray(v)) return v.map(walk);
    if (v instanceof Date) return v.toISOString();
    const o: Record<string, unknown> = {};
    for (const [k, x] of Object.entries(v as Record<string, unknown>)) {
      if (x !== undefined && typeof x !== 'function') o[k] = walk(x);
    }
    return o;
  };
  const header = new TextEncoder().encode(JSON.stringify(walk(value) ?? null));
  const start = align8(8 + header.byteLength);
  const out = new Uint8Array(start + offset);
  out.set(MAGIC, 0);
  new DataView(out.buffer).setUint32(4, header.byteLength, true);
  out.set(header, 8);
  let at = start;
  for (const c of chunks) {
    out.set(c, at);
    at = align8(at + c.byteLength);
  }
  return out;
}

/** Decode what encodeWire produced; typed arrays are views on (an aligned copy of) the bytes. */
export function decodeWire(input: ArrayBuffer | Uint8Array): unknown {
  let bytes = input instanceof Uint8Array ? input : new Uint8Array(input);
  if (bytes.byteOffset % 8 !== 0) bytes = bytes.slice();
  if (bytes.byteLength < 8 || MAGIC.some((m, i) => bytes[i] !== m)) {
    throw new Error('The server answered with bytes that are not a Stillwater result.');
  }
  const headerLength = new DataView(bytes.buffer, bytes.byteOffset, 8).getUint32(4, true);
  const header = JSON.parse(new TextDecoder().decode(bytes.subarray(8, 8 + headerLength))) as unknown;
  const base = bytes.byteOffset + align8(8 + headerLength);
  const walk = (v: unknown): unknown => {
    if (v === null || typeof v !== 'object') return v;
    if (Array.isArray(v)) return v.map(walk);
    const o = v as Record<string, unknown>;
    if (typeof o.$num === 'string') return o.big ? BigInt(o.$num) : Number(o.$num);
    if (typeof o.$typed === 'string' && typeof o.at === 'number' && typeof o.n === 'number') {
      const Ctor = CTORS[o.$typed];
      if (!Ctor) throw new Error(`Unknown array type '${o.$typed}' in a Stillwater result.`);
      return new Ctor(bytes.buffer as ArrayBuffer, base + o.at, o.n);
    }
    const r: Record<string, unknown> = {};
    for (const [k, x] of Object.entries(o)) r[k] = walk(x);
    return r;
  };
  return walk(header);
}
