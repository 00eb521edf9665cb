/**
 * Choosing a file: the system dialog in Electron, otherwise a browser of the folders this workbench
 * may read (the files.list service). Resolves with an absolute path, or null when cancelled.
 */
import type { FolderEntry, FolderListing } from '../../app/services/files.js';
import { call, hasNativeDialog, openFiles } from '../bridge.js';
import { h } from '../elements.js';

export async function pickFile(title: string, accept: (e: FolderEntry) => boolean, extensions: string[]): Promise<string | null> {
  if (hasNativeDialog()) {
    const r = await openFiles({ title, filters: [{ name: title, extensions }] });
    return r && r.length ? r[0] : null;
  }
  return new Promise((resolve) => {
    const dialog = h('dialog', { class: 'file-picker', 'aria-label': title });
    const heading = h('h2', {}, title);
    const where = h('p', { class: 'picker-where muted' });
    const list = h('ul', { class: 'picker-list', role: 'listbox', 'aria-label': 'Files and folders' });
    const cancel = h('button', { type: 'button' }, 'Cancel');
    dialog.append(heading, where, list, h('div', { class: 'picker-actions' }, cancel));
    document.body.append(dialog);
    const done = (v: string | null): void => {
      dialog.close();
      dialog.remove();
      resolve(v);
    };
    cancel.addEventListener('click', () => done(null));
    dialog.addEventListener('cancel', () => done(null));
    const show = async (folder?: string): Promise<void> => {
      let listing: FolderListing;
      try {
        listing = folder ? await call<FolderListing>('files.list', { folder }) : { folder: '', parent: null, entries: await call<FolderEntry[]>('files.roots', {}) };
      } catch (e) {
        where.textContent = e instanceof Error ? e.message : String(e);
        return;
      }
      where.textContent = listing.folder || 'Allowed folders';
      list.replaceChildren();
      if (listing.parent || listing.folder) {
        const up = h('button', { type: 'button', class: 'picker-entry folder' }, '↑ up');
        up.addEventListener('click', () => void show(listing.parent ?? undefined));
        list.append(h('li', {}, up));
      }
      for (const e of listing.entries) {
        const ok = e.type === 'folder' || accept(e);
        const b = h('button', { type: 'button', class: `picker-entry ${e.type}`, disabled: !ok, 'data-path': e.path }, e.type === 'folder' ? `${e.name}/` : e.name);
        b.addEventListener('click', () => (e.type === 'folder' ? void show(e.path) : done(e.path)));
        list.append(h('li', {}, b));
      }
      (list.querySelector('button:not([disabled])') as HTMLButtonElement | null)?.focus();
    };
    dialog.showModal();
    void show();
  });
}
