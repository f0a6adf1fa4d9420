/**
 * Test helpers for the engine: spectra made from published templates that
 * the fitted families leave out (held-out tests), with the simulator's PRNG.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { buildAllFamilies } from '../../../src/core/templates/build/buildAll';
import { readTemplateCsv, type TemplateTable } from '../../../src/core/templates/build/readTemplateCsv';
import { familyFromBasis, type Family } from '../../../src/core/engine/family';
import { observeTemplate, type HeldOutLayout } from '../../../src/core/sim/fromTemplate';
import { createRng } from '../../../src/core/sim/prng';
import type { Spectrum } from '../../../src/core/types';

const DIR = join(import.meta.dirname, '..', '..', '..', 'src', 'core', 'templates', 'published');
let tables: TemplateTable[] | null = null;

/** Every published table (read once per test file). */
export function publishedTables(): TemplateTable[] {
  if (!tables) {
    tables = [];
    for (const sub of ['qso', 'galaxy', 'star']) {
      for (const f of readdirSync(join(DIR, sub)).sort()) if (f.endsWith('.csv')) tables.push(readTemplateCsv(readFileSync(join(DIR, sub, f), 'utf8'), f.replace(/\.csv$/, '')));
    }
  }
  return tables;
}

export function table(name: string): TemplateTable {
  const t = publishedTables().find((x) => x.name === name);
  if (!t) throw new Error(`no published table ${name}`);
  return t;
}

/** The engine's families rebuilt without the named tables. */
export function familiesWithout(...names: string[]): Family[] {
  return buildAllFamilies(publishedTables(), new Set(names)).map(familyFromBasis);
}

/** A simulated observation of a published table at z (fixed seed). */
export function observe(name: string, z: number, snr: number, seed: number, layout: HeldOutLayout = 'log-3800-9200'): Spectrum {
  const t = table(name);
  return observeTemplate({ restWavelengthA: t.wavelengthA, restFlux: t.flux, z, snr, layout, file: `${name}-z${z}.csv` }, createRng(seed));
}

/** Velocity difference of two redshifts, km/s (c ln((1+z2)/(1+z1))). */
export function dvKms(z1: number, z2: number): number {
  return 299792.458 * Math.log((1 + z2) / (1 + z1));
}
