// The command-line tools (`npm run fit`, `npm run merge`) run from JavaScript
// bundled for Node by esbuild, so a task starts without compiling TypeScript.
// Plain JavaScript on purpose: it must run before anything is built.
//
//   node scripts/cli-bundle.mjs            build if stale (npm's prepare step runs this)
//   node scripts/cli-bundle.mjs run fit …  build if stale, then run the tool
//
// Never stale: the bundle records a SHA-256 hash of the content of every file
// under src/, of package-lock.json and of this script; any difference rebuilds
// before the tool runs. Tasks that start together (a job array) may build at
// once: each writes to a folder of its own and moves every file into place by
// rename, the hash last, so a reader never sees a half-written file.
import { createHash } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

export const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
/** Where the bundle lives: a cache inside node_modules (npm ci starts it afresh). */
export const BUNDLE_DIR = join(ROOT, 'node_modules', '.cache', 'shiftmark-cli');
/** Tools and the worker thread's entry, each one self-contained ES module. */
const ENTRIES = { fit: 'src/cli/fit.ts', merge: 'src/cli/merge.ts', reconcile: 'src/cli/reconcile.ts', fitThread: 'src/cli/fitThread.ts' };
const STAMP = 'source-hash.txt';

/** Every file under `dir`, sorted, as paths relative to `root` with '/' separators. */
function filesUnder(root, dir) {
  const out = [];
  const walk = (d) => {
    for (const e of readdirSync(d, { withFileTypes: true }).sort((a, b) => (a.name < b.name ? -1 : 1))) {
      const p = join(d, e.name);
      if (e.isDirectory()) walk(p);
      else if (e.isFile()) out.push(relative(root, p).split(sep).join('/'));
    }
  };
  walk(join(root, dir));
  return out;
}

/** SHA-256 over the names and contents of the sources the bundle is built from. */
export function sourceHash(root = ROOT) {
  const h = createHash('sha256');
  const files = [...filesUnder(root, 'src'), 'package-lock.json', 'scripts/cli-bundle.mjs'];
  for (const f of files) {
    let bytes;
    try {
      bytes = readFileSync(join(root, f));
    } catch {
      bytes = Buffer.alloc(0); // no lock file in a bare checkout: hashed as empty
    }
    h.update(`${f}\0${bytes.length}\0`);
    h.update(bytes);
  }
  return h.digest('hex');
}

/** The hash the bundle in `outDir` was built from, or null. */
function builtHash(outDir) {
  try {
    return readFileSync(join(outDir, STAMP), 'utf8').trim();
  } catch {
    return null;
  }
}

/** Write `text` to `path` by rename, so no reader sees it half written. */
function writeAtomic(path, text) {
  const tmp = `${path}.${process.pid}.tmp`;
  writeFileSync(tmp, text);
  renameSync(tmp, path);
}

/** Build the bundle into `outDir` from the sources of `root`. */
export async function buildCli({ root = ROOT, outDir = BUNDLE_DIR, hash = sourceHash(root) } = {}) {
  const { build } = await import('esbuild');
  const work = `${outDir}.build-${process.pid}-${Date.now()}`;
  try {
    await build({
      absWorkingDir: root,
      entryPoints: Object.fromEntries(Object.entries(ENTRIES).map(([name, src]) => [name, join(root, src)])),
      outdir: work,
      outExtension: { '.js': '.mjs' },
      bundle: true,
      platform: 'node',
      format: 'esm',
      target: 'node20',
      sourcemap: 'linked',
      logLevel: 'warning',
      // Bundled CommonJS packages (d3-dsv's iconv-free reader, fft.js) may call require: give ES modules one.
      banner: { js: "import { createRequire as __shiftmarkRequire } from 'node:module'; const require = __shiftmarkRequire(import.meta.url);" },
    });
    mkdirSync(outDir, { recursive: true });
    for (const f of readdirSync(work)) renameSync(join(work, f), join(outDir, f));
    writeAtomic(join(outDir, STAMP), hash);
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}

/** Build unless the bundle was built from exactly the sources there are now. */
export async function ensureCli({ root = ROOT, outDir = BUNDLE_DIR, log = (s) => process.stderr.write(s) } = {}) {
  const hash = sourceHash(root);
  if (builtHash(outDir) === hash) return false;
  log('building the command-line tools (once per change of the sources)...\n');
  await buildCli({ root, outDir, hash });
  return true;
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const [mode, tool] = process.argv.slice(2);
  if (mode === 'run') {
    if (tool !== 'fit' && tool !== 'merge' && tool !== 'reconcile') {
      process.stderr.write(`error: unknown tool '${tool}' (fit, merge or reconcile)\n`);
      process.exit(2);
    }
    await ensureCli();
    // The tool reads its options from process.argv.slice(2), as if started directly.
    process.argv.splice(2, 2);
    await import(pathToFileURL(join(BUNDLE_DIR, `${tool}.mjs`)).href);
  } else {
    await ensureCli({ log: () => undefined });
  }
}
