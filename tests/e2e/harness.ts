/**
 * End-to-end harness: builds dist/, makes sure the demo scenario exists, starts `stillwater serve` on a free
 * port with sample-data/ as its only root, and drives Debian's Chromium through playwright-core with a fresh
 * profile. Every request URL is recorded (tests assert none leaves 127.0.0.1), console errors and page errors
 * are collected, and screenshots go to tests/e2e/screenshots/ (gitignored) for a person to look at.
 *
 *   const wb = await openWorkbench();           // page loaded with the token
 *   await wb.shot('map');
 *   expect(wb.foreignRequests()).toEqual([]);
 *   expect(wb.consoleErrors).toEqual([]);
 *   await wb.close();
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { ensureDemo } from '../../sample-data/generator/generate.js';

/** The project folder: tests run from it (vitest, and tests/bench/run.mjs which bundles this file elsewhere). */
export const PROJECT = existsSync(join(process.cwd(), 'main', 'cli.ts')) ? process.cwd() : join(__dirname, '..', '..');
export const SAMPLE_DATA = join(PROJECT, 'sample-data');
export const SCREENSHOTS = join(PROJECT, 'tests', 'e2e', 'screenshots');
export const CHROMIUM = '/usr/bin/chromium';
export const CHROMIUM_ARGS = ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run'];

/** Several test files start at once: one build (and demo generation) at a time, no build while dist/ is fresh. */
async function buildAndDemo(): Promise<void> {
  const lock = join(PROJECT, 'dist', '.e2e-build-lock');
  mkdirSync(join(PROJECT, 'dist'), { recursive: true });
  for (let waited = 0; ; waited += 200) {
    try {
      mkdirSync(lock);
      break;
    } catch {
      // a lock older than two minutes belongs to a test process that died
      if (waited > 120_000) rmSync(lock, { recursive: true, force: true });
      await new Promise((r) => setTimeout(r, 200));
    }
  }
  try {
    // the same staleness rule as the `stillwater` bin (main/dist-stale.mjs)
    const b = spawnSync(process.execPath, [join(PROJECT, 'main', 'build.mjs'), '--if-stale'], { cwd: PROJECT, encoding: 'utf8' });
    if (b.status !== 0) throw new Error(`node main/build.mjs failed: ${b.stderr}`);
    await ensureDemo(SAMPLE_DATA);
  } finally {
    rmSync(lock, { recursive: true, force: true });
  }
}

let built: Promise<void> | undefined;
/** Build dist/ (when stale) and the demo scenario, once per test process. */
export function prepare(): Promise<void> {
  built ??= (async () => {
    await buildAndDemo();
  })();
  return built;
}

export interface Served {
  url: string;
  port: number;
  token: string;
  process: ChildProcess;
  /** everything the server wrote to stderr */
  log: string[];
  stop(): Promise<void>;
}

/** Start `stillwater serve` (the built CLI, as `npm run stillwater -- serve` would) and wait for its address. */
export async function startServe(extraArgs: string[] = ['--root', SAMPLE_DATA, '--recipe', join(SAMPLE_DATA, 'demo-recipe.json')]): Promise<Served> {
  const child = spawn(process.execPath, [join(PROJECT, 'dist', 'cli.mjs'), 'serve', '--port', '0', ...extraArgs], { cwd: PROJECT, stdio: ['ignore', 'pipe', 'pipe'] });
  const log: string[] = [];
  child.stderr!.on('data', (b: Buffer) => log.push(b.toString()));
  const url = await new Promise<string>((resolve, reject) => {
    let out = '';
    const timer = setTimeout(() => reject(new Error(`serve printed no address in 30 s; stderr: ${log.join('')}`)), 30_000);
    child.stdout!.on('data', (b: Buffer) => {
      out += b.toString();
      const line = out.split('\n').find((l) => l.startsWith('http://'));
      if (line) {
        clearTimeout(timer);
        resolve(line.trim());
      }
    });
    child.on('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`serve exited with ${code}: ${log.join('')}`));
    });
  });
  const u = new URL(url);
  return {
    url,
    port: Number(u.port),
    token: u.searchParams.get('token') ?? '',
    process: child,
    log,
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
      }),
  };
}

export interface Workbench {
  served: Served;
  context: BrowserContext;
  page: Page;
  /** every URL the browser asked for, in order */
  requests: string[];
  /** console messages of type error, and uncaught page errors */
  consoleErrors: string[];
  /** requests to anything but the server on 127.0.0.1 (data: and blob: URLs are local and allowed) */
  foreignRequests(): string[];
  /** save a screenshot as tests/e2e/screenshots/<name>.png and return its path */
  shot(name: string, opts?: { fullPage?: boolean }): Promise<string>;
  close(): Promise<void>;
}

/** Launch Chromium with a fresh profile, open the workbench address, and wait for the page to load. */
export async function openWorkbench(opts: { serveArgs?: string[]; viewport?: { width: number; height: number }; waitFor?: string } = {}): Promise<Workbench> {
  await prepare();
  const served = await startServe(opts.serveArgs);
  const profile = mkdtempSync(join(tmpdir(), 'sw-chromium-'));
  let context: BrowserContext;
  try {
    context = await chromium.launchPersistentContext(profile, {
      executablePath: CHROMIUM,
      args: CHROMIUM_ARGS,
      headless: true,
      viewport: opts.viewport ?? { width: 1440, height: 900 },
      deviceScaleFactor: 1,
      acceptDownloads: true,
    });
  } catch (e) {
    await served.stop();
    throw e;
  }
  const requests: string[] = [];
  const consoleErrors: string[] = [];
  context.on('request', (r) => requests.push(r.url()));
  const page = context.pages()[0] ?? (await context.newPage());
  page.on('console', (m) => {
    if (m.type() === 'error') consoleErrors.push(`${m.text()} (${m.location().url})`);
  });
  page.on('pageerror', (e) => consoleErrors.push(`page error: ${e.message}`));
  await page.goto(served.url, { waitUntil: 'load', timeout: 120_000 });
  if (opts.waitFor) await page.waitForSelector(opts.waitFor, { timeout: 60_000 });
  mkdirSync(SCREENSHOTS, { recursive: true });
  const origin = `http://127.0.0.1:${served.port}`;
  return {
    served,
    context,
    page,
    requests,
    consoleErrors,
    foreignRequests: () => requests.filter((u) => !(u.startsWith(origin + '/') || u === origin || u.startsWith('data:') || u.startsWith('blob:' + origin))),
    async shot(name, o = {}) {
      const file = join(SCREENSHOTS, `${name}.png`);
      await page.screenshot({ path: file, fullPage: o.fullPage ?? false });
      return file;
    },
    async close() {
      await context.close().catch(() => undefined);
      await served.stop();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** True where the e2e tests can run at all (Debian's Chromium installed). */
export const canRunBrowser = existsSync(CHROMIUM);

/** Call a service through the page's own bridge (renderer/bridge.ts), as the views do. */
export function callInPage<T>(page: Page, name: string, input: unknown): Promise<T> {
  return page.evaluate(
    async ([n, i]) => {
      const b = (globalThis as unknown as { stillwaterBridge: { call(n: string, i: unknown): Promise<unknown> } }).stillwaterBridge;
      return b.call(n, i);
    },
    [name, input] as const,
  ) as Promise<T>;
}

/** The workbench at 1600 × 1000 (serving the demo, or `serveArgs`), once the page says it is ready and `view` (a selector) has drawn. */
export async function readyWorkbench(view: string, timeout: number, serveArgs?: string[]): Promise<{ wb: Workbench; page: Page }> {
  const wb = await openWorkbench({ viewport: { width: 1600, height: 1000 }, serveArgs });
  await wb.page.waitForSelector('body[data-ready="true"]', { timeout });
  await wb.page.waitForSelector(view, { timeout });
  return { wb, page: wb.page };
}
