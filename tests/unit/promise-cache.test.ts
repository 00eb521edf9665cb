import { describe, expect, it } from 'vitest';
import { PromiseCache } from '../../app/promise-cache.js';

// The cache behind the levels of a session and the screen's data: least recently used out first.
describe('PromiseCache', () => {
  it('shares one pending request per key and does not keep a failed one', async () => {
    const c = new PromiseCache<number>(10);
    let made = 0;
    const make = () => new Promise<number>((r) => setTimeout(() => r(++made), 5));
    const [a, b] = await Promise.all([c.get('k', make), c.get('k', make)]);
    expect([a, b, made]).toEqual([1, 1, 1]);
    await expect(c.get('bad', () => Promise.reject(new Error('no')))).rejects.toThrow('no');
    expect(await c.get('bad', async () => 7)).toBe(7);
  });

  it('drops the least recently used entries beyond the limit, counting by size when given', async () => {
    const c = new PromiseCache<Float32Array>(100, (a) => a.byteLength);
    let made = 0;
    const level = (bytes: number) => async () => (made++, new Float32Array(bytes / 4));
    await c.get('a', level(40));
    await c.get('b', level(40));
    await c.get('a', level(40)); // a is now the most recent
    await c.get('c', level(40)); // 120 bytes: b goes
    expect(made).toBe(3);
    await c.get('a', level(40));
    await c.get('c', level(40));
    expect(made).toBe(3);
    await c.get('b', level(40));
    expect(made).toBe(4);
  });

  it('forgets by prefix', async () => {
    const c = new PromiseCache<number>(10);
    let made = 0;
    for (const k of ['po4:1', 'po4:2', 'o2:1']) await c.get(k, async () => ++made);
    c.clear('po4:');
    await c.get('o2:1', async () => ++made);
    await c.get('po4:1', async () => ++made);
    expect(made).toBe(4);
  });
});
