/**
 * Canonical units. Concentration units are split into an amount part and a "per" part so that
 * conversion (app/ocean) can tell per-volume from per-mass. Filled in by the units parser.
 */
import { StillwaterError } from '../errors.js';

export type UnitKind =
  | 'amount_per_volume' // e.g. mmol m-3, umol L-1, mol m-3, uM
  | 'amount_per_mass' // e.g. umol kg-1
  | 'gas_volume_per_volume' // ml L-1 (oxygen)
  | 'temperature'
  | 'salinity'
  | 'dimensionless'
  | 'length'
  | 'other';

export interface ParsedUnits {
  /** the text as written in the file or recipe */
  text: string;
  kind: UnitKind;
  /** canonical spelling, e.g. "mmol m-3", "umol kg-1", "degC", "K", "1e-3", "m" */
  canonical: string;
  /**
   * multiply a value in these units by `factor` to get the kind's base unit:
   * mol m-3 for amount_per_volume, mol kg-1 for amount_per_mass, L L-1 for gas volume, degC offset handled by `offset`.
   */
  factor: number;
  offset: number;
}

/** Base unit of each kind: value_in_base = value * factor + offset. */
export const BASE_UNITS: Record<UnitKind, string> = {
  amount_per_volume: 'mol m-3',
  amount_per_mass: 'mol kg-1',
  gas_volume_per_volume: 'L L-1',
  temperature: 'degC',
  salinity: '1e-3',
  dimensionless: '1',
  length: 'm',
  other: 'SI',
};

/** Whole spellings that a product-of-powers parser cannot read (case matters: mM is not mm). */
const WHOLE: Record<string, Omit<ParsedUnits, 'text'>> = {};
function whole(names: string[], u: Omit<ParsedUnits, 'text'>): void {
  for (const n of names) WHOLE[n] = u;
}
whole(['degC', 'deg_C', 'degrees_C', 'degree_C', 'degrees_celsius', 'degree_celsius', 'degrees_Celsius', 'degree_Celsius', 'degrees Celsius', 'degree Celsius', 'Celsius', 'celsius', 'deg C', '°C', 'C', 'degreesC', 'degC (ITS-90)', 'degC_ITS90'], {
  kind: 'temperature', canonical: 'degC', factor: 1, offset: 0,
});
whole(['K', 'kelvin', 'Kelvin', 'degK', 'deg_K', 'degrees_K', 'degree_K', 'degrees_kelvin', 'degree_kelvin', 'degrees_Kelvin'], {
  kind: 'temperature', canonical: 'K', factor: 1, offset: -273.15,
});
whole(['psu', 'PSU', 'pss', 'PSS', 'pss-78', 'PSS-78', 'PSS78', '1e-3', '1.e-3', '1E-3', '0.001', 'ppt', 'ppt (psu)', 'practical_salinity_units', '1e-03'], {
  kind: 'salinity', canonical: '1e-3', factor: 1, offset: 0,
});
whole(['g/kg', 'g kg-1', 'g kg^-1', 'g.kg-1', 'g/Kg', 'g_per_kg', 'grams_per_kilogram'], {
  kind: 'salinity', canonical: 'g kg-1', factor: 1, offset: 0,
});
whole(['1', '', 'dimensionless', 'unitless', 'none', 'fraction'], { kind: 'dimensionless', canonical: '1', factor: 1, offset: 0 });
// molarity: M = mol L-1 = 1000 mol m-3
for (const [prefix, f] of [['', 1e3], ['m', 1], ['u', 1e-3], ['µ', 1e-3], ['μ', 1e-3], ['n', 1e-6]] as const) {
  whole([`${prefix}M`, `${prefix}mol/L`], { kind: 'amount_per_volume', canonical: canonicalAmount(f, 'm-3'), factor: f, offset: 0 });
}

const WHOLE_ANY_CASE = new Map<string, Omit<ParsedUnits, 'text'>>();
for (const [k, u] of Object.entries(WHOLE)) if (k.length > 2 && !WHOLE_ANY_CASE.has(k.toLowerCase())) WHOLE_ANY_CASE.set(k.toLowerCase(), u);

/** Dimension exponents of a unit product: amount (mol), mass (kg), length (m), time (s), temperature, angle. */
interface Dim {
  mol: number;
  kg: number;
  m: number;
  s: number;
  /** number of volume units (L or m3) written in the numerator minus denominator, to tell ml/l from a pure ratio */
  vol: number;
  deg: number;
  factor: number;
}

/** Base symbols (after prefix): factor to SI and dimension. */
const SYMBOLS: Record<string, Partial<Dim> & { factor: number }> = {
  mol: { mol: 1, factor: 1 },
  g: { kg: 1, factor: 1e-3 },
  m: { m: 1, factor: 1 },
  l: { m: 3, vol: 1, factor: 1e-3 },
  s: { s: 1, factor: 1 },
  sec: { s: 1, factor: 1 },
  min: { s: 1, factor: 60 },
  h: { s: 1, factor: 3600 },
  hr: { s: 1, factor: 3600 },
  hour: { s: 1, factor: 3600 },
  d: { s: 1, factor: 86400 },
  day: { s: 1, factor: 86400 },
  yr: { s: 1, factor: 365.242198781 * 86400 },
  year: { s: 1, factor: 365.242198781 * 86400 },
  a: { s: 1, factor: 365.242198781 * 86400 },
  w: { kg: 1, m: 2, s: -3, factor: 1 },
  j: { kg: 1, m: 2, s: -2, factor: 1 },
  n: { kg: 1, m: 1, s: -2, factor: 1 },
  pa: { kg: 1, m: -1, s: -2, factor: 1 },
  bar: { kg: 1, m: -1, s: -2, factor: 1e5 },
  dbar: { kg: 1, m: -1, s: -2, factor: 1e4 },
  degree: { deg: 1, factor: 1 },
  degrees: { deg: 1, factor: 1 },
  degrees_north: { deg: 1, factor: 1 },
  degrees_east: { deg: 1, factor: 1 },
  degree_north: { deg: 1, factor: 1 },
  degree_east: { deg: 1, factor: 1 },
};
const PREFIXES: Record<string, number> = { p: 1e-12, n: 1e-9, u: 1e-6, m: 1e-3, c: 1e-2, d: 1e-1, k: 1e3, h: 1e2, M: 1e6, G: 1e9 };
const WORDS: [RegExp, string][] = [
  [/\bcubic[_ ]?(meters?|metres?)\b/g, 'm3'],
  [/\bsquare[_ ]?(meters?|metres?)\b/g, 'm2'],
  [/\bmicromol(e|es)?\b/g, 'umol'],
  [/\bmillimol(e|es)?\b/g, 'mmol'],
  [/\bnanomol(e|es)?\b/g, 'nmol'],
  [/\bmol(e|es)\b/g, 'mol'],
  [/\bkilograms?\b/g, 'kg'],
  [/\bgrams?\b/g, 'g'],
  [/\bmilli(liters?|litres?)\b/g, 'ml'],
  [/\b(liters?|litres?)\b/g, 'l'],
  [/\bcentim(eters?|etres?)\b/g, 'cm'],
  [/\bkilom(eters?|etres?)\b/g, 'km'],
  [/\b(meters?|metres?)\b/g, 'm'],
  [/\bseconds?\b/g, 's'],
  [/\bdays\b/g, 'day'],
  [/\bhours\b/g, 'hour'],
  [/\byears\b/g, 'year'],
];

function canonicalAmount(factor: number, per: 'm-3' | 'kg-1'): string {
  const names: [number, string][] = [[1, 'mol'], [1e-3, 'mmol'], [1e-6, 'umol'], [1e-9, 'nmol']];
  for (const [f, name] of names) if (close(factor, f)) return `${name} ${per}`;
  return `${factor} mol ${per}`;
}

function close(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-12 * Math.abs(b);
}

function unitsError(text: string): StillwaterError {
  return new StillwaterError('E_UNITS', `unknown units '${text}'.`);
}

/** One token such as "m-3", "m^-3", "kg-1", "mmol", "m3", "m**-3" → dimension with exponent. */
function parseToken(token: string, sign: number, text: string): Dim {
  const m = /^([a-zA-Z_µμ]+)(?:\^|\*\*)?(-?\d+)?$/.exec(token);
  if (!m) throw unitsError(text);
  const symbol = m[1].replace(/[µμ]/g, 'u');
  const power = (m[2] !== undefined ? Number(m[2]) : 1) * sign;
  const found = lookupSymbol(symbol);
  if (!found) throw unitsError(text);
  return {
    mol: (found.mol ?? 0) * power,
    kg: (found.kg ?? 0) * power,
    m: (found.m ?? 0) * power,
    s: (found.s ?? 0) * power,
    vol: (found.vol ?? 0) * power,
    deg: (found.deg ?? 0) * power,
    factor: Math.pow(found.factor, power),
  };
}

function lookupSymbol(symbol: string): (Partial<Dim> & { factor: number }) | undefined {
  const lower = symbol.toLowerCase();
  if (SYMBOLS[lower]) return SYMBOLS[lower];
  // a prefix followed by a base symbol; keep the prefix's case (M mega vs m milli) but only where it is unambiguous
  const p = symbol[0];
  const rest = lower.slice(1);
  const pf = PREFIXES[p] ?? PREFIXES[p.toLowerCase()];
  if (pf !== undefined && rest && SYMBOLS[rest] && ['mol', 'g', 'm', 'l', 's', 'w', 'j', 'pa', 'bar'].includes(rest)) {
    const b = SYMBOLS[rest];
    return { ...b, factor: pf * b.factor };
  }
  return undefined;
}

function parseProduct(text: string): Dim {
  let t = text.trim().replace(/[µμ]/g, 'u').replace(/_per_/g, '/').replace(/\bdegrees?_(north|east|n|e)\b/gi, 'degree');
  t = t.replace(/_/g, ' ');
  for (const [re, rep] of WORDS) t = t.replace(re, rep);
  t = t.replace(/\*\*/g, '^').replace(/\bper\b/g, '/').replace(/\s*\/\s*/g, '/').replace(/\s*\*\s*/g, ' ').replace(/\./g, ' ');
  const total: Dim = { mol: 0, kg: 0, m: 0, s: 0, vol: 0, deg: 0, factor: 1 };
  const parts = t.split('/');
  if (parts.some((p) => p.trim() === '')) throw unitsError(text);
  parts.forEach((part, i) => {
    for (const token of part.trim().split(/\s+/)) {
      if (!token) continue;
      const d = parseToken(token, i === 0 ? 1 : -1, text);
      total.mol += d.mol;
      total.kg += d.kg;
      total.m += d.m;
      total.s += d.s;
      total.vol += d.vol;
      total.deg += d.deg;
      total.factor *= d.factor;
    }
  });
  return total;
}

/**
 * Parse the units that climatologies and models write into a kind, a canonical spelling and the
 * factor (and offset) to the kind's base unit. Unknown units throw E_UNITS; they are never guessed.
 */
export function parseUnits(text: string): ParsedUnits {
  const trimmed = text.trim();
  // exact spelling first (mM is not MM); longer names also in any letter case ("Degrees Celsius")
  const w = WHOLE[trimmed] ?? (trimmed.length > 2 ? WHOLE_ANY_CASE.get(trimmed.toLowerCase()) : undefined);
  if (w) return { text, ...w };
  if (/\bsince\b/.test(trimmed)) throw new StillwaterError('E_UNITS', `units '${text}' are a time coordinate, not the units of a field.`);
  const d = parseProduct(trimmed);
  const is = (mol: number, kg: number, m: number, s: number): boolean => d.mol === mol && d.kg === kg && d.m === m && d.s === s && d.deg === 0;
  if (is(1, 0, -3, 0)) return { text, kind: 'amount_per_volume', canonical: canonicalAmount(d.factor, 'm-3'), factor: d.factor, offset: 0 };
  if (is(1, -1, 0, 0)) return { text, kind: 'amount_per_mass', canonical: canonicalAmount(d.factor, 'kg-1'), factor: d.factor, offset: 0 };
  if (is(0, 0, 0, 0) && d.vol === 0 && d.m === 0 && countVolumes(trimmed)) {
    // ml/l: a gas volume per volume of water
    return { text, kind: 'gas_volume_per_volume', canonical: close(d.factor, 1e-3) ? 'ml L-1' : `${d.factor} L L-1`, factor: d.factor, offset: 0 };
  }
  if (is(0, 0, 1, 0)) return { text, kind: 'length', canonical: lengthName(d.factor), factor: d.factor, offset: 0 };
  if (is(0, 0, 0, 0)) return { text, kind: 'dimensionless', canonical: close(d.factor, 1) ? '1' : String(d.factor), factor: d.factor, offset: 0 };
  return { text, kind: 'other', canonical: siName(d), factor: d.factor, offset: 0 };
}

function countVolumes(t: string): boolean {
  return /l\b|L\b|m\^?3|m\*\*3|liter|litre/i.test(t);
}

function lengthName(f: number): string {
  for (const [v, n] of [[1, 'm'], [1e-2, 'cm'], [1e-3, 'mm'], [1e3, 'km']] as const) if (close(f, v)) return n;
  return `${f} m`;
}

function siName(d: Dim): string {
  const parts: string[] = [];
  if (!close(d.factor, 1)) parts.push(String(d.factor));
  for (const [sym, p] of [['mol', d.mol], ['kg', d.kg], ['m', d.m], ['s', d.s], ['degree', d.deg]] as const) {
    if (p === 1) parts.push(sym);
    else if (p !== 0) parts.push(`${sym}${p}`);
  }
  return parts.join(' ') || '1';
}

/** value in `from` → value in `to`, both of the same kind. */
export function convertValue(value: number, from: ParsedUnits, to: ParsedUnits): number {
  if (from.kind !== to.kind) {
    throw new StillwaterError('E_UNITS', `cannot convert '${from.text}' (${from.kind}) to '${to.text}' (${to.kind}) without more information.`);
  }
  return (value * from.factor + from.offset - to.offset) / to.factor;
}
