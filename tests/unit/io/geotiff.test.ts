/**
 * GeoTIFF reader against files written by GDAL (gdal_translate from an ASCII grid with nodata, and a
 * tiled two-band UTM file; see tests/fixtures/io/make_fixtures.py). Expected values, nodata, EPSG code
 * and geotransform are what GDAL's Python bindings report. Pixel centres follow the GDAL data model:
 * the geotransform maps pixel corners, so the centre of column i is GT[0] + (i + 0.5)·GT[1].
 */
import { describe, expect, it } from 'vitest';
import { openDataset } from '../../../app/io/open.js';
import { expectedTif, fixture, plain } from './expected.js';

describe('grid.tif (geographic, EPSG:4326, Float32, nodata -9999)', () => {
  const exp = expectedTif('grid');

  it('has dims (lat, lon) and the band values GDAL reads', async () => {
    const ds = await openDataset(fixture('grid.tif'));
    expect(ds.format).toBe('geotiff');
    const raster = ds.variables.find((v) => v.name === 'raster');
    expect(raster?.dims).toEqual(['lat', 'lon']);
    expect(raster?.shape).toEqual([exp.height, exp.width]);
    expect(raster?.dtype).toBe('f4');
    expect(plain(await ds.read('raster'))).toEqual(exp.bands[0].data);
    await ds.close();
  });

  it('has _FillValue from GDAL_NODATA and the CRS code', async () => {
    const ds = await openDataset(fixture('grid.tif'));
    const raster = ds.variables.find((v) => v.name === 'raster');
    expect(exp.bands[0].nodata).toBe(-9999);
    expect(raster?.attrs).toEqual({ _FillValue: [exp.bands[0].nodata], crs: `EPSG:${exp.epsg}` });
    await ds.close();
  });

  it('has 1-D lon/lat at pixel centres of the GDAL geotransform, in degrees_east/degrees_north', async () => {
    const ds = await openDataset(fixture('grid.tif'));
    const gt = exp.geotransform;
    const lon = Array.from({ length: exp.width }, (_, i) => gt[0] + (i + 0.5) * gt[1]);
    const lat = Array.from({ length: exp.height }, (_, j) => gt[3] + (j + 0.5) * gt[5]);
    expect(plain(await ds.read('lon'))).toEqual(lon);
    expect(plain(await ds.read('lat'))).toEqual(lat);
    expect(ds.variables.find((v) => v.name === 'lon')?.attrs.units).toBe('degrees_east');
    expect(ds.variables.find((v) => v.name === 'lat')?.attrs.units).toBe('degrees_north');
    await ds.close();
  });

  it('reads a window', async () => {
    const ds = await openDataset(fixture('grid.tif'));
    const all = exp.bands[0].data;
    const w = exp.width;
    expect(plain(await ds.read('raster', [1, 2], [2, 3]))).toEqual([all[w + 2], all[w + 3], all[w + 4], all[2 * w + 2], all[2 * w + 3], all[2 * w + 4]]);
    await ds.close();
  });
});

describe('bands_utm.tif (projected EPSG:32633, tiled, two Int16 bands)', () => {
  const exp = expectedTif('bands_utm');

  it('has dims (band, y, x), band values as GDAL reads them, x/y in metres', async () => {
    const ds = await openDataset(fixture('bands_utm.tif'));
    const raster = ds.variables.find((v) => v.name === 'raster');
    expect(raster?.dims).toEqual(['band', 'y', 'x']);
    expect(raster?.dtype).toBe('i2');
    expect(raster?.attrs.crs).toBe('EPSG:32633');
    // projected: 2-D longitude/latitude named by `coordinates` (checked against GDAL in geotiff-gdal.test.ts)
    expect(raster?.attrs.coordinates).toBe('lat lon');
    // no nodata: GDAL reads every value as valid
    expect(raster?.attrs._NoFill).toBe('true');
    expect(raster?.attrs._FillValue).toBeUndefined();
    expect(plain(await ds.read('raster'))).toEqual([...exp.bands[0].data, ...exp.bands[1].data]);
    expect(plain(await ds.read('raster', [1, 1, 0], [1, 1, exp.width]))).toEqual(exp.bands[1].data.slice(exp.width, 2 * exp.width));
    const gt = exp.geotransform;
    expect(plain(await ds.read('x'))).toEqual(Array.from({ length: exp.width }, (_, i) => gt[0] + (i + 0.5) * gt[1]));
    expect(plain(await ds.read('y'))).toEqual(Array.from({ length: exp.height }, (_, j) => gt[3] + (j + 0.5) * gt[5]));
    expect(ds.variables.find((v) => v.name === 'x')?.attrs.units).toBe('m');
    await ds.close();
  });
});
