// AssemblyScript, compiled to WebAssembly by main/build-kernels.mjs into remap-wasm.ts (never by tsc).
//
// The per-level work of remapping one level of a field. For each target level, accumulate fills the
// pairs nd = (Σ h·v, Σ h) over valid source values (per source cell, over the overlapping source
// layers), then one of
//   remapSparse:    any weights as a sparse matrix (CSR): (a, b) = Σ w · nd over each target row;
//   remapSeparable: conservative weights between two lat-lon grids, which factor into a longitude part
//                   and a latitude part (Jones 1999), w[(jt, it), (js, is)] = lat[jt → js] · lon[it → is]:
//                   latitude factor on whole source rows (two-lane, contiguous), then the longitude
//                   factor on that one row;
// and coverage and value of each target cell from (a, b).
// Every argument ending in P is a byte offset into the memory the caller passes in; the caller owns the
// layout (app/regrid/separable-level.ts). Nothing here allocates.

/**
 * nd[s] (+)= (h·v[s], h) where v[s] is a number; with first != 0 the sums start here (missing values
 * then set both to 0). n and d live side by side, so that one two-lane operation carries both.
 * Returns how many values were valid.
 */
export function accumulate(levP: usize, count: i32, h: f64, ndP: usize, first: i32): i32 {
  let valid = 0;
  const end = <usize>count;
  const hv = f64x2.splat(h), one = f32x4.splat(1);
  let s: usize = 0;
  // four cells a step: NaN lanes become 0 (value) and 0 (weight), then pairs (h·v, h·ok) per cell
  for (; s + 4 <= end; s += 4) {
    const v = v128.load(levP + (s << 2));
    const ok = f32x4.eq(v, v);
    const vz = v128.and(v, ok), wz = v128.and(one, ok);
    const vLo = f64x2.mul(f64x2.promote_low_f32x4(vz), hv), vHi = f64x2.mul(f64x2.promote_low_f32x4(v128.shuffle<f32>(vz, vz, 2, 3, 0, 1)), hv);
    const wLo = f64x2.mul(f64x2.promote_low_f32x4(wz), hv), wHi = f64x2.mul(f64x2.promote_low_f32x4(v128.shuffle<f32>(wz, wz, 2, 3, 0, 1)), hv);
    const at = ndP + (s << 4);
    const c0 = v128.shuffle<f64>(vLo, wLo, 0, 2), c1 = v128.shuffle<f64>(vLo, wLo, 1, 3);
    const c2 = v128.shuffle<f64>(vHi, wHi, 0, 2), c3 = v128.shuffle<f64>(vHi, wHi, 1, 3);
    if (first != 0) {
      v128.store(at, c0);
      v128.store(at + 16, c1);
      v128.store(at + 32, c2);
      v128.store(at + 48, c3);
    } else {
      v128.store(at, f64x2.add(v128.load(at), c0));
      v128.store(at + 16, f64x2.add(v128.load(at + 16), c1));
      v128.store(at + 32, f64x2.add(v128.load(at + 32), c2));
      v128.store(at + 48, f64x2.add(v128.load(at + 48), c3));
    }
    valid += <i32>popcnt(i32x4.bitmask(ok));
  }
  for (; s < end; s++) {
    const v = <f64>load<f32>(levP + (s << 2));
    const ok = v == v;
    const add = ok ? f64x2(h * v, h) : f64x2.splat(0);
    const at = ndP + (s << 4);
    v128.store(at, first != 0 ? add : f64x2.add(v128.load(at), add));
    valid += <i32>ok;
  }
  return valid;
}

/**
 * One target level, target row by target row, through small row buffers only:
 *   row[is] = Σ lat[jt → js] · nd[js, is]        (CSR latStart/latSrc/latLen; two lanes carry n and d)
 *   ab[it]  = Σ lon[it → is] · row[is]           (the longitude factor as `slots` rows of tnx entries,
 *                                                 slot-major, padded with weight 0: no dependency from
 *                                                 one column to the next)
 * then coverage c = min(b · inv, 1) with inv = invRowRef · invRef, and the value a / b (or a · inv
 * when normalise is 0) where b > 0 and c >= floor, else NaN; values and coverage are written as f32.
 */
export function remapSeparable(
  tny: i32,
  tnx: i32,
  snx: i32,
  latStartP: usize,
  latSrcP: usize,
  latLenP: usize,
  slots: i32,
  lonIdxP: usize,
  lonWP: usize,
  ndP: usize,
  rowP: usize,
  abP: usize,
  invRowRefP: usize,
  invRef: f64,
  floor: f64,
  normalise: i32,
  valP: usize,
  covP: usize,
): void {
  const rowBytes = <usize>snx << 4;
  for (let jt = 0; jt < tny; jt++) {
    const p0 = load<i32>(latStartP + (<usize>jt << 2)), p1 = load<i32>(latStartP + (<usize>(jt + 1) << 2));
    if (p0 == p1) memory.fill(rowP, 0, rowBytes);
    for (let p = p0; p < p1; p++) {
      const f = f64x2.splat(load<f64>(latLenP + (<usize>p << 3)));
      const x = ndP + <usize>load<i32>(latSrcP + (<usize>p << 2)) * rowBytes;
      if (p == p0) for (let i: usize = 0; i < rowBytes; i += 16) v128.store(rowP + i, f64x2.mul(f, v128.load(x + i)));
      else for (let i: usize = 0; i < rowBytes; i += 16) v128.store(rowP + i, f64x2.add(v128.load(rowP + i), f64x2.mul(f, v128.load(x + i))));
    }
    lonRow(tnx, slots, lonIdxP, lonWP, rowP, abP);
    finishRow(abP, <usize>(jt * tnx), tnx, invRowRefP, invRef, floor, normalise, valP, covP);
  }
}

/** ab[it] = Σ over slots of w[s, it] · row[idx[s, it]], pairs (n, d) at once. */
function lonRow(tnx: i32, slots: i32, idxP: usize, wP: usize, rowP: usize, abP: usize): void {
  for (let it = 0; it < tnx; it++) {
    const q = <usize>load<i32>(idxP + (<usize>it << 2)) << 4;
    const l = f64x2.splat(load<f64>(wP + (<usize>it << 3)));
    v128.store(abP + (<usize>it << 4), f64x2.mul(l, v128.load(rowP + q)));
  }
  for (let s = 1; s < slots; s++) {
    const idxS = idxP + (<usize>(s * tnx) << 2), wS = wP + (<usize>(s * tnx) << 3);
    for (let it = 0; it < tnx; it++) {
      const q = <usize>load<i32>(idxS + (<usize>it << 2)) << 4;
      const l = f64x2.splat(load<f64>(wS + (<usize>it << 3)));
      const o = abP + (<usize>it << 4);
      v128.store(o, f64x2.add(v128.load(o), f64x2.mul(l, v128.load(rowP + q))));
    }
  }
}

/** Coverage and value of one target row (cells r0 .. r0 + tnx) from its pairs (a, b), two cells at a time. */
function finishRow(abP: usize, r0: usize, tnx: i32, invRowRefP: usize, invRef: f64, floor: f64, normalise: i32, valP: usize, covP: usize): void {
  const one = f64x2.splat(1), zero = f64x2.splat(0), fl = f64x2.splat(floor), ir = f64x2.splat(invRef), nan = f64x2.splat(NaN);
  const n = <usize>tnx;
  let i: usize = 0;
  for (; i + 2 <= n; i += 2) {
    const r = r0 + i;
    const p0 = v128.load(abP + (i << 4)), p1 = v128.load(abP + (i << 4) + 16);
    const a = v128.shuffle<f64>(p0, p1, 0, 2), b = v128.shuffle<f64>(p0, p1, 1, 3);
    const inv = f64x2.mul(v128.load(invRowRefP + (r << 3)), ir);
    const c = f64x2.min(f64x2.mul(b, inv), one);
    const ok = v128.and(f64x2.gt(b, zero), f64x2.ge(c, fl));
    const v = normalise != 0 ? f64x2.div(a, b) : f64x2.mul(a, inv);
    v128.store64_lane(covP + (r << 2), f32x4.demote_f64x2_zero(c), 0);
    v128.store64_lane(valP + (r << 2), f32x4.demote_f64x2_zero(v128.bitselect(v, nan, ok)), 0);
  }
  for (; i < n; i++) finishCell(r0 + i, load<f64>(abP + (i << 4)), load<f64>(abP + (i << 4) + 8), invRowRefP, invRef, floor, normalise, valP, covP);
}

/** Coverage and value of target cell r from its sums a = Σ w·h·v and b = Σ w·h (the rule of finishRow, one cell). */
// @ts-ignore: decorator
@inline
function finishCell(r: usize, a: f64, b: f64, invRowRefP: usize, invRef: f64, floor: f64, normalise: i32, valP: usize, covP: usize): void {
  const inv = load<f64>(invRowRefP + (r << 3)) * invRef;
  let c = b * inv;
  if (c > 1) c = 1;
  store<f32>(covP + (r << 2), <f32>c);
  store<f32>(valP + (r << 2), b > 0 && c >= floor ? <f32>(normalise != 0 ? a / b : a * inv) : NaN);
}

/**
 * Any weights as a sparse matrix (CSR rowPtr, col, w): per target row r, (a, b) = Σ w[p] · nd[col[p]],
 * two entries a step into two accumulators (no single dependency chain), then finishCell.
 */
export function remapSparse(nRows: i32, rowPtrP: usize, colP: usize, wP: usize, ndP: usize, invRowRefP: usize, invRef: f64, floor: f64, normalise: i32, valP: usize, covP: usize): void {
  let p = load<i32>(rowPtrP);
  for (let r = 0; r < nRows; r++) {
    const end = load<i32>(rowPtrP + (<usize>(r + 1) << 2));
    let acc0 = f64x2.splat(0), acc1 = f64x2.splat(0);
    for (; p + 1 < end; p += 2) {
      const q0 = <usize>load<i32>(colP + (<usize>p << 2)) << 4, q1 = <usize>load<i32>(colP + (<usize>(p + 1) << 2)) << 4;
      acc0 = f64x2.add(acc0, f64x2.mul(f64x2.splat(load<f64>(wP + (<usize>p << 3))), v128.load(ndP + q0)));
      acc1 = f64x2.add(acc1, f64x2.mul(f64x2.splat(load<f64>(wP + (<usize>(p + 1) << 3))), v128.load(ndP + q1)));
    }
    if (p < end) {
      const q = <usize>load<i32>(colP + (<usize>p << 2)) << 4;
      acc0 = f64x2.add(acc0, f64x2.mul(f64x2.splat(load<f64>(wP + (<usize>p << 3))), v128.load(ndP + q)));
      p++;
    }
    const acc = f64x2.add(acc0, acc1);
    finishCell(<usize>r, f64x2.extract_lane(acc, 0), f64x2.extract_lane(acc, 1), invRowRefP, invRef, floor, normalise, valP, covP);
  }
}
