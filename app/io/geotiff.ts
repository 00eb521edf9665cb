/**
 * GeoTIFF reader on top of the `geotiff` package, reading lazily through our ByteSource (only the
 * tiles or strips of a requested window are fetched). The bands become one variable `raster` with
 * dims (band?, y, x) — (band?, lat, lon) for a geographic CRS — and 1-D coordinate variables computed
 * from the georeferencing tags. A projected raster also gets 2-D `lon`/`lat` at the cell centres and
 * their CF bounds (`lon_bnds`/`lat_bnds`, the cell corners), named by the raster's `coordinates`, so it
 * opens as a curvilinear grid. GDAL's nodata becomes _FillValue and GDAL's per-band SCALE/OFFSET become
 * scale_factor/add_offset (GDAL's meaning: physical = raw · scale + offset, nodata compared on raw values);
 * without nodata, `_NoFill` says that no value is missing. No masking or scaling happens here.
 */
import { GeoTIFF, type GeoTIFFImage } from 'geotiff';
import { fileError, printable, StillwaterError } from '../errors.js';
import type { ByteSource } from './byte-source.js';
import { allocArray } from './dtype.js';
import { crsFromGeoKeys, type GeoKeys } from './geotiff-crs.js';
import { projectedLonLat, type ProjectedLonLat } from './geotiff-lonlat.js';
import { geoTransformFromTags, pixelCentres, type GeoTransform } from './geotiff-transform.js';
import { checkSlab, copySlab } from './slab.js';
import type { Attributes, DType, RawArray, RawDataset, RawDimension, RawVariable } from './types.js';

export const RASTER_VARIABLE = 'raster';

/** The `geotiff` package's source interface, served from a ByteSource. */
class ByteSourceAdapter {
  constructor(private readonly source: ByteSource) {}
  get fileSize(): number {
    return this.source.size;
  }
  async fetch(slices: { offset: number; length: number }[]): Promise<ArrayBuffer[]> {
    return Promise.all(slices.map(async (s) => (await this.fetchSlice(s)).data));
  }
  async fetchSlice(slice: { offset: number; length: number }): Promise<{ offset: number; length: number; data: ArrayBuffer }> {
    const length = Math.max(0, Math.min(slice.length, this.source.size - slice.offset));
    const bytes = await this.source.read(slice.offset, length);
    const data = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
    return { offset: slice.offset, length, data };
  }
  async close(): Promise<void> {}
}

function dtypeOf(format: number, bits: number): DType | undefined {
  // SampleFormat: 1 unsigned integer, 2 signed integer, 3 IEEE float (TIFF 6.0 / Adobe supplement)
  const table: Record<string, DType> = {
    '1:8': 'u1', '1:16': 'u2', '1:32': 'u4', '2:8': 'i1', '2:16': 'i2', '2:32': 'i4', '3:32': 'f4', '3:64': 'f8',
  };
  return table[`${format}:${bits}`];
}

/** Largest raster side we read: 0.001° over the globe; a damaged size field becomes a sentence, not an allocation. */
const MAX_SIDE = 360_000;

interface MemVar extends RawVariable {
  data?: RawArray;
  /** computed on first read (the 2-D longitudes and latitudes of a projected raster) */
  compute?: () => RawArray;
}

/** GDAL's scale and offset of each band (GDAL_METADATA items SCALE / OFFSET with role scale / offset). */
async function bandPacking(image: GeoTIFFImage, bands: number, path: string): Promise<{ scale?: number; offset?: number }> {
  const per: { scale?: number; offset?: number }[] = [];
  for (let b = 0; b < bands; b++) {
    let meta: Record<string, unknown> | null;
    try {
      meta = (await image.getGDALMetadata(b)) as Record<string, unknown> | null;
    } catch (e) {
      throw fileError('E_FORMAT', path, `its GDAL metadata cannot be read (${(e as Error).message}).`);
    }
    const value = (key: string): number | undefined => {
      const text = meta?.[key];
      if (text === undefined || text === null) return undefined;
      const x = Number(String(text).trim());
      if (!Number.isFinite(x)) throw fileError('E_FORMAT', path, `band ${b + 1} has a GDAL ${key} that is not a number ('${String(text).slice(0, 40)}').`);
      return x;
    };
    per.push({ scale: value('SCALE'), offset: value('OFFSET') });
  }
  const same = per.every((p) => p.scale === per[0].scale && p.offset === per[0].offset);
  if (!same) throw fileError('E_FORMAT', path, 'its bands have different GDAL scales or offsets, which we do not read as one variable.');
  return per[0] ?? {};
}

export async function openGeoTiff(source: ByteSource, path: string): Promise<RawDataset> {
  let tiff: GeoTIFF;
  let image: GeoTIFFImage;
  try {
    tiff = await GeoTIFF.fromSource(new ByteSourceAdapter(source) as unknown as Parameters<typeof GeoTIFF.fromSource>[0]);
    image = await tiff.getImage(0);
  } catch (e) {
    if (e instanceof StillwaterError) throw e;
    throw fileError('E_FORMAT', path, `the TIFF file is damaged or truncated (${printable((e as Error).message)}).`);
  }
  try {
    return await describeGeoTiff(source, path, tiff, image);
  } catch (e) {
    if (e instanceof StillwaterError) throw e;
    // the `geotiff` package throws plain errors (or TypeErrors) on damaged tags: one sentence of ours instead
    throw fileError('E_FORMAT', path, 'the TIFF tags are damaged (a size, type or GeoTIFF key cannot be read).');
  }
}

/** A numeric GeoKey, or undefined when absent or damaged into another type. */
function numericKey(keys: Record<string, unknown>, name: string): number | undefined {
  const v = keys[name];
  return typeof v === 'number' && Number.isFinite(v) ? v : undefined;
}

async function describeGeoTiff(source: ByteSource, path: string, tiff: GeoTIFF, image: GeoTIFFImage): Promise<RawDataset> {
  const width = image.getWidth();
  const height = image.getHeight();
  const bands = image.getSamplesPerPixel();
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1 || width > MAX_SIDE || height > MAX_SIDE) {
    throw fileError('E_FORMAT', path, `its raster size (${width} × ${height} pixels) is damaged or beyond what we read (${MAX_SIDE} a side).`);
  }
  if (!Number.isInteger(bands) || bands < 1 || bands > 4096) throw fileError('E_FORMAT', path, `its number of bands (${bands}) is damaged.`);
  checkBlockOffsets(image, path, width, height, bands);
  const dtype = dtypeOf(image.getSampleFormat(0), image.getBitsPerSample(0));
  if (!dtype) throw fileError('E_FORMAT', path, `its samples (format ${image.getSampleFormat(0)}, ${image.getBitsPerSample(0)} bits) are not a type we read.`);
  for (let b = 1; b < bands; b++) {
    if (dtypeOf(image.getSampleFormat(b), image.getBitsPerSample(b)) !== dtype) {
      throw fileError('E_FORMAT', path, 'its bands have different sample types, which we do not read.');
    }
  }

  const fd = image.fileDirectory as unknown as { getValue(name: string): ArrayLike<number> | undefined };
  const transform = geoTransformFromTags(fd.getValue('ModelTiepoint'), fd.getValue('ModelPixelScale'), fd.getValue('ModelTransformation'));
  if (transform === 'rotated') throw fileError('E_FORMAT', path, 'its grid is rotated (ModelTransformation with rotation terms), which we do not read.');
  if (!transform) throw fileError('E_COORDS', path, 'it has no georeferencing (no ModelTiepoint/ModelPixelScale or ModelTransformation).');

  let keys: Record<string, unknown>;
  try {
    keys = (image.getGeoKeys() ?? {}) as Record<string, unknown>;
  } catch {
    throw fileError('E_FORMAT', path, 'its GeoTIFF key directory is damaged (a key points at a value that is not there).');
  }
  const projected = numericKey(keys, 'ProjectedCSTypeGeoKey');
  const geographicCode = numericKey(keys, 'GeographicTypeGeoKey');
  const modelType = numericKey(keys, 'GTModelTypeGeoKey');
  const geographic = modelType === 2 || (modelType === undefined && projected === undefined && geographicCode !== undefined);
  const epsg = geographic ? geographicCode : projected;
  const pixelIsPoint = numericKey(keys, 'GTRasterTypeGeoKey') === 2;
  const linearUnits = numericKey(keys, 'ProjLinearUnitsGeoKey');

  const [xName, yName] = geographic ? ['lon', 'lat'] : ['x', 'y'];
  const xAttrs: Attributes = geographic
    ? { units: 'degrees_east', standard_name: 'longitude', axis: 'X' }
    : { units: linearUnits === 9001 || linearUnits === undefined ? 'm' : `EPSG:${linearUnits}`, standard_name: 'projection_x_coordinate', axis: 'X' };
  const yAttrs: Attributes = geographic
    ? { units: 'degrees_north', standard_name: 'latitude', axis: 'Y' }
    : { ...xAttrs, standard_name: 'projection_y_coordinate', axis: 'Y' };

  const rasterAttrs: Attributes = {};
  const nodata = gdalNoData(image, path);
  if (nodata !== undefined && Number.isFinite(nodata)) rasterAttrs._FillValue = [nodata];
  // without nodata GDAL treats every value as valid; NetCDF's default fill values must not mask any
  else if (nodata === undefined) rasterAttrs._NoFill = 'true';
  const packing = await bandPacking(image, bands, path);
  if (packing.scale !== undefined && packing.scale !== 1) rasterAttrs.scale_factor = [packing.scale];
  if (packing.offset !== undefined && packing.offset !== 0) rasterAttrs.add_offset = [packing.offset];
  if (epsg !== undefined) rasterAttrs.crs = `EPSG:${epsg}`;
  let projection: { proj4: string; name: string } | undefined;
  if (!geographic) {
    const crs = crsFromGeoKeys(keys as GeoKeys);
    if ('unknown' in crs) throw fileError('E_COORDS', path, `its projection ${crs.unknown} is not one we can turn into longitude and latitude.`);
    projection = crs;
    rasterAttrs.crs_name = crs.name;
    rasterAttrs.crs_proj4 = crs.proj4;
    rasterAttrs.coordinates = 'lat lon';
  }

  const dims: RawDimension[] = [];
  const variables: MemVar[] = [];
  if (bands > 1) {
    dims.push({ name: 'band', size: bands, unlimited: false });
    variables.push({ name: 'band', dims: ['band'], shape: [bands], dtype: 'i4', attrs: { long_name: 'band number' }, data: Int32Array.from({ length: bands }, (_, i) => i + 1) });
  }
  dims.push({ name: yName, size: height, unlimited: false }, { name: xName, size: width, unlimited: false });
  variables.push(
    { name: yName, dims: [yName], shape: [height], dtype: 'f8', attrs: yAttrs, data: pixelCentres(transform.y, height, pixelIsPoint) },
    { name: xName, dims: [xName], shape: [width], dtype: 'f8', attrs: xAttrs, data: pixelCentres(transform.x, width, pixelIsPoint) },
  );
  if (projection) variables.push(...lonLatVariables(projection.proj4, transform, width, height, pixelIsPoint, xName, yName, dims));
  const raster: MemVar = {
    name: RASTER_VARIABLE,
    dims: bands > 1 ? ['band', yName, xName] : [yName, xName],
    shape: bands > 1 ? [bands, height, width] : [height, width],
    dtype,
    attrs: rasterAttrs,
    // GDAL keeps scale and offset as doubles (GDALRasterBand::GetScale/GetOffset)
    attrTypes: { ...(rasterAttrs.scale_factor ? { scale_factor: 'f8' } : {}), ...(rasterAttrs.add_offset ? { add_offset: 'f8' } : {}) },
  };
  variables.unshift(raster);
  return new GeoTiffDataset(path, source, tiff, image, dims, variables);
}

/**
 * GDAL_NODATA is ASCII text holding a number (GDAL's TIFF tag 42113); any other type is a damaged tag.
 * Undefined when absent; NaN for a nodata of "nan".
 */
function gdalNoData(image: GeoTIFFImage, path: string): number | undefined {
  const fd = image.fileDirectory as unknown as { hasTag?(name: string): boolean; getValue(name: string): unknown };
  const raw = fd.hasTag && !fd.hasTag('GDAL_NODATA') ? undefined : fd.getValue('GDAL_NODATA');
  if (raw === undefined || raw === null) return undefined;
  if (typeof raw !== 'string') throw fileError('E_FORMAT', path, 'its GDAL_NODATA tag is not text holding a number (the tag is damaged).');
  const text = raw.replace(/\0+$/, '').trim();
  if (text === '') return undefined;
  const value = Number(text);
  if (Number.isNaN(value) && !/^nan$/i.test(text)) {
    throw fileError('E_FORMAT', path, `its GDAL_NODATA tag ('${printable(text, 40)}') is not a number.`);
  }
  return value;
}

/**
 * The strip or tile offset table must hold one entry per block (TIFF 6.0, sections 3 and 15); a damaged
 * size or a damaged table would otherwise be read block by block far past the file.
 */
function checkBlockOffsets(image: GeoTIFFImage, path: string, width: number, height: number, bands: number): void {
  const fd = image.fileDirectory as unknown as { getValue(name: string): unknown };
  const tiled = image.isTiled;
  const offsets = (tiled ? fd.getValue('TileOffsets') : fd.getValue('StripOffsets')) as ArrayLike<number> | number | undefined;
  const counts = (tiled ? fd.getValue('TileByteCounts') : fd.getValue('StripByteCounts')) as ArrayLike<number> | number | undefined;
  const n = (x: ArrayLike<number> | number | undefined): number => (typeof x === 'number' ? 1 : (x?.length ?? 0));
  const tw = image.getTileWidth();
  const th = image.getTileHeight();
  const planes = image.planarConfiguration === 2 ? bands : 1;
  const expected = tiled ? Math.ceil(width / tw) * Math.ceil(height / th) * planes : Math.ceil(height / th) * planes;
  if (!Number.isFinite(expected) || n(offsets) < expected || n(counts) < expected) {
    throw fileError('E_FORMAT', path, `its ${tiled ? 'tile' : 'strip'} table is damaged (${n(offsets)} entries for ${expected} ${tiled ? 'tiles' : 'strips'}).`);
  }
}

class GeoTiffDataset implements RawDataset {
  readonly format = 'geotiff' as const;
  readonly attrs: Attributes = {};
  readonly variables: RawVariable[];

  constructor(
    readonly path: string,
    private readonly source: ByteSource,
    private readonly tiff: GeoTIFF,
    private readonly image: GeoTIFFImage,
    readonly dimensions: RawDimension[],
    private readonly vars: MemVar[],
  ) {
    this.variables = vars.map(({ name, dims, shape, dtype, attrs, attrTypes }) => ({ name, dims, shape, dtype, attrs, ...(attrTypes ? { attrTypes } : {}) }));
  }

  async read(name: string, start?: number[], count?: number[]): Promise<RawArray> {
    const v = this.vars.find((x) => x.name === name);
    if (!v) throw fileError('E_VARIABLE', this.path, `there is no variable '${name}'.`, name);
    const { s, c } = checkSlab(this.path, v, start, count);
    if (v.compute) v.data ??= v.compute();
    if (v.data) return copySlab(v.data, v.shape, s, c);
    const banded = v.shape.length === 3;
    const [b0, nb] = banded ? [s[0], c[0]] : [0, 1];
    const [y0, ny, x0, nx] = banded ? [s[1], c[1], s[2], c[2]] : [s[0], c[0], s[1], c[1]];
    const out = allocArray(v.dtype, nb * ny * nx);
    if (out.length === 0) return out;
    let planes: ArrayLike<number>[];
    try {
      const samples = Array.from({ length: nb }, (_, i) => b0 + i);
      planes = (await this.image.readRasters({ window: [x0, y0, x0 + nx, y0 + ny], samples, interleave: false })) as unknown as ArrayLike<number>[];
    } catch (e) {
      throw fileError('E_FORMAT', this.path, `its raster cannot be read (${printable((e as Error).message)}).`, name);
    }
    for (let b = 0; b < nb; b++) (out as Float64Array).set(planes[b], b * ny * nx);
    return out;
  }

  async close(): Promise<void> {
    await this.tiff.close();
    await this.source.close();
  }
}

/** 2-D longitude/latitude of a projected raster and their bounds, computed together on first read. */
function lonLatVariables(proj4def: string, t: GeoTransform, nx: number, ny: number, pixelIsPoint: boolean, xName: string, yName: string, dims: RawDimension[]): MemVar[] {
  let cached: ProjectedLonLat | undefined;
  const get = (): ProjectedLonLat => (cached ??= projectedLonLat(proj4def, t, nx, ny, pixelIsPoint));
  dims.push({ name: 'nv4', size: 4, unlimited: false });
  return [
    { name: 'lat', dims: [yName, xName], shape: [ny, nx], dtype: 'f8', attrs: { standard_name: 'latitude', units: 'degrees_north', bounds: 'lat_bnds' }, compute: () => get().lat },
    { name: 'lon', dims: [yName, xName], shape: [ny, nx], dtype: 'f8', attrs: { standard_name: 'longitude', units: 'degrees_east', bounds: 'lon_bnds' }, compute: () => get().lon },
    { name: 'lat_bnds', dims: [yName, xName, 'nv4'], shape: [ny, nx, 4], dtype: 'f8', attrs: { units: 'degrees_north' }, compute: () => get().latBounds },
    { name: 'lon_bnds', dims: [yName, xName, 'nv4'], shape: [ny, nx, 4], dtype: 'f8', attrs: { units: 'degrees_east' }, compute: () => get().lonBounds },
  ];
}
