/** Recipe paths as people read them: runs[1].variables.O2.file */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const p of path) {
    if (typeof p === 'number') out += `[${p}]`;
    else {
      const s = String(p);
      out += /^[A-Za-z_$][\w$]*$/.test(s) ? (out ? '.' : '') + s : `[${JSON.stringify(s)}]`;
    }
  }
  return out || 'recipe';
}
