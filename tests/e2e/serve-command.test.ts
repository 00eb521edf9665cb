// The `serve` and `start` commands as a person runs them (DESIGN.md section 3: results on stdout, messages on
// stderr, exit 2 on bad input with one sentence). Here there is no Electron binary, so `start` must fall
// back to browser mode and say why.
import { spawn, spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { PROJECT, prepare } from './harness.js';

const CLI = join(PROJECT, 'dist', 'cli.mjs');

beforeAll(async () => {
  await prepare();
});

function runUntilUrl(
  args: string[],
  env: NodeJS.ProcessEnv,
): Promise<{ url: string; stderr: () => string; stderrMatching: (re: RegExp) => Promise<void>; stop: () => Promise<number | null> }> {
  const child = spawn(process.execPath, [CLI, ...args], { cwd: PROJECT, env, stdio: ['ignore', 'pipe', 'pipe'] });
  let err = '';
  child.stderr.on('data', (b: Buffer) => (err += b.toString()));
  /** settles once stderr says `re` (it may already have) */
  const stderrMatching = (re: RegExp): Promise<void> =>
    new Promise((resolveMatch) => {
      const check = (): void => {
        if (!re.test(err)) return;
        child.stderr.off('data', check);
        resolveMatch();
      };
      child.stderr.on('data', check);
      check();
    });
  return new Promise((resolve, reject) => {
    let out = '';
    const timer = setTimeout(() => reject(new Error(`no address in 60 s: ${err}`)), 60_000);
    child.stdout.on('data', (b: Buffer) => {
      out += b.toString();
      const line = out.split('\n').find((l) => l.startsWith('http://'));
      if (line) {
        clearTimeout(timer);
        resolve({
          url: line.trim(),
          stderr: () => err,
          stderrMatching,
          stop: () =>
            new Promise((done) => {
              child.once('exit', (code) => done(code));
              child.kill('SIGINT');
            }),
        });
      }
    });
    child.on('exit', (code) => reject(new Error(`exited ${code}: ${err}`)));
  });
}

describe('stillwater start and serve', () => {
  it('start falls back to browser mode without the Electron binary, says so, and serves the page', async () => {
    const env = { ...process.env, DISPLAY: '', WAYLAND_DISPLAY: '' };
    const r = await runUntilUrl(['start', '--port', '0'], env);
    await r.stderrMatching(/browser mode/);
    expect(r.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/\?token=[\w-]{32,}$/);
    expect(r.stderr()).toMatch(/browser mode \((the Electron binary is not installed|there is no display)\)/);
    const res = await fetch(r.url);
    expect(res.status).toBe(200);
    expect(await res.text()).toContain('<title>Stillwater</title>');
    const recipe = await fetch(new URL('/start-recipe', r.url), { headers: { cookie: String(res.headers.get('set-cookie')).split(';')[0] } });
    expect(((await recipe.json()) as { recipe: string }).recipe).toBe(join(PROJECT, 'sample-data', 'demo-recipe.json'));
    expect(await r.stop()).toBe(0);
  });

  it('serve prints only the address on stdout and stops cleanly on Ctrl+C', async () => {
    const r = await runUntilUrl(['serve', '--root', join(PROJECT, 'sample-data')], process.env);
    await r.stderrMatching(/files readable/);
    expect(r.stderr()).toMatch(/files readable under .*sample-data/);
    // the address with its token is printed once, on stdout (issue 16, item 11)
    expect(r.stderr()).not.toContain(new URL(r.url).searchParams.get('token')!);
    expect(await r.stop()).toBe(0);
  });

  it('refuses bad options with exit 2 and one sentence', () => {
    const cases: [string[], RegExp][] = [
      [['serve', '--port', 'eighty'], /--port must be a number/],
      [['serve', '--port', '70000'], /--port must be a whole number from 0 to 65535/],
      [['serve', '--root', '/no/such/folder'], /no such folder/],
      [['serve', '--recipe', '/no/such/recipe.json'], /no such file/],
      [['serve', '--colour', 'blue'], /unknown option --colour/],
    ];
    for (const [args, message] of cases) {
      const r = spawnSync(process.execPath, [CLI, ...args], { cwd: PROJECT, encoding: 'utf8' });
      expect(r.status, args.join(' ')).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stdout).toBe('');
    }
  });
});
