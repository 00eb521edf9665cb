/**
 * The one CSV writer and number format. RFC 4180 §2: CRLF record ends, fields with commas, quotes or line
 * breaks in double quotes, quotes doubled. Formula-looking text (= + - @, tab, carriage return at the start)
 * gets a leading apostrophe (common practice: OWASP "CSV Injection"); numbers stay numbers.
 */
import { describe, expect, it } from 'vitest';
import { csvCell, csvTable, csvText } from '../../../app/output/csv.js';
import { camelKey, camelKeys, jsonText, snakeKey, snakeKeys } from '../../../app/output/json-keys.js';
import { dataNumber, formatChange, formatNumber, formatPercent, formatSigned, MISSING } from '../../../app/output/number-format.js';

describe('CSV', () => {
  it('quotes and doubles per RFC 4180 and ends every record with CRLF', () => {
    expect(csvTable(['a', 'b, c'], [['say "hi"', 'two\nlines'], [1.5, null]])).toBe('a,"b, c"\r\n"say ""hi""","two\nlines"\r\n1.5,\r\n');
  });

  it('neutralises text a spreadsheet would run as a formula', () => {
    for (const s of ['=1+1', '+1', '-1', '@SUM(A1)', '\tx', '\rx']) expect(csvText(s).replace(/^"/, '')[0]).toBe("'");
    expect(csvText('=HYPERLINK("u")')).toBe(`"'=HYPERLINK(""u"")"`);
    expect(csvText('PO4')).toBe('PO4');
  });

  it('numbers are written as numbers, negative ones included; missing numbers are empty fields', () => {
    expect(csvCell(-1.25)).toBe('-1.25');
    expect(csvCell(NaN)).toBe('');
    expect(csvCell(Infinity)).toBe('');
    expect(csvCell(undefined)).toBe('');
    expect(csvCell(true)).toBe('true');
    expect(csvCell(1 / 3, 7)).toBe('0.3333333');
  });
});

describe('number format', () => {
  it('one missing mark, never NaN', () => {
    expect([formatNumber(NaN), formatNumber(null), formatPercent(undefined), formatSigned(NaN)]).toEqual([MISSING, MISSING, MISSING, MISSING]);
    expect(dataNumber(NaN)).toBeNull();
  });

  it('significant digits, with an exponent only outside 0.001 ≤ |x| < 1e6', () => {
    expect(formatNumber(3991.86795711963)).toBe('3992');
    expect(formatNumber(-2.98e-9, 3)).toBe('-2.98e-9');
    expect(formatNumber(0.0012346)).toBe('0.001235');
    expect(formatSigned(0.5, 3)).toBe('+0.5');
    expect(formatPercent(0.1234)).toBe('12.3%');
    expect(dataNumber(1.23456789, 7)).toBe(1.234568);
  });

  it('a change below single-precision round-off of its size reads 0 (FLT_EPSILON = 2^-23 ≈ 1.19e-7, IEEE 754)', () => {
    // a drift of -2.98e-9 per 1000 years of a mean near 2 °C is round-off, not a drift
    expect(formatChange(-2.98e-9, 1.9)).toBe('0');
    expect(formatChange(-2.98e-3, 1.9, 3)).toBe('-0.00298');
    // one float32 step of 2 (2^-22 ≈ 2.4e-7) still counts as round-off; a millionth and more does not
    expect(formatChange(2 * 2 ** -23, 2)).toBe('0');
    expect(formatChange(3e-6, 2)).toBe('3.000e-6');
    expect(formatChange(NaN, 2)).toBe(MISSING);
    // with no size to measure against, the plain format
    expect(formatChange(-2.98e-9, 0, 3)).toBe('-2.98e-9');
  });
});

describe('JSON keys', () => {
  it('snake_case out, camelCase back, for field names', () => {
    expect(['thresholdPercentPerKyr', 'xInf', 't90', 'yearsTo90', 'model_mean'].map(snakeKey)).toEqual(['threshold_percent_per_kyr', 'x_inf', 't90', 'years_to_90', 'model_mean']);
    expect(['threshold_percent_per_kyr', 'x_inf', 't90', 'years_to_90'].map(camelKey)).toEqual(['thresholdPercentPerKyr', 'xInf', 't90', 'yearsTo90']);
    const tree = { fitNote: 'x', tracks: [{ inventoryUnits: 'mol', drift: { perKyr: 1 } }], skill: [{ model_mean: 1 }] };
    expect(camelKeys(snakeKeys(tree), new Set(['skill']))).toEqual(tree);
    expect(jsonText({ a: NaN })).toBe('{"a":null}\n');
  });
});
