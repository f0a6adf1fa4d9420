/**
 * A small least-recently-used map: the worker keeps the last few parsed
 * spectra so that moving between candidates or naming a line does not
 * re-read the file each time.
 */
export class LruCache<K, V> {
  private readonly map = new Map<K, V>();

  /** @param capacity most entries kept (>= 1). */
  constructor(readonly capacity: number) {
    if (!(capacity >= 1)) throw new Error(`invalid capacity: ${capacity}`);
  }

  get size(): number {
    return this.map.size;
  }

  get(key: K): V | undefined {
    const value = this.map.get(key);
    if (value === undefined) return undefined;
    // Re-insert so that Map's insertion order doubles as recency order.
    this.map.delete(key);
    this.map.set(key, value);
    return value;
  }

  has(key: K): boolean {
    return this.map.has(key);
  }

  set(key: K, value: V): void {
    this.map.delete(key);
    this.map.set(key, value);
    while (this.map.size > this.capacity) {
      const oldest = this.map.keys().next().value as K;
      this.map.delete(oldest);
    }
  }

  delete(key: K): boolean {
    return this.map.delete(key);
  }

  clear(): void {
    this.map.clear();
  }
}
