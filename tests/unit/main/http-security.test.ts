// Browser mode's security rules (issue 5; DESIGN.md section 6). Sources for the rules themselves:
// DNS rebinding defence by checking the Host header (common practice; e.g. the Node.js inspector and the
// Jupyter server do the same), Origin checks per RFC 6454, SameSite/HttpOnly cookies per RFC 6265bis,
// path confinement by canonicalising first (OWASP "Path Traversal"). Each test asserts a refusal that a
// lax server would not give.
import { mkdirSync, mkdtempSync, realpathSync, symlinkSync, writeFileSync } from 'node:fs';
import { networkInterfaces, tmpdir } from 'node:os';
import { connect } from 'node:net';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { StillwaterError } from '../../../app/errors.js';
import { filesServices } from '../../../app/services/files.js';
import { entry, type ServiceEntry } from '../../../app/services/types.js';
import { Dispatcher } from '../../../main/dispatch.js';
import { BIND_ADDRESS, startServer, type RunningServer } from '../../../main/http.js';
import { PathGuard } from '../../../main/path-guard.js';
import { CONTENT_SECURITY_POLICY } from '../../../main/csp.js';
import { decodeWire } from '../../../contract/wire.js';
import { raw } from './helpers.js';

const echo: ServiceEntry[] = [
  entry({
    name: 'test.echo',
    summary: 'echo',
    input: z.object({ n: z.number().int().min(1).max(1000) }),
    async run(input) {
      const a = new Float32Array(input.n).map((_, i) => i / 2);
      a[0] = NaN;
      return { values: a, missing: NaN, label: 'ok' };
    },
  }),
  entry({
    name: 'test.read',
    summary: 'resolve a path',
    input: z.object({ path: z.string() }),
    async run(input, ctx) {
      return { resolved: ctx.resolvePath(input.path) };
    },
  }),
  entry({
    name: 'test.slow',
    summary: 'slow work',
    heavy: true,
    input: z.object({}),
    async run(_input, ctx) {
      // a few steps of progress, then work that goes on until it is cancelled
      for (const f of [0.1, 0.3, 0.5]) {
        ctx.progress(f, `step ${f}`);
        await new Promise((r) => setImmediate(r));
      }
      if (!ctx.signal.aborted) await new Promise((r) => ctx.signal.addEventListener('abort', r, { once: true }));
      throw new StillwaterError('E_CANCELLED', 'stopped');
    },
  }),
];

let top: string;
let allowed: string;
let server: RunningServer;
let port: number;
let token: string;

beforeAll(async () => {
  top = realpathSync(mkdtempSync(join(tmpdir(), 'sw-http-')));
  allowed = join(top, 'data');
  mkdirSync(join(allowed, 'sub'), { recursive: true });
  writeFileSync(join(allowed, 'sub', 'a.nc'), 'CDF');
  mkdirSync(join(top, 'private'));
  writeFileSync(join(top, 'private', 'secret.txt'), 'secret');
  symlinkSync(join(top, 'private'), join(allowed, 'escape'));
  // a project folder with a built page and a file beside it that must not be served
  mkdirSync(join(top, 'project', 'dist', 'renderer'), { recursive: true });
  writeFileSync(join(top, 'project', 'dist', 'renderer', 'index.html'), '<!doctype html><title>t</title>');
  writeFileSync(join(top, 'project', 'package.json'), '{"name":"secret-package"}');
  const dispatcher = new Dispatcher({ table: [...filesServices, ...echo], guard: new PathGuard([allowed], top), cacheDir: join(top, 'cache') });
  server = await startServer({ dispatcher, root: join(top, 'project'), startRecipe: join(allowed, 'recipe.json') });
  port = server.port;
  token = server.token;
});

afterAll(async () => {
  await server?.close();
});

const api = (name: string, input: unknown, headers: Record<string, string> = {}, extra: { host?: string } = {}) =>
  raw(port, {
    method: 'POST',
    path: `/api/${name}`,
    headers: { 'content-type': 'application/json', 'x-stillwater-token': token, ...headers },
    body: JSON.stringify({ input }),
    ...extra,
  });

describe('binding and the address', () => {
  it('listens on 127.0.0.1 only', () => {
    const a = server.server.address();
    expect(typeof a === 'object' && a ? a.address : '').toBe('127.0.0.1');
    expect(BIND_ADDRESS).toBe('127.0.0.1');
  });
  it('cannot be reached through another address of this machine', async () => {
    // 127.0.0.2 reaches this machine on every Linux (all of 127.0.0.0/8 is loopback) but is not 127.0.0.1;
    // an external interface, where there is one, is tried too
    const external = Object.values(networkInterfaces())
      .flat()
      .filter((i) => i && i.family === 'IPv4' && !i.internal)
      .map((i) => i!.address);
    const reaches = (host: string): Promise<boolean> =>
      new Promise<boolean>((resolve) => {
        const s = connect({ host, port }, () => {
          s.destroy();
          resolve(true);
        });
        s.on('error', () => resolve(false));
      });
    for (const host of ['127.0.0.2', ...external]) expect(await reaches(host), host).toBe(false);
    // and the same check does reach the address we bind
    expect(await reaches(BIND_ADDRESS)).toBe(true);
  });
  it('prints an address that carries a long random token', () => {
    expect(server.url).toBe(`http://127.0.0.1:${port}/?token=${token}`);
    expect(token.length).toBeGreaterThanOrEqual(32);
  });
});

describe('the token', () => {
  it('refuses the page, the services and the progress stream without it (401)', async () => {
    expect((await raw(port, { path: '/' })).status).toBe(401);
    expect((await raw(port, { path: '/index.html' })).status).toBe(401);
    expect((await raw(port, { path: '/events' })).status).toBe(401);
    const r = await raw(port, { method: 'POST', path: '/api/files.roots', headers: { 'content-type': 'application/json' }, body: '{}' });
    expect(r.status).toBe(401);
    expect(r.body.toString()).toMatch(/token/);
  });
  it('refuses a wrong token of the same length and a prefix of the right one', async () => {
    const wrong = token.slice(0, -1) + (token.endsWith('A') ? 'B' : 'A');
    expect((await raw(port, { path: `/?token=${wrong}` })).status).toBe(401);
    expect((await api('files.roots', {}, { 'x-stillwater-token': token.slice(0, 10) })).status).toBe(401);
  });
  it('accepts it in the address once and then keeps it in an HttpOnly SameSite=Strict cookie', async () => {
    const first = await raw(port, { path: `/?token=${token}` });
    expect(first.status).toBe(200);
    const cookie = String(first.headers['set-cookie']);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Strict/);
    const pair = cookie.split(';')[0];
    const again = await raw(port, { path: '/index.html', headers: { cookie: pair } });
    expect(again.status).toBe(200);
    expect(again.body.toString()).toContain('<title>t</title>');
  });
  it('sends the Content-Security-Policy with the page', async () => {
    const r = await raw(port, { path: `/?token=${token}` });
    expect(r.headers['content-security-policy']).toBe(CONTENT_SECURITY_POLICY);
    expect(r.headers['x-content-type-options']).toBe('nosniff');
  });
});

describe('Host and Origin (DNS rebinding, cross-site pages)', () => {
  it('refuses a foreign Host even with the right token', async () => {
    const r = await raw(port, { path: `/?token=${token}`, host: `attacker.example:${port}` });
    expect(r.status).toBe(403);
    expect((await api('files.roots', {}, {}, { host: 'attacker.example' })).status).toBe(403);
    expect((await api('files.roots', {}, {}, { host: `127.0.0.1:${port + 1}` })).status).toBe(403);
  });
  it('accepts localhost on our port as Host', async () => {
    expect((await api('files.roots', {}, {}, { host: `localhost:${port}` })).status).toBe(200);
  });
  it('refuses a foreign Origin and a cross-site fetch', async () => {
    expect((await api('files.roots', {}, { origin: 'http://attacker.example' })).status).toBe(403);
    expect((await api('files.roots', {}, { origin: `http://127.0.0.1:${port + 1}` })).status).toBe(403);
    expect((await api('files.roots', {}, { origin: 'null' })).status).toBe(403);
    expect((await api('files.roots', {}, { 'sec-fetch-site': 'cross-site' })).status).toBe(403);
    // a page on another port of 127.0.0.1 is "same-site" and would carry the SameSite cookie
    expect((await raw(port, { path: '/start-recipe', headers: { 'x-stillwater-token': token, 'sec-fetch-site': 'same-site' } })).status).toBe(403);
    expect((await raw(port, { path: '/start-recipe', headers: { 'x-stillwater-token': token, 'sec-fetch-site': 'same-origin' } })).status).toBe(200);
    expect((await api('files.roots', {}, { origin: `http://127.0.0.1:${port}` })).status).toBe(200);
  });
  it('takes services only as POST with a JSON body (no form or image tag can call them)', async () => {
    expect((await raw(port, { path: `/api/files.roots?token=${token}` })).status).toBe(405);
    const form = await raw(port, { method: 'POST', path: '/api/files.roots', headers: { 'x-stillwater-token': token, 'content-type': 'application/x-www-form-urlencoded' }, body: 'input=1' });
    expect(form.status).toBe(415);
  });
});

describe('files outside the allowed folders', () => {
  it('lists an allowed folder', async () => {
    const r = await api('files.list', { folder: allowed });
    expect(r.status).toBe(200);
    const listing = decodeWire(r.body) as { entries: { name: string; type: string }[] };
    expect(listing.entries.map((e) => e.name)).toContain('sub');
  });
  it('refuses a folder outside, naming it (E_FILE)', async () => {
    const r = await api('files.list', { folder: join(top, 'private') });
    expect(r.headers['content-type']).toMatch(/^application\/json/);
    const body = JSON.parse(r.body.toString()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('E_FILE');
    expect(body.error.message).toContain(join(top, 'private'));
  });
  it("refuses '../' traversal in a service's path input", async () => {
    for (const p of [`${allowed}/../private/secret.txt`, `${allowed}/sub/../../private`, '../private/secret.txt']) {
      const r = await api('test.read', { path: p });
      expect((JSON.parse(r.body.toString()) as { error: { code: string } }).error.code).toBe('E_FILE');
    }
  });
  it('refuses a symbolic link that leads out of an allowed folder', async () => {
    const r = await api('test.read', { path: join(allowed, 'escape', 'secret.txt') });
    expect((JSON.parse(r.body.toString()) as { error: { code: string } }).error.code).toBe('E_FILE');
  });
  it('serves no file beside the built page, whatever the URL spelling', async () => {
    for (const p of ['/../package.json', '/%2e%2e/package.json', '/..%2fpackage.json', '/%2e%2e%2f%2e%2e%2fpackage.json', '/vendor/../../package.json']) {
      const r = await raw(port, { path: p, headers: { 'x-stillwater-token': token } });
      expect(r.status, p).toBe(404);
      expect(r.body.toString()).not.toContain('secret-package');
    }
  });
});

describe('calls', () => {
  it('validates the input against the schema and names the field', async () => {
    const r = await api('test.echo', { n: 'three' });
    expect(r.status).toBe(200); // a refusal is an answer, not a failed request (no console noise in the page)
    const body = JSON.parse(r.body.toString()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('E_INPUT');
    expect(body.error.message).toMatch(/^test\.echo: input\.n: /);
  });
  it('answers 404 for a service that does not exist', async () => {
    expect((await api('no.such', {})).status).toBe(404);
  });
  it('answers 400, not a fault, for a service name that is not valid percent-encoding', async () => {
    const r = await api('test.%E0%A4%A', { n: 1 });
    expect(r.status).toBe(400);
    expect((JSON.parse(r.body.toString()) as { error: { code: string } }).error.code).toBe('E_INPUT');
  });
  it('keeps typed arrays and NaN on the wire', async () => {
    const r = await api('test.echo', { n: 5 });
    const v = decodeWire(r.body) as { values: Float32Array; missing: number; label: string };
    expect(v.values).toBeInstanceOf(Float32Array);
    expect(Number.isNaN(v.values[0])).toBe(true);
    expect(Array.from(v.values.slice(1))).toEqual([0.5, 1, 1.5, 2]);
    expect(Number.isNaN(v.missing)).toBe(true);
    expect(v.label).toBe('ok');
  });
  it('tells the page which recipe to open first', async () => {
    const r = await raw(port, { path: '/start-recipe', headers: { 'x-stillwater-token': token } });
    expect(JSON.parse(r.body.toString())).toEqual({ recipe: join(allowed, 'recipe.json') });
  });
  it('streams progress of a heavy job and cancels it', async () => {
    const events: { jobId: string; state?: string; fraction: number }[] = [];
    const waiting: { test: (e: (typeof events)[number]) => boolean; resolve: () => void }[] = [];
    /** settles once an event passing `test` has come (or already had) */
    const eventWhere = (test: (e: (typeof events)[number]) => boolean): Promise<void> =>
      events.some(test) ? Promise.resolve() : new Promise((resolve) => waiting.push({ test, resolve }));
    let connected!: () => void;
    const open = new Promise<void>((r) => (connected = r));
    const controller = new AbortController();
    const stream = fetch(`http://127.0.0.1:${port}/events`, { headers: { 'x-stillwater-token': token }, signal: controller.signal }).then(async (res) => {
      const reader = res.body!.getReader();
      const dec = new TextDecoder();
      let buf = '';
      for (;;) {
        const { value, done } = await reader.read();
        if (done) break;
        buf += dec.decode(value);
        let i: number;
        while ((i = buf.indexOf('\n\n')) >= 0) {
          const block = buf.slice(0, i);
          buf = buf.slice(i + 2);
          if (block.startsWith(':')) connected(); // the server's greeting: we are listening
          if (!block.startsWith('data: ')) continue;
          const e = JSON.parse(block.slice(6)) as (typeof events)[number];
          events.push(e);
          for (const w of waiting.filter((x) => x.test(e))) w.resolve();
        }
      }
    }).catch(() => undefined);
    await open;
    const mine = (state: string) => (e: (typeof events)[number]) => e.jobId === 'job-t1' && e.state === state;
    const call = raw(port, { method: 'POST', path: '/api/test.slow', headers: { 'content-type': 'application/json', 'x-stillwater-token': token }, body: JSON.stringify({ input: {}, jobId: 'job-t1' }) });
    await eventWhere((e) => mine('running')(e) && e.fraction >= 0.5);
    const c = await raw(port, { method: 'POST', path: '/cancel', headers: { 'content-type': 'application/json', 'x-stillwater-token': token }, body: JSON.stringify({ jobId: 'job-t1' }) });
    expect(JSON.parse(c.body.toString())).toEqual({ cancelled: true });
    const r = await call;
    expect((JSON.parse(r.body.toString()) as { error: { code: string } }).error.code).toBe('E_CANCELLED');
    await eventWhere(mine('cancelled'));
    controller.abort();
    await stream;
    const seen = events.filter((e) => e.jobId === 'job-t1');
    expect(seen.filter((e) => e.state === 'running').length).toBeGreaterThan(2);
    expect(seen[seen.length - 1].state).toBe('cancelled');
  });
});
