#!/usr/bin/python3
"""Peer for tests/bench/io.bench.ts: netCDF4-python (Debian's python3-netcdf4).

  io_peer.py make DIR       write the benchmark files into DIR (not committed):
                            classic.nc       (time, depth, lat, lon) float32, NetCDF classic
                            nc4_level.nc     same values, NetCDF-4, deflate level 4 + shuffle, chunks 1x1x180x360
                            nc4_default.nc   same values, NetCDF-4, deflate level 4 + shuffle, the library's default chunks
  io_peer.py read FILE VAR REPEATS
                            read VAR level by level (raw values, auto mask/scale off) REPEATS times;
                            print JSON {"seconds": [...], "checksum": ...}
"""
import json
import os
import sys
import time

import numpy as np
import netCDF4

NZ, NY, NX = 102, 180, 360


def field():
    lat = np.linspace(-89.5, 89.5, NY)[:, None]
    lon = np.linspace(0.5, 359.5, NX)[None, :]
    rng = np.random.default_rng(1)
    out = np.empty((NZ, NY, NX), dtype="f4")
    for k in range(NZ):
        depth = 5.0 * (k + 1) ** 1.6
        smooth = 2.0 + 1.5 * np.tanh(depth / 800.0) + 0.5 * np.cos(np.radians(lat)) * np.sin(np.radians(2 * lon + k))
        noise = 0.01 * rng.standard_normal((NY, NX))
        out[k] = np.round(smooth + noise, 4)
    return out


def make(folder):
    data = field()
    specs = [
        ("classic.nc", "NETCDF3_CLASSIC", {}),
        ("nc4_level.nc", "NETCDF4", dict(zlib=True, complevel=4, shuffle=True, chunksizes=(1, 1, NY, NX))),
        ("nc4_default.nc", "NETCDF4", dict(zlib=True, complevel=4, shuffle=True)),
    ]
    for name, fmt, kw in specs:
        path = os.path.join(folder, name)
        ds = netCDF4.Dataset(path, "w", format=fmt)
        ds.createDimension("time", None)
        ds.createDimension("depth", NZ)
        ds.createDimension("lat", NY)
        ds.createDimension("lon", NX)
        v = ds.createVariable("o2", "f4", ("time", "depth", "lat", "lon"), **kw)
        v.set_auto_maskandscale(False)
        for k in range(NZ):
            v[0, k] = data[k]
        chunking = v.chunking() if fmt == "NETCDF4" else "contiguous"
        ds.close()
        print(json.dumps({"file": name, "chunking": chunking if isinstance(chunking, str) else list(chunking)}))


def read(path, var, repeats):
    ds = netCDF4.Dataset(path)
    v = ds.variables[var]
    v.set_auto_maskandscale(False)
    nz = v.shape[1]
    seconds = []
    checksum = 0.0
    for _ in range(repeats):
        t0 = time.perf_counter()
        for k in range(nz):
            level = v[0, k, :, :]
            checksum += float(level[0, 0])
        seconds.append(time.perf_counter() - t0)
    ds.close()
    print(json.dumps({"seconds": seconds, "checksum": checksum}))


if __name__ == "__main__":
    if sys.argv[1] == "make":
        make(sys.argv[2])
    else:
        read(sys.argv[2], sys.argv[3], int(sys.argv[4]))
