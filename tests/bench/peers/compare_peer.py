"""Peer for tests/bench/compare.bench.ts: the same weighted statistics with numpy, as a user would write them.

  /usr/bin/python3 compare_peer.py make DIR     writes DIR/ref.nc and DIR/run.nc (1° x 1° x 102 levels, float32)
  /usr/bin/python3 compare_peer.py run DIR      reads them (netCDF4) and DIR/basins.u8 (the basin index of each
                                               cell, written by the benchmark from our own basin lines), computes
                                               n, weight, means, bias, RMSE, centred RMSE, r, both std for
                                               6 regions x 5 layers, prints JSON {seconds, rows}

Vectorised numpy: per region, per-level weighted sums of m, r, m², r², m·r over the valid cells, then the
layers as overlap-weighted combinations of the levels; the bottom layer from the deepest level where both
have data. Timing covers reading and computing, not interpreter start-up or imports.
"""
import json
import sys
import time

import netCDF4
import numpy as np

R = 6371008.8
NZ, NY, NX = 102, 180, 360


def edges_z():
    k = np.arange(NZ + 1)
    return 6000.0 * (k / NZ) ** 2 + 5.0 * k


def make(d):
    rng = np.random.default_rng(1)
    lon_e = np.linspace(-180, 180, NX + 1)
    lat_e = np.linspace(-90, 90, NY + 1)
    z_e = edges_z()
    lat_c = 0.5 * (lat_e[1:] + lat_e[:-1])
    lon_c = 0.5 * (lon_e[1:] + lon_e[:-1])
    # an invented seafloor: smooth bumps, some land
    floor = 3500 + 2500 * np.sin(np.radians(lon_c))[None, :] * np.cos(np.radians(2 * lat_c))[:, None] - 1500 * (np.abs(lat_c)[:, None] > 70)
    floor = floor + 400 * rng.standard_normal((NY, NX))
    zc = 0.5 * (z_e[1:] + z_e[:-1])
    wet = zc[:, None, None] < floor[None]
    base = (0.5 + 2.5 * (1 - np.exp(-zc / 800)))[:, None, None] + 0.3 * np.cos(np.radians(lat_c))[None, :, None]
    ref = base + 0.1 * rng.standard_normal((NZ, NY, NX))
    run = 1.05 * ref + 0.05 + 0.08 * rng.standard_normal((NZ, NY, NX))
    run_wet = wet & (zc[:, None, None] < floor[None] + 150 * rng.standard_normal((NY, NX))[None])
    for name, vals, mask in (("ref.nc", ref, ~wet), ("run.nc", run, ~run_wet)):
        with netCDF4.Dataset(f"{d}/{name}", "w", format="NETCDF3_64BIT_OFFSET") as ds:
            for n, s in (("lon", NX), ("lat", NY), ("depth", NZ), ("nv", 2)):
                ds.createDimension(n, s)
            v = ds.createVariable("lon", "f8", ("lon",)); v.units = "degrees_east"; v.bounds = "lon_bnds"; v[:] = lon_c
            ds.createVariable("lon_bnds", "f8", ("lon", "nv"))[:] = np.stack([lon_e[:-1], lon_e[1:]], 1)
            v = ds.createVariable("lat", "f8", ("lat",)); v.units = "degrees_north"; v.bounds = "lat_bnds"; v[:] = lat_c
            ds.createVariable("lat_bnds", "f8", ("lat", "nv"))[:] = np.stack([lat_e[:-1], lat_e[1:]], 1)
            v = ds.createVariable("depth", "f8", ("depth",)); v.units = "m"; v.positive = "down"; v.bounds = "depth_bnds"; v[:] = zc
            ds.createVariable("depth_bnds", "f8", ("depth", "nv"))[:] = np.stack([z_e[:-1], z_e[1:]], 1)
            v = ds.createVariable("PO4", "f4", ("depth", "lat", "lon"), fill_value=np.float32(1e20))
            v.units = "mmol m-3"
            v[:] = np.ma.array(vals.astype(np.float32), mask=mask)


def stats(S, W):
    """S: dict of weighted sums over the comparison; returns the skill numbers."""
    w = S["w"]
    if S["n"] == 0 or w == 0:
        return {"n": 0}
    mm, rm = S["m"] / w, S["r"] / w
    vm = S["mm"] / w - mm * mm
    vr = S["rr"] / w - rm * rm
    cv = S["mr"] / w - mm * rm
    crmse2 = vm + vr - 2 * cv
    bias = mm - rm
    return {"n": int(S["n"]), "weight": float(w), "model_mean": float(mm), "ref_mean": float(rm), "bias": float(bias),
            "rmse": float(np.sqrt(bias * bias + crmse2)), "crmse": float(np.sqrt(max(crmse2, 0))), "corr": float(cv / np.sqrt(vm * vr)),
            "model_std": float(np.sqrt(vm)), "ref_std": float(np.sqrt(vr))}


def run(d):
    t0 = time.perf_counter()
    with netCDF4.Dataset(f"{d}/ref.nc") as ds:
        r = ds["PO4"][:].astype(np.float64).filled(np.nan)
        z_e = np.concatenate([ds["depth_bnds"][:, 0], ds["depth_bnds"][-1:, 1]])
        lat_b = ds["lat_bnds"][:]
    with netCDF4.Dataset(f"{d}/run.nc") as ds:
        m = ds["PO4"][:].astype(np.float64).filled(np.nan)
    basins = np.fromfile(f"{d}/basins.u8", dtype=np.uint8).reshape(NY, NX)
    area = (R ** 2 * np.radians(1.0) * (np.sin(np.radians(lat_b[:, 1])) - np.sin(np.radians(lat_b[:, 0]))))[:, None] * np.ones((1, NX))
    thick = np.diff(z_e)
    layers = [(0, 100), (100, 1000), (1000, 6000), "surface", "bottom"]
    ov = []
    for l in layers[:4]:
        if l == "surface":
            o = np.zeros(NZ); o[0] = thick[0]
        else:
            o = np.clip(np.minimum(z_e[1:], l[1]) - np.maximum(z_e[:-1], l[0]), 0, None)
        ov.append(o)
    ov = np.array(ov)
    valid = np.isfinite(m) & np.isfinite(r)
    mz = np.where(valid, m, 0.0)
    rz = np.where(valid, r, 0.0)
    # bottom: deepest level where both are valid
    anyv = valid.any(0)
    kb = NZ - 1 - np.argmax(valid[::-1], 0)
    jj, ii = np.nonzero(anyv)
    bm = np.zeros((NY, NX)); br = np.zeros((NY, NX))
    bm[jj, ii] = m[kb[jj, ii], jj, ii]; br[jj, ii] = r[kb[jj, ii], jj, ii]
    regions = {"global": np.ones((NY, NX), bool)}
    for b, name in enumerate(["atlantic", "pacific", "indian", "southern", "arctic"]):
        regions[name] = basins == b
    rows = []
    for name, sel in regions.items():
        a = np.where(sel, area, 0.0)
        aw = a[None] * valid
        per = {"n": (valid & sel[None]).sum((1, 2)), "w": aw.sum((1, 2)), "m": (aw * mz).sum((1, 2)), "r": (aw * rz).sum((1, 2)),
               "mm": (aw * mz * mz).sum((1, 2)), "rr": (aw * rz * rz).sum((1, 2)), "mr": (aw * mz * rz).sum((1, 2))}
        for li, l in enumerate(layers[:4]):
            o = ov[li]
            S = {k: (float((v * (o > 0)).sum()) if k == "n" else float(o @ v)) for k, v in per.items()}
            rows.append({"region": name, "layer": str(l), **stats(S, None)})
        ab = np.where(anyv, a, 0.0)
        S = {"n": int((anyv & sel).sum()), "w": ab.sum(), "m": (ab * bm).sum(), "r": (ab * br).sum(), "mm": (ab * bm * bm).sum(),
             "rr": (ab * br * br).sum(), "mr": (ab * bm * br).sum()}
        rows.append({"region": name, "layer": "bottom", **stats(S, None)})
    print(json.dumps({"seconds": time.perf_counter() - t0, "rows": rows}))


if __name__ == "__main__":
    {"make": make, "run": run}[sys.argv[1]](sys.argv[2])
