// The Electron transport without Electron: a stand-in ipcMain records the handlers that main/ipc.ts registers
// from the service table, and the preload is loaded against a stand-in `electron` module to see exactly what
// it puts on the page (Electron security checklist: "Validate the sender of all IPC messages", "Do not
// expose Electron APIs to untrusted web content"; electronjs.org/docs/latest/tutorial/security).
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { entry, type ServiceEntry } from '../../../app/services/types.js';
import { Dispatcher } from '../../../main/dispatch.js';
import { registerIpc, serviceChannel, type IpcEventLike } from '../../../main/ipc.js';
import { PathGuard } from '../../../main/path-guard.js';
import { START_URL } from '../../../main/window-options.js';
import { IPC, type CallReply, type PreloadApi } from '../../../contract/transport.js';

type Handler = (event: IpcEventLike, ...args: unknown[]) => unknown;

function setup() {
  const table: ServiceEntry[] = [
    entry({ name: 'a.double', summary: '', input: z.object({ x: z.number() }), run: async (i) => i.x * 2 }),
    entry({ name: 'b.hello', summary: '', input: z.object({}), run: async () => 'hello' }),
  ];
  const handlers = new Map<string, Handler>();
  const fake = { handle: (c: string, h: Handler) => void handlers.set(c, h) };
  const dispatcher = new Dispatcher({ table, guard: new PathGuard([mkdtempSync(join(tmpdir(), 'sw-ipc-'))]), cacheDir: tmpdir() });
  const channels = registerIpc(fake, table, dispatcher, { openDialog: async () => ['/picked.nc'], startRecipe: '/r.json' });
  return { handlers, channels };
}

const ours: IpcEventLike = { senderFrame: { url: START_URL } };
const foreign: IpcEventLike = { senderFrame: { url: 'https://example.org/' } };

describe('IPC handlers', () => {
  it('registers one handler per service entry, generated from the table', () => {
    const { handlers, channels } = setup();
    expect(channels).toContain(serviceChannel('a.double'));
    expect(channels).toContain(serviceChannel('b.hello'));
    expect([...handlers.keys()].filter((k) => k.startsWith(IPC.call + ':'))).toHaveLength(2);
  });
  it('runs a valid call from our page', async () => {
    const { handlers } = setup();
    const r = (await handlers.get(serviceChannel('a.double'))!(ours, { x: 21 }, 'j1')) as CallReply;
    expect(r).toEqual({ ok: true, result: 42 });
  });
  it('validates the input against the schema', async () => {
    const { handlers } = setup();
    const r = (await handlers.get(serviceChannel('a.double'))!(ours, { x: 'no' }, 'j2')) as CallReply;
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.message).toMatch(/^a\.double: input\.x: /);
  });
  it('refuses calls, dialogs and the start recipe from any other frame', async () => {
    const { handlers } = setup();
    const r = (await handlers.get(serviceChannel('b.hello'))!(foreign, {}, 'j3')) as CallReply;
    expect(r.ok).toBe(false);
    expect(await handlers.get(IPC.dialog)!(foreign, {})).toBeNull();
    expect(await handlers.get(IPC.startRecipe)!(foreign)).toBeNull();
    expect(await handlers.get(IPC.startRecipe)!({ senderFrame: null })).toBeNull();
    expect(await handlers.get(IPC.startRecipe)!(ours)).toBe('/r.json');
  });
});

describe('preload bridge', () => {
  it('exposes one object, window.stillwater, with only the agreed functions and no Electron objects', async () => {
    const exposed: Record<string, unknown> = {};
    const invoke = vi.fn(async (..._args: unknown[]) => ({ ok: true, result: 1 }));
    vi.doMock('electron', () => ({
      contextBridge: { exposeInMainWorld: (k: string, v: unknown) => void (exposed[k] = v) },
      ipcRenderer: { invoke, on: vi.fn(), removeListener: vi.fn() },
    }));
    await import('../../../main/preload.js');
    expect(Object.keys(exposed)).toEqual(['stillwater']);
    const api = exposed.stillwater as PreloadApi & Record<string, unknown>;
    expect(Object.keys(api).sort()).toEqual(['call', 'cancel', 'kind', 'onMenuOpen', 'onProgress', 'openDialog', 'startRecipe']);
    for (const v of Object.values(api)) expect(typeof v === 'function' || v === 'electron').toBe(true);
    await api.call('a.double', { x: 1 }, 'j');
    expect(invoke).toHaveBeenCalledWith(serviceChannel('a.double'), { x: 1 }, 'j');
    // a name that is not a service name never reaches ipcRenderer (no invoking arbitrary channels)
    invoke.mockClear();
    const r = await api.call('x:../stillwater:open-dialog', {}, 'j');
    expect(r.ok).toBe(false);
    expect(invoke).not.toHaveBeenCalled();
    vi.doUnmock('electron');
  });
});
