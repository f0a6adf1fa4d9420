/**
 * Inputs of the headless fitter: which files a list of paths expands to, the
 * name each gets in the `file` column (the same as the browser gives), and
 * the inputs it refuses before any work.
 */
import { describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { expandInputFiles, InputError } from '../../src/cli/walk';
import { collectFromFileList } from '../../src/ui/intake/collectFiles';

function tree(): string {
  const root = mkdtempSync(join(tmpdir(), 'shiftmark-walk-'));
  mkdirSync(join(root, 'night1', 'red'), { recursive: true });
  mkdirSync(join(root, 'empty'));
  mkdirSync(join(root, 'notes-only'));
  writeFileSync(join(root, 'night1', 'b.fits'), 'b');
  writeFileSync(join(root, 'night1', 'a.csv'), 'a');
  writeFileSync(join(root, 'night1', 'red', 'c.fits'), 'c');
  writeFileSync(join(root, 'night1', 'README.md'), 'notes');
  writeFileSync(join(root, 'night1', '.hidden'), 'x');
  writeFileSync(join(root, 'notes-only', 'truth.csv'), 'file,z');
  writeFileSync(join(root, 'notes-only', 'truth-plate.csv'), 'id,z'); // a multi-object file's own truth table
  writeFileSync(join(root, 'single.txt'), 's');
  return root;
}

describe('expandInputFiles', () => {
  const root = tree();

  it('names a folder\'s files by the folder name and the path inside it, sorted, skipping notes and hidden files', () => {
    const files = expandInputFiles([join(root, 'night1')]);
    expect(files.map((f) => f.name)).toEqual(['night1/a.csv', 'night1/b.fits', 'night1/red/c.fits']);
    expect(files.map((f) => f.path)).toEqual([join(root, 'night1', 'a.csv'), join(root, 'night1', 'b.fits'), join(root, 'night1', 'red', 'c.fits')]);
  });

  it('gives the same names for an absolute, a relative and a slash-ended folder path (no machine path leaks into the table)', () => {
    const abs = expandInputFiles([join(root, 'night1')]).map((f) => f.name);
    const rel = expandInputFiles([relative(process.cwd(), join(root, 'night1'))]).map((f) => f.name);
    const slash = expandInputFiles([join(root, 'night1') + '/']).map((f) => f.name);
    expect(rel).toEqual(abs);
    expect(slash).toEqual(abs);
    for (const n of abs) expect(n).not.toContain(root);
  });

  it('names a file given by itself by its name, whatever its extension', () => {
    expect(expandInputFiles([join(root, 'single.txt')])).toEqual([{ path: join(root, 'single.txt'), name: 'single.txt' }]);
  });

  it('matches the browser: a picked folder (webkitRelativePath starts with the folder name, File and Directory Entries API) and picked files', async () => {
    const cli = expandInputFiles([join(root, 'night1'), join(root, 'single.txt')]).map((f) => f.name);
    const picked = (name: string, relPath: string) => {
      const f = new File(['x'], name);
      Object.defineProperty(f, 'webkitRelativePath', { value: relPath });
      return f;
    };
    const browser = await collectFromFileList([
      picked('a.csv', 'night1/a.csv'),
      picked('b.fits', 'night1/b.fits'),
      picked('c.fits', 'night1/red/c.fits'),
      picked('single.txt', ''), // a file picked by itself has an empty webkitRelativePath
    ]);
    expect(cli).toEqual(browser.files.map((f) => f.path).sort());
  });

  it('refuses a missing path, naming it', () => {
    const missing = join(root, 'no-such.fits');
    expect(() => expandInputFiles([join(root, 'single.txt'), missing])).toThrow(InputError);
    expect(() => expandInputFiles([missing])).toThrow(`${missing}: no such file or folder`);
  });

  it('refuses a folder that holds no spectrum file, naming it', () => {
    expect(() => expandInputFiles([join(root, 'empty')])).toThrow(`${join(root, 'empty')}: the folder holds no spectrum files`);
    expect(() => expandInputFiles([join(root, 'notes-only'), join(root, 'single.txt')])).toThrow(/notes-only: the folder holds no spectrum files/);
  });

  it('refuses two files that would share a name, and takes a file given twice once', () => {
    const other = join(root, 'other');
    mkdirSync(join(other, 'night1'), { recursive: true });
    writeFileSync(join(other, 'night1', 'a.csv'), 'a2');
    expect(() => expandInputFiles([join(root, 'night1'), join(other, 'night1')])).toThrow(/would both be 'night1\/a\.csv'/);
    expect(expandInputFiles([join(root, 'single.txt'), join(root, 'single.txt')])).toHaveLength(1);
  });
});
