/**
 * The one number format for text a person reads (Markdown and LaTeX tables, console lines, sentences) and
 * for files other programs read (CSV, JSON). A missing or undefined value is MISSING in human text, an
 * empty field in CSV and null in JSON; never "NaN".
 */
export const MISSING = '—';

/** A few significant digits, exponent only outside everyday sizes: 0.001 ≤ |x| < 1e6 prints plainly. */
export function formatNumber(x: number | null | undefined, digits = 4): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return MISSING;
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e6 || a < 1e-3) return x.toExponential(digits - 1);
  return Number(x.toPrecision(digits)).toString();
}

/** With an explicit sign for positive values (drifts, changes). */
export function formatSigned(x: number | null | undefined, digits = 4): string {
  const s = formatNumber(x, digits);
  return x !== null && x !== undefined && x > 0 ? `+${s}` : s;
}

/**
 * A change (a drift, a difference) beside the size of what changes: a change below `size` × 1e-6 is the
 * round-off of single-precision data (about 7 significant digits) and reads 0; otherwise as formatNumber.
 */
export function formatChange(x: number | null | undefined, size: number, digits = 4): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return MISSING;
  if (Number.isFinite(size) && size !== 0 && Math.abs(x) < Math.abs(size) * ROUND_OFF) return '0';
  return formatNumber(x, digits);
}

/** relative size of single-precision round-off that a change must exceed to be shown (FLT_EPSILON ≈ 1.19e-7, IEEE 754) */
const ROUND_OFF = 1e-6;

export function formatCount(x: number | null | undefined): string {
  return x === null || x === undefined || !Number.isFinite(x) ? MISSING : String(x);
}

export function formatPercent(fraction: number | null | undefined): string {
  return fraction === null || fraction === undefined || !Number.isFinite(fraction) ? MISSING : `${(100 * fraction).toFixed(1)}%`;
}

/** Whole model years. */
export function formatYears(x: number): string {
  return Number.isFinite(x) ? Math.round(x).toString() : MISSING;
}

/**
 * A number for machine-read files, rounded to `digits` significant digits (7 suits single-precision data;
 * omit for full precision); null when missing. CSV writes null as an empty field, JSON as null.
 */
export function dataNumber(x: number | null | undefined, digits?: number): number | null {
  if (x === null || x === undefined || !Number.isFinite(x)) return null;
  return digits === undefined ? x : Number(x.toPrecision(digits));
}
