/**
 * Files from outside are parsed only where a deadline can stop the work, never on the thread that serves the
 * screen (the browser-mode server's thread, Electron's main process): a damaged file can make a parser or a
 * library loop, and that thread must keep answering. Those threads call keepParsingOffThisThread() when they
 * start; every reader of an outside file calls checkParsingHere() first, so a service entry that reads a file
 * without being `heavy` fails at once with one sentence instead of freezing the screen on some damaged file.
 * The flag belongs to the module instance, that is to one thread: worker threads never see it set.
 */
import { fileError } from '../errors.js';

let servingThread: string | undefined;

/** Mark this thread as the one that serves the screen (`who` names it in the sentence). */
export function keepParsingOffThisThread(who: string): void {
  servingThread = who;
}

/** Throw when this thread serves the screen: `file` would be parsed where nothing can stop a loop. */
export function checkParsingHere(file: string): void {
  if (servingThread !== undefined) {
    throw fileError('E_INTERNAL', file, `would be read on the thread that serves the screen (${servingThread}); the service reading it must run on a worker thread.`);
  }
}
