// The Electron window's security settings, held without launching Electron so they cannot regress silently
// where the binary is absent. The rules come from Electron's security checklist
// (electronjs.org/docs/latest/tutorial/security: "Enable context isolation", "Enable process sandboxing",
// "Do not enable Node.js integration for remote content", "Do not disable webSecurity", "Define a Content
// Security Policy", "Limit navigation", "Limit creation of new windows", "Handle session permission
// requests") and from the CSP Level 3 specification (W3C) for the policy's directives.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { CONTENT_SECURITY_POLICY } from '../../../main/csp.js';
import {
  APP_ORIGIN,
  START_URL,
  blocksNavigation,
  grantsPermission,
  hardenedHeaders,
  isAppUrl,
  windowOpenDecision,
  windowOptions,
} from '../../../main/window-options.js';

function directives(policy: string): Map<string, string[]> {
  const m = new Map<string, string[]>();
  for (const part of policy.split(';')) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (name) m.set(name, values);
  }
  return m;
}

describe('BrowserWindow options', () => {
  const o = windowOptions('/x/preload.cjs');
  const w = o.webPreferences!;
  it('isolate the page from the preload and sandbox it', () => {
    expect(w.contextIsolation).toBe(true);
    expect(w.sandbox).toBe(true);
  });
  it('give the page no Node.js, in workers and sub-frames neither', () => {
    expect(w.nodeIntegration).toBe(false);
    expect(w.nodeIntegrationInWorker).toBe(false);
    expect(w.nodeIntegrationInSubFrames).toBe(false);
  });
  it('keep web security and refuse insecure content, webviews and experimental features', () => {
    expect(w.webSecurity).toBe(true);
    expect(w.allowRunningInsecureContent).toBe(false);
    expect(w.webviewTag).toBe(false);
    expect(w.experimentalFeatures).toBe(false);
    expect(w.navigateOnDragDrop).toBe(false);
  });
  it('load only the given preload', () => {
    expect(w.preload).toBe('/x/preload.cjs');
  });
});

describe('Content-Security-Policy', () => {
  const d = directives(CONTENT_SECURITY_POLICY);
  it("starts from default-src 'none'", () => {
    expect(d.get('default-src')).toEqual(["'none'"]);
  });
  it('runs scripts from our own origin only: no inline script, no eval, no remote host', () => {
    expect(d.get('script-src')).toEqual(["'self'"]);
  });
  it('connects, loads images and fonts from our own origin (plus local data:/blob: for exports) and nowhere else', () => {
    expect(d.get('connect-src')).toEqual(["'self'"]);
    for (const k of ['img-src', 'font-src', 'style-src', 'worker-src']) {
      for (const v of d.get(k) ?? []) expect(["'self'", "'unsafe-inline'", 'data:', 'blob:']).toContain(v);
    }
    expect(CONTENT_SECURITY_POLICY).not.toMatch(/https?:|\*|'unsafe-eval'|'wasm-unsafe-eval'/);
  });
  it('forbids plugins, <base>, form posts and being framed', () => {
    expect(d.get('object-src')).toEqual(["'none'"]);
    expect(d.get('base-uri')).toEqual(["'none'"]);
    expect(d.get('form-action')).toEqual(["'none'"]);
    expect(d.get('frame-ancestors')).toEqual(["'none'"]);
  });
  it('is repeated in renderer/index.html as a meta tag (without frame-ancestors, which a meta tag cannot carry)', () => {
    const html = readFileSync(join(__dirname, '..', '..', '..', 'renderer', 'index.html'), 'utf8');
    const meta = /http-equiv="Content-Security-Policy"\s+content="([^"]+)"/.exec(html);
    expect(meta).not.toBeNull();
    const expected = new Map(d);
    expected.delete('frame-ancestors');
    expect(directives(meta![1])).toEqual(expected);
    expect(html).not.toMatch(/<script(?![^>]*\bsrc=)[^>]*>/); // no inline script
    expect(html).not.toMatch(/(src|href)="(https?:)?\/\//); // nothing remote
  });
  it('is put on every response by onHeadersReceived, replacing a laxer one whatever its case', () => {
    const h = hardenedHeaders({ 'content-security-policy': ["default-src *"], 'X-Other': 'kept' });
    expect(h['Content-Security-Policy']).toEqual([CONTENT_SECURITY_POLICY]);
    expect(Object.keys(h).filter((k) => k.toLowerCase() === 'content-security-policy')).toHaveLength(1);
    expect(h['X-Other']).toEqual(['kept']);
    expect(h['X-Content-Type-Options']).toEqual(['nosniff']);
    expect(hardenedHeaders(undefined)['Content-Security-Policy']).toEqual([CONTENT_SECURITY_POLICY]);
  });
});

describe('navigation, new windows and permissions', () => {
  it('blocks every navigation, to remote pages, files and even our own scheme', () => {
    for (const u of ['https://example.org/', 'file:///etc/passwd', 'http://127.0.0.1:1/', `${APP_ORIGIN}/other.html`, 'javascript:alert(1)']) {
      expect(blocksNavigation(u)).toBe(true);
    }
  });
  it('denies every new window', () => {
    expect(windowOpenDecision({ url: 'https://example.org/' })).toEqual({ action: 'deny' });
    expect(windowOpenDecision({ url: START_URL })).toEqual({ action: 'deny' });
  });
  it('grants no permission', () => {
    for (const p of ['media', 'geolocation', 'notifications', 'openExternal', 'clipboard-read']) expect(grantsPermission(p)).toBe(false);
  });
  it('recognises only our own page as the caller of services', () => {
    expect(isAppUrl(START_URL)).toBe(true);
    expect(isAppUrl('app://stillwater.evil/index.html')).toBe(false);
    expect(isAppUrl('app://other/index.html')).toBe(false);
    expect(isAppUrl('https://stillwater/index.html')).toBe(false);
    expect(isAppUrl('not a url')).toBe(false);
  });
});
