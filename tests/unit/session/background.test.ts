/**
 * Work computed ahead for a session (app/session/background.ts): it waits while a request is served, goes on when
 * none is, runs one task after another, is computed once and shared, and a request that wants a task makes it go
 * on at once (even while requests are served). Only order is checked, never time; every wait is for an event.
 */
import { describe, expect, it } from 'vitest';
import { BackgroundQueue, allowBackground, requestEnded, requestStarted, type TaskContext } from '../../../app/session/background.js';

/** A task of `steps` steps that records each step in `log` and pauses before each. */
function stepper(name: string, steps: number, log: string[]): (t: TaskContext) => Promise<string> {
  return async (t) => {
    for (let i = 0; i < steps; i++) {
      await t.pause();
      log.push(`${name}${i}`);
    }
    return name;
  };
}

/** Resolves after the event loop has turned `n` times (setImmediate), for steps that could run to run. */
async function turns(n: number): Promise<void> {
  for (let i = 0; i < n; i++) await new Promise<void>((r) => setImmediate(r));
}

describe('background work of a session', () => {
  it('computes nothing ahead where it is not allowed (the command line, tests)', async () => {
    const q = new BackgroundQueue();
    const log: string[] = [];
    q.ahead('a', stepper('a', 2, log));
    await turns(10);
    expect(log).toEqual([]);
    expect(q.has('a')).toBe(false);
    // asked for, it is computed
    await expect(q.want('a', stepper('a', 2, log))).resolves.toBe('a');
    expect(log).toEqual(['a0', 'a1']);
  });

  it('waits while a request is served, runs tasks one after another, and goes on when no request is left', async () => {
    allowBackground();
    const q = new BackgroundQueue();
    const log: string[] = [];
    requestStarted();
    q.ahead('a', stepper('a', 2, log));
    q.ahead('b', stepper('b', 2, log));
    await turns(10);
    expect(log).toEqual([]); // a request is being served
    requestEnded();
    const b = q.want('b', async () => 'never called: b is known');
    await expect(b).resolves.toBe('b');
    expect(log.indexOf('b0')).toBeLessThan(log.indexOf('b1'));
    await q.want('a', async () => 'never called: a is known');
    expect([...log].sort()).toEqual(['a0', 'a1', 'b0', 'b1']);
    expect(log.indexOf('a0')).toBeLessThan(log.indexOf('a1'));
    q.close();
  });

  it('a task a request waits for goes on while that request is served; others wait', async () => {
    allowBackground();
    const q = new BackgroundQueue();
    const log: string[] = [];
    q.ahead('slow', stepper('slow', 3, log));
    requestStarted(); // the request that will want 'fast'
    const fast = q.want('fast', stepper('fast', 3, log));
    await expect(fast).resolves.toBe('fast');
    expect(log.filter((x) => x.startsWith('slow'))).toEqual([]); // still held: a request is served
    requestEnded();
    q.close();
  });

  it('a request that waits for work "later" neither hurries it nor holds it up, and the work keeps its turn', async () => {
    allowBackground();
    const q = new BackgroundQueue();
    const log: string[] = [];
    requestStarted(); // the banner's request, served on this thread
    q.ahead('table', stepper('table', 2, log));
    const banner = q.later('spin-up', stepper('spin', 2, log));
    await expect(banner).resolves.toBe('spin');
    // the table's rows were queued first and are done first
    expect(log).toEqual(['table0', 'table1', 'spin0', 'spin1']);
    requestEnded();
    q.close();
  });

  it('closing the session refuses those waiting for a task that never started', async () => {
    allowBackground();
    const q = new BackgroundQueue();
    requestStarted();
    q.ahead('first', stepper('first', 1, []));
    const waiting = q.want('second', stepper('second', 1, []));
    const queued = q.later('third', stepper('third', 1, []));
    q.close();
    await expect(queued).rejects.toMatchObject({ code: 'E_CANCELLED' });
    requestEnded();
    await expect(waiting).resolves.toBe('second');
  });

  it('computes a task once and shares it; a failed task is computed again when asked', async () => {
    const q = new BackgroundQueue();
    let runs = 0;
    const work = async (): Promise<number> => ++runs;
    const [x, y] = await Promise.all([q.want('k', work), q.want('k', work)]);
    expect([x, y, runs]).toEqual([1, 1, 1]);
    let fails = 0;
    const failing = async (): Promise<number> => {
      if (++fails === 1) throw new Error('first time');
      return fails;
    };
    await expect(q.want('f', failing)).rejects.toThrow('first time');
    await expect(q.want('f', failing)).resolves.toBe(2);
  });

  it('closing the session stops its tasks at their next pause', async () => {
    allowBackground();
    const q = new BackgroundQueue();
    const log: string[] = [];
    let sawAbort = false;
    requestStarted();
    q.ahead('a', async (t) => {
      await t.pause();
      sawAbort = t.signal.aborted;
      log.push('after pause');
    });
    q.close();
    await turns(5);
    requestEnded();
    await turns(5);
    expect(log).toEqual(['after pause']);
    expect(sawAbort).toBe(true);
  });
});
