/**
 * Spectra dropped into a batch opened from a packet that carried references
 * only: each file named like one of the packet's is checked by SHA-256. A
 * file with other contents is refused by name; a matching one takes the
 * packet's name for it, so it joins its entries (same key) instead of
 * becoming a new spectrum. A spectrum of a multi-object file is named
 * `file#n`; the file itself (`file`, same hash for all its spectra) is what
 * the reviewer drops. Files the packet does not name pass unchanged.
 */
import { contentHash, type TeamTag } from '../../core/team';
import type { IncomingFile } from '../state/session';

const baseName = (p: string) => p.slice(p.lastIndexOf('/') + 1);
/** The file a packet spectrum lives in: its name without a trailing `#n`. */
const containerOf = (file: string) => file.replace(/#\d+$/, '');

export async function screenAgainstPacket(tag: TeamTag | null, files: readonly IncomingFile[]): Promise<{ files: IncomingFile[]; refused: string[] }> {
  if (!tag) return { files: [...files], refused: [] };
  const byPath = new Map<string, { file: string; sha256: string }>();
  const byBase = new Map<string, { file: string; sha256: string } | null>();
  for (const s of tag.spectra) {
    const f = { file: containerOf(s.file), sha256: s.sha256 };
    byPath.set(f.file, f);
    const b = baseName(f.file);
    const seen = byBase.get(b);
    // Two packet files with one base name: only the full path decides.
    byBase.set(b, seen === undefined || (seen && seen.file === f.file) ? f : null);
  }
  const out: IncomingFile[] = [];
  const refused: string[] = [];
  for (const f of files) {
    const match = byPath.get(f.path) ?? byBase.get(baseName(f.path)) ?? null;
    if (!match) {
      out.push(f);
      continue;
    }
    const hash = await contentHash(f.bytes);
    if (hash !== match.sha256) refused.push(`${f.path}: not the packet's ${match.file} (the contents differ: SHA-256 ${hash.slice(0, 12)}… instead of ${match.sha256.slice(0, 12)}…); not added`);
    else out.push({ path: match.file, bytes: f.bytes });
  }
  return { files: out, refused };
}
