/**
 * `stillwater serve`: the workbench in browser mode, explicitly.
 * `stillwater start` (npm start): an Electron window when the binary and a display are there, otherwise browser
 * mode, saying so; both open the demo recipe, generating the demo scenario first when it is missing.
 */
import { spawn } from 'node:child_process';
import { availableParallelism } from 'node:os';
import { existsSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { ensureDemo } from '../../sample-data/generator/generate.js';
import { serviceTable } from '../../app/service.js';
import { defaultCacheDir } from '../../app/regrid/weight-cache.js';
import { StillwaterError } from '../../app/errors.js';
import { keepParsingOffThisThread } from '../../app/io/parsing-thread.js';
import { allowOnly, optional, optionalNumber, parseArgs, type ParsedArgs } from '../args.js';
import { err, out, type Command } from '../command.js';
import { Dispatcher } from '../dispatch.js';
import { BIND_ADDRESS, startServer } from '../http.js';
import { PathGuard } from '../path-guard.js';
import { browserOpener, electronBinary, hasDisplay } from '../shell-detect.js';
import { projectRoot } from '../static-files.js';
import { WorkerPool } from '../workers.js';

interface ShellSettings {
  port: number;
  roots: string[];
  recipe: string | null;
}

function settings(args: ParsedArgs, root: string, defaultRecipe: string | null): ShellSettings {
  const port = optionalNumber(args, 'port') ?? 0;
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new StillwaterError('E_INPUT', `Option --port must be a whole number from 0 to 65535, got '${port}'.`);
  const given = args.options.get('root');
  const roots = given && given.length ? given.map((r) => resolve(r)) : [join(root, 'sample-data'), process.cwd()];
  for (const r of roots) if (!existsSync(r)) throw new StillwaterError('E_FILE', `--root ${r}: no such folder.`, { file: r });
  const recipeArg = optional(args, 'recipe');
  const recipe = recipeArg ? resolve(recipeArg) : defaultRecipe;
  if (recipe && !existsSync(recipe)) throw new StillwaterError('E_FILE', `--recipe ${recipe}: no such file.`, { file: recipe });
  return { port, roots, recipe };
}

/** Serve until the process is asked to stop; the URL (with its token) goes to stdout. */
async function serveBrowser(s: ShellSettings, root: string, openBrowser: boolean, who: string): Promise<number> {
  const guard = new PathGuard(s.roots);
  // a recipe named at start may be read, and the data beside it (its paths are relative to its folder)
  if (s.recipe) guard.grant(dirname(s.recipe));
  // every file from outside is parsed on the pool's threads: this one only serves the page and the calls
  keepParsingOffThisThread('the browser-mode server');
  const pool = new WorkerPool();
  const dispatcher = new Dispatcher({ table: serviceTable, guard, cacheDir: defaultCacheDir(), heavy: pool.runner });
  const server = await startServer({ dispatcher, port: s.port, startRecipe: s.recipe, root });
  // Ctrl+C is handled before the address is printed: whoever reads the address may stop us at once.
  // The pool's threads are terminated too: one stuck in a library loop on a damaged file would keep us alive.
  const stopped = new Promise<number>((done) => {
    const stop = (): void => {
      void Promise.all([server.close(), pool.close()]).then(() => done(0));
    };
    process.once('SIGINT', stop);
    process.once('SIGTERM', stop);
  });
  if (!existsSync(join(root, 'dist', 'renderer', 'index.html'))) err(`${who}: dist/renderer/index.html is missing; run npm run build.`);
  // the address carries the token: printed once, on stdout, for whoever started us
  err(`${who}: serving on ${BIND_ADDRESS}:${server.port}; the address to open (with its token) is on stdout.`);
  err(`${who}: files readable under ${guard.roots.join(', ')}; press Ctrl+C to stop.`);
  if (pool.size < availableParallelism()) err(`${who}: ${pool.size} worker thread${pool.size === 1 ? '' : 's'} for ${availableParallelism()} cores, as many as fit under this process's address-space limit.`);
  out(server.url);
  if (openBrowser) {
    const opener = browserOpener();
    if (opener) {
      try {
        const child = spawn(opener.cmd, [...opener.args, server.url], { stdio: 'ignore', detached: true });
        child.on('error', () => err(`${who}: could not open a browser; open the address above yourself.`));
        child.unref();
      } catch {
        err(`${who}: could not open a browser; open the address above yourself.`);
      }
    } else {
      err(`${who}: no system browser to open here; open the address above yourself.`);
    }
  }
  return stopped;
}

/** Electron window; resolves with its exit code, or with undefined when it failed to come up at all. */
function runElectron(bin: string, root: string, s: ShellSettings): Promise<number | undefined> {
  const args = [join(root, 'dist', 'electron-main.cjs'), ...s.roots.map((r) => `--stillwater-root=${r}`)];
  if (s.recipe) args.push(`--stillwater-recipe=${s.recipe}`);
  const started = Date.now();
  return new Promise((done) => {
    const child = spawn(bin, args, { stdio: ['ignore', 'inherit', 'inherit'], env: { ...process.env, ELECTRON_RUN_AS_NODE: undefined } });
    child.on('error', () => done(undefined));
    child.on('exit', (code) => done(code !== 0 && Date.now() - started < 5000 ? undefined : (code ?? 0)));
  });
}

async function demoRecipe(root: string): Promise<string | null> {
  try {
    const paths = await ensureDemo(join(root, 'sample-data'), (m) => err(`demo: ${m}`));
    return existsSync(paths.recipe) ? paths.recipe : null;
  } catch (e) {
    err(`start: the demo scenario could not be prepared (${e instanceof Error ? e.message : String(e)}); starting without it.`);
    return null;
  }
}

export const serveCommand: Command = {
  name: 'serve',
  summary: 'open the workbench in a web browser (on 127.0.0.1 only, with a per-start token)',
  usage: [
    'stillwater serve [--port P] [--root DIR ...] [--recipe R] [--open]',
    '',
    'Serves the workbench on http://127.0.0.1:P (a free port by default) and prints the address with its',
    'token on stdout. Only the folders named by --root may be read (default: sample-data/ and the working',
    'directory). --recipe opens that recipe first. --open also opens the system browser.',
  ].join('\n'),
  async run(argv) {
    const args = parseArgs(argv, ['open']);
    allowOnly(args, 'serve', ['port', 'root', 'recipe', 'open']);
    const root = projectRoot();
    return serveBrowser(settings(args, root, null), root, args.switches.has('open'), 'serve');
  },
};

export const startCommand: Command = {
  name: 'start',
  summary: 'open the workbench on the demo recipe (Electron window, or browser mode where there is none)',
  usage: [
    'stillwater start [--port P] [--root DIR ...] [--recipe R] [--browser]',
    '',
    'Opens an Electron window when the Electron binary and a display are present; otherwise serves browser',
    'mode like `stillwater serve` and opens the system browser when there is one. --browser forces browser mode.',
    'The demo scenario is generated first when it is missing; --recipe opens another recipe instead.',
  ].join('\n'),
  async run(argv) {
    const args = parseArgs(argv, ['browser']);
    allowOnly(args, 'start', ['port', 'root', 'recipe', 'browser']);
    const root = projectRoot();
    const recipe = optional(args, 'recipe') ? null : await demoRecipe(root);
    const s = settings(args, root, recipe);
    const bin = electronBinary(root);
    if (!args.switches.has('browser') && bin && hasDisplay()) {
      err('start: opening the Electron window.');
      const code = await runElectron(bin, root, s);
      if (code !== undefined) return code;
      err('start: the Electron window did not come up; using browser mode instead.');
    } else {
      const why = args.switches.has('browser') ? 'asked for' : !bin ? 'the Electron binary is not installed' : 'there is no display';
      err(`start: browser mode (${why}).`);
    }
    return serveBrowser(s, root, true, 'start');
  },
};
