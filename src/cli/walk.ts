import { readdirSync, statSync } from 'node:fs';
import { basename, join, relative, resolve, sep } from 'node:path';

/** Names never taken for spectra when walking a folder (documentation and truth tables). */
const SKIP_IN_FOLDERS = /(^\.|\.md$|\.json$|^truth(-[\w.-]+)?\.csv$)/i;

/** An input the fitter cannot start with: a path that does not exist, or inputs holding no file at all. */
export class InputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'InputError';
  }
}

/** One file to fit: where to read it, and the name the table gives it. */
export interface InputFile {
  /** Path to read, as given or joined onto a given folder. */
  path: string;
  /**
   * The `file` column, the same as the browser writes: a file given by itself
   * is its name; a file found in a given folder is that folder's name plus the
   * path inside it ('/'-separated), as a dropped or picked folder gives.
   */
  name: string;
}

/** A '/'-separated path, whatever the platform's separator. */
function slashed(p: string): string {
  return sep === '/' ? p : p.split(sep).join('/');
}

/**
 * Expand files and folders into the files to fit, sorted by table name and
 * de-duplicated by path. Folders are walked recursively (skipping hidden files,
 * notes and truth tables); a file named explicitly is always kept, whatever its
 * name. Throws InputError naming the input for a path that does not exist, for
 * inputs that hold no file, and for two files that would get the same name.
 */
export function expandInputFiles(inputs: readonly string[]): InputFile[] {
  const byPath = new Map<string, InputFile>();
  const add = (path: string, name: string) => {
    const key = resolve(path);
    if (!byPath.has(key)) byPath.set(key, { path, name });
  };
  const walk = (dir: string, root: string, rootName: string): number => {
    let found = 0;
    for (const entry of readdirSync(dir).sort()) {
      if (SKIP_IN_FOLDERS.test(entry)) continue;
      const p = join(dir, entry);
      const st = statSync(p, { throwIfNoEntry: false });
      if (!st) continue;
      if (st.isDirectory()) found += walk(p, root, rootName);
      else if (st.isFile()) {
        add(p, `${rootName}/${slashed(relative(root, p))}`);
        found++;
      }
    }
    return found;
  };
  for (const input of inputs) {
    const st = statSync(input, { throwIfNoEntry: false });
    if (!st) throw new InputError(`${input}: no such file or folder`);
    if (st.isDirectory()) {
      // The folder's own name, also for '.' or a path ending in '/'.
      if (walk(input, input, basename(resolve(input))) === 0) throw new InputError(`${input}: the folder holds no spectrum files (hidden files, .md, .json and truth*.csv are not read)`);
    } else add(input, basename(input));
  }
  const files = [...byPath.values()];
  if (files.length === 0) throw new InputError(`no spectrum files in ${inputs.join(', ')}`);
  const byName = new Map<string, string>();
  for (const f of files) {
    const other = byName.get(f.name);
    if (other !== undefined) {
      throw new InputError(`${other} and ${f.path} would both be '${f.name}' in the file column: give their common folder instead`);
    }
    byName.set(f.name, f.path);
  }
  return files.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
}
