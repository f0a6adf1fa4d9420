import { describe, expect, it } from 'vitest';
import { listFingerprint, parseShard, selectShard } from '../../src/cli/shard';

describe('selectShard(items, {index, count})', () => {
  const items = Array.from({ length: 103 }, (_, i) => `f${String(i).padStart(4, '0')}.fits`);
  it('gives disjoint shards that together cover every input exactly once', () => {
    const seen = new Map<string, number>();
    for (let i = 1; i <= 7; i++) {
      for (const f of selectShard(items, { index: i, count: 7 })) seen.set(f, (seen.get(f) ?? 0) + 1);
    }
    expect(seen.size).toBe(items.length);
    expect([...seen.values()].every((n) => n === 1)).toBe(true);
  });
  it('balances shard sizes to within one file', () => {
    const sizes = [1, 2, 3, 4].map((i) => selectShard(items, { index: i, count: 4 }).length);
    expect(Math.max(...sizes) - Math.min(...sizes)).toBeLessThanOrEqual(1);
  });
  it('parseShard rejects malformed or out-of-range specs', () => {
    expect(parseShard('3/16')).toEqual({ index: 3, count: 16 });
    expect(() => parseShard('0/4')).toThrow(/1 <= i <= n/);
    expect(() => parseShard('5/4')).toThrow(/1 <= i <= n/);
    expect(() => parseShard('a/b')).toThrow(/expected i\/n/);
  });
  it('listFingerprint changes when the input list changes', () => {
    expect(listFingerprint(['a', 'b'])).toBe(listFingerprint(['a', 'b']));
    expect(listFingerprint(['a', 'b'])).not.toBe(listFingerprint(['a', 'c']));
    expect(listFingerprint(['ab'])).not.toBe(listFingerprint(['a', 'b']));
  });
});
