/** Entry of a report rasteriser thread (dist/png-worker.mjs): SVG text in, PNG bytes out (app/report/report-tools.ts). */
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { parentPort } from 'node:worker_threads';
import { serveDeadlineRequests } from './deadline-worker.js';
import { svgToPng } from '../app/report/report-tools.js';

export interface PngRequest {
  svg: string;
  widthPx: number;
}

// resvg's images live outside the JavaScript heap, which barely grows here, so the collector would hardly
// ever run and tens of figure-sized pixmaps would wait for it: collect after each figure instead
setFlagsFromString('--expose-gc');
const collect = runInNewContext('gc') as (() => void) | undefined;

if (parentPort) {
  serveDeadlineRequests(
    parentPort,
    async (r) => {
      const req = r as PngRequest;
      const png = svgToPng(req.svg, req.widthPx);
      collect?.();
      return png;
    },
    (value) => (value instanceof Uint8Array && value.byteLength === value.buffer.byteLength ? [value.buffer as ArrayBuffer] : []),
  );
}
