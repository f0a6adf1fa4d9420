/**
 * Deterministic sharding of an input list for batch schedulers: shard i of n
 * (1-based) takes every n-th file of the sorted list, starting at i-1, so the
 * shards are disjoint, cover the list, and need no coordination.
 */
export interface ShardSpec {
  index: number;
  count: number;
}

export function parseShard(text: string): ShardSpec {
  const m = /^(\d+)\/(\d+)$/.exec(text.trim());
  if (!m) throw new Error(`invalid shard "${text}": expected i/n, e.g. 3/16`);
  const index = Number(m[1]);
  const count = Number(m[2]);
  if (count < 1 || index < 1 || index > count) throw new Error(`invalid shard "${text}": need 1 <= i <= n`);
  return { index, count };
}

export function selectShard<T>(sortedItems: readonly T[], shard: ShardSpec): T[] {
  return sortedItems.filter((_, k) => k % shard.count === shard.index - 1);
}

/** FNV-1a 32-bit hash of the whole input list, written into every shard table so merge can tell shards of different runs apart. */
export function listFingerprint(items: readonly string[]): string {
  let h = 0x811c9dc5;
  for (const s of items) {
    for (let i = 0; i < s.length; i++) {
      h ^= s.charCodeAt(i);
      h = Math.imul(h, 0x01000193) >>> 0;
    }
    h ^= 0x0a;
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h.toString(16).padStart(8, '0');
}
