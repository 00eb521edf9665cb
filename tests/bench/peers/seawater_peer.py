#!/usr/bin/python3
"""Peer for tests/bench/seawater.bench.ts: python3-gsw (TEOS-10, vectorised C) on the same cells.

  seawater_peer.py REPEATS   one 1° level (64 800 cells) of practical salinity and potential temperature
                             from the formula below, at 1000 dbar: SR_from_SP, CT_from_pt, rho, as a person
                             would write it; prints JSON {"seconds": [...], "checksum": ...}
"""
import json
import sys
import time

import gsw
import numpy as np

REPEATS = int(sys.argv[1]) if len(sys.argv) > 1 else 5
i = np.arange(64800)
# the same cells as the benchmark: a spread over the oceanographic range
T = (-1.5 + (i % 317) * 0.1).astype(np.float32).astype(np.float64)
S = (30 + (i % 89) * 0.08).astype(np.float32).astype(np.float64)
seconds = []
rho = None
for _ in range(REPEATS):
    t0 = time.perf_counter()
    SA = gsw.SR_from_SP(S)
    CT = gsw.CT_from_pt(SA, T)
    rho = gsw.rho(SA, CT, 1000.0)
    seconds.append(time.perf_counter() - t0)
print(json.dumps({'seconds': seconds, 'checksum': float(np.sum(rho))}))
