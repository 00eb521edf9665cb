/**
 * The Electron window: locked-down options (main/window-options.ts), the page served from the private app://
 * scheme, CSP on every response, no navigation, no new windows, no permissions, and the menus.
 */
import { BrowserWindow, Menu, app, dialog, protocol, session, type MenuItemConstructorOptions, type WebContents } from 'electron';
import { join } from 'node:path';
import { readFile } from 'node:fs/promises';
import type { OpenDialogOptions } from '../contract/transport.js';
import { securityHeaders } from './csp.js';
import { contentType, staticFile } from './static-files.js';
import { APP_HOST, APP_SCHEME, START_URL, blocksNavigation, grantsPermission, hardenedHeaders, windowOpenDecision, windowOptions } from './window-options.js';

/** Must run before app is ready. */
export function registerAppScheme(): void {
  protocol.registerSchemesAsPrivileged([{ scheme: APP_SCHEME, privileges: { standard: true, secure: true, supportFetchAPI: true } }]);
}

/** Serve dist/renderer and the vendor files on app://stillwater/, nothing else. */
export function serveAppScheme(root: string): void {
  protocol.handle(APP_SCHEME, async (request) => {
    const url = new URL(request.url);
    const file = url.host === APP_HOST ? staticFile(url.pathname, root) : undefined;
    if (!file) return new Response('not found', { status: 404, headers: securityHeaders() });
    const body = await readFile(file);
    return new Response(new Uint8Array(body), { status: 200, headers: { ...securityHeaders(), 'Content-Type': contentType(file) } });
  });
}

/** Session-wide rules: CSP on every response, no permissions, no requests to anywhere but our scheme. */
export function hardenSession(): void {
  const s = session.defaultSession;
  s.webRequest.onHeadersReceived((details, callback) => callback({ responseHeaders: hardenedHeaders(details.responseHeaders) }));
  s.webRequest.onBeforeRequest((details, callback) => {
    const ok = details.url.startsWith(`${APP_SCHEME}://`) || details.url.startsWith('devtools://') || details.url.startsWith('data:') || details.url.startsWith('blob:');
    callback({ cancel: !ok });
  });
  s.setPermissionRequestHandler((_wc, permission, callback) => callback(grantsPermission(permission)));
  s.setPermissionCheckHandler((_wc, permission) => grantsPermission(permission));
}

/** Rules for every web contents ever created (windows, and anything a page might try to attach). */
export function hardenContents(contents: WebContents): void {
  contents.on('will-navigate', (event, url) => {
    if (blocksNavigation(url)) event.preventDefault();
  });
  contents.on('will-redirect', (event, url) => {
    if (blocksNavigation(url)) event.preventDefault();
  });
  contents.on('will-attach-webview', (event) => event.preventDefault());
  contents.setWindowOpenHandler(windowOpenDecision);
}

export async function showOpenDialog(win: BrowserWindow | null, o: OpenDialogOptions): Promise<string[] | null> {
  const props: ('openFile' | 'openDirectory' | 'multiSelections')[] = [o.directory ? 'openDirectory' : 'openFile'];
  if (o.multiple) props.push('multiSelections');
  const options = { title: o.title ?? 'Open', filters: o.filters, properties: props };
  const r = win ? await dialog.showOpenDialog(win, options) : await dialog.showOpenDialog(options);
  return r.canceled || r.filePaths.length === 0 ? null : r.filePaths;
}

export function buildMenu(onOpen: () => void): void {
  const mac = process.platform === 'darwin';
  const template: MenuItemConstructorOptions[] = [
    ...(mac ? [{ role: 'appMenu' as const }] : []),
    {
      label: 'File',
      submenu: [{ label: 'Open data or recipe…', accelerator: 'CmdOrCtrl+O', click: onOpen }, { type: 'separator' }, mac ? { role: 'close' } : { role: 'quit' }],
    },
    { role: 'editMenu' },
    {
      label: 'View',
      submenu: [{ role: 'resetZoom' }, { role: 'zoomIn' }, { role: 'zoomOut' }, { type: 'separator' }, { role: 'togglefullscreen' }, ...(app.isPackaged ? [] : [{ role: 'toggleDevTools' as const }])],
    },
    { role: 'windowMenu' },
    { label: 'Help', submenu: [{ label: `Stillwater ${app.getVersion()}`, enabled: false }] },
  ];
  Menu.setApplicationMenu(Menu.buildFromTemplate(template));
}

export function createWindow(distDir: string): BrowserWindow {
  const win = new BrowserWindow(windowOptions(join(distDir, 'preload.cjs')));
  win.once('ready-to-show', () => win.show());
  void win.loadURL(START_URL);
  return win;
}
