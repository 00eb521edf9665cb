/**
 * Electron main process (dist/electron-main.cjs). Started by `stillwater start` with
 * --stillwater-root=DIR (repeated) and --stillwater-recipe=FILE.
 */
import { BrowserWindow, app, ipcMain } from 'electron';
import { dirname, join } from 'node:path';
import { keepParsingOffThisThread } from '../app/io/parsing-thread.js';
import { serviceTable } from '../app/service.js';
import { defaultCacheDir } from '../app/regrid/weight-cache.js';
import { IPC } from '../contract/transport.js';
import { Dispatcher } from './dispatch.js';
import { registerIpc } from './ipc.js';
import { PathGuard } from './path-guard.js';
import { projectRoot } from './static-files.js';
import { buildMenu, createWindow, hardenContents, hardenSession, registerAppScheme, serveAppScheme, showOpenDialog } from './window.js';
import { WorkerPool } from './workers.js';

function argValues(name: string): string[] {
  const prefix = `--${name}=`;
  return process.argv.filter((a) => a.startsWith(prefix)).map((a) => a.slice(prefix.length));
}

const root = projectRoot();
const distDir = join(root, 'dist');
const roots = argValues('stillwater-root');
const recipe = argValues('stillwater-recipe')[0] ?? null;

if (!app.requestSingleInstanceLock()) app.quit();
registerAppScheme();
app.on('web-contents-created', (_e, contents) => hardenContents(contents));

let win: BrowserWindow | null = null;

void app.whenReady().then(() => {
  hardenSession();
  serveAppScheme(root);
  const guard = new PathGuard(roots.length ? roots : [join(root, 'sample-data'), process.cwd()]);
  // the recipe named at start may be read, and the data beside it (its paths are relative to its folder)
  if (recipe) guard.grant(dirname(recipe));
  // every file from outside is parsed on the pool's threads (the HDF5 library on a thread of its own below
  // each, as in browser mode): this process only serves the window
  keepParsingOffThisThread('the Electron main process');
  const pool = new WorkerPool(join(distDir, 'worker.mjs'));
  app.on('will-quit', () => void pool.close());
  const dispatcher = new Dispatcher({ table: serviceTable, guard, cacheDir: defaultCacheDir(), heavy: pool.runner });
  const openDialog = async (o: Parameters<typeof showOpenDialog>[1]): Promise<string[] | null> => {
    const paths = await showOpenDialog(win, o);
    // a file the person picked may be read, even outside the folders named at start; for a recipe, its folder
    for (const p of paths ?? []) guard.grant(/\.json$/i.test(p) ? dirname(p) : p);
    return paths;
  };
  registerIpc(ipcMain, serviceTable, dispatcher, { openDialog, startRecipe: recipe });
  dispatcher.events.on('progress', (e) => win?.webContents.send(IPC.progress, e));
  buildMenu(() => {
    void openDialog({ title: 'Open data or recipe', multiple: true }).then((paths) => {
      if (paths) win?.webContents.send(IPC.menuOpen, paths);
    });
  });
  win = createWindow(distDir);
  win.on('closed', () => {
    win = null;
  });
});

app.on('second-instance', () => {
  if (win) {
    if (win.isMinimized()) win.restore();
    win.focus();
  }
});
app.on('window-all-closed', () => app.quit());
