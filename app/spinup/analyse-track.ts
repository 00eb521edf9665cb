import { fitFirstOrder, firstOrderValue, t90 } from './first-order-fit.js';
import { linearSlope, mean } from './linear-slope.js';
import { chooseTail } from './tail-window.js';
import { turningPoints } from './turning-points.js';
import { formatNumber as fmt, formatSigned as fmtSigned, formatYears as yrs } from '../output/number-format.js';
import { typesetUnits } from '../figures/typeset.js';
import type { DriftRate, FirstOrderFit, TrackVerdict } from './types.js';

/** A run shorter than this has not settled in the deep ocean (England 1995; common practice: "a few thousand years"). */
export const DEEP_SETTLING_YEARS = 3000;
/** A first-order fit has three parameters: it needs one more point than that to say anything. */
export const MIN_FIT_POINTS = 4;
/** The fit uses the later half of the snapshots (see fitStart). */
export const FIT_TAIL_FRACTION = 0.5;

export interface TrackInput {
  years: ArrayLike<number>;
  mean: ArrayLike<number>;
  inventory: ArrayLike<number>;
  units: string;
  /** the track includes depths below 1000 m */
  deep: boolean;
  /**
   * added to the mean before the relative drift is taken: the zero of an interval scale (273.15 for degC,
   * so that a temperature drift is relative to the mean in kelvin); 0 for amounts and ratios
   */
  scaleZero?: number;
  thresholdPercentPerKyr: number;
  tailYears?: number;
}

export interface TrackAnalysis {
  drift: DriftRate | null;
  fit: FirstOrderFit | null;
  fitNote: string;
  turningYears: number[];
  monotonic: boolean;
  verdict: TrackVerdict;
}

export function driftRate(input: TrackInput): DriftRate {
  const tail = chooseTail(input.years, input.tailYears);
  const t = Array.from(input.years).slice(tail.start);
  const x = Array.from(input.mean).slice(tail.start);
  const inv = Array.from(input.inventory).slice(tail.start);
  const perYear = linearSlope(t, x);
  const m = mean(x);
  return {
    fromYear: t[0],
    toYear: t[t.length - 1],
    n: t.length,
    perKyr: perYear * 1000,
    windowMean: m,
    percentPerKyr: m + (input.scaleZero ?? 0) !== 0 ? ((perYear * 1000) / Math.abs(m + (input.scaleZero ?? 0))) * 100 : null,
    ...(input.scaleZero ? { relativeTo: 'the mean in kelvin' } : {}),
    inventoryPerKyr: linearSlope(t, inv) * 1000,
    window: tail.description,
  };
}

/**
 * Fit on the window, with the derived quantities a person asks about. The fit's drift decays as e^(−t/τ),
 * so where the fit is constrained the time until it falls below the threshold has a closed form; the tail
 * slope (a straight line over a window that can be long compared with τ) is kept as its own number.
 * `scale` is what relative drifts are relative to (|tail mean|, in kelvin for temperatures).
 */
export function describeFit(t: number[], x: number[], drift: DriftRate, thresholdPerKyr: number, scale: number): FirstOrderFit | null {
  const raw = fitFirstOrder(t, x);
  if (!raw) return null;
  const lastYear = drift.toYear;
  const xLast = firstOrderValue(raw, lastYear);
  const remaining = raw.xInf - xLast;
  const amplitude = raw.x0 - raw.xInf;
  const driftPerKyr = ((-amplitude / raw.tau) * Math.exp(-(lastYear - raw.t0) / raw.tau)) * 1000;
  let yearsToSettle: number | null = null;
  if (raw.constrained && thresholdPerKyr > 0) {
    const startRate = (Math.abs(amplitude) / raw.tau) * 1000;
    const settleAt = startRate > thresholdPerKyr ? raw.t0 + raw.tau * Math.log(startRate / thresholdPerKyr) : raw.t0;
    yearsToSettle = Math.max(0, settleAt - lastYear);
  }
  return {
    t0: raw.t0,
    x0: raw.x0,
    xInf: raw.xInf,
    tau: raw.tau,
    t90: t90(raw.tau),
    remainingChange: remaining,
    remainingPercent: raw.xInf !== 0 ? (remaining / Math.abs(raw.xInf)) * 100 : null,
    yearsTo90: Math.max(0, raw.t0 + t90(raw.tau) - lastYear),
    driftPerKyr,
    driftPercentPerKyr: scale !== 0 ? (driftPerKyr / scale) * 100 : null,
    yearsToSettle,
    rmse: Math.sqrt(raw.sse / raw.n),
    n: raw.n,
    constrained: raw.constrained,
    extrapolated: raw.tau > t[t.length - 1] - t[0],
  };
}

/**
 * Where the fit starts: after the last turning point, and within what follows, the later half of the
 * snapshots (at least MIN_FIT_POINTS). Early snapshots carry fast upper-ocean adjustments; the slowest
 * adjustment, which decides how long the run still needs, dominates the later half.
 */
export function fitStart(n: number, lastTurn: number | null): number {
  const from = lastTurn ?? 0;
  const available = n - from;
  const take = Math.max(MIN_FIT_POINTS, Math.ceil(available * FIT_TAIL_FRACTION));
  return available <= take ? from : n - take;
}

export function analyseTrack(input: TrackInput): TrackAnalysis {
  const t = Array.from(input.years);
  const x = Array.from(input.mean);
  const n = t.length;
  const lastYear = t[n - 1];
  if (x.some((v) => !Number.isFinite(v))) {
    return {
      drift: null,
      fit: null,
      fitNote: 'no fit: the track has no wet cell in some snapshot',
      turningYears: [],
      monotonic: true,
      verdict: { status: 'undetermined', basis: 'tail slope', percentPerKyr: null, deepCaution: false, sentence: 'Undetermined: this region and layer hold no wet cell in some snapshot.' },
    };
  }
  const drift = driftRate(input);
  const turns = turningPoints(x);
  const turningYears = turns.map((i) => t[i]);
  const lastTurn = turns.length ? turns[turns.length - 1] : null;
  const start = fitStart(n, lastTurn);
  const tw = t.slice(start);
  const xw = x.slice(start);
  // the threshold is relative to the same mean as the drift rate: the tail's
  const scale = Math.abs(drift.windowMean + (input.scaleZero ?? 0));
  const thresholdPerKyr = (input.thresholdPercentPerKyr / 100) * scale;
  const range = Math.max(...x) - Math.min(...x);
  let fit: FirstOrderFit | null = null;
  let fitNote: string;
  if (range === 0) {
    fitNote = 'no fit: the track does not change';
  } else if (tw.length < MIN_FIT_POINTS) {
    fitNote = lastTurn !== null
      ? `no fit: only ${tw.length} snapshots from the last turning point (model year ${yrs(t[lastTurn])}) on; a first-order fit needs ${MIN_FIT_POINTS}`
      : `no fit: ${tw.length} snapshots; a first-order fit needs ${MIN_FIT_POINTS}`;
  } else {
    fit = describeFit(tw, xw, drift, thresholdPerKyr, scale);
    const span = `model years ${yrs(tw[0])}–${yrs(lastYear)}`;
    fitNote = lastTurn !== null
      ? `fit on the ${tw.length} snapshots of ${span}, after the last turning point (model year ${yrs(t[lastTurn])}), because the track overshoots and turns back`
      : tw.length === n
        ? `fit on all ${n} snapshots (${span})`
        : `fit on the later ${tw.length} of ${n} snapshots (${span}), where the slowest adjustment dominates`;
  }
  const deepCaution = input.deep && lastYear < DEEP_SETTLING_YEARS;
  return { drift, fit, fitNote, turningYears, monotonic: turns.length === 0, verdict: verdictFor(input, drift, fit, turningYears, deepCaution, lastYear) };
}

function verdictFor(
  input: TrackInput,
  drift: DriftRate,
  fit: FirstOrderFit | null,
  turningYears: number[],
  deepCaution: boolean,
  lastYear: number,
): TrackVerdict {
  const over = `over model years ${yrs(drift.fromYear)}–${yrs(drift.toYear)}`;
  const ofMean = `of ${drift.relativeTo ?? 'the mean'}`;
  const parts: string[] = [];
  let status: TrackVerdict['status'];
  // a constrained fit knows the drift at the last snapshot; the tail slope averages over its window
  const byFit = fit !== null && fit.constrained && fit.driftPercentPerKyr !== null;
  const basis: TrackVerdict['basis'] = byFit ? 'first-order fit' : 'tail slope';
  const judged = byFit ? fit.driftPercentPerKyr : drift.percentPerKyr;
  const how = byFit
    ? `by the first-order fit at model year ${yrs(lastYear)} (the tail slope ${over} is ${drift.percentPerKyr === null ? 'undefined' : `${fmtSigned(drift.percentPerKyr)} %`})`
    : `by the tail slope ${over}`;
  if (judged === null) {
    status = 'undetermined';
    parts.push(`Undetermined: the mean is zero, so a relative drift has no meaning; the drift is ${fmtSigned(drift.perKyr, 3)} ${typesetUnits(input.units)} per 1000 years ${over}.`);
  } else if (Math.abs(judged) <= input.thresholdPercentPerKyr) {
    status = 'settled';
    parts.push(`Settled: drift ${fmtSigned(judged, 3)} % ${ofMean} per 1000 years ${how}; threshold ${fmt(input.thresholdPercentPerKyr, 3)} %.`);
  } else {
    status = 'drifting';
    parts.push(`Still drifting: ${fmtSigned(judged, 3)} % ${ofMean} per 1000 years ${how}; threshold ${fmt(input.thresholdPercentPerKyr, 3)} %.`);
  }
  if (turningYears.length) {
    parts.push(`The track overshoots and turns back (turning point${turningYears.length > 1 ? 's' : ''} at model year ${turningYears.map(yrs).join(', ')}), so it is not monotonic; the fit uses only the snapshots after the last turning point.`);
  }
  if (status === 'drifting' && fit) {
    if (!fit.constrained) {
      parts.push('The fit cannot yet tell where it will settle: the tail still looks like a straight line.');
    } else {
      const toSettle =
        fit.yearsToSettle === null
          ? ''
          : fit.yearsToSettle > 0
            ? `; about ${yrs(fit.yearsToSettle)} more model years until the fit's drift falls below the threshold`
            : '';
      parts.push(
        `First-order fit from model year ${yrs(fit.t0)}: heading for ${fmt(fit.xInf, 3)} ${typesetUnits(input.units)} with τ = ${yrs(fit.tau)} years (90 % of the change takes ${yrs(fit.t90)} years; ${fit.yearsTo90 > 0 ? `${yrs(fit.yearsTo90)} more model years to get there` : 'already past that'})${toSettle}.`,
      );
    }
  }
  if (deepCaution) {
    parts.push(
      `The run is only ${yrs(lastYear)} model years long: a spin-up much shorter than a few thousand years has not settled in the deep ocean (England 1995; common practice), so a small drift here may hide a slow deep adjustment.`,
    );
  }
  return { status, basis, percentPerKyr: judged, deepCaution, sentence: parts.join(' ') };
}
