import type { FieldSource } from '../../../app/cf/field-source.js';
import { StillwaterError } from '../../../app/errors.js';
import type { SnapshotHandle, SnapshotOpener } from '../../../app/spinup/series.js';

/** A set of in-memory snapshot files: file name -> variable -> field. Records how many files are open. */
export function memoryOpener(files: Record<string, Record<string, FieldSource>>): SnapshotOpener & { openCount: () => number } {
  let open = 0;
  const opener = async (file: string): Promise<SnapshotHandle> => {
    const vars = files[file];
    if (!vars) throw new StillwaterError('E_FILE', `${file}: no such file.`, { file });
    open++;
    return {
      async field(variable: string) {
        const f = vars[variable];
        if (!f) throw new StillwaterError('E_VARIABLE', `${file}: there is no variable '${variable}'.`, { file, variable });
        return f;
      },
      has: (variable: string) => variable in vars,
      async close() {
        open--;
      },
    };
  };
  return Object.assign(opener, { openCount: () => open });
}
