/**
 * Results of asynchronous work by key, most recently used last, bounded by a total "size" (a count by
 * default, or bytes with a size function). A request that fails is not kept; a pending one is shared by
 * everyone asking for the same key. Pure: used by the services (levels per session) and by the screen.
 */
export class PromiseCache<T> {
  private readonly map = new Map<string, Promise<T>>();
  private readonly sizes = new Map<string, number>();
  private total = 0;

  constructor(
    private readonly limit: number,
    private readonly sizeOf: (value: T) => number = () => 1,
  ) {}

  get(key: string, make: () => Promise<T>): Promise<T> {
    const hit = this.map.get(key);
    if (hit) {
      this.map.delete(key);
      this.map.set(key, hit);
      return hit;
    }
    const p = make();
    this.map.set(key, p);
    p.then(
      (v) => {
        if (this.map.get(key) !== p) return;
        const size = this.sizeOf(v);
        this.sizes.set(key, size);
        this.total += size;
        this.trim(key);
      },
      () => {
        if (this.map.get(key) === p) this.map.delete(key);
      },
    );
    return p;
  }

  /** Forget every key (or those that start with `prefix`). */
  clear(prefix = ''): void {
    for (const k of [...this.map.keys()]) if (k.startsWith(prefix)) this.forget(k);
  }

  /** Drop the least recently used settled entries until the total fits; the one just settled stays. */
  private trim(keep: string): void {
    for (const k of [...this.map.keys()]) {
      if (this.total <= this.limit) return;
      if (k !== keep && this.sizes.has(k)) this.forget(k);
    }
  }

  private forget(key: string): void {
    this.map.delete(key);
    this.total -= this.sizes.get(key) ?? 0;
    this.sizes.delete(key);
  }
}
