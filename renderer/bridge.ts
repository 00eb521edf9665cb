/**
 * The one client the views use to reach the service table (app/service.ts). In Electron it goes through the
 * preload bridge (IPC); in browser mode through same-origin HTTP with the start token. Views never know which.
 *
 *   const info = await call<FileInfo>('files.describe', { path });
 *   const off = onProgress((e) => status(e.message, e.fraction));
 *   const jobId = newJobId();
 *   const rows = call<SkillRow[]>('view.skill', { session, variable }, { jobId, onProgress: show });
 *   cancel(jobId);                      // rejects the call with code E_CANCELLED
 *
 * Results keep typed arrays (Float32Array, ...) and NaN in both transports.
 */
import type { CallReply, OpenDialogOptions, PreloadApi, ProgressEvent, WireError } from '../contract/transport.js';
import { ROUTES, TOKEN_HEADER, VENDOR } from '../contract/transport.js';
import { WIRE_CONTENT_TYPE, decodeWire } from '../contract/wire.js';

export type { ProgressEvent, OpenDialogOptions } from '../contract/transport.js';

/** A refusal or fault from a service, with the StillwaterError code (E_FILE, E_RECIPE, E_CANCELLED, ...). */
export class ServiceError extends Error {
  readonly code: string;
  readonly file?: string;
  readonly variable?: string;
  readonly path?: string;
  constructor(e: WireError) {
    super(e.message);
    this.name = 'ServiceError';
    this.code = e.code;
    this.file = e.file;
    this.variable = e.variable;
    this.path = e.path;
  }
}

export interface CallOptions {
  /** name the job so it can be cancelled; one is made up when absent */
  jobId?: string;
  /** progress of this job only */
  onProgress?: (e: ProgressEvent) => void;
  /** let the request outlive the page (closing a session as the page goes) */
  keepalive?: boolean;
}

function preload(): PreloadApi | undefined {
  const w = globalThis as unknown as { stillwater?: PreloadApi };
  return w.stillwater && w.stillwater.kind === 'electron' ? w.stillwater : undefined;
}

export function transportKind(): 'electron' | 'browser' {
  return preload() ? 'electron' : 'browser';
}

let jobCounter = 0;
export function newJobId(): string {
  const rnd = Math.random().toString(36).slice(2, 8);
  return `job-${Date.now().toString(36)}-${++jobCounter}-${rnd}`;
}

// ---- progress: one subscription list, fed by IPC events or by the server-sent event stream ----

const listeners = new Set<(e: ProgressEvent) => void>();
let unhook: (() => void) | undefined;

function dispatch(e: ProgressEvent): void {
  for (const cb of listeners) {
    try {
      cb(e);
    } catch (err) {
      console.warn('progress listener failed', err);
    }
  }
}

function ensureProgressFeed(): void {
  if (unhook) return;
  const p = preload();
  if (p) {
    unhook = p.onProgress(dispatch);
    return;
  }
  if (typeof EventSource === 'undefined') return;
  const source = new EventSource(ROUTES.events);
  source.onmessage = (m) => {
    try {
      dispatch(JSON.parse(m.data as string) as ProgressEvent);
    } catch {
      /* a malformed event is dropped; the call's own reply still arrives */
    }
  };
  unhook = () => source.close();
}

/** Listen to the progress of every job; returns the function that stops listening. */
export function onProgress(cb: (e: ProgressEvent) => void): () => void {
  listeners.add(cb);
  ensureProgressFeed();
  return () => {
    listeners.delete(cb);
  };
}

// ---- browser-mode HTTP ----

function startToken(): string | undefined {
  if (typeof location === 'undefined') return undefined;
  const fromUrl = new URLSearchParams(location.search).get('token');
  if (fromUrl) {
    try {
      sessionStorage.setItem('stillwater-token', fromUrl);
    } catch {
      /* storage may be off; the cookie set by the server still works */
    }
    return fromUrl;
  }
  try {
    return sessionStorage.getItem('stillwater-token') ?? undefined;
  } catch {
    return undefined;
  }
}

function headers(json: boolean): Record<string, string> {
  const h: Record<string, string> = {};
  if (json) h['content-type'] = 'application/json';
  const t = startToken();
  if (t) h[TOKEN_HEADER] = t;
  return h;
}

async function httpCall(name: string, input: unknown, jobId: string, keepalive = false): Promise<CallReply> {
  let res: Response;
  try {
    res = await fetch(ROUTES.api + encodeURIComponent(name), {
      method: 'POST',
      headers: headers(true),
      body: JSON.stringify({ input: input ?? null, jobId }),
      credentials: 'same-origin',
      keepalive,
    });
  } catch (e) {
    return { ok: false, error: { code: 'E_INTERNAL', message: `The Stillwater server cannot be reached (${String(e)}).` } };
  }
  const type = res.headers.get('content-type') ?? '';
  if (res.ok && type.startsWith(WIRE_CONTENT_TYPE)) {
    return { ok: true, result: decodeWire(await res.arrayBuffer()) };
  }
  if (type.startsWith('application/json')) {
    const body = (await res.json()) as { error?: WireError };
    if (body.error) return { ok: false, error: body.error };
  }
  return { ok: false, error: { code: 'E_INTERNAL', message: `The Stillwater server answered ${res.status} ${res.statusText} to '${name}'.` } };
}

// ---- the calls the views use ----

/** Ask the service table for one operation. Rejects with ServiceError. */
export async function call<T>(name: string, input: unknown, options: CallOptions = {}): Promise<T> {
  const jobId = options.jobId ?? newJobId();
  let off: (() => void) | undefined;
  if (options.onProgress) {
    const own = options.onProgress;
    off = onProgress((e) => {
      if (e.jobId === jobId) own(e);
    });
  }
  try {
    const p = preload();
    const reply = p ? await p.call(name, input, jobId) : await httpCall(name, input, jobId, options.keepalive === true);
    if (!reply.ok) throw new ServiceError(reply.error);
    return reply.result as T;
  } finally {
    off?.();
  }
}

/** Stop a running job; its call then rejects with code E_CANCELLED. Unknown or finished jobs are ignored. */
export async function cancel(jobId: string): Promise<void> {
  const p = preload();
  if (p) return p.cancel(jobId);
  await fetch(ROUTES.cancel, { method: 'POST', headers: headers(true), body: JSON.stringify({ jobId }), credentials: 'same-origin' });
}

/** True in Electron, where openFiles() shows the system dialog; in browser mode use the 'files.list' service. */
export function hasNativeDialog(): boolean {
  return preload() !== undefined;
}

/** The system open-file dialog (Electron); null when cancelled or in browser mode. */
export async function openFiles(options: OpenDialogOptions = {}): Promise<string[] | null> {
  const p = preload();
  return p ? p.openDialog(options) : null;
}

/** Files picked through the Electron File menu (never called in browser mode); returns the unsubscribe. */
export function onMenuOpen(cb: (paths: string[]) => void): () => void {
  const p = preload();
  return p ? p.onMenuOpen(cb) : () => undefined;
}

/** The recipe the workbench was started with (npm start opens the demo recipe), or null. */
export async function startRecipe(): Promise<string | null> {
  const p = preload();
  if (p) return p.startRecipe();
  const res = await fetch(ROUTES.startRecipe, { headers: headers(false), credentials: 'same-origin' });
  if (!res.ok) return null;
  const body = (await res.json()) as { recipe?: string | null };
  return body.recipe ?? null;
}

/** URL of a bundled vendor file (world-atlas shapes), the same in both transports. */
export function vendorUrl(key: keyof typeof VENDOR): string {
  return VENDOR[key];
}

// The end-to-end tests (tests/e2e) reach the same client through the page; it grants nothing the page's own
// scripts could not already do.
(globalThis as unknown as { stillwaterBridge?: unknown }).stillwaterBridge = { call, cancel, onProgress, transportKind, startRecipe };
