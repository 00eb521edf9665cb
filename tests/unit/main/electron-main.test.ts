// The Electron main process wired up against a stand-in `electron` module (the binary is absent here):
// the private scheme is registered before the app is ready, every web contents gets the navigation and
// new-window blocks, the session puts the CSP on every response and refuses requests to other schemes,
// the window is built from windowOptions(), and one IPC handler per service entry is registered.
// Rules from Electron's security checklist (electronjs.org/docs/latest/tutorial/security).
import { EventEmitter } from 'node:events';
import { describe, expect, it, vi } from 'vitest';
import { serviceTable } from '../../../app/service.js';
import { IPC } from '../../../contract/transport.js';
import { CONTENT_SECURITY_POLICY } from '../../../main/csp.js';
import { START_URL } from '../../../main/window-options.js';

type Listener = (...args: unknown[]) => void;

function fakeElectron() {
  const calls: string[] = [];
  let readyResolve!: () => void;
  const ready = new Promise<void>((r) => (readyResolve = r));
  const app = Object.assign(new EventEmitter(), {
    requestSingleInstanceLock: () => true,
    whenReady: () => ready,
    quit: vi.fn(),
    getPath: () => '/tmp/sw-electron-test',
    getVersion: () => '0.0.0',
    isPackaged: false,
  });
  const windows: { options: Record<string, unknown>; url?: string }[] = [];
  let windowLoading!: () => void;
  /** settles when the main process asks the window to load its page: the last step once the app is ready */
  const loading = new Promise<void>((r) => (windowLoading = r));
  class BrowserWindow extends EventEmitter {
    webContents = { send: vi.fn() };
    constructor(readonly options: Record<string, unknown>) {
      super();
      windows.push({ options });
    }
    loadURL(url: string) {
      windows[windows.length - 1].url = url;
      windowLoading();
      return Promise.resolve();
    }
    show() {}
  }
  const session = {
    defaultSession: {
      headers: undefined as undefined | Listener,
      before: undefined as undefined | Listener,
      permission: undefined as undefined | Listener,
      webRequest: {
        onHeadersReceived(l: Listener) {
          session.defaultSession.headers = l;
        },
        onBeforeRequest(l: Listener) {
          session.defaultSession.before = l;
        },
      },
      setPermissionRequestHandler(l: Listener) {
        session.defaultSession.permission = l;
      },
      setPermissionCheckHandler: vi.fn(),
    },
  };
  const handlers = new Map<string, unknown>();
  const electron = {
    app,
    BrowserWindow,
    Menu: { buildFromTemplate: (t: unknown) => t, setApplicationMenu: vi.fn() },
    dialog: { showOpenDialog: vi.fn() },
    ipcMain: { handle: (c: string, h: unknown) => void handlers.set(c, h) },
    protocol: {
      registerSchemesAsPrivileged: (s: unknown) => {
        calls.push(`register-scheme ready=${String(isReady)}`);
        schemes.push(s);
      },
      handle: (scheme: string) => calls.push(`handle ${scheme}`),
    },
    session,
  };
  let isReady = false;
  const schemes: unknown[] = [];
  return { electron, calls, windows, handlers, session, app, schemes, loading, ready: () => ((isReady = true), readyResolve()) };
}

describe('Electron main process wiring', () => {
  it('applies every rule before and after the app is ready', async () => {
    const f = fakeElectron();
    vi.resetModules();
    vi.doMock('electron', () => f.electron);
    await import('../../../main/electron-main.js');
    // before ready: the scheme is privileged (standard, secure) and nothing else happened yet
    expect(f.calls).toEqual(['register-scheme ready=false']);
    expect(JSON.stringify(f.schemes)).toContain('"secure":true');
    f.ready();
    await f.loading;
    expect(f.calls).toContain('handle app');

    // the window: built from windowOptions, loading our page from the private scheme
    expect(f.windows).toHaveLength(1);
    const prefs = f.windows[0].options.webPreferences as Record<string, unknown>;
    expect(prefs.contextIsolation).toBe(true);
    expect(prefs.sandbox).toBe(true);
    expect(prefs.nodeIntegration).toBe(false);
    expect(String(prefs.preload)).toMatch(/dist[\\/]preload\.cjs$/);
    expect(f.windows[0].url).toBe(START_URL);

    // every web contents: navigation and new windows blocked, webviews refused
    const contents = Object.assign(new EventEmitter(), { setWindowOpenHandler: vi.fn() });
    f.app.emit('web-contents-created', {}, contents);
    const nav = { preventDefault: vi.fn() };
    contents.emit('will-navigate', nav, 'https://example.org/');
    expect(nav.preventDefault).toHaveBeenCalled();
    const webview = { preventDefault: vi.fn() };
    contents.emit('will-attach-webview', webview);
    expect(webview.preventDefault).toHaveBeenCalled();
    const openHandler = contents.setWindowOpenHandler.mock.calls[0][0] as (d: { url: string }) => unknown;
    expect(openHandler({ url: 'https://example.org/' })).toEqual({ action: 'deny' });

    // the session: our CSP on every response, only our scheme requested, no permission granted
    let headersOut: unknown;
    f.session.defaultSession.headers!({ responseHeaders: { 'Content-Security-Policy': ['default-src *'] } }, (r: unknown) => (headersOut = r));
    expect(headersOut).toMatchObject({ responseHeaders: { 'Content-Security-Policy': [CONTENT_SECURITY_POLICY] } });
    const decide = (url: string) => {
      let d: unknown;
      f.session.defaultSession.before!({ url }, (r: unknown) => (d = r));
      return d;
    };
    expect(decide('https://tile.example.org/1/2/3.png')).toEqual({ cancel: true });
    expect(decide('http://127.0.0.1:8080/')).toEqual({ cancel: true });
    expect(decide('file:///etc/passwd')).toEqual({ cancel: true });
    expect(decide(START_URL)).toEqual({ cancel: false });
    let granted: unknown;
    f.session.defaultSession.permission!({}, 'geolocation', (g: unknown) => (granted = g));
    expect(granted).toBe(false);

    // no file from outside is parsed in this process: every reader refuses to run on its thread
    const { checkParsingHere } = await import('../../../app/io/parsing-thread.js');
    expect(() => checkParsingHere('/data/x.nc')).toThrow(/would be read on the thread that serves the screen \(the Electron main process\)/);

    // IPC: one handler per service entry, plus cancel, dialog, start recipe
    for (const e of serviceTable) expect(f.handlers.has(`${IPC.call}:${e.name}`), e.name).toBe(true);
    for (const c of [IPC.cancel, IPC.dialog, IPC.startRecipe]) expect(f.handlers.has(c)).toBe(true);
    vi.doUnmock('electron');
  });
});
