// AssemblyScript, compiled to WebAssembly by main/build-kernels.mjs into density-wasm.ts (never by tsc).
//
// TEOS-10 density of a whole level from practical salinity and potential temperature, four cells a step
// in two-lane SIMD: the same operations in the same order as densityFromPracticalAndPotential in
// app/ocean/teos10.ts (SR from SP, Θ from the potential-enthalpy polynomial, the 75-term specific volume,
// both in the Horner form there), so the values are the same to the last bit. The main loop is that Horner
// form written out by a script, innermost term first; the last odd cells use the inline functions below. The coefficients are not
// repeated here: the caller copies the tables of density.ts into memory at coefP (75 specific-volume
// terms, then 29 potential-enthalpy terms). Every argument ending in P is a byte offset into the memory
// the caller passes in (app/ocean/density-level.ts). Nothing here allocates.

let vBase: usize = 0;
let hBase: usize = 0;

// @ts-ignore: decorator
@inline function cv(i: i32): v128 {
  return v128.load64_splat(vBase + (<usize>i << 3));
}

// @ts-ignore: decorator
@inline function ch(i: i32): v128 {
  return v128.load64_splat(hBase + (<usize>i << 3));
}

// @ts-ignore: decorator
@inline function specificVolume2(xs: v128, ys: v128, z: v128): v128 {
  const a00 = f64x2.add(cv(0), f64x2.mul(xs, f64x2.add(cv(25), f64x2.mul(xs, f64x2.add(cv(43), f64x2.mul(xs, f64x2.add(cv(56), f64x2.mul(xs, f64x2.add(cv(65), f64x2.mul(xs, f64x2.add(cv(71), f64x2.mul(xs, cv(74)))))))))))));
  const a10 = f64x2.add(cv(7), f64x2.mul(xs, f64x2.add(cv(30), f64x2.mul(xs, f64x2.add(cv(47), f64x2.mul(xs, f64x2.add(cv(59), f64x2.mul(xs, f64x2.add(cv(68), f64x2.mul(xs, cv(73)))))))))));
  const a20 = f64x2.add(cv(12), f64x2.mul(xs, f64x2.add(cv(34), f64x2.mul(xs, f64x2.add(cv(50), f64x2.mul(xs, f64x2.add(cv(62), f64x2.mul(xs, cv(70)))))))));
  const a30 = f64x2.add(cv(16), f64x2.mul(xs, f64x2.add(cv(37), f64x2.mul(xs, f64x2.add(cv(53), f64x2.mul(xs, cv(64)))))));
  const a40 = f64x2.add(cv(19), f64x2.mul(xs, f64x2.add(cv(40), f64x2.mul(xs, cv(55)))));
  const a50 = f64x2.add(cv(22), f64x2.mul(xs, cv(42)));
  const a60 = cv(24);
  const b0 = f64x2.add(a00, f64x2.mul(ys, f64x2.add(a10, f64x2.mul(ys, f64x2.add(a20, f64x2.mul(ys, f64x2.add(a30, f64x2.mul(ys, f64x2.add(a40, f64x2.mul(ys, f64x2.add(a50, f64x2.mul(ys, a60))))))))))));
  const a01 = f64x2.add(cv(1), f64x2.mul(xs, f64x2.add(cv(26), f64x2.mul(xs, f64x2.add(cv(44), f64x2.mul(xs, f64x2.add(cv(57), f64x2.mul(xs, f64x2.add(cv(66), f64x2.mul(xs, cv(72)))))))))));
  const a11 = f64x2.add(cv(8), f64x2.mul(xs, f64x2.add(cv(31), f64x2.mul(xs, f64x2.add(cv(48), f64x2.mul(xs, f64x2.add(cv(60), f64x2.mul(xs, cv(69)))))))));
  const a21 = f64x2.add(cv(13), f64x2.mul(xs, f64x2.add(cv(35), f64x2.mul(xs, f64x2.add(cv(51), f64x2.mul(xs, cv(63)))))));
  const a31 = f64x2.add(cv(17), f64x2.mul(xs, f64x2.add(cv(38), f64x2.mul(xs, cv(54)))));
  const a41 = f64x2.add(cv(20), f64x2.mul(xs, cv(41)));
  const a51 = cv(23);
  const b1 = f64x2.add(a01, f64x2.mul(ys, f64x2.add(a11, f64x2.mul(ys, f64x2.add(a21, f64x2.mul(ys, f64x2.add(a31, f64x2.mul(ys, f64x2.add(a41, f64x2.mul(ys, a51))))))))));
  const a02 = f64x2.add(cv(2), f64x2.mul(xs, f64x2.add(cv(27), f64x2.mul(xs, f64x2.add(cv(45), f64x2.mul(xs, f64x2.add(cv(58), f64x2.mul(xs, cv(67)))))))));
  const a12 = f64x2.add(cv(9), f64x2.mul(xs, f64x2.add(cv(32), f64x2.mul(xs, f64x2.add(cv(49), f64x2.mul(xs, cv(61)))))));
  const a22 = f64x2.add(cv(14), f64x2.mul(xs, f64x2.add(cv(36), f64x2.mul(xs, cv(52)))));
  const a32 = f64x2.add(cv(18), f64x2.mul(xs, cv(39)));
  const a42 = cv(21);
  const b2 = f64x2.add(a02, f64x2.mul(ys, f64x2.add(a12, f64x2.mul(ys, f64x2.add(a22, f64x2.mul(ys, f64x2.add(a32, f64x2.mul(ys, a42))))))));
  const a03 = f64x2.add(cv(3), f64x2.mul(xs, f64x2.add(cv(28), f64x2.mul(xs, cv(46)))));
  const a13 = f64x2.add(cv(10), f64x2.mul(xs, cv(33)));
  const a23 = cv(15);
  const b3 = f64x2.add(a03, f64x2.mul(ys, f64x2.add(a13, f64x2.mul(ys, a23))));
  const a04 = f64x2.add(cv(4), f64x2.mul(xs, cv(29)));
  const a14 = cv(11);
  const b4 = f64x2.add(a04, f64x2.mul(ys, a14));
  const a05 = cv(5);
  const b5 = a05;
  const a06 = cv(6);
  const b6 = a06;
  return f64x2.add(b0, f64x2.mul(z, f64x2.add(b1, f64x2.mul(z, f64x2.add(b2, f64x2.mul(z, f64x2.add(b3, f64x2.mul(z, f64x2.add(b4, f64x2.mul(z, f64x2.add(b5, f64x2.mul(z, b6))))))))))));
}

// @ts-ignore: decorator
@inline function potentialEnthalpy2(x: v128, y: v128): v128 {
  const a0 = f64x2.add(ch(0), f64x2.mul(x, f64x2.mul(x, f64x2.add(ch(8), f64x2.mul(x, f64x2.add(ch(15), f64x2.mul(x, f64x2.add(ch(20), f64x2.mul(x, f64x2.add(ch(26), f64x2.mul(x, f64x2.add(ch(27), f64x2.mul(x, ch(28))))))))))))));
  const a1 = f64x2.add(ch(1), f64x2.mul(x, f64x2.mul(x, f64x2.add(ch(9), f64x2.mul(x, f64x2.add(ch(16), f64x2.mul(x, ch(21))))))));
  const a2 = f64x2.add(ch(2), f64x2.mul(x, f64x2.mul(x, f64x2.add(ch(10), f64x2.mul(x, f64x2.add(ch(17), f64x2.mul(x, ch(22))))))));
  const a3 = f64x2.add(ch(3), f64x2.mul(x, f64x2.mul(x, f64x2.add(ch(11), f64x2.mul(x, f64x2.add(ch(18), f64x2.mul(x, ch(23))))))));
  const a4 = f64x2.add(ch(4), f64x2.mul(x, f64x2.mul(x, f64x2.add(ch(12), f64x2.mul(x, f64x2.add(ch(19), f64x2.mul(x, ch(24))))))));
  const a5 = f64x2.add(ch(5), f64x2.mul(x, f64x2.mul(x, f64x2.add(ch(13), f64x2.mul(x, f64x2.mul(x, ch(25)))))));
  const a6 = f64x2.add(ch(6), f64x2.mul(x, f64x2.mul(x, ch(14))));
  const a7 = ch(7);
  return f64x2.add(a0, f64x2.mul(y, f64x2.add(a1, f64x2.mul(y, f64x2.add(a2, f64x2.mul(y, f64x2.add(a3, f64x2.mul(y, f64x2.add(a4, f64x2.mul(y, f64x2.add(a5, f64x2.mul(y, f64x2.add(a6, f64x2.mul(y, a7))))))))))))));
}

/** ρ of two cells (kg m⁻³) from SP and θ (f64 lanes) at sea pressure p (z = p·1e-4). */
// @ts-ignore: decorator
@inline function density2(sp: v128, pt: v128, z: v128, srPerSp: v128, sfac: v128, sOffset: v128, cp0: v128, quarter: v128, zero: v128, one: v128): v128 {
  const sa = f64x2.mul(srPerSp, sp);
  const ssa = f64x2.mul(sfac, f64x2.max(sa, zero));
  const ct = f64x2.div(potentialEnthalpy2(f64x2.sqrt(ssa), f64x2.mul(pt, quarter)), cp0);
  const v = specificVolume2(f64x2.sqrt(f64x2.add(ssa, sOffset)), f64x2.mul(ct, quarter), z);
  return f64x2.div(one, v);
}

/**
 * rho[i] = ρ(S[i], T[i], p) for i < count: S and T float32 at sP and tP, rho float64 at rhoP, the
 * coefficient tables at coefP. The constants are passed in so that they are the very doubles of density.ts.
 */
export function densityLevel(sP: usize, tP: usize, count: i32, p: f64, rhoP: usize, coefP: usize, srPerSp: f64, sfac: f64, sOffset: f64, cp0: f64): void {
  vBase = coefP;
  hBase = coefP + 75 * 8;
  const z = f64x2.splat(p * 1e-4);
  const sr = f64x2.splat(srPerSp), sf = f64x2.splat(sfac), so = f64x2.splat(sOffset), cp = f64x2.splat(cp0);
  const quarter = f64x2.splat(0.025), zero = f64x2.splat(0), one = f64x2.splat(1);
  const end = <usize>count;
  let i: usize = 0;
  // 4 cells a step; each polynomial is evaluated innermost first, its terms made just before use, so few
  // values are live at once (no spills), the groups interleaved statement by statement so that their chains overlap
  for (; i + 4 <= end; i += 4) {
    const sp0 = f64x2.promote_low_f32x4(v128.load64_zero(sP + ((i + 0) << 2)));
    const pt0 = f64x2.promote_low_f32x4(v128.load64_zero(tP + ((i + 0) << 2)));
    const sp1 = f64x2.promote_low_f32x4(v128.load64_zero(sP + ((i + 2) << 2)));
    const pt1 = f64x2.promote_low_f32x4(v128.load64_zero(tP + ((i + 2) << 2)));
    const ssa0 = f64x2.mul(sf, f64x2.max(f64x2.mul(sr, sp0), zero));
    const x0 = f64x2.sqrt(ssa0);
    const y0 = f64x2.mul(pt0, quarter);
    const ssa1 = f64x2.mul(sf, f64x2.max(f64x2.mul(sr, sp1), zero));
    const x1 = f64x2.sqrt(ssa1);
    const y1 = f64x2.mul(pt1, quarter);
    let t1_0 = ch(7);
    let t1_1 = ch(7);
    let t2_0 = ch(14);
    let t2_1 = ch(14);
    t2_0 = f64x2.mul(x0, t2_0);
    t2_1 = f64x2.mul(x1, t2_1);
    t2_0 = f64x2.add(ch(6), f64x2.mul(x0, t2_0));
    t2_1 = f64x2.add(ch(6), f64x2.mul(x1, t2_1));
    t1_0 = f64x2.add(t2_0, f64x2.mul(y0, t1_0));
    t1_1 = f64x2.add(t2_1, f64x2.mul(y1, t1_1));
    let t3_0 = ch(25);
    let t3_1 = ch(25);
    t3_0 = f64x2.mul(x0, t3_0);
    t3_1 = f64x2.mul(x1, t3_1);
    t3_0 = f64x2.add(ch(13), f64x2.mul(x0, t3_0));
    t3_1 = f64x2.add(ch(13), f64x2.mul(x1, t3_1));
    t3_0 = f64x2.mul(x0, t3_0);
    t3_1 = f64x2.mul(x1, t3_1);
    t3_0 = f64x2.add(ch(5), f64x2.mul(x0, t3_0));
    t3_1 = f64x2.add(ch(5), f64x2.mul(x1, t3_1));
    t1_0 = f64x2.add(t3_0, f64x2.mul(y0, t1_0));
    t1_1 = f64x2.add(t3_1, f64x2.mul(y1, t1_1));
    let t4_0 = ch(24);
    let t4_1 = ch(24);
    t4_0 = f64x2.add(ch(19), f64x2.mul(x0, t4_0));
    t4_1 = f64x2.add(ch(19), f64x2.mul(x1, t4_1));
    t4_0 = f64x2.add(ch(12), f64x2.mul(x0, t4_0));
    t4_1 = f64x2.add(ch(12), f64x2.mul(x1, t4_1));
    t4_0 = f64x2.mul(x0, t4_0);
    t4_1 = f64x2.mul(x1, t4_1);
    t4_0 = f64x2.add(ch(4), f64x2.mul(x0, t4_0));
    t4_1 = f64x2.add(ch(4), f64x2.mul(x1, t4_1));
    t1_0 = f64x2.add(t4_0, f64x2.mul(y0, t1_0));
    t1_1 = f64x2.add(t4_1, f64x2.mul(y1, t1_1));
    let t5_0 = ch(23);
    let t5_1 = ch(23);
    t5_0 = f64x2.add(ch(18), f64x2.mul(x0, t5_0));
    t5_1 = f64x2.add(ch(18), f64x2.mul(x1, t5_1));
    t5_0 = f64x2.add(ch(11), f64x2.mul(x0, t5_0));
    t5_1 = f64x2.add(ch(11), f64x2.mul(x1, t5_1));
    t5_0 = f64x2.mul(x0, t5_0);
    t5_1 = f64x2.mul(x1, t5_1);
    t5_0 = f64x2.add(ch(3), f64x2.mul(x0, t5_0));
    t5_1 = f64x2.add(ch(3), f64x2.mul(x1, t5_1));
    t1_0 = f64x2.add(t5_0, f64x2.mul(y0, t1_0));
    t1_1 = f64x2.add(t5_1, f64x2.mul(y1, t1_1));
    let t6_0 = ch(22);
    let t6_1 = ch(22);
    t6_0 = f64x2.add(ch(17), f64x2.mul(x0, t6_0));
    t6_1 = f64x2.add(ch(17), f64x2.mul(x1, t6_1));
    t6_0 = f64x2.add(ch(10), f64x2.mul(x0, t6_0));
    t6_1 = f64x2.add(ch(10), f64x2.mul(x1, t6_1));
    t6_0 = f64x2.mul(x0, t6_0);
    t6_1 = f64x2.mul(x1, t6_1);
    t6_0 = f64x2.add(ch(2), f64x2.mul(x0, t6_0));
    t6_1 = f64x2.add(ch(2), f64x2.mul(x1, t6_1));
    t1_0 = f64x2.add(t6_0, f64x2.mul(y0, t1_0));
    t1_1 = f64x2.add(t6_1, f64x2.mul(y1, t1_1));
    let t7_0 = ch(21);
    let t7_1 = ch(21);
    t7_0 = f64x2.add(ch(16), f64x2.mul(x0, t7_0));
    t7_1 = f64x2.add(ch(16), f64x2.mul(x1, t7_1));
    t7_0 = f64x2.add(ch(9), f64x2.mul(x0, t7_0));
    t7_1 = f64x2.add(ch(9), f64x2.mul(x1, t7_1));
    t7_0 = f64x2.mul(x0, t7_0);
    t7_1 = f64x2.mul(x1, t7_1);
    t7_0 = f64x2.add(ch(1), f64x2.mul(x0, t7_0));
    t7_1 = f64x2.add(ch(1), f64x2.mul(x1, t7_1));
    t1_0 = f64x2.add(t7_0, f64x2.mul(y0, t1_0));
    t1_1 = f64x2.add(t7_1, f64x2.mul(y1, t1_1));
    let t8_0 = ch(28);
    let t8_1 = ch(28);
    t8_0 = f64x2.add(ch(27), f64x2.mul(x0, t8_0));
    t8_1 = f64x2.add(ch(27), f64x2.mul(x1, t8_1));
    t8_0 = f64x2.add(ch(26), f64x2.mul(x0, t8_0));
    t8_1 = f64x2.add(ch(26), f64x2.mul(x1, t8_1));
    t8_0 = f64x2.add(ch(20), f64x2.mul(x0, t8_0));
    t8_1 = f64x2.add(ch(20), f64x2.mul(x1, t8_1));
    t8_0 = f64x2.add(ch(15), f64x2.mul(x0, t8_0));
    t8_1 = f64x2.add(ch(15), f64x2.mul(x1, t8_1));
    t8_0 = f64x2.add(ch(8), f64x2.mul(x0, t8_0));
    t8_1 = f64x2.add(ch(8), f64x2.mul(x1, t8_1));
    t8_0 = f64x2.mul(x0, t8_0);
    t8_1 = f64x2.mul(x1, t8_1);
    t8_0 = f64x2.add(ch(0), f64x2.mul(x0, t8_0));
    t8_1 = f64x2.add(ch(0), f64x2.mul(x1, t8_1));
    t1_0 = f64x2.add(t8_0, f64x2.mul(y0, t1_0));
    t1_1 = f64x2.add(t8_1, f64x2.mul(y1, t1_1));
    const xs0 = f64x2.sqrt(f64x2.add(ssa0, so));
    const ys0 = f64x2.mul(f64x2.div(t1_0, cp), quarter);
    const xs1 = f64x2.sqrt(f64x2.add(ssa1, so));
    const ys1 = f64x2.mul(f64x2.div(t1_1, cp), quarter);
    let t9_0 = cv(6);
    let t9_1 = cv(6);
    t9_0 = f64x2.add(cv(5), f64x2.mul(z, t9_0));
    t9_1 = f64x2.add(cv(5), f64x2.mul(z, t9_1));
    let t10_0 = cv(11);
    let t10_1 = cv(11);
    let t11_0 = cv(29);
    let t11_1 = cv(29);
    t11_0 = f64x2.add(cv(4), f64x2.mul(xs0, t11_0));
    t11_1 = f64x2.add(cv(4), f64x2.mul(xs1, t11_1));
    t10_0 = f64x2.add(t11_0, f64x2.mul(ys0, t10_0));
    t10_1 = f64x2.add(t11_1, f64x2.mul(ys1, t10_1));
    t9_0 = f64x2.add(t10_0, f64x2.mul(z, t9_0));
    t9_1 = f64x2.add(t10_1, f64x2.mul(z, t9_1));
    let t12_0 = cv(15);
    let t12_1 = cv(15);
    let t13_0 = cv(33);
    let t13_1 = cv(33);
    t13_0 = f64x2.add(cv(10), f64x2.mul(xs0, t13_0));
    t13_1 = f64x2.add(cv(10), f64x2.mul(xs1, t13_1));
    t12_0 = f64x2.add(t13_0, f64x2.mul(ys0, t12_0));
    t12_1 = f64x2.add(t13_1, f64x2.mul(ys1, t12_1));
    let t14_0 = cv(46);
    let t14_1 = cv(46);
    t14_0 = f64x2.add(cv(28), f64x2.mul(xs0, t14_0));
    t14_1 = f64x2.add(cv(28), f64x2.mul(xs1, t14_1));
    t14_0 = f64x2.add(cv(3), f64x2.mul(xs0, t14_0));
    t14_1 = f64x2.add(cv(3), f64x2.mul(xs1, t14_1));
    t12_0 = f64x2.add(t14_0, f64x2.mul(ys0, t12_0));
    t12_1 = f64x2.add(t14_1, f64x2.mul(ys1, t12_1));
    t9_0 = f64x2.add(t12_0, f64x2.mul(z, t9_0));
    t9_1 = f64x2.add(t12_1, f64x2.mul(z, t9_1));
    let t15_0 = cv(21);
    let t15_1 = cv(21);
    let t16_0 = cv(39);
    let t16_1 = cv(39);
    t16_0 = f64x2.add(cv(18), f64x2.mul(xs0, t16_0));
    t16_1 = f64x2.add(cv(18), f64x2.mul(xs1, t16_1));
    t15_0 = f64x2.add(t16_0, f64x2.mul(ys0, t15_0));
    t15_1 = f64x2.add(t16_1, f64x2.mul(ys1, t15_1));
    let t17_0 = cv(52);
    let t17_1 = cv(52);
    t17_0 = f64x2.add(cv(36), f64x2.mul(xs0, t17_0));
    t17_1 = f64x2.add(cv(36), f64x2.mul(xs1, t17_1));
    t17_0 = f64x2.add(cv(14), f64x2.mul(xs0, t17_0));
    t17_1 = f64x2.add(cv(14), f64x2.mul(xs1, t17_1));
    t15_0 = f64x2.add(t17_0, f64x2.mul(ys0, t15_0));
    t15_1 = f64x2.add(t17_1, f64x2.mul(ys1, t15_1));
    let t18_0 = cv(61);
    let t18_1 = cv(61);
    t18_0 = f64x2.add(cv(49), f64x2.mul(xs0, t18_0));
    t18_1 = f64x2.add(cv(49), f64x2.mul(xs1, t18_1));
    t18_0 = f64x2.add(cv(32), f64x2.mul(xs0, t18_0));
    t18_1 = f64x2.add(cv(32), f64x2.mul(xs1, t18_1));
    t18_0 = f64x2.add(cv(9), f64x2.mul(xs0, t18_0));
    t18_1 = f64x2.add(cv(9), f64x2.mul(xs1, t18_1));
    t15_0 = f64x2.add(t18_0, f64x2.mul(ys0, t15_0));
    t15_1 = f64x2.add(t18_1, f64x2.mul(ys1, t15_1));
    let t19_0 = cv(67);
    let t19_1 = cv(67);
    t19_0 = f64x2.add(cv(58), f64x2.mul(xs0, t19_0));
    t19_1 = f64x2.add(cv(58), f64x2.mul(xs1, t19_1));
    t19_0 = f64x2.add(cv(45), f64x2.mul(xs0, t19_0));
    t19_1 = f64x2.add(cv(45), f64x2.mul(xs1, t19_1));
    t19_0 = f64x2.add(cv(27), f64x2.mul(xs0, t19_0));
    t19_1 = f64x2.add(cv(27), f64x2.mul(xs1, t19_1));
    t19_0 = f64x2.add(cv(2), f64x2.mul(xs0, t19_0));
    t19_1 = f64x2.add(cv(2), f64x2.mul(xs1, t19_1));
    t15_0 = f64x2.add(t19_0, f64x2.mul(ys0, t15_0));
    t15_1 = f64x2.add(t19_1, f64x2.mul(ys1, t15_1));
    t9_0 = f64x2.add(t15_0, f64x2.mul(z, t9_0));
    t9_1 = f64x2.add(t15_1, f64x2.mul(z, t9_1));
    let t20_0 = cv(23);
    let t20_1 = cv(23);
    let t21_0 = cv(41);
    let t21_1 = cv(41);
    t21_0 = f64x2.add(cv(20), f64x2.mul(xs0, t21_0));
    t21_1 = f64x2.add(cv(20), f64x2.mul(xs1, t21_1));
    t20_0 = f64x2.add(t21_0, f64x2.mul(ys0, t20_0));
    t20_1 = f64x2.add(t21_1, f64x2.mul(ys1, t20_1));
    let t22_0 = cv(54);
    let t22_1 = cv(54);
    t22_0 = f64x2.add(cv(38), f64x2.mul(xs0, t22_0));
    t22_1 = f64x2.add(cv(38), f64x2.mul(xs1, t22_1));
    t22_0 = f64x2.add(cv(17), f64x2.mul(xs0, t22_0));
    t22_1 = f64x2.add(cv(17), f64x2.mul(xs1, t22_1));
    t20_0 = f64x2.add(t22_0, f64x2.mul(ys0, t20_0));
    t20_1 = f64x2.add(t22_1, f64x2.mul(ys1, t20_1));
    let t23_0 = cv(63);
    let t23_1 = cv(63);
    t23_0 = f64x2.add(cv(51), f64x2.mul(xs0, t23_0));
    t23_1 = f64x2.add(cv(51), f64x2.mul(xs1, t23_1));
    t23_0 = f64x2.add(cv(35), f64x2.mul(xs0, t23_0));
    t23_1 = f64x2.add(cv(35), f64x2.mul(xs1, t23_1));
    t23_0 = f64x2.add(cv(13), f64x2.mul(xs0, t23_0));
    t23_1 = f64x2.add(cv(13), f64x2.mul(xs1, t23_1));
    t20_0 = f64x2.add(t23_0, f64x2.mul(ys0, t20_0));
    t20_1 = f64x2.add(t23_1, f64x2.mul(ys1, t20_1));
    let t24_0 = cv(69);
    let t24_1 = cv(69);
    t24_0 = f64x2.add(cv(60), f64x2.mul(xs0, t24_0));
    t24_1 = f64x2.add(cv(60), f64x2.mul(xs1, t24_1));
    t24_0 = f64x2.add(cv(48), f64x2.mul(xs0, t24_0));
    t24_1 = f64x2.add(cv(48), f64x2.mul(xs1, t24_1));
    t24_0 = f64x2.add(cv(31), f64x2.mul(xs0, t24_0));
    t24_1 = f64x2.add(cv(31), f64x2.mul(xs1, t24_1));
    t24_0 = f64x2.add(cv(8), f64x2.mul(xs0, t24_0));
    t24_1 = f64x2.add(cv(8), f64x2.mul(xs1, t24_1));
    t20_0 = f64x2.add(t24_0, f64x2.mul(ys0, t20_0));
    t20_1 = f64x2.add(t24_1, f64x2.mul(ys1, t20_1));
    let t25_0 = cv(72);
    let t25_1 = cv(72);
    t25_0 = f64x2.add(cv(66), f64x2.mul(xs0, t25_0));
    t25_1 = f64x2.add(cv(66), f64x2.mul(xs1, t25_1));
    t25_0 = f64x2.add(cv(57), f64x2.mul(xs0, t25_0));
    t25_1 = f64x2.add(cv(57), f64x2.mul(xs1, t25_1));
    t25_0 = f64x2.add(cv(44), f64x2.mul(xs0, t25_0));
    t25_1 = f64x2.add(cv(44), f64x2.mul(xs1, t25_1));
    t25_0 = f64x2.add(cv(26), f64x2.mul(xs0, t25_0));
    t25_1 = f64x2.add(cv(26), f64x2.mul(xs1, t25_1));
    t25_0 = f64x2.add(cv(1), f64x2.mul(xs0, t25_0));
    t25_1 = f64x2.add(cv(1), f64x2.mul(xs1, t25_1));
    t20_0 = f64x2.add(t25_0, f64x2.mul(ys0, t20_0));
    t20_1 = f64x2.add(t25_1, f64x2.mul(ys1, t20_1));
    t9_0 = f64x2.add(t20_0, f64x2.mul(z, t9_0));
    t9_1 = f64x2.add(t20_1, f64x2.mul(z, t9_1));
    let t26_0 = cv(24);
    let t26_1 = cv(24);
    let t27_0 = cv(42);
    let t27_1 = cv(42);
    t27_0 = f64x2.add(cv(22), f64x2.mul(xs0, t27_0));
    t27_1 = f64x2.add(cv(22), f64x2.mul(xs1, t27_1));
    t26_0 = f64x2.add(t27_0, f64x2.mul(ys0, t26_0));
    t26_1 = f64x2.add(t27_1, f64x2.mul(ys1, t26_1));
    let t28_0 = cv(55);
    let t28_1 = cv(55);
    t28_0 = f64x2.add(cv(40), f64x2.mul(xs0, t28_0));
    t28_1 = f64x2.add(cv(40), f64x2.mul(xs1, t28_1));
    t28_0 = f64x2.add(cv(19), f64x2.mul(xs0, t28_0));
    t28_1 = f64x2.add(cv(19), f64x2.mul(xs1, t28_1));
    t26_0 = f64x2.add(t28_0, f64x2.mul(ys0, t26_0));
    t26_1 = f64x2.add(t28_1, f64x2.mul(ys1, t26_1));
    let t29_0 = cv(64);
    let t29_1 = cv(64);
    t29_0 = f64x2.add(cv(53), f64x2.mul(xs0, t29_0));
    t29_1 = f64x2.add(cv(53), f64x2.mul(xs1, t29_1));
    t29_0 = f64x2.add(cv(37), f64x2.mul(xs0, t29_0));
    t29_1 = f64x2.add(cv(37), f64x2.mul(xs1, t29_1));
    t29_0 = f64x2.add(cv(16), f64x2.mul(xs0, t29_0));
    t29_1 = f64x2.add(cv(16), f64x2.mul(xs1, t29_1));
    t26_0 = f64x2.add(t29_0, f64x2.mul(ys0, t26_0));
    t26_1 = f64x2.add(t29_1, f64x2.mul(ys1, t26_1));
    let t30_0 = cv(70);
    let t30_1 = cv(70);
    t30_0 = f64x2.add(cv(62), f64x2.mul(xs0, t30_0));
    t30_1 = f64x2.add(cv(62), f64x2.mul(xs1, t30_1));
    t30_0 = f64x2.add(cv(50), f64x2.mul(xs0, t30_0));
    t30_1 = f64x2.add(cv(50), f64x2.mul(xs1, t30_1));
    t30_0 = f64x2.add(cv(34), f64x2.mul(xs0, t30_0));
    t30_1 = f64x2.add(cv(34), f64x2.mul(xs1, t30_1));
    t30_0 = f64x2.add(cv(12), f64x2.mul(xs0, t30_0));
    t30_1 = f64x2.add(cv(12), f64x2.mul(xs1, t30_1));
    t26_0 = f64x2.add(t30_0, f64x2.mul(ys0, t26_0));
    t26_1 = f64x2.add(t30_1, f64x2.mul(ys1, t26_1));
    let t31_0 = cv(73);
    let t31_1 = cv(73);
    t31_0 = f64x2.add(cv(68), f64x2.mul(xs0, t31_0));
    t31_1 = f64x2.add(cv(68), f64x2.mul(xs1, t31_1));
    t31_0 = f64x2.add(cv(59), f64x2.mul(xs0, t31_0));
    t31_1 = f64x2.add(cv(59), f64x2.mul(xs1, t31_1));
    t31_0 = f64x2.add(cv(47), f64x2.mul(xs0, t31_0));
    t31_1 = f64x2.add(cv(47), f64x2.mul(xs1, t31_1));
    t31_0 = f64x2.add(cv(30), f64x2.mul(xs0, t31_0));
    t31_1 = f64x2.add(cv(30), f64x2.mul(xs1, t31_1));
    t31_0 = f64x2.add(cv(7), f64x2.mul(xs0, t31_0));
    t31_1 = f64x2.add(cv(7), f64x2.mul(xs1, t31_1));
    t26_0 = f64x2.add(t31_0, f64x2.mul(ys0, t26_0));
    t26_1 = f64x2.add(t31_1, f64x2.mul(ys1, t26_1));
    let t32_0 = cv(74);
    let t32_1 = cv(74);
    t32_0 = f64x2.add(cv(71), f64x2.mul(xs0, t32_0));
    t32_1 = f64x2.add(cv(71), f64x2.mul(xs1, t32_1));
    t32_0 = f64x2.add(cv(65), f64x2.mul(xs0, t32_0));
    t32_1 = f64x2.add(cv(65), f64x2.mul(xs1, t32_1));
    t32_0 = f64x2.add(cv(56), f64x2.mul(xs0, t32_0));
    t32_1 = f64x2.add(cv(56), f64x2.mul(xs1, t32_1));
    t32_0 = f64x2.add(cv(43), f64x2.mul(xs0, t32_0));
    t32_1 = f64x2.add(cv(43), f64x2.mul(xs1, t32_1));
    t32_0 = f64x2.add(cv(25), f64x2.mul(xs0, t32_0));
    t32_1 = f64x2.add(cv(25), f64x2.mul(xs1, t32_1));
    t32_0 = f64x2.add(cv(0), f64x2.mul(xs0, t32_0));
    t32_1 = f64x2.add(cv(0), f64x2.mul(xs1, t32_1));
    t26_0 = f64x2.add(t32_0, f64x2.mul(ys0, t26_0));
    t26_1 = f64x2.add(t32_1, f64x2.mul(ys1, t26_1));
    t9_0 = f64x2.add(t26_0, f64x2.mul(z, t9_0));
    t9_1 = f64x2.add(t26_1, f64x2.mul(z, t9_1));
    v128.store(rhoP + ((i + 0) << 3), f64x2.div(one, t9_0));
    v128.store(rhoP + ((i + 2) << 3), f64x2.div(one, t9_1));
  }
  for (; i < end; i++) {
    const sp = f64x2.splat(<f64>load<f32>(sP + (i << 2)));
    const pt = f64x2.splat(<f64>load<f32>(tP + (i << 2)));
    store<f64>(rhoP + (i << 3), f64x2.extract_lane(density2(sp, pt, z, sr, sf, so, cp, quarter, zero, one), 0));
  }
}
