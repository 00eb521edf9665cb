/**
 * NetCDF classic reader (CDF-1, 64-bit offset CDF-2, CDF-5) over a ByteSource.
 * The header is parsed once; data are read as hyperslabs by offset, big-endian bytes
 * swapped in place into typed arrays. No CF interpretation happens here.
 */
import { fileError } from '../errors.js';
import type { ByteSource } from './byte-source.js';
import { allocArrayForOverwrite, bigEndianToHost, DTYPE_SIZE } from './dtype.js';
import { readCdf3Header, type Cdf3Header, type Cdf3Variable } from './netcdf3-header.js';
import { checkSlab } from './slab.js';
import { contiguousStrides, readStrided } from './strided-read.js';
import type { Attributes, DatasetFormat, RawArray, RawDataset, RawDimension, RawVariable } from './types.js';

/** Slabs up to this size are read through the staging buffer; larger ones straight into the result. */
const STAGING_LIMIT = 16 * 1024 * 1024;

const FORMATS: Record<1 | 2 | 5, DatasetFormat> = { 1: 'netcdf3-classic', 2: 'netcdf3-64bit-offset', 5: 'netcdf3-cdf5' };

export class Netcdf3Dataset implements RawDataset {
  readonly format: DatasetFormat;
  readonly dimensions: RawDimension[];
  readonly attrs: Attributes;
  readonly variables: RawVariable[];
  private readonly byName = new Map<string, Cdf3Variable>();
  /** reused for every read up to STAGING_LIMIT bytes (one level of a large grid) */
  private staging: Uint8Array | undefined;

  private constructor(readonly path: string, private readonly source: ByteSource, private readonly header: Cdf3Header) {
    this.format = FORMATS[header.version];
    this.dimensions = header.dimensions;
    this.attrs = header.attrs;
    this.variables = header.variables.map((v) => ({ name: v.name, dims: v.dims, shape: v.shape, dtype: v.dtype, attrs: v.attrs, attrTypes: v.attrTypes }));
    for (const v of header.variables) this.byName.set(v.name, v);
  }

  static async open(source: ByteSource, path = source.name): Promise<Netcdf3Dataset> {
    const header = await readCdf3Header(source);
    const ds = new Netcdf3Dataset(path, source, header);
    ds.checkExtents();
    return ds;
  }

  /** A file cut short after its header: say so at open, not at the first read. */
  private checkExtents(): void {
    let end = 0;
    for (const v of this.header.variables) {
      const size = DTYPE_SIZE[v.dtype];
      if (v.isRecord) {
        if (this.header.numrecs === 0) continue;
        const inner = v.shape.slice(1).reduce((a, b) => a * b, 1) * size;
        end = Math.max(end, v.begin + (this.header.numrecs - 1) * this.header.recsize + inner);
      } else {
        end = Math.max(end, v.begin + v.shape.reduce((a, b) => a * b, 1) * size);
      }
    }
    if (end > this.source.size) {
      throw fileError('E_FORMAT', this.path, `the file is truncated: its header describes ${end} bytes of data but the file has ${this.source.size}.`);
    }
  }

  async read(name: string, start?: number[], count?: number[]): Promise<RawArray> {
    const v = this.byName.get(name);
    if (!v) throw fileError('E_VARIABLE', this.path, `there is no variable '${name}'.`, name);
    const { s, c } = checkSlab(this.path, v, start, count);
    const size = DTYPE_SIZE[v.dtype];
    // every byte is overwritten below
    const out = allocArrayForOverwrite(v.dtype, c.reduce((a, b) => a * b, 1));
    const bytes = new Uint8Array(out.buffer, out.byteOffset, out.byteLength);
    const strides = contiguousStrides(v.shape, size);
    if (v.isRecord) strides[0] = this.header.recsize;
    const layout = { base: v.begin, elementSize: size, shape: v.shape, strides };
    const staging = bytes.byteLength <= STAGING_LIMIT ? this.takeStaging(bytes.byteLength) : undefined;
    if (staging) {
      // Read into memory already mapped by an earlier read, then copy: on the VMs we measured, letting the
      // kernel fill never-touched pages and then touching them to swap costs more than this one copy.
      try {
        await readStrided(this.source, layout, s, c, staging);
        bytes.set(staging);
      } finally {
        this.giveBackStaging(staging);
      }
    } else {
      await readStrided(this.source, layout, s, c, bytes);
    }
    bigEndianToHost(bytes, size);
    return out;
  }

  /** The staging buffer (grown to `n` bytes), taken out while in use so that overlapping reads never share it. */
  private takeStaging(n: number): Uint8Array {
    let buf = this.staging;
    this.staging = undefined;
    if (!buf || buf.byteLength < n) buf = new Uint8Array(Buffer.allocUnsafeSlow(n).buffer);
    return buf.subarray(0, n);
  }

  private giveBackStaging(view: Uint8Array): void {
    const whole = new Uint8Array(view.buffer);
    if (!this.staging || this.staging.byteLength < whole.byteLength) this.staging = whole;
  }

  async close(): Promise<void> {
    await this.source.close();
  }
}
