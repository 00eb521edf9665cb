import type { z } from 'zod';

/** What a service handler may use from the transport that called it. */
export interface ServiceContext {
  /**
   * Turn a path given by the screen into an absolute path that the handler may read or write.
   * Browser mode allows only the folders named at start; throws StillwaterError E_FILE otherwise.
   */
  resolvePath(path: string): string;
  /** folders the person may browse */
  roots: string[];
  /** cache folder for regridding weights */
  cacheDir: string;
  /** progress of long work, fraction 0..1 */
  progress(fraction: number, message: string): void;
  signal: AbortSignal;
}

/** One operation the screen may ask for: a name, an input schema, and a handler. */
export interface ServiceEntry<S extends z.ZodType = z.ZodType, O = unknown> {
  name: string;
  summary: string;
  input: S;
  /**
   * run in a worker thread, so that the screen never freezes: every entry that reads a file from outside is
   * heavy (the serving threads refuse to parse one, app/io/parsing-thread.ts)
   */
  heavy?: boolean;
  /**
   * How the entry relates to workbench sessions, which live on the worker thread that opened them:
   * 'open' returns a SessionInfo whose session then lives on that thread, 'use' and 'close' take
   * input.session and run on its thread.
   */
  session?: 'open' | 'use' | 'close';
  /**
   * Seconds the entry may take before its thread is stopped: for entries that parse untrusted files
   * and should be quick (headers), so that a damaged file that makes a library loop costs one sentence.
   */
  deadlineSeconds?: number;
  run(input: z.infer<S>, ctx: ServiceContext): Promise<O>;
}

export function entry<S extends z.ZodType, O>(e: ServiceEntry<S, O>): ServiceEntry<S, O> {
  return e;
}
