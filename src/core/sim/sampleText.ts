/**
 * Text layouts of the demo set: CSV/TSV/whitespace columns written from a
 * simulated spectrum. Pure: returns bytes, touches no file system.
 */
import { strToU8, gzipSync } from 'fflate';
import type { Spectrum } from '../types';
import { vacuumToAir } from './airVacuum';

/** Facts written into comment lines. */
export interface TextFacts {
  objectId: string;
  raDeg: number;
  decDeg: number;
  dateObs: string;
  exposureS: number;
  fluxUnit: string;
}

const NOTE = 'Synthetic spectrum from the Shiftmark simulator: not a real observation.';

function commentBlock(f: TextFacts, extra: string[] = []): string[] {
  return [
    `# ${NOTE}`,
    `# object: ${f.objectId}`,
    `# ra: ${f.raDeg.toFixed(5)}`,
    `# dec: ${f.decDeg.toFixed(5)}`,
    `# date_obs: ${f.dateObs}`,
    `# exptime: ${f.exposureS}`,
    `# flux_unit: ${f.fluxUnit}`,
    ...extra,
  ];
}

/** Flux to 5 significant digits, ivar and errors to 4: enough for any S/N here and small files. */
const fFlux = (v: number) => (v === 0 ? '0' : v.toPrecision(5));
const fUnc = (v: number) => (v === 0 ? '0' : v.toPrecision(4));
const fWave = (v: number) => v.toFixed(3);

/** 1-sigma error from inverse variance; 0 where ivar is 0 (readers take an error of 0 as "no information"). */
function errorOf(ivar: number): number {
  return ivar > 0 ? 1 / Math.sqrt(ivar) : 0;
}

function join(lines: string[]): Uint8Array {
  return strToU8(lines.join('\n') + '\n');
}

export type TextLayout = 'csv-ivar' | 'csv-error' | 'tsv' | 'text-bare' | 'text-nm-air' | 'csv-mask' | 'csv-gz';

/** Bytes of one text layout. For 'text-nm-air' the wavelengths are written in air, in nm. */
export function writeTextLayout(layout: TextLayout, s: Spectrum, f: TextFacts): Uint8Array {
  const wl = s.wavelengthA;
  const n = wl.length;
  const ivar = s.ivar ?? new Float64Array(n);
  const rows: string[] = [];
  switch (layout) {
    case 'csv-ivar':
    case 'csv-gz': {
      rows.push(...commentBlock(f), 'wavelength,flux,ivar');
      for (let i = 0; i < n; i++) rows.push(`${fWave(wl[i])},${fFlux(s.flux[i])},${fUnc(ivar[i])}`);
      const bytes = join(rows);
      // mtime 0: no time stamp, so the same seed gives the same bytes.
      return layout === 'csv-gz' ? gzipSync(bytes, { level: 9, mtime: 0 }) : bytes;
    }
    case 'csv-error':
      rows.push(...commentBlock(f), 'wavelength,flux,error');
      for (let i = 0; i < n; i++) rows.push(`${fWave(wl[i])},${fFlux(s.flux[i])},${fUnc(errorOf(ivar[i]))}`);
      return join(rows);
    case 'tsv':
      rows.push(...commentBlock(f), 'wave\tflux\tivar');
      for (let i = 0; i < n; i++) rows.push(`${fWave(wl[i])}\t${fFlux(s.flux[i])}\t${fUnc(ivar[i])}`);
      return join(rows);
    case 'text-bare':
      // No header and no comments: wavelength (vacuum A), flux, 1-sigma error by position.
      for (let i = 0; i < n; i++) rows.push(`${fWave(wl[i]).padStart(9)}  ${fFlux(s.flux[i]).padStart(11)}  ${fUnc(errorOf(ivar[i])).padStart(10)}`);
      return join(rows);
    case 'text-nm-air':
      rows.push(...commentBlock(f, ['# wavelength: air, nm', '# columns: wavelength flux error']));
      for (let i = 0; i < n; i++) rows.push(`${(vacuumToAir(wl[i]) / 10).toFixed(4)} ${fFlux(s.flux[i])} ${fUnc(errorOf(ivar[i]))}`);
      return join(rows);
    case 'csv-mask':
      rows.push(...commentBlock(f), 'wavelength,flux,ivar,mask');
      for (let i = 0; i < n; i++) rows.push(`${fWave(wl[i])},${fFlux(s.flux[i])},${fUnc(ivar[i])},${s.mask[i]}`);
      return join(rows);
  }
}
