import { describe, expect, it } from 'vitest';
import { parseStations, splitCsvLine } from '../../../app/points/stations-csv.js';

describe('station CSV', () => {
  it('reads stations with a units comment line, seafloor depths, ids and times', () => {
    const s = parseStations(
      ['# units: mmol m-2 d-1', 'id,longitude,latitude,depth,value,time', 'A1,-25.5,10,seafloor,0.31,2019-04-02', '', '"B,2",200,-40.25,150,1.5e-2,'].join('\n'),
      'st.csv',
    );
    expect(s.n).toBe(2);
    expect(s.units).toBe('mmol m-2 d-1');
    expect(s.id).toEqual(['A1', 'B,2']);
    expect(Array.from(s.seafloor)).toEqual([1, 0]);
    expect(Number.isNaN(s.depth[0])).toBe(true);
    expect(s.depth[1]).toBe(150);
    expect(s.value[1]).toBeCloseTo(0.015, 12);
    expect(Array.from(s.line)).toEqual([3, 5]);
    expect(s.time).toEqual(['2019-04-02', '']);
  });
  it('takes units from a units column, columns in any order, short names', () => {
    const s = parseStations('value,depth,lat,lon,units\n2,10,5,6,umol kg-1\n3,20,5,6,umol kg-1\n', 'u.csv');
    expect(s.units).toBe('umol kg-1');
    expect(Array.from(s.lon)).toEqual([6, 6]);
    expect(s.id).toEqual(['1', '2']);
  });
  it('splits quoted fields with doubled quotes (RFC 4180)', () => {
    expect(splitCsvLine('a,"b ""c"", d",e')).toEqual(['a', 'b "c", d', 'e']);
  });
});

describe('malformed station files: one sentence with the line number', () => {
  const head = 'longitude,latitude,depth,value\n';
  it('an empty file', () => {
    expect(() => parseStations('', 'e.csv')).toThrow(/^e\.csv: the file is empty/);
    expect(() => parseStations('# units: m\n\n', 'e.csv')).toThrow(/the file is empty/);
  });
  it('a header without stations', () => {
    expect(() => parseStations(head, 'h.csv')).toThrow(/h\.csv: the file has a header but no stations/);
  });
  it('a header lacking a column', () => {
    expect(() => parseStations('lon,lat,value\n1,2,3\n', 'm.csv')).toThrow(/m\.csv line 1: the header lacks the column depth/);
  });
  it('a row with too few fields', () => {
    expect(() => parseStations(head + '1,2,3,4\n1,2,3\n', 'f.csv')).toThrow(/f\.csv line 3: expected 4 fields as in the header, found 3/);
  });
  it('a value that is not a number', () => {
    expect(() => parseStations(head + '1,2,3,abc\n', 'n.csv')).toThrow(/n\.csv line 2: value 'abc' is not a number/);
  });
  it('coordinates out of range and negative or unreadable depths', () => {
    expect(() => parseStations(head + '1,95,3,4\n', 'r.csv')).toThrow(/line 2: latitude 95 lies outside/);
    expect(() => parseStations(head + '1,5,-3,4\n', 'r.csv')).toThrow(/line 2: depth -3 is negative/);
    expect(() => parseStations(head + '1,5,deep,4\n', 'r.csv')).toThrow(/line 2: depth 'deep' is neither metres nor the word seafloor/);
  });
  it('mixed units in the units column', () => {
    expect(() => parseStations('lon,lat,depth,value,units\n1,2,3,4,m\n1,2,3,4,km\n', 'x.csv')).toThrow(/x\.csv line 3: units 'km' differ from 'm'/);
  });
});
