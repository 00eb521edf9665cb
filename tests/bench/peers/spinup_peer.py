"""Peer for tests/bench/spinup.bench.ts: what a person would write instead with netCDF4-python and numpy.
For each snapshot file: read the whole 3-D field, then volume-weighted means and inventories for every region
x layer (layers by overlap of the level bounds; the bottom layer as the deepest wet cell of each column).

usage: spinup_peer.py DIR NSNAP REGIONS.u8 NREG
prints JSON: seconds per snapshot, peak traced memory (tracemalloc: numpy arrays are traced), the means.
"""
import json
import sys
import time
import tracemalloc

import numpy as np
from netCDF4 import Dataset

folder, nsnap, regfile, nreg = sys.argv[1], int(sys.argv[2]), sys.argv[3], int(sys.argv[4])
LAYERS = [(0.0, 200.0), (200.0, 1000.0), (1000.0, 6000.0), 'all', 'bottom']
R = 6371008.8

tracemalloc.start()
with Dataset(f'{folder}/year-{1:05d}.nc') as ds:
    lon_b = ds['lon_bnds'][:]
    lat_b = ds['lat_bnds'][:]
    dep_b = ds['depth_bnds'][:]
regions = np.fromfile(regfile, dtype=np.uint8).reshape(nreg, lat_b.shape[0], lon_b.shape[0]).astype(bool)
area = R * R * np.deg2rad(lon_b[:, 1] - lon_b[:, 0])[None, :] * (np.sin(np.deg2rad(lat_b[:, 1])) - np.sin(np.deg2rad(lat_b[:, 0])))[:, None]
dz = dep_b[:, 1] - dep_b[:, 0]
frac = []
for layer in LAYERS:
    if layer == 'all':
        frac.append(np.ones_like(dz))
    elif layer == 'bottom':
        frac.append(None)
    else:
        frac.append(np.clip(np.minimum(dep_b[:, 1], layer[1]) - np.maximum(dep_b[:, 0], layer[0]), 0, None) / dz)
tracemalloc.reset_peak()
base = tracemalloc.get_traced_memory()[0]
seconds = []
means = []
for s in range(1, nsnap + 1):
    t0 = time.perf_counter()
    with Dataset(f'{folder}/year-{s:05d}.nc') as ds:
        c = ds['po4'][:].filled(np.nan).astype(np.float64)
    wet = ~np.isnan(c)
    c0 = np.where(wet, c, 0.0)
    vol = area[None, :, :] * dz[:, None, None]
    kb = wet.shape[0] - 1 - np.argmax(wet[::-1], axis=0)
    has = wet.any(axis=0)
    bc = np.take_along_axis(c0, kb[None], 0)[0]
    bv = np.where(has, area * dz[kb], 0.0)
    row = []
    for r in range(nreg):
        m = regions[r]
        for li, layer in enumerate(LAYERS):
            if layer == 'bottom':
                w = np.where(m, bv, 0.0)
                row.append(float((bc * w).sum() / w.sum()))
            else:
                w = vol * frac[li][:, None, None] * (wet & m[None])
                row.append(float((c0 * w).sum() / w.sum()))
    means.append(row)
    seconds.append(time.perf_counter() - t0)
peak = tracemalloc.get_traced_memory()[1] - base
print(json.dumps({'seconds': seconds, 'peak_bytes': peak, 'means': means}))
