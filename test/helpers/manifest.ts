/**
 * Reads test/data/real-spectra/MANIFEST.tsv: one row per real survey spectrum
 * with the survey's redshift, pixel count and wavelength range (the numbers come
 * from the surveys' own files; see test/data/real-spectra/README.md).
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';

export interface ManifestRow {
  /** Base name without extension, e.g. 'spec-0266-51630-0168'. */
  name: string;
  survey: string;
  class: 'qso' | 'galaxy' | 'star';
  zTrue: number;
  zErr: number;
  quality: string;
  nPix: number;
  /** Vacuum Angstrom, as the manifest gives them (2 decimals). */
  lambdaMinA: number;
  lambdaMaxA: number;
  notes: string;
}

/** Folder holding MANIFEST.tsv, csv/ and fits/. */
export const REAL_SPECTRA_DIR = join(dirname(fileURLToPath(import.meta.url)), '..', 'data', 'real-spectra');

const COLUMNS = ['name', 'survey', 'class', 'z_true', 'z_err', 'quality', 'n_pix', 'lambda_min', 'lambda_max', 'notes'];

/** Parse manifest text; throws on a header or row that does not have the expected shape. */
export function parseManifest(text: string): ManifestRow[] {
  const lines = text.split(/\r?\n/).filter((l) => l.trim().length > 0);
  const header = lines[0]?.split('\t') ?? [];
  if (header.join('|') !== COLUMNS.join('|')) throw new Error(`unexpected manifest header: ${header.join(', ')}`);
  return lines.slice(1).map((line, i) => {
    const f = line.split('\t');
    if (f.length !== COLUMNS.length) throw new Error(`manifest row ${i + 2} has ${f.length} fields, expected ${COLUMNS.length}`);
    const num = (s: string, what: string) => {
      const v = Number(s);
      if (s.trim() === '' || !Number.isFinite(v)) throw new Error(`manifest row ${i + 2}: ${what} '${s}' is not a number`);
      return v;
    };
    const cls = f[2];
    if (cls !== 'qso' && cls !== 'galaxy' && cls !== 'star') throw new Error(`manifest row ${i + 2}: unknown class '${cls}'`);
    return {
      name: f[0],
      survey: f[1],
      class: cls,
      zTrue: num(f[3], 'z_true'),
      zErr: num(f[4], 'z_err'),
      quality: f[5],
      nPix: num(f[6], 'n_pix'),
      lambdaMinA: num(f[7], 'lambda_min'),
      lambdaMaxA: num(f[8], 'lambda_max'),
      notes: f[9],
    };
  });
}

export function readManifest(): ManifestRow[] {
  return parseManifest(readFileSync(join(REAL_SPECTRA_DIR, 'MANIFEST.tsv'), 'utf8'));
}
