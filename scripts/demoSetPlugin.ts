/**
 * Vite plugin that serves the bundled demo set (sample-spectra/) to the app:
 * in dev from the folder, in a build copied into dist/sample-spectra/, both
 * with an index.json listing the files the app should load.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import type { Plugin } from 'vite';

const NOT_SPECTRA = /(^\.|\.md$|\.json$|^truth(-[\w.-]+)?\.csv$)/i;

export function listDemoFiles(root: string): string[] {
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir).sort()) {
      if (NOT_SPECTRA.test(name)) continue;
      const p = join(dir, name);
      if (statSync(p).isDirectory()) walk(p);
      else out.push(relative(root, p).split(sep).join('/'));
    }
  };
  walk(root);
  return out;
}

export function demoSetPlugin(folder: string): Plugin {
  const index = () => JSON.stringify({ files: listDemoFiles(folder) });
  return {
    name: 'shiftmark-demo-set',
    configureServer(server) {
      server.middlewares.use((req, res, next) => {
        const url = decodeURIComponent((req.url ?? '').split('?')[0]);
        const m = /\/sample-spectra\/(.+)$/.exec(url);
        if (!m) return next();
        if (m[1] === 'index.json') {
          res.setHeader('Content-Type', 'application/json');
          res.end(index());
          return;
        }
        const rel = m[1];
        if (rel.split('/').some((part) => part === '..' || part === '')) return next();
        const p = join(folder, rel);
        const st = statSync(p, { throwIfNoEntry: false });
        if (!st?.isFile()) return next();
        res.setHeader('Content-Type', 'application/octet-stream');
        res.end(readFileSync(p));
      });
    },
    generateBundle() {
      this.emitFile({ type: 'asset', fileName: 'sample-spectra/index.json', source: index() });
      for (const rel of listDemoFiles(folder)) {
        this.emitFile({ type: 'asset', fileName: `sample-spectra/${rel}`, source: readFileSync(join(folder, rel)) });
      }
    },
  };
}
