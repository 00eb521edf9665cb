// recipe.validate in browser mode must not tell whether a file outside the allowed folders exists (issue 16,
// item 11): a probe for /etc/shadow and for a made-up name get the same refusal, and neither says "no such file".
// Common practice for confined file access (OWASP "Path Traversal": check confinement before touching the disk).
import { mkdirSync, mkdtempSync, realpathSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { compareServices } from '../../../app/services/compare.js';
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
const validate = compareServices.find((e) => e.name === 'recipe.validate')!;

type Answer = { ok: boolean; message?: string; path?: string | null };
const answerFor = (file: string) =>
  validate.run({ recipe: { reference: { label: 'ref', file, variables: { T: 'T' } }, runs: [{ label: 'run', file: join(allowed, 'inside.nc'), variables: { T: 'T' } }] }, baseDir: allowed }, ctx) as Promise<Answer>;

describe('recipe.validate and files outside the allowed folders', () => {
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
