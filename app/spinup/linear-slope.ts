/** Ordinary least-squares slope of x against t (NaN when fewer than 2 distinct times). */
export function linearSlope(t: ArrayLike<number>, x: ArrayLike<number>): number {
  const n = t.length;
  let mt = 0;
  let mx = 0;
  for (let i = 0; i < n; i++) {
    mt += t[i];
    mx += x[i];
  }
  mt /= n;
  mx /= n;
  let stt = 0;
  let stx = 0;
  for (let i = 0; i < n; i++) {
    stt += (t[i] - mt) * (t[i] - mt);
    stx += (t[i] - mt) * (x[i] - mx);
  }
  return stt > 0 ? stx / stt : NaN;
}

export function mean(x: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i];
  return s / x.length;
}
