/**
 * Report figures rasterised on worker threads, several at once, while the comparison goes on on the calling
 * thread: one thread per core (at most four). Without the bundled worker (running from sources) the SVG is
 * rasterised on the calling thread.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { DeadlineWorker } from './deadline-worker.js';
import type { PngRequest } from './png-worker.js';
import { svgToPng } from '../app/report/report-tools.js';

/** A figure takes well under a second to rasterise; a minute means something is wrong. */
const DEADLINE_MS = 120_000;

export interface PngPool {
  toPng(svg: string, widthPx: number): Promise<Uint8Array>;
  /** how many rasterisations may usefully wait at once */
  readonly parallel: number;
  close(): Promise<void>;
}

export function pngPool(distDir: string, size = Math.min(4, availableParallelism())): PngPool {
  const file = join(distDir, 'png-worker.mjs');
  if (!existsSync(file) || size < 1) {
    return { toPng: async (svg, w) => svgToPng(svg, w), parallel: 1, close: async () => undefined };
  }
  const threads = Array.from({ length: size }, () => ({ worker: new DeadlineWorker(file), busy: 0 }));
  return {
    parallel: size,
    async toPng(svg, widthPx) {
      const t = threads.reduce((a, b) => (b.busy < a.busy ? b : a));
      t.busy++;
      try {
        const png = await t.worker.call<Uint8Array>({ svg, widthPx } satisfies PngRequest, { deadlineMs: DEADLINE_MS, subject: { file: 'a report figure' } });
        return png;
      } finally {
        t.busy--;
      }
    },
    async close() {
      await Promise.all(threads.map((t) => t.worker.close()));
    },
  };
}
