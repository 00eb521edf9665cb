#!/usr/bin/python3
"""Peer of tests/bench/lines.bench.ts: the same sampling with scipy's RegularGridInterpolator, as a
person would write it. The field is built from the same formula, held in memory as float32
(depth, lat, lon), padded with its first longitude column at +360 so the interpolator sees the wrap.

usage: lines_peer.py transect|stations POINTS.f64 OUT.f64 REPEATS
POINTS.f64 holds lon, lat, depth (float64, three arrays one after another).
Prints one JSON line: best CPU time (process_time) and elapsed time of the sampling in ms
(interpolator built and called), and peak RSS.
"""
import json
import resource
import sys
import time

import numpy as np
from scipy.interpolate import RegularGridInterpolator

NX, NY, NZ = 360, 180, 102


def depth_edges():
    # 102 layers, thin at the top, thick below, to 6000 m (same rule as the benchmark)
    k = np.arange(NZ + 1, dtype=np.float64)
    return 6000.0 * (k / NZ) ** 1.8


def field():
    lon = -179.5 + np.arange(NX, dtype=np.float64)
    lat = -89.5 + np.arange(NY, dtype=np.float64)
    e = depth_edges()
    z = 0.5 * (e[:-1] + e[1:])
    lam = np.radians(lon)[None, None, :]
    phi = np.radians(lat)[None, :, None]
    zz = z[:, None, None]
    v = (np.sin(2 * lam) * np.cos(phi) + 0.3 * np.cos(3 * phi) + zz / 2000.0 + 0.05 * np.sin(lam * 5 + zz / 500.0)).astype(np.float32)
    return lon, lat, z, v


def main():
    mode, points_file, out_file, repeats = sys.argv[1], sys.argv[2], sys.argv[3], int(sys.argv[4])
    lon, lat, z, v = field()
    pts = np.fromfile(points_file, dtype=np.float64).reshape(3, -1)
    plon, plat, pz = pts
    best = float("inf")
    best_wall = float("inf")
    out = None
    for _ in range(repeats):
        t0 = time.perf_counter()
        c0 = time.process_time()
        lon_p = np.concatenate([lon, [lon[0] + 360.0]])
        v_p = np.concatenate([v, v[:, :, :1]], axis=2)
        rgi = RegularGridInterpolator((z, lat, lon_p), v_p, method="linear", bounds_error=False, fill_value=np.nan)
        x = np.where(plon < lon[0], plon + 360.0, plon)
        if mode == "transect":
            # every level centre at every sample of the line
            q = np.column_stack([np.repeat(z, plon.size), np.tile(plat, z.size), np.tile(x, z.size)])
        else:
            q = np.column_stack([pz, plat, x])
        out = rgi(q)
        best = min(best, (time.process_time() - c0) * 1000.0)
        best_wall = min(best_wall, (time.perf_counter() - t0) * 1000.0)
    out.astype(np.float64).tofile(out_file)
    peak_mb = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024.0
    print(json.dumps({"ms": best, "wall_ms": best_wall, "peak_mb": peak_mb, "n": int(out.size)}))


if __name__ == "__main__":
    main()
