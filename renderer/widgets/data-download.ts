/**
 * "Data: CSV | NetCDF": the data behind the figure shown, as a file written by a session service on its worker
 * thread (view.export-section, -profile, -line). The view says what it drew; nothing big travels from the page.
 */
import { h, saveBlob } from '../elements.js';
import { tracked } from '../service-client.js';
import { errorText } from '../views/view.js';

export interface DataRequest {
  service: string;
  input: Record<string, unknown>;
}

/** The buttons, with the sentence of a refusal beside them (role alert) until the next try. */
export function dataDownload(id: string, what: string, ask: () => DataRequest | null): HTMLElement {
  const message = h('span', { class: 'field-message download-message', role: 'alert', id: `${id}-download-message` });
  const onError = (sentence: string): void => {
    message.textContent = sentence;
  };
  const get = async (format: 'csv' | 'netcdf'): Promise<void> => {
    message.textContent = '';
    const req = ask();
    if (!req) return onError(`There is no ${what} to download yet.`);
    try {
      const f = await tracked<{ fileName: string; mime: string; data: Uint8Array }>(`Writing the ${what} as ${format === 'csv' ? 'CSV' : 'NetCDF'}`, req.service, { ...req.input, format });
      saveBlob(new Blob([f.data as BlobPart], { type: f.mime }), f.fileName);
    } catch (e) {
      onError(errorText(e));
    }
  };
  return h(
    'span',
    { class: 'data-download' },
    h('span', { class: 'toolbar-label' }, 'Data '),
    h(
      'span',
      { class: 'segmented', role: 'group', 'aria-label': `Download the data of the ${what} shown` },
      h('button', { type: 'button', id: `${id}-download-csv`, title: `The ${what} shown as CSV: '# ' lines say what, units, period and where; one row per value with its coordinates`, onclick: () => void get('csv') }, 'CSV'),
      h('button', { type: 'button', id: `${id}-download-netcdf`, title: `The ${what} shown as CF NetCDF (coordinates with bounds, fill value, units)`, onclick: () => void get('netcdf') }, 'NetCDF'),
    ),
    message,
  );
}
