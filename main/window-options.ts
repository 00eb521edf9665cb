/**
 * Everything that decides how locked-down the Electron window is, as plain data and pure functions, so that
 * tests/unit/main/window-options.test.ts holds them without launching Electron.
 * main/window.ts applies them; nothing there may loosen them.
 */
import type { BrowserWindowConstructorOptions } from 'electron';
import { CONTENT_SECURITY_POLICY, securityHeaders } from './csp.js';

/** The page is served from this private scheme by main/window.ts (never file:// and never http). */
export const APP_SCHEME = 'app';
export const APP_HOST = 'stillwater';
export const APP_ORIGIN = `${APP_SCHEME}://${APP_HOST}`;
export const START_URL = `${APP_ORIGIN}/index.html`;

export function windowOptions(preloadPath: string): BrowserWindowConstructorOptions {
  return {
    width: 1440,
    height: 900,
    minWidth: 960,
    minHeight: 600,
    title: 'Stillwater',
    show: false,
    backgroundColor: '#101418',
    webPreferences: {
      preload: preloadPath,
      contextIsolation: true,
      sandbox: true,
      nodeIntegration: false,
      nodeIntegrationInWorker: false,
      nodeIntegrationInSubFrames: false,
      webSecurity: true,
      allowRunningInsecureContent: false,
      experimentalFeatures: false,
      webviewTag: false,
      navigateOnDragDrop: false,
      spellcheck: false,
      safeDialogs: true,
    },
  };
}

/** Is this URL our own page (the only thing a frame of ours may show or call the services from)? */
export function isAppUrl(url: string): boolean {
  try {
    const u = new URL(url);
    return u.protocol === `${APP_SCHEME}:` && u.host === APP_HOST;
  } catch {
    return false;
  }
}

/**
 * will-navigate: the page never leaves itself. A link or a dropped file would otherwise replace the
 * workbench with content that keeps the preload bridge. Returns true when the navigation must be stopped.
 */
export function blocksNavigation(_url: string): boolean {
  return true;
}

/** setWindowOpenHandler: no new windows, ever (exports are downloads, not windows). */
export function windowOpenDecision(_details: { url: string }): { action: 'deny' } {
  return { action: 'deny' };
}

/** Permission requests (camera, geolocation, notifications, ...): none is needed, none is granted. */
export function grantsPermission(_permission: string): boolean {
  return false;
}

/**
 * session.webRequest.onHeadersReceived: every response carries our Content-Security-Policy and companions,
 * replacing any the response brought along (case-insensitively).
 */
export function hardenedHeaders(headers: Record<string, string[] | string> | undefined): Record<string, string[]> {
  const ours = securityHeaders();
  const lower = new Set(Object.keys(ours).map((k) => k.toLowerCase()));
  const out: Record<string, string[]> = {};
  for (const [k, v] of Object.entries(headers ?? {})) {
    if (!lower.has(k.toLowerCase())) out[k] = Array.isArray(v) ? v : [v];
  }
  for (const [k, v] of Object.entries(ours)) out[k] = [v];
  return out;
}

export { CONTENT_SECURITY_POLICY };
