/**
 * Text as a printed figure shows it: units with real superscripts and symbols (µmol kg⁻¹, mmol m⁻³, °C),
 * longitudes and latitudes with hemisphere letters (30°W, 60°S), and numbers with a true minus sign.
 */

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };

const WHOLE_UNITS: Record<string, string> = {
  degC: '°C',
  degree_C: '°C',
  degrees_C: '°C',
  deg_C: '°C',
  celsius: '°C',
  K: 'K',
  '1e-3': '10⁻³',
  psu: 'PSS-78',
  '1': 'dimensionless',
  '': 'dimensionless',
};

const sup = (digits: string): string => [...digits].map((c) => SUPERSCRIPT[c] ?? c).join('');

/** One factor of a UDUNITS product, e.g. "umol", "kg-1", "m^-3", "m**3". */
function factor(t: string): string {
  // a power of ten written as 1e-3 (salinity's "units" of parts per thousand): 10⁻³
  const p = /^1e(-?\d+)$/.exec(t);
  if (p) return `10${sup(String(Number(p[1])))}`;
  const m = /^([A-Za-zµμ%]+)(?:\^|\*\*)?(-?\d+)?$/.exec(t);
  if (!m) return t;
  let base = m[1];
  // SI prefix micro written as u (UDUNITS' ASCII spelling)
  if (/^u(mol|g|m|M|L|l|atm)$/.test(base)) base = 'µ' + base.slice(1);
  base = base.replace(/^μ/, 'µ');
  return m[2] && m[2] !== '1' ? base + sup(m[2]) : base;
}

/** Units written for print: "umol kg-1" → "µmol kg⁻¹", "degC" → "°C", "mmol/m3" → "mmol m⁻³". */
export function typesetUnits(units: string): string {
  const u = units.trim();
  if (u in WHOLE_UNITS) return WHOLE_UNITS[u];
  if (/^deg(ree)?s?[ _]?C(elsius)?$/i.test(u)) return '°C';
  // a single "/" divides everything after it
  const slash = u.split('/');
  const num = slash[0].trim().split(/[\s.·*]+/).filter(Boolean).map(factor);
  const den = slash.slice(1).flatMap((d) => d.trim().split(/[\s.·*]+/).filter(Boolean)).map((t) => {
    const m = /^([A-Za-zµμ]+)(?:\^|\*\*)?(\d+)?$/.exec(t);
    return m ? factor(`${m[1]}-${m[2] ?? '1'}`) : t;
  });
  return [...num, ...den].join(' ');
}

/** A quantity's axis or colour-bar label: "Oxygen (µmol kg⁻¹)". */
export function withUnits(label: string, units: string): string {
  return `${label} (${typesetUnits(units)})`;
}

/** A longitude for print: 30°W, 0°, 120°E, 180°; any longitude is first brought into (−180, 180]. */
export function lonLabel(lon: number): string {
  let l = ((((lon + 180) % 360) + 360) % 360) - 180;
  if (l === -180) l = 180;
  const a = Number(Math.abs(l).toFixed(2));
  if (a === 0) return '0°';
  if (a === 180) return '180°';
  return `${a}°${l < 0 ? 'W' : 'E'}`;
}

/** A latitude for print: 60°S, 0°, 45°N. */
export function latLabel(lat: number): string {
  const a = Number(Math.abs(lat).toFixed(2));
  if (a === 0) return '0°';
  return `${a}°${lat < 0 ? 'S' : 'N'}`;
}

/** A number with the typographic minus sign (U+2212), as print wants it. */
export function minus(text: string): string {
  return text.replace(/^-/, '−').replace(/([\s(])-/g, '$1−');
}

/** A number with a few significant digits for a panel's corner or a table. */
export function shortNumber(v: number | null | undefined, digits = 3): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  if (v === 0) return '0';
  const a = Math.abs(v);
  const t = a >= 1e5 || a < 1e-3 ? v.toExponential(digits - 1) : Number(v.toPrecision(digits)).toString();
  return minus(t);
}
