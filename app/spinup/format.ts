/** Numbers for sentences and the verdict table: a few significant digits, no exponent for everyday sizes. */
export function fmt(x: number, digits = 3): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e6 || a < 1e-3) return x.toExponential(digits - 1);
  return Number(x.toPrecision(digits)).toString();
}

export function fmtSigned(x: number, digits = 3): string {
  return (x > 0 ? '+' : '') + fmt(x, digits);
}

/** Whole model years. */
export function years(x: number): string {
  return Math.round(x).toString();
}
