"""Peer for tests/bench/time.bench.ts: what a person would write instead with xarray (Debian python3-xarray
and cftime): a 12-month climatology with day-count weights, by grouping on the month, missing values skipped
with their weights. Level by level (isel on depth), so that the peer's memory stays bounded as ours does.

usage: time_peer.py FILE VARIABLE
prints JSON: seconds, peak traced memory (tracemalloc: numpy arrays are traced), and per month the sum of
the climatology over the wet cells of every level (to check that both sides agree).
"""
import json
import sys
import time
import tracemalloc

import numpy as np
import xarray as xr

path, name = sys.argv[1], sys.argv[2]
tracemalloc.start()
t0 = time.perf_counter()
ds = xr.open_dataset(path, use_cftime=True)
w = ds.time.dt.days_in_month.astype('f8')
sums = np.zeros(12)
for k in range(ds.sizes['depth']):
    x = ds[name].isel(depth=k).load()
    wv = w.where(x.notnull())
    clim = (x * w).groupby('time.month').sum('time') / wv.groupby('time.month').sum('time')
    sums += np.nansum(clim.values.reshape(12, -1), axis=1)
seconds = time.perf_counter() - t0
print(json.dumps({'seconds': seconds, 'peak_bytes': tracemalloc.get_traced_memory()[1], 'sums': sums.tolist()}))
