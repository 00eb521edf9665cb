/**
 * The open sessions of this thread. The browser-mode server and Electron route every call that names a session
 * to the worker thread that opened it (main/pool.ts), so the store lives where the fields are read and the
 * dispatching thread never regrids. Sessions are closed when the page goes (view.close), when they have been
 * idle for a while, and, beyond a few, the least recently used first: a 0.1° common grid holds hundreds of MB.
 */
import { StillwaterError } from '../errors.js';
import type { Session } from './session.js';

export interface StoreLimits {
  /** sessions kept open at once; opening one more closes the least recently used */
  maxSessions: number;
  /** milliseconds without a call after which a session is closed */
  idleMs: number;
}

export const DEFAULT_LIMITS: StoreLimits = { maxSessions: 4, idleMs: 30 * 60 * 1000 };

export class SessionStore {
  private readonly sessions = new Map<string, Session>();
  private sweeper: NodeJS.Timeout | undefined;

  constructor(private readonly limits: StoreLimits = DEFAULT_LIMITS, private readonly now: () => number = Date.now) {}

  /** The session, marked as used now; one sentence when it is gone. */
  get(id: string): Session {
    const s = this.sessions.get(id);
    if (!s) throw new StillwaterError('E_INPUT', `The workbench session '${id}' is no longer open; open the recipe again.`);
    s.lastUsed = this.now();
    return s;
  }

  async put(s: Session): Promise<void> {
    const old = this.sessions.get(s.id);
    this.sessions.set(s.id, s);
    s.lastUsed = this.now();
    if (old && old !== s) await old.close();
    while (this.sessions.size > this.limits.maxSessions) {
      const oldest = [...this.sessions.values()].reduce((a, b) => (b.lastUsed < a.lastUsed ? b : a));
      await this.close(oldest.id);
    }
    this.sweepLater();
  }

  /** Close a session; false when there was none. */
  async close(id: string): Promise<boolean> {
    const s = this.sessions.get(id);
    if (!s) return false;
    this.sessions.delete(id);
    await s.close();
    return true;
  }

  /** Close the sessions idle for longer than the limit; returns their ids. */
  async closeIdle(): Promise<string[]> {
    const limit = this.now() - this.limits.idleMs;
    const idle = [...this.sessions.values()].filter((s) => s.lastUsed < limit).map((s) => s.id);
    for (const id of idle) await this.close(id);
    return idle;
  }

  async closeAll(): Promise<void> {
    for (const id of [...this.sessions.keys()]) await this.close(id);
  }

  get size(): number {
    return this.sessions.size;
  }

  private sweepLater(): void {
    if (this.sweeper) return;
    // an unref'd timer: an idle thread or process is never kept alive by it
    this.sweeper = setInterval(() => {
      void this.closeIdle().then(() => {
        if (this.sessions.size === 0 && this.sweeper) {
          clearInterval(this.sweeper);
          this.sweeper = undefined;
        }
      });
    }, Math.max(1000, Math.min(this.limits.idleMs, 60_000)));
    this.sweeper.unref();
  }
}

/** The store of this thread. */
export const sessionStore = new SessionStore();
