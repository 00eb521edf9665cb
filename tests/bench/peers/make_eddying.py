#!/usr/bin/python3
"""Input files for tests/bench/eddying.bench.ts (not a peer: the benchmark times our compare on them).

  make_eddying.py DIR STEP NZ   a global rotated-pole curvilinear run at STEP degrees (pole of the rotated
                                frame at 40°N, 170°W, so no cell edge passes through a geographic pole), NZ
                                levels, two tracers (po4, o2) in float32, NetCDF-4 deflate level 1 + shuffle,
                                one chunk per level; 2-D lon/lat with CF bounds (float64); written level by
                                level so that memory stays small. Also a 1° x NZ-level reference on a regular
                                grid (ref.nc, classic) in µmol kg-1 ... here mmol m-3 to keep units out of it.
The fields are smooth invented functions; only time and memory count.
"""
import sys

import numpy as np
from netCDF4 import Dataset

out, step, nz = sys.argv[1], float(sys.argv[2]), int(sys.argv[3])
nx, ny = int(round(360 / step)), int(round(180 / step))
pole_lat, pole_lon = np.radians(40.0), np.radians(-170.0)


def unrotate(rlon, rlat):
    """Rotated-pole (degrees) to geographic (degrees), CF rotated_latitude_longitude."""
    lam, phi = np.radians(rlon), np.radians(rlat)
    x, y, z = np.cos(phi) * np.cos(lam), np.cos(phi) * np.sin(lam), np.sin(phi)
    th = np.pi / 2 - pole_lat  # rotate about y by -(90 - pole lat), then about z by pole lon
    x2 = x * np.cos(th) + z * np.sin(th)
    z2 = -x * np.sin(th) + z * np.cos(th)
    lon = np.degrees(np.arctan2(y, x2)) + np.degrees(pole_lon)
    lat = np.degrees(np.arcsin(np.clip(z2, -1, 1)))
    return (lon + 180) % 360 - 180, lat


depth_edges = np.concatenate([[0], np.cumsum(np.linspace(10, 500, nz))])
depth = 0.5 * (depth_edges[:-1] + depth_edges[1:])

with Dataset(f'{out}/run.nc', 'w', format='NETCDF4') as ds:
    ds.createDimension('depth', nz)
    ds.createDimension('y', ny)
    ds.createDimension('x', nx)
    ds.createDimension('nv', 4)
    ds.createDimension('bnds', 2)
    d = ds.createVariable('depth', 'f8', ('depth',))
    d.units, d.positive, d.axis, d.bounds = 'm', 'down', 'Z', 'depth_bnds'
    d[:] = depth
    ds.createVariable('depth_bnds', 'f8', ('depth', 'bnds'))[:] = np.stack([depth_edges[:-1], depth_edges[1:]], 1)
    lon = ds.createVariable('lon', 'f8', ('y', 'x'), zlib=True, complevel=1)
    lat = ds.createVariable('lat', 'f8', ('y', 'x'), zlib=True, complevel=1)
    lonb = ds.createVariable('lon_bnds', 'f8', ('y', 'x', 'nv'), zlib=True, complevel=1)
    latb = ds.createVariable('lat_bnds', 'f8', ('y', 'x', 'nv'), zlib=True, complevel=1)
    lon.units, lon.standard_name, lon.bounds = 'degrees_east', 'longitude', 'lon_bnds'
    lat.units, lat.standard_name, lat.bounds = 'degrees_north', 'latitude', 'lat_bnds'
    rlon_e = -180 + step * np.arange(nx + 1)
    rlat_e = -90 + step * np.arange(ny + 1)
    tracers = {}
    for name, units in (('po4', 'mmol m-3'), ('o2', 'mmol m-3')):
        v = ds.createVariable(name, 'f4', ('depth', 'y', 'x'), zlib=True, complevel=1, shuffle=True,
                              chunksizes=(1, ny, nx), fill_value=np.float32(1e20))
        v.units, v.coordinates = units, 'lon lat'
        tracers[name] = v
    band = max(1, ny // 20)
    for j0 in range(0, ny, band):
        j1 = min(ny, j0 + band)
        rl, rp = np.meshgrid(rlon_e, rlat_e[j0:j1 + 1])
        elon, elat = unrotate(rl, rp)
        cl, cp = np.meshgrid(0.5 * (rlon_e[:-1] + rlon_e[1:]), 0.5 * (rlat_e[j0:j1] + rlat_e[j0 + 1:j1 + 1]))
        clon, clat = unrotate(cl, cp)
        lon[j0:j1, :], lat[j0:j1, :] = clon, clat
        corners = lambda e: np.stack([e[:-1, :-1], e[:-1, 1:], e[1:, 1:], e[1:, :-1]], -1)
        lonb[j0:j1, :, :], latb[j0:j1, :, :] = corners(elon), corners(elat)
    lonr, latr = np.radians(lon[:]), np.radians(lat[:])
    land = (np.sin(3 * lonr) * np.cos(2 * latr) > 0.85) | (np.abs(lat[:]) > 85)
    for k in range(nz):
        f = np.exp(-depth[k] / 1500.0)
        po4 = (2.2 - 1.8 * f * np.cos(latr) ** 2 + 0.1 * np.sin(2 * lonr)).astype(np.float32)
        o2 = (180 + 120 * np.sin(latr) ** 2 - 40 * f * np.cos(3 * lonr) * np.cos(latr)).astype(np.float32)
        po4[land], o2[land] = 1e20, 1e20
        tracers['po4'][k, :, :] = po4
        tracers['o2'][k, :, :] = o2

with Dataset(f'{out}/ref.nc', 'w', format='NETCDF3_64BIT_OFFSET') as ds:
    ds.createDimension('depth', nz)
    ds.createDimension('lat', 180)
    ds.createDimension('lon', 360)
    d = ds.createVariable('depth', 'f8', ('depth',))
    d.units, d.positive, d.axis = 'm', 'down', 'Z'
    d[:] = depth
    la = ds.createVariable('lat', 'f8', ('lat',))
    la.units = 'degrees_north'
    la[:] = -89.5 + np.arange(180)
    lo = ds.createVariable('lon', 'f8', ('lon',))
    lo.units = 'degrees_east'
    lo[:] = -179.5 + np.arange(360)
    glon, glat = np.meshgrid(np.radians(lo[:]), np.radians(la[:]))
    for name, base in (('po4', 2.0), ('o2', 200.0)):
        v = ds.createVariable(name, 'f4', ('depth', 'lat', 'lon'), fill_value=np.float32(1e20))
        v.units = 'mmol m-3'
        for k in range(nz):
            v[k] = (base * (1 + 0.2 * np.cos(glat) * np.exp(-depth[k] / 1500.0))).astype(np.float32)
