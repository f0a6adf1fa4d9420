/**
 * The demo sample set, built in memory from one seed: simulated spectra of the
 * invented Marrow Reach field written in every layout the readers support, the
 * deliberately broken files, and the truth table. Pure (no file system), so a
 * test can rebuild it and compare bytes; scripts/make-samples.ts writes it out.
 */
import { strToU8 } from 'fflate';
import { createRng, mixSeed } from './prng';
import { makeGrid, DEFAULT_GRID } from './grid';
import { airToVacuum } from './airVacuum';
import { simulateSpectrum, FLUX_UNIT, type SimClass, type Simulated } from './simulateSpectrum';
import { drawRedshift } from './simulateBatch';
import { PLAN, FIELD_CODE, FIELD_RA_DEG, FIELD_DEC_DEG, type SampleLayout } from './samplePlan';
import { writeTextLayout, type TextLayout } from './sampleText';
import { writeFitsImageLayout, writeFitsTableLayout, type FitsAxis } from './sampleFits';
import { brokenFiles } from './sampleBroken';

/** Default seed of the committed demo set. */
export const SAMPLE_SEED = 20310414;

export interface SampleFile {
  /** Path relative to sample-spectra/, '/' separated. */
  name: string;
  bytes: Uint8Array;
}

export interface SampleTruthRow {
  file: string;
  objectId: string;
  /** '' for broken files. */
  class: SimClass | '';
  /** Star sub-type (A, G, M) or ''. */
  subtype: string;
  z: number;
  snr: number;
  layout: SampleLayout | 'broken';
  nPix: number;
  /** Vacuum wavelength of the first and last pixel, Angstrom. */
  waveMinA: number;
  waveMaxA: number;
  /** 1 when the file states air wavelengths (the reader converts them). */
  air: 0 | 1;
  /** 1 when the file carries the object id. */
  idInFile: 0 | 1;
  /** Phrase the read error must contain (broken files only). */
  expectedError: string;
}

const FILE_EXT: Record<SampleLayout, string> = {
  'csv-ivar': 'csv',
  'csv-error': 'csv',
  tsv: 'tsv',
  'text-bare': 'txt',
  'text-nm-air': 'txt',
  'csv-mask': 'csv',
  'csv-gz': 'csv.gz',
  'fits-wave-linear': 'fits',
  'fits-wave-cd': 'fits',
  'fits-wave-log': 'fits',
  'fits-dcflag-log10': 'fits',
  'fits-awav': 'fits',
  'fits-bitpix-64': 'fits',
  'fits-bitpix-16': 'fits',
  'fits-table-loglam': 'fits',
  'fits-table-wave': 'fits',
  'fits-table-arrays': 'fits',
  'fits-gz': 'fits.gz',
};

const TEXT_LAYOUTS = new Set<SampleLayout>(['csv-ivar', 'csv-error', 'tsv', 'text-bare', 'text-nm-air', 'csv-mask', 'csv-gz']);
const TABLE_LAYOUTS = new Set<SampleLayout>(['fits-table-loglam', 'fits-table-wave', 'fits-table-arrays']);

/** Pixel grid (vacuum A) of each layout, and the WCS that describes it for FITS images. */
function layoutGrid(layout: SampleLayout): { wl: Float64Array; axis?: FitsAxis } {
  const logGrid = () => makeGrid(DEFAULT_GRID);
  switch (layout) {
    case 'csv-error':
      return { wl: makeGrid({ kind: 'linear', startA: 3700, endA: 9100, stepA: 1.5 }) };
    case 'text-nm-air': {
      // Linear in air wavelength (2 A), as an air-calibrated instrument would deliver.
      const air = makeGrid({ kind: 'linear', startA: 3650, endA: 9150, stepA: 2 });
      return { wl: Float64Array.from(air, airToVacuum) };
    }
    case 'fits-wave-linear':
      return { wl: makeGrid({ kind: 'linear', startA: 3600, endA: 9200, stepA: 1.25 }), axis: { kind: 'linear', startA: 3600, stepA: 1.25 } };
    case 'fits-wave-cd': {
      const crpix = 835.5;
      const crvalA = 5000;
      const cdA = 1.6;
      const wl = Float64Array.from({ length: 3400 }, (_, i) => crvalA + cdA * (i + 1 - crpix));
      return { wl, axis: { kind: 'cd', crpix, crvalA, cdA } };
    }
    case 'fits-wave-log':
    case 'fits-gz':
      return { wl: logGrid(), axis: { kind: 'log', startA: 3600, dLog10: 1e-4 } };
    case 'fits-dcflag-log10':
      return { wl: logGrid(), axis: { kind: 'dcflag', startA: 3600, dLog10: 1e-4 } };
    case 'fits-awav': {
      const air = makeGrid({ kind: 'linear', startA: 3650, endA: 9150, stepA: 1.5 });
      return { wl: Float64Array.from(air, airToVacuum), axis: { kind: 'awav', startAirA: 3650, stepA: 1.5 } };
    }
    case 'fits-bitpix-64':
      return { wl: makeGrid({ kind: 'linear', startA: 3580, endA: 9180, stepA: 1 }), axis: { kind: 'linear', startA: 3580, stepA: 1 } };
    case 'fits-bitpix-16':
      return { wl: makeGrid({ kind: 'linear', startA: 3600, endA: 9200, stepA: 2 }), axis: { kind: 'linear', startA: 3600, stepA: 2 } };
    case 'fits-table-wave':
      return { wl: makeGrid({ kind: 'linear', startA: 3620, endA: 9180, stepA: 1.4 }) };
    default:
      return { wl: logGrid() };
  }
}

/** Round a wavelength as the text writers do, so the truth matches what a reader gets back. */
function asWritten(layout: SampleLayout, vacA: number): number {
  if (layout === 'text-nm-air') return vacA; // written in air nm to 1e-4 nm; the test tolerance covers it
  return TEXT_LAYOUTS.has(layout) ? Number(vacA.toFixed(3)) : vacA;
}

export interface SampleSet {
  files: SampleFile[];
  truth: SampleTruthRow[];
  /** The simulated spectra behind the files, keyed by file name (in memory only, for tests). */
  simulated: Map<string, Simulated>;
}

export function buildSampleSet(seed: number = SAMPLE_SEED): SampleSet {
  const files: SampleFile[] = [];
  const truth: SampleTruthRow[] = [];
  const simulated = new Map<string, Simulated>();
  const idRng = createRng(mixSeed(seed, 0x1d5));
  // Invented object ids: field code plus a 4-digit running number with random
  // gaps, dealt out in shuffled order so that the id says nothing about the class.
  const numbers: number[] = [];
  let running = 100;
  for (let k = 0; k < PLAN.length; k++) numbers.push((running += idRng.int(1, 37)));
  for (let k = numbers.length - 1; k > 0; k--) {
    const j = idRng.int(0, k);
    [numbers[k], numbers[j]] = [numbers[j], numbers[k]];
  }
  PLAN.forEach((p, k) => {
    const objectId = `${FIELD_CODE}-${String(numbers[k]).padStart(4, '0')}`;
    const rng = createRng(mixSeed(seed, 0x5a3 + k));
    const z = p.cls === 'star' ? drawRedshift('star', rng.next()) : p.z;
    const { wl, axis } = layoutGrid(p.layout);
    const name = `${objectId.toLowerCase()}.${FILE_EXT[p.layout]}`;
    const sim = simulateSpectrum(
      { class: p.cls, z, snr: p.snr, grid: wl, objectId, file: name, starType: p.starType, telluric: p.telluric ?? false, resolutionR: 2000 },
      rng,
    );
    const facts = {
      objectId,
      raDeg: FIELD_RA_DEG + rng.uniform(-0.75, 0.75),
      decDeg: FIELD_DEC_DEG + rng.uniform(-0.75, 0.75),
      dateObs: `2031-04-${String(11 + (k % 4)).padStart(2, '0')}`,
      exposureS: [2700, 3600, 4500][k % 3],
      fluxUnit: FLUX_UNIT,
    };
    let bytes: Uint8Array;
    if (TEXT_LAYOUTS.has(p.layout)) bytes = writeTextLayout(p.layout as TextLayout, sim.spectrum, facts);
    else if (TABLE_LAYOUTS.has(p.layout)) bytes = writeFitsTableLayout(p.layout as 'fits-table-loglam', sim.spectrum, facts);
    else bytes = writeFitsImageLayout(p.layout as 'fits-wave-linear', sim.spectrum, facts, axis!);
    files.push({ name, bytes });
    simulated.set(name, sim);
    truth.push({
      file: name,
      objectId,
      class: p.cls,
      subtype: sim.truth.subtype,
      z,
      snr: p.snr,
      layout: p.layout,
      nPix: wl.length,
      waveMinA: asWritten(p.layout, wl[0]),
      waveMaxA: asWritten(p.layout, wl[wl.length - 1]),
      air: p.layout === 'text-nm-air' || p.layout === 'fits-awav' ? 1 : 0,
      idInFile: p.layout === 'text-bare' ? 0 : 1,
      expectedError: '',
    });
  });
  for (const b of brokenFiles()) {
    const name = `broken/${b.name}`;
    files.push({ name, bytes: b.bytes });
    truth.push({ file: name, objectId: '', class: '', subtype: '', z: NaN, snr: NaN, layout: 'broken', nPix: 0, waveMinA: NaN, waveMaxA: NaN, air: 0, idInFile: 0, expectedError: b.expected });
  }
  files.push({ name: 'truth.csv', bytes: strToU8(truthCsv(truth)) });
  return { files, truth, simulated };
}

const TRUTH_COLUMNS = ['file', 'object_id', 'class', 'subtype', 'z', 'snr', 'layout', 'n_pix', 'wave_min_a', 'wave_max_a', 'air', 'id_in_file', 'expected_error'] as const;

/** The truth table as CSV (numbers fixed-precision; empty cells for not-applicable values). */
export function truthCsv(rows: readonly SampleTruthRow[]): string {
  const num = (v: number, d: number) => (Number.isFinite(v) ? v.toFixed(d) : '');
  const q = (s: string) => (/[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
  const lines = [TRUTH_COLUMNS.join(',')];
  for (const r of rows) {
    lines.push(
      [
        r.file,
        r.objectId,
        r.class,
        r.subtype,
        num(r.z, 6),
        num(r.snr, 1),
        r.layout,
        r.nPix ? String(r.nPix) : '',
        num(r.waveMinA, 3),
        num(r.waveMaxA, 3),
        r.layout === 'broken' ? '' : String(r.air),
        r.layout === 'broken' ? '' : String(r.idInFile),
        q(r.expectedError),
      ].join(','),
    );
  }
  return lines.join('\n') + '\n';
}

/** Parse truth.csv back into rows (for tests and evaluation scripts). */
export function parseTruthCsv(text: string): SampleTruthRow[] {
  const lines = text.split('\n').filter((l) => l.trim() !== '');
  const head = splitCsv(lines[0]);
  return lines.slice(1).map((line) => {
    const c = splitCsv(line);
    const get = (k: string) => c[head.indexOf(k)] ?? '';
    const n = (k: string) => (get(k) === '' ? NaN : Number(get(k)));
    return {
      file: get('file'),
      objectId: get('object_id'),
      class: get('class') as SimClass | '',
      subtype: get('subtype'),
      z: n('z'),
      snr: n('snr'),
      layout: get('layout') as SampleLayout | 'broken',
      nPix: get('n_pix') === '' ? 0 : Number(get('n_pix')),
      waveMinA: n('wave_min_a'),
      waveMaxA: n('wave_max_a'),
      air: get('air') === '1' ? 1 : 0,
      idInFile: get('id_in_file') === '1' ? 1 : 0,
      expectedError: get('expected_error'),
    };
  });
}

function splitCsv(line: string): string[] {
  const out: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cur += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') {
      out.push(cur);
      cur = '';
    } else cur += ch;
  }
  out.push(cur);
  return out;
}
