/** Read every published template table (Node only: scripts and tests). */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { readTemplateCsv, type TemplateTable } from '../../src/core/templates/build/readTemplateCsv';

export const TEMPLATES_DIR = join(import.meta.dirname, '..', '..', 'src', 'core', 'templates');

export function readPublished(dir = join(TEMPLATES_DIR, 'published')): TemplateTable[] {
  const out: TemplateTable[] = [];
  for (const sub of ['qso', 'galaxy', 'star']) {
    for (const f of readdirSync(join(dir, sub)).sort()) {
      if (f.endsWith('.csv')) out.push(readTemplateCsv(readFileSync(join(dir, sub, f), 'utf8'), f.replace(/\.csv$/, '')));
    }
  }
  return out;
}
