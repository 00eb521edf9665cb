// Opening a recipe in browser mode (view.open) must not tell whether a file outside the allowed folders exists (issue 16,
// item 11): a probe for /etc/shadow and for a made-up name get the same refusal, and neither says "no such file".
// Common practice for confined file access (OWASP "Path Traversal": check confinement before touching the disk).
import { mkdirSync, mkdtempSync, realpathSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { viewsServices } from '../../../app/services/views.js';
import type { ServiceContext } from '../../../app/services/types.js';
import { PathGuard } from '../../../main/path-guard.js';

const top = realpathSync(mkdtempSync(join(tmpdir(), 'sw-validate-')));
const allowed = join(top, 'data');
mkdirSync(allowed);
mkdirSync(join(top, 'private'));
writeFileSync(join(top, 'private', 'exists.nc'), 'CDF');
writeFileSync(join(allowed, 'inside.nc'), 'CDF');

const guard = new PathGuard([allowed], top);
const ctx: ServiceContext = { resolvePath: (p) => guard.resolve(p), roots: guard.roots, cacheDir: tmpdir(), progress: () => undefined, signal: new AbortController().signal };
const open = viewsServices.find((e) => e.name === 'view.open')!;

type Answer = { ok: boolean; message?: string; path?: string | null };
/** Open a recipe whose reference is `file`; the refusal as {ok: false, message, path}. */
const answerFor = async (file: string): Promise<Answer> => {
  const path = join(allowed, "probe.json");
  writeFileSync(path, JSON.stringify({ reference: { label: 'ref', file, variables: { T: 'T' } }, runs: [{ label: 'run', file: join(allowed, 'inside.nc'), variables: { T: 'T' } }] }));
  try {
    await open.run({ recipe: path }, ctx);
    return { ok: true };
  } catch (e) {
    const err = e as { message: string; subject?: { path?: string } };
    return { ok: false, message: err.message, path: err.subject?.path ?? null };
  }
};

describe('opening a recipe that names files outside the allowed folders', () => {
  it('answers the same for an existing and a missing file outside', async () => {
    const existing = await answerFor(join(top, 'private', 'exists.nc'));
    const missing = await answerFor(join(top, 'private', 'missing.nc'));
    expect(existing.ok).toBe(false);
    expect(missing.ok).toBe(false);
    expect(existing.path).toBe('reference.file');
    expect(missing.path).toBe('reference.file');
    expect(existing.message!.replace('exists.nc', 'X')).toBe(missing.message!.replace('missing.nc', 'X'));
    expect(missing.message).not.toMatch(/no such file/);
  });
  it('still says "no such file" inside the allowed folders', async () => {
    const missing = await answerFor(join(allowed, 'missing.nc'));
    expect(missing.ok).toBe(false);
    expect(missing.message).toMatch(/no such file/);
  });
});
