import { StillwaterError } from '../errors.js';
import type { SnapshotSpec } from './types.js';

function where(s: SnapshotSpec, i: number): string {
  return `${s.origin ?? `snapshot ${i + 1}`} (${s.file})`;
}

/**
 * A spin-up series must have at least two snapshots, each with a model year, in strictly increasing
 * order. Out-of-order lists are refused rather than sorted: a swapped year is more often a typo than intent.
 */
export function checkSnapshotList(snapshots: SnapshotSpec[], listName: string): void {
  if (snapshots.length === 0) {
    throw new StillwaterError('E_INPUT', `${listName}: a spin-up needs at least two snapshots; none are listed.`, { path: listName });
  }
  snapshots.forEach((s, i) => {
    if (typeof s.year !== 'number' || !Number.isFinite(s.year)) {
      throw new StillwaterError('E_INPUT', `${where(s, i)}: the snapshot has no model year; give one, or use a file with a CF time axis.`, {
        file: s.file,
        path: s.origin,
      });
    }
  });
  if (snapshots.length === 1) {
    const s = snapshots[0];
    throw new StillwaterError('E_INPUT', `${listName}: a spin-up needs at least two snapshots; only one is listed (${s.file}, model year ${s.year}).`, {
      file: s.file,
      path: listName,
    });
  }
  for (let i = 1; i < snapshots.length; i++) {
    const a = snapshots[i - 1];
    const b = snapshots[i];
    if (!(b.year > a.year)) {
      const what = b.year === a.year ? 'repeats' : 'comes before';
      throw new StillwaterError(
        'E_INPUT',
        `${where(b, i)}: model year ${b.year} ${what} model year ${a.year} of the snapshot listed before it (${a.file}); list snapshots in increasing model year.`,
        { file: b.file, path: b.origin },
      );
    }
  }
}

/**
 * Snapshots given on the command line: "a.nc:100,b.nc:200" (file:model year). A file may contain ':'
 * (Windows drive letters), so the year is what follows the last ':'.
 */
export function parseSnapshotOption(text: string): SnapshotSpec[] {
  return text
    .split(',')
    .map((p) => p.trim())
    .filter((p) => p.length > 0)
    .map((p, i) => {
      const colon = p.lastIndexOf(':');
      const file = colon > 0 ? p.slice(0, colon) : p;
      const yearText = colon > 0 ? p.slice(colon + 1) : '';
      const year = yearText.trim() === '' ? NaN : Number(yearText);
      if (yearText !== '' && !Number.isFinite(year)) {
        throw new StillwaterError('E_INPUT', `--snapshots: '${p}' should be file:model-year, and '${yearText}' is not a number.`, { file });
      }
      return { file, year, origin: `--snapshots item ${i + 1}` };
    });
}
