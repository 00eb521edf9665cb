#!/usr/bin/python3
"""Peer for tests/bench/cf.bench.ts: netCDF4-python (Debian's python3-netcdf4) decoding CF fields.

  cf_peer.py make DIR      write into DIR (not committed) packed_classic.nc and packed_nc4.nc: a
                           (time, depth, lat, lon) = 1 x 102 x 180 x 360 int16 variable 'temp' packed with
                           scale_factor/add_offset (float32) and a _FillValue over "land", descending latitude,
                           with coordinates; the NetCDF-4 copy deflated (level 4 + shuffle), chunks 1x1x180x360
  cf_peer.py read FILE REPEATS
                           decode 'temp' level by level as a person would with netCDF4-python (auto mask and
                           scale on, masked values filled with NaN, rows flipped so latitude increases);
                           print JSON {"seconds": [...], "checksum": ..., "valid": ...}
"""
import json
import os
import sys
import time

import netCDF4
import numpy as np

NZ, NY, NX = 102, 180, 360


def make(folder):
    lat = np.linspace(89.5, -89.5, NY)
    lon = np.linspace(0.5, 359.5, NX)
    rng = np.random.default_rng(2)
    for name, fmt, kw in [('packed_classic.nc', 'NETCDF3_64BIT_OFFSET', {}),
                          ('packed_nc4.nc', 'NETCDF4', dict(zlib=True, complevel=4, shuffle=True, chunksizes=(1, 1, NY, NX)))]:
        ds = netCDF4.Dataset(os.path.join(folder, name), 'w', format=fmt)
        ds.createDimension('time', None)
        ds.createDimension('depth', NZ)
        ds.createDimension('lat', NY)
        ds.createDimension('lon', NX)
        t = ds.createVariable('time', 'f8', ('time',))
        t.units = 'days since 1850-01-01'
        t[:] = [0.0]
        z = ds.createVariable('depth', 'f4', ('depth',))
        z.units = 'm'
        z.positive = 'down'
        z[:] = 5.0 * (np.arange(NZ) + 1) ** 1.6
        la = ds.createVariable('lat', 'f4', ('lat',))
        la.units = 'degrees_north'
        la[:] = lat
        lo = ds.createVariable('lon', 'f4', ('lon',))
        lo.units = 'degrees_east'
        lo[:] = lon
        v = ds.createVariable('temp', 'i2', ('time', 'depth', 'lat', 'lon'), fill_value=np.int16(-32767), **kw)
        v.scale_factor = np.float32(0.001)
        v.add_offset = np.float32(10.0)
        v.units = 'degC'
        v.set_auto_maskandscale(False)
        for k in range(NZ):
            raw = rng.integers(-10000, 20000, size=(NY, NX)).astype('i2')
            # land: more of it with depth
            raw[np.abs(lat) > 80 - 0.6 * k, :] = -32767
            raw[:, (lon > 280) & (lon < 300 + k)] = -32767
            v[0, k] = raw
        ds.close()
        print(json.dumps({'file': name}))


def read(path, repeats):
    ds = netCDF4.Dataset(path)
    v = ds['temp']
    seconds = []
    checksum = 0.0
    valid = 0
    for _ in range(repeats):
        t0 = time.perf_counter()
        checksum = 0.0
        valid = 0
        for k in range(v.shape[1]):
            level = v[0, k, ::-1, :].filled(np.nan)  # latitude increasing, NaN for missing
            checksum += float(np.nansum(level[::37, ::41]))
            valid += int(np.count_nonzero(~np.isnan(level)))
        seconds.append(time.perf_counter() - t0)
    ds.close()
    print(json.dumps({'seconds': seconds, 'checksum': checksum, 'valid': valid}))


if __name__ == '__main__':
    if sys.argv[1] == 'make':
        make(sys.argv[2])
    else:
        read(sys.argv[2], int(sys.argv[3]))
