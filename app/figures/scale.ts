/** A linear scale from data values to figure units, with round ticks. */
import { formatTick, niceTicks } from '../render/colour-scales.js';

export interface Scale {
  (v: number): number;
  domain: [number, number];
  range: [number, number];
  ticks(count?: number): number[];
  tickText(v: number, count?: number): string;
  invert(p: number): number;
}

export function linear(domain: [number, number], range: [number, number]): Scale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const k = d1 !== d0 ? (r1 - r0) / (d1 - d0) : 0;
  const f = ((v: number) => r0 + (v - d0) * k) as Scale;
  f.domain = domain;
  f.range = range;
  f.ticks = (count = 5) => niceTicks(Math.min(d0, d1), Math.max(d0, d1), count);
  f.tickText = (v, count = 5) => {
    const t = f.ticks(count);
    const step = t.length > 1 ? Math.abs(t[1] - t[0]) : Math.abs(v) || 1;
    return formatTick(v, step).replace(/^-/, '−');
  };
  f.invert = (p) => (k !== 0 ? d0 + (p - r0) / k : d0);
  return f;
}

/** Extend [min, max] by a fraction on both sides; a flat or empty range gets some width. */
export function padded(min: number, max: number, frac = 0.05): [number, number] {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return [0, 1];
  if (max === min) {
    const d = Math.abs(min) * 0.1 || 1;
    return [min - d, max + d];
  }
  const d = (max - min) * frac;
  return [min - d, max + d];
}

/**
 * A depth axis stretched over the upper ocean: the top `split` metres take half the height, the rest of the
 * column the other half (each part linear), with ticks chosen per part.
 */
export function stretchedDepth(depthMax: number, range: [number, number], split = 1000): Scale {
  const [r0, r1] = range;
  if (!(depthMax > split * 1.5)) return linear([0, depthMax], range);
  const mid = r0 + (r1 - r0) / 2;
  const f = ((v: number) => (v <= split ? r0 + (v / split) * (mid - r0) : mid + ((v - split) / (depthMax - split)) * (r1 - mid))) as Scale;
  f.domain = [0, depthMax];
  f.range = range;
  f.ticks = () => [...niceTicks(0, split, 4), ...niceTicks(split, depthMax, 4).filter((t) => t > split * 1.2)];
  f.tickText = (v) => formatTick(v, 100);
  f.invert = (p) => (p <= mid ? ((p - r0) / (mid - r0)) * split : split + ((p - mid) / (r1 - mid)) * (depthMax - split));
  return f;
}
