/**
 * The narrow bridge between the sandboxed page and the main process: a handful of functions on
 * window.stillwater, nothing of Node or of ipcRenderer itself. Service names are checked for shape here;
 * inputs are validated against their schemas in the main process.
 */
import { contextBridge, ipcRenderer, type IpcRendererEvent } from 'electron';
import { IPC, type OpenDialogOptions, type PreloadApi, type ProgressEvent } from '../contract/transport.js';

const NAME = /^[a-z][A-Za-z0-9]*(\.[A-Za-z0-9-]+)*$/;

const api: PreloadApi = {
  kind: 'electron',
  call(name: string, input: unknown, jobId: string) {
    if (typeof name !== 'string' || !NAME.test(name)) {
      return Promise.resolve({ ok: false, error: { code: 'E_INPUT', message: `'${String(name)}' is not a service name.` } });
    }
    return ipcRenderer.invoke(`${IPC.call}:${name}`, input, jobId);
  },
  cancel(jobId: string) {
    return ipcRenderer.invoke(IPC.cancel, String(jobId));
  },
  onProgress(cb: (e: ProgressEvent) => void) {
    const listener = (_event: IpcRendererEvent, e: ProgressEvent): void => cb(e);
    ipcRenderer.on(IPC.progress, listener);
    return () => {
      ipcRenderer.removeListener(IPC.progress, listener);
    };
  },
  openDialog(options: OpenDialogOptions) {
    return ipcRenderer.invoke(IPC.dialog, options);
  },
  startRecipe() {
    return ipcRenderer.invoke(IPC.startRecipe);
  },
  onMenuOpen(cb: (paths: string[]) => void) {
    const listener = (_event: IpcRendererEvent, paths: string[]): void => cb(paths);
    ipcRenderer.on(IPC.menuOpen, listener);
    return () => {
      ipcRenderer.removeListener(IPC.menuOpen, listener);
    };
  },
};

contextBridge.exposeInMainWorld('stillwater', api);
