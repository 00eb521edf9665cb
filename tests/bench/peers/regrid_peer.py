#!/usr/bin/python3
"""Peer for tests/bench/regrid.bench.ts case (b): what a user would write with numpy and scipy.sparse.

Regular 1-degree source onto a regular 1-degree target shifted by half a cell, 102 levels, conservative:
overlap matrices per axis (longitude periodic, latitude in sin), their Kronecker product as CSR (areas in m^2),
vertical layer overlaps, then per target level: N = sum h*v, D = sum h over valid source values,
num = W @ N, den = W @ D, coverage = den / (area * thickness), value = num / den where coverage >= 0.5.
The same synthetic field as the benchmark (formula repeated here). Prints JSON: build and apply seconds per
pass (wall clock and process CPU time), the time of making the source levels alone, entries, checksum.
"""
import json
import sys
import time

import numpy as np
import scipy.sparse as sp

R = 6371008.8
REPEATS = int(sys.argv[1]) if len(sys.argv) > 1 else 3


def depth_edges(nz):
    return 5500.0 * (np.arange(nz + 1) / nz) ** 1.8


def lon_overlap(src, tgt):
    a0, a1 = src[:-1][None, :], src[1:][None, :]
    o = np.zeros((len(tgt) - 1, len(src) - 1))
    for k in (-1, 0, 1):
        b0, b1 = tgt[:-1][:, None] + 360.0 * k, tgt[1:][:, None] + 360.0 * k
        o += np.clip(np.minimum(a1, b1) - np.maximum(a0, b0), 0, None)
    return sp.csr_matrix(np.radians(o))


def lat_overlap(src, tgt):
    a0, a1 = src[:-1][None, :], src[1:][None, :]
    b0, b1 = tgt[:-1][:, None], tgt[1:][:, None]
    lo, hi = np.maximum(a0, b0), np.minimum(a1, b1)
    o = np.where(hi > lo, np.sin(np.radians(hi)) - np.sin(np.radians(np.minimum(lo, hi))), 0.0)
    return sp.csr_matrix(o)


src_lon = -180.0 + np.arange(361.0)
src_lat = -90.0 + np.arange(181.0)
tgt_lon = -179.5 + np.arange(361.0)
tgt_lat = np.concatenate([[-90.0], -89.5 + np.arange(180.0), [90.0]])
nz = 102
ez = depth_edges(nz)

# synthetic source, as in the benchmark
lon_c = 0.5 * (src_lon[1:] + src_lon[:-1])
lat_c = 0.5 * (src_lat[1:] + src_lat[:-1])
LO, LA = np.meshgrid(np.radians(lon_c), np.radians(lat_c))
base = (1 + 0.5 * np.sin(LA) + 0.25 * np.cos(LA) * np.cos(2 * LO)).astype(np.float32).ravel()
floor = (3000 + 2600 * np.cos(LA) * np.sin(LO) - 1500 * np.sin(LA) ** 2).ravel()


def read_level(k):
    v = np.where(ez[k] < floor, base + np.float32(0.01 * k), np.nan).astype(np.float32)
    return v


builds, applies, builds_cpu, applies_cpu = [], [], [], []
checksum = 0.0
for rep in range(-1, REPEATS):  # one untimed pass first, as on the benchmark's side
    t0, c0 = time.perf_counter(), time.process_time()
    W = (sp.kron(lat_overlap(src_lat, tgt_lat), lon_overlap(src_lon, tgt_lon), format='csr') * R * R).tocsr()
    W.eliminate_zeros()
    area = R * R * np.radians(np.diff(tgt_lon))[None, :] * np.diff(np.sin(np.radians(tgt_lat)))[:, None]
    area = area.ravel()
    dz = np.clip(np.minimum(ez[1:][:, None], ez[1:][None, :]) - np.maximum(ez[:-1][:, None], ez[:-1][None, :]), 0, None)
    thick = np.diff(ez)
    if rep >= 0:
        builds.append(time.perf_counter() - t0)
        builds_cpu.append(time.process_time() - c0)

    t0, c0 = time.perf_counter(), time.process_time()
    checksum = 0.0
    for k in range(nz):
        N = np.zeros(base.size)
        D = np.zeros(base.size)
        for s in np.nonzero(dz[k])[0]:
            v = read_level(s)
            ok = np.isfinite(v)
            N += dz[k, s] * np.where(ok, v, 0.0)
            D += dz[k, s] * ok
        num = W @ N
        den = W @ D
        cov = den / (area * thick[k])
        with np.errstate(invalid='ignore', divide='ignore'):
            val = np.where((den > 0) & (cov >= 0.5 - 1e-12), num / den, np.nan).astype(np.float32)
        sample = val[::97]
        checksum += float(np.sum(sample[np.isfinite(sample)], dtype=np.float64))
    if rep >= 0:
        applies.append(time.perf_counter() - t0)
        applies_cpu.append(time.process_time() - c0)

# making the source levels alone (a part of apply), reported beside the benchmark's own
sources = []
for _ in range(REPEATS):
    t0 = time.perf_counter()
    for k in range(nz):
        read_level(k)
    sources.append(time.perf_counter() - t0)

print(json.dumps({'build': builds, 'apply': applies, 'buildCpu': builds_cpu, 'applyCpu': applies_cpu, 'source': sources, 'nnz': int(W.nnz), 'checksum': checksum}))
