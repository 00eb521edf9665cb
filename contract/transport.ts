/**
 * What the screen and the process side agree on, whichever transport carries it: progress events, errors,
 * replies, the IPC channel names and the browser-mode routes. Pure types and constants, importing nothing:
 * renderer/bridge.ts and main/ (preload, ipc, http, dispatch, workers) both import it.
 */

/** Progress of a long job, sent while a heavy service entry runs. */
export interface ProgressEvent {
  jobId: string;
  /** service entry name, e.g. "view.level" */
  service: string;
  /** 0..1 */
  fraction: number;
  message: string;
  /** set on the last event of a job */
  state?: 'running' | 'done' | 'failed' | 'cancelled';
}

/** A fault as the screen sees it: the StillwaterError code and sentence, plus the file/variable/path. */
export interface WireError {
  code: string;
  message: string;
  file?: string;
  variable?: string;
  path?: string;
}

/** How every call comes back over either transport. */
export type CallReply = { ok: true; result: unknown } | { ok: false; error: WireError };

/** Options of the native open-file dialog (Electron only). */
export interface OpenDialogOptions {
  title?: string;
  /** e.g. [{ name: 'NetCDF', extensions: ['nc', 'nc4'] }] */
  filters?: { name: string; extensions: string[] }[];
  multiple?: boolean;
  directory?: boolean;
}

/** The narrow bridge that main/preload.ts puts on window.stillwater in Electron. */
export interface PreloadApi {
  readonly kind: 'electron';
  call(name: string, input: unknown, jobId: string): Promise<CallReply>;
  cancel(jobId: string): Promise<void>;
  onProgress(cb: (e: ProgressEvent) => void): () => void;
  openDialog(options: OpenDialogOptions): Promise<string[] | null>;
  /** the recipe the shell was started with, if any */
  startRecipe(): Promise<string | null>;
  /** files picked through the File menu */
  onMenuOpen(cb: (paths: string[]) => void): () => void;
}

export const IPC = {
  call: 'stillwater:call',
  cancel: 'stillwater:cancel',
  progress: 'stillwater:progress',
  dialog: 'stillwater:open-dialog',
  startRecipe: 'stillwater:start-recipe',
  /** main -> page: files picked through the File menu */
  menuOpen: 'stillwater:menu-open',
} as const;

/** Browser-mode HTTP routes (all same-origin, all need the start token). */
export const ROUTES = {
  /** POST /api/<name>, body {"input": ..., "jobId": "..."} */
  api: '/api/',
  /** GET, text/event-stream of ProgressEvent */
  events: '/events',
  /** POST {"jobId": "..."} */
  cancel: '/cancel',
  /** GET, {"recipe": string | null} */
  startRecipe: '/start-recipe',
} as const;

/** Header that carries the start token when the cookie is not used. */
export const TOKEN_HEADER = 'x-stillwater-token';
export const TOKEN_COOKIE = 'stillwater_token';

/**
 * Vendor files the renderer may load, same URL in both transports (relative to index.html).
 * The server side maps them to files inside node_modules; nothing is ever fetched from the network.
 */
export const VENDOR = {
  land110m: 'vendor/world-atlas/land-110m.json',
  land50m: 'vendor/world-atlas/land-50m.json',
  countries110m: 'vendor/world-atlas/countries-110m.json',
} as const;
