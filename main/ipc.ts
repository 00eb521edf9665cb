/**
 * Electron transport: one ipcMain.handle per service entry, generated from the table, each checking that
 * the call comes from our own page and validating the input against the entry's schema (in Dispatcher).
 * Written against a narrow interface of ipcMain so that a test can drive it without Electron.
 */
import { IPC, type CallReply, type OpenDialogOptions } from '../contract/transport.js';
import type { ServiceEntry } from '../app/services/types.js';
import type { Dispatcher } from './dispatch.js';
import { isAppUrl } from './window-options.js';

export interface IpcEventLike {
  senderFrame: { url: string } | null;
}
export interface IpcMainLike {
  handle(channel: string, listener: (event: IpcEventLike, ...args: unknown[]) => unknown): void;
}

export interface IpcHooks {
  /** system open dialog; the chosen paths are granted to the path guard by the caller */
  openDialog(options: OpenDialogOptions): Promise<string[] | null>;
  startRecipe: string | null;
}

/** Channel of one service entry. */
export function serviceChannel(name: string): string {
  return `${IPC.call}:${name}`;
}

function refused(): CallReply {
  return { ok: false, error: { code: 'E_INPUT', message: 'Refused: the call did not come from the workbench page.' } };
}

function trusted(event: IpcEventLike): boolean {
  return event.senderFrame !== null && isAppUrl(event.senderFrame.url);
}

function dialogOptions(raw: unknown): OpenDialogOptions {
  const o = (raw && typeof raw === 'object' ? raw : {}) as Record<string, unknown>;
  const filters = Array.isArray(o.filters)
    ? o.filters
        .filter((f): f is { name: string; extensions: string[] } => !!f && typeof f.name === 'string' && Array.isArray(f.extensions))
        .map((f) => ({ name: f.name.slice(0, 80), extensions: f.extensions.filter((x) => typeof x === 'string' && /^[\w*]{1,10}$/.test(x)) }))
    : undefined;
  return {
    title: typeof o.title === 'string' ? o.title.slice(0, 120) : undefined,
    filters,
    multiple: o.multiple === true,
    directory: o.directory === true,
  };
}

/** Register every handler; returns the channels registered (for the test and for logging). */
export function registerIpc(ipcMain: IpcMainLike, table: ServiceEntry[], dispatcher: Dispatcher, hooks: IpcHooks): string[] {
  const channels: string[] = [];
  for (const e of table) {
    const channel = serviceChannel(e.name);
    ipcMain.handle(channel, (event, input, jobId) => (trusted(event) ? dispatcher.call(e.name, input, jobId) : refused()));
    channels.push(channel);
  }
  ipcMain.handle(IPC.cancel, (event, jobId) => {
    if (trusted(event) && typeof jobId === 'string') dispatcher.cancel(jobId);
  });
  ipcMain.handle(IPC.dialog, (event, options) => (trusted(event) ? hooks.openDialog(dialogOptions(options)) : null));
  ipcMain.handle(IPC.startRecipe, (event) => (trusted(event) ? hooks.startRecipe : null));
  channels.push(IPC.cancel, IPC.dialog, IPC.startRecipe);
  return channels;
}
