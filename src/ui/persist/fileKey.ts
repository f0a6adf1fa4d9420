/**
 * A stable key for a file: its path as given, its size in bytes and a
 * 32-bit FNV-1a hash of its content. The same file dropped twice gets the
 * same key (so results and decisions attach to it again); two different
 * files with the same name do not collide.
 * FNV-1a: Fowler, Noll & Vo, IETF draft-eastlake-fnv (common practice).
 */
export function fnv1a32(bytes: Uint8Array): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < bytes.length; i++) {
    h ^= bytes[i];
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

export function fileKey(path: string, bytes: Uint8Array): string {
  return `${path}|${bytes.length}|${fnv1a32(bytes).toString(16).padStart(8, '0')}`;
}
