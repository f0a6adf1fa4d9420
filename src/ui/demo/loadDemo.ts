/**
 * The bundled demo set: `sample-spectra/index.json` ({"files": [relative
 * paths]}) and each file, fetched relative to the page, so the app asks
 * only its own origin.
 */
import type { IncomingFile } from '../state/session';

export const DEMO_FOLDER = 'sample-spectra';
/** Sub-folder of the demo set holding files that are meant to fail. */
export const BROKEN_FOLDER = 'broken';

export interface DemoIndex {
  files: string[];
}

/** Accept only plain relative paths inside the demo folder. */
function safeRelativePath(p: unknown): p is string {
  return typeof p === 'string' && p.length > 0 && p.length < 500 && !p.startsWith('/') && !p.includes('\\') && !/^[a-z]+:/i.test(p) && p.split('/').every((part) => part !== '..' && part !== '.' && part !== '');
}

export function parseDemoIndex(json: unknown): DemoIndex {
  const files = (json as { files?: unknown })?.files;
  if (!Array.isArray(files)) throw new Error('demo index has no "files" list');
  const bad = files.filter((f) => !safeRelativePath(f));
  if (bad.length) throw new Error(`demo index lists unsafe paths: ${bad.slice(0, 3).map(String).join(', ')}`);
  return { files: files as string[] };
}

export async function loadDemo(
  fetchFn: typeof fetch = fetch,
  onProgress?: (loaded: number, total: number) => void,
  base = `./${DEMO_FOLDER}/`,
): Promise<IncomingFile[]> {
  const res = await fetchFn(`${base}index.json`);
  if (!res.ok) throw new Error(`demo set not found (HTTP ${res.status} for ${base}index.json)`);
  const index = parseDemoIndex(await res.json());
  const out: IncomingFile[] = [];
  let loaded = 0;
  // A few requests at a time: quick on a local server, gentle on a slow disk.
  const CONCURRENT = 6;
  const queue = [...index.files];
  const results = new Map<string, Uint8Array>();
  await Promise.all(
    Array.from({ length: CONCURRENT }, async () => {
      for (let rel = queue.shift(); rel !== undefined; rel = queue.shift()) {
        const r = await fetchFn(base + rel.split('/').map(encodeURIComponent).join('/'));
        if (!r.ok) throw new Error(`demo file ${rel} not found (HTTP ${r.status})`);
        results.set(rel, new Uint8Array(await r.arrayBuffer()));
        onProgress?.(++loaded, index.files.length);
      }
    }),
  );
  // The deliberately broken examples come after the spectra, so the list opens on something to review.
  const broken = (rel: string) => rel.startsWith(`${BROKEN_FOLDER}/`);
  const ordered = [...index.files.filter((r) => !broken(r)), ...index.files.filter(broken)];
  for (const rel of ordered) out.push({ path: `${DEMO_FOLDER}/${rel}`, bytes: results.get(rel)! });
  return out;
}

/** True when the page address asks for the demo set at once (`?demo`). */
export function wantsDemo(search: string): boolean {
  return new URLSearchParams(search).has('demo');
}
