/**
 * Nonlinear least-squares fit of a first-order approach to equilibrium,
 *   x(t) = x∞ + (x0 − x∞)·e^(−(t − t0)/τ),
 * exact for a first-order system. For a fixed τ the model is linear in x∞ and the amplitude (x0 − x∞),
 * so those two are solved in closed form and only τ is searched: a log-spaced scan followed by a
 * golden-section refinement in log τ. No starting guess, no random restarts: the same input always gives
 * the same answer.
 */

export interface RawFit {
  t0: number;
  x0: number;
  xInf: number;
  tau: number;
  sse: number;
  n: number;
  /** false when the best τ lies at the edge of the search range */
  constrained: boolean;
}

const SCAN_POINTS = 240;
const GOLDEN_STEPS = 80;

/** Residual sum of squares and the linear coefficients for one τ. */
function solveForTau(s: Float64Array, x: Float64Array, tau: number): { sse: number; a: number; b: number } {
  const n = s.length;
  let me = 0;
  let mx = 0;
  const e = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    e[i] = Math.exp(-s[i] / tau);
    me += e[i];
    mx += x[i];
  }
  me /= n;
  mx /= n;
  let see = 0;
  let sex = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    const de = e[i] - me;
    const dx = x[i] - mx;
    see += de * de;
    sex += de * dx;
    sxx += dx * dx;
  }
  // e constant over the window (τ far outside the sampled range): only the mean is determined
  if (!(see > 1e-300)) return { sse: sxx, a: mx, b: 0 };
  const b = sex / see;
  const a = mx - b * me;
  return { sse: Math.max(0, sxx - (sex * sex) / see), a, b };
}

/**
 * Fit the first-order model to (t, x), t increasing, at least 3 points. Returns null when the data
 * cannot determine it (fewer than 3 points, or all times equal).
 */
export function fitFirstOrder(t: ArrayLike<number>, x: ArrayLike<number>): RawFit | null {
  const n = t.length;
  if (n < 3 || x.length !== n) return null;
  const t0 = t[0];
  const s = new Float64Array(n);
  const xv = new Float64Array(n);
  let minStep = Infinity;
  for (let i = 0; i < n; i++) {
    s[i] = t[i] - t0;
    xv[i] = x[i];
    if (i > 0 && s[i] - s[i - 1] > 0) minStep = Math.min(minStep, s[i] - s[i - 1]);
  }
  const span = s[n - 1];
  if (!(span > 0) || !Number.isFinite(minStep)) return null;
  // Below a tenth of the smallest step the exponential is a step at t0; far above the span it is a
  // straight line: neither end carries information about τ any more.
  const lo = Math.log(minStep / 10);
  const hi = Math.log(span * 1000);
  let best = 0;
  let bestSse = Infinity;
  const scan = new Float64Array(SCAN_POINTS);
  for (let i = 0; i < SCAN_POINTS; i++) {
    const lt = lo + ((hi - lo) * i) / (SCAN_POINTS - 1);
    scan[i] = solveForTau(s, xv, Math.exp(lt)).sse;
    if (scan[i] < bestSse) {
      bestSse = scan[i];
      best = i;
    }
  }
  const step = (hi - lo) / (SCAN_POINTS - 1);
  let a = lo + Math.max(0, best - 1) * step;
  let b = lo + Math.min(SCAN_POINTS - 1, best + 1) * step;
  const g = (Math.sqrt(5) - 1) / 2;
  let c = b - g * (b - a);
  let d = a + g * (b - a);
  let fc = solveForTau(s, xv, Math.exp(c)).sse;
  let fd = solveForTau(s, xv, Math.exp(d)).sse;
  for (let i = 0; i < GOLDEN_STEPS; i++) {
    if (fc <= fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - g * (b - a);
      fc = solveForTau(s, xv, Math.exp(c)).sse;
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + g * (b - a);
      fd = solveForTau(s, xv, Math.exp(d)).sse;
    }
  }
  const lt = fc <= fd ? c : d;
  const tau = Math.exp(lt);
  const sol = solveForTau(s, xv, tau);
  // a flat SSE (constant data) also lands here: no τ is better than another
  const flat = scan.every((v) => Math.abs(v - scan[0]) <= 1e-12 * Math.max(1e-300, Math.abs(scan[0])) || v === scan[0]);
  const constrained = !flat && best > 0 && best < SCAN_POINTS - 1;
  return { t0, x0: sol.a + sol.b, xInf: sol.a, tau, sse: sol.sse, n, constrained };
}

/** The fitted curve at time t. */
export function firstOrderValue(f: Pick<RawFit, 't0' | 'x0' | 'xInf' | 'tau'>, t: number): number {
  return f.xInf + (f.x0 - f.xInf) * Math.exp(-(t - f.t0) / f.tau);
}

/** 90 % of the change is covered after τ·ln 10 (exact for a first-order system). */
export function t90(tau: number): number {
  return tau * Math.LN10;
}
