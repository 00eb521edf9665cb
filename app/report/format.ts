/** Number formatting for the human tables: undefined values print as "—", never NaN. */
export const DASH = '—';

export function fmtNumber(x: number | null | undefined, digits = 4): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return DASH;
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e6 || a < 1e-3) return x.toExponential(digits - 1);
  return Number(x.toPrecision(digits)).toString();
}

export function fmtCount(x: number | null | undefined): string {
  return x === null || x === undefined ? DASH : String(x);
}

export function fmtPercent(x: number | null | undefined): string {
  return x === null || x === undefined || !Number.isFinite(x) ? DASH : `${(100 * x).toFixed(1)}%`;
}
