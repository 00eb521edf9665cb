"""Compare a NetCDF file and a CSV file downloaded from the workbench (the same data twice): read the NetCDF with
netCDF4-python, the CSV with Python's csv module, and check every CSV row against the NetCDF cell at its
coordinates, and that every cell with a value has its row. Prints a JSON summary.

usage: compare_data_files.py FILE.nc FILE.csv DIM[,DIM...]   (the CSV table's dimensions, slowest first)
"""
import csv
import json
import sys

import netCDF4
import numpy as np

nc_path, csv_path, dims = sys.argv[1], sys.argv[2], sys.argv[3].split(",")
nc = netCDF4.Dataset(nc_path)
with open(csv_path, encoding="utf-8", newline="") as f:
    text = f.read()
lines = text.split("\r\n")
header = dict(l[2:].split(": ", 1) for l in lines if l.startswith("# "))
rows = list(csv.reader([l for l in lines if l and not l.startswith("# ")]))
head, body = rows[0], rows[1:]
# data variables carry a fill value; coordinates (and their bounds) do not
fields = [n for n, v in nc.variables.items() if list(v.dimensions) == dims and "_FillValue" in v.ncattrs()]
coords = [np.asarray(nc.variables[d][:], dtype="f8") for d in dims]
cidx = [next(i for i, h in enumerate(head) if h.split(" (")[0] == d) for d in dims]
start = len(head) - len(fields)
mismatches = []
for r in body:
    idx = tuple(int(np.argmin(np.abs(coords[a] - float(r[cidx[a]])))) for a in range(len(dims)))
    for q, name in enumerate(fields):
        v = nc.variables[name][idx]
        c = r[start + q]
        ok = (c == "") if np.ma.is_masked(v) else (c != "" and float(c) == float(np.float32(v)))
        if not ok:
            mismatches.append([name, list(idx), c, None if np.ma.is_masked(v) else float(v)])
anyval = np.zeros([len(c) for c in coords], dtype=bool)
for name in fields:
    anyval |= ~np.ma.getmaskarray(nc.variables[name][:])
out = {
    "header": header,
    "heading": head,
    "rows": len(body),
    "cells_with_values": int(anyval.sum()),
    "fields": fields,
    "field_headings_match": all(head[start + q].startswith(nc.variables[n].long_name.split(": ", 1)[1]) for q, n in enumerate(fields)),
    "units": sorted({nc.variables[n].units for n in fields}),
    "fill_values": sorted({float(nc.variables[n]._FillValue) for n in fields}),
    "bounds": {d: getattr(nc.variables[d], "bounds", None) for d in dims},
    "mismatches": mismatches[:5],
    "conventions": nc.Conventions,
}
print(json.dumps(out))
