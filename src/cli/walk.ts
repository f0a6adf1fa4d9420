import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

/** Names never taken for spectra when walking a folder (documentation and truth tables). */
const SKIP_IN_FOLDERS = /(^\.|\.md$|\.json$|^truth\.csv$)/i;

/**
 * Expand files and folders into a sorted, de-duplicated list of file paths, as
 * given (relative paths stay relative). Folders are walked recursively; a file
 * named explicitly is always kept, whatever its name, even when it does not exist.
 */
export function expandInputs(inputs: readonly string[]): string[] {
  const out = new Set<string>();
  const walk = (dir: string) => {
    for (const name of readdirSync(dir).sort()) {
      if (SKIP_IN_FOLDERS.test(name)) continue;
      const p = join(dir, name);
      const st = statSync(p, { throwIfNoEntry: false });
      if (!st) continue;
      if (st.isDirectory()) walk(p);
      else if (st.isFile()) out.add(p);
    }
  };
  for (const input of inputs) {
    const st = statSync(input, { throwIfNoEntry: false });
    // A missing file stays in the list: it gets a row whose error says so.
    if (st?.isDirectory()) walk(input);
    else out.add(input);
  }
  return [...out].sort();
}
