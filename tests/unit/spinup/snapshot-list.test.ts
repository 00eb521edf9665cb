import { describe, expect, it } from 'vitest';
import { checkSnapshotList, parseSnapshotOption } from '../../../app/spinup/snapshot-list.js';

describe('snapshot lists', () => {
  it('reads file:model-year items; the year follows the last colon, so drive letters survive', () => {
    expect(parseSnapshotOption('a.nc:100, b.nc:250.5,C:\\runs\\c.nc:400').map(({ file, year }) => ({ file, year }))).toEqual([
      { file: 'a.nc', year: 100 },
      { file: 'b.nc', year: 250.5 },
      { file: 'C:\\runs\\c.nc', year: 400 },
    ]);
  });

  it('leaves the year out for a file given alone (its time axis decides) and refuses a year that is no number', () => {
    expect(Number.isNaN(parseSnapshotOption('series.nc')[0].year)).toBe(true);
    expect(() => parseSnapshotOption('a.nc:ten')).toThrow(/'a\.nc:ten' should be file:model-year, and 'ten' is not a number/);
  });

  it('refuses a repeated model year, naming both files', () => {
    expect(() => checkSnapshotList([{ file: 'a.nc', year: 100 }, { file: 'b.nc', year: 100 }], 'runs[0].snapshots')).toThrow(
      /snapshot 2 \(b\.nc\): model year 100 repeats model year 100 of the snapshot listed before it \(a\.nc\)/,
    );
  });

  it('refuses an empty list', () => {
    expect(() => checkSnapshotList([], 'runs[0].snapshots')).toThrow(/runs\[0\]\.snapshots: a spin-up needs at least two snapshots; none are listed/);
  });
});
