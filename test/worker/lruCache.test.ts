import { describe, it, expect } from 'vitest';
import { LruCache } from '../../src/worker/lruCache';

describe('LruCache', () => {
  it('evicts the least recently used entry beyond capacity', () => {
    const c = new LruCache<string, number>(2);
    c.set('a', 1);
    c.set('b', 2);
    c.get('a'); // a is now the most recent
    c.set('c', 3);
    expect(c.has('a')).toBe(true);
    expect(c.has('b')).toBe(false);
    expect(c.has('c')).toBe(true);
    expect(c.size).toBe(2);
  });

  it('replacing a key keeps one entry', () => {
    const c = new LruCache<string, number>(3);
    c.set('a', 1);
    c.set('a', 2);
    expect(c.size).toBe(1);
    expect(c.get('a')).toBe(2);
  });

  it('refuses a capacity below one', () => {
    expect(() => new LruCache(0)).toThrow(/invalid capacity/);
  });
});
