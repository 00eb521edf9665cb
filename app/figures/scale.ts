/** A linear scale from data values to figure units, with round ticks. */
import { formatTick, niceTicks } from '../render/colour-scales.js';

export interface Scale {
  (v: number): number;
  domain: [number, number];
  range: [number, number];
  ticks(count?: number): number[];
  tickText(v: number, count?: number): string;
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
