/**
 * An invented 64-fibre plate of the demo scenario (field "Marrow Reach", plate
 * P01): one FITS file whose primary image holds one spectrum per fibre on a
 * shared log-linear wavelength axis, with IVAR and MASK images of the same
 * shape and a fibre table (FIBERID, OBJECT, OBJTYPE, RA, DEC). Eight fibres
 * are sky, two unused, and one target fibre is dead (inverse variance 0
 * everywhere, which the table does not say), so a reader must drop ten rows
 * and refuse one on its own. Pure: returns bytes and the truth.
 *
 * scripts/make-samples.ts writes it to sample-spectra/ beside the demo set of
 * buildSampleSet (whose files stay as they were), with its own truth table,
 * PLATE_TRUTH_NAME (plateTruthCsv).
 */
import { createRng, mixSeed } from './prng';
import { makeGrid, DEFAULT_GRID } from './grid';
import { simulateSpectrum, FLUX_UNIT, type SimClass } from './simulateSpectrum';
import { drawRedshift } from './simulateBatch';
import { FIELD_CODE, FIELD_DEC_DEG, FIELD_RA_DEG } from './samplePlan';
import { writeBinTableHdu, writeFitsFile, writeImageHdu, type FitsCardInput } from '../io/fits/write';
import type { SampleFile } from './sampleSet';

export const PLATE_FIBRES = 64;
export const PLATE_NAME = 'mrx-plate-p01.fits';
/** Fibres (1-based) that look at blank sky, that hold no fibre, and the dead target fibre. */
export const PLATE_SKY_FIBRES: readonly number[] = [5, 13, 21, 29, 37, 45, 53, 61];
export const PLATE_UNUSED_FIBRES: readonly number[] = [32, 64];
export const PLATE_DEAD_FIBRE = 42;
/** The plate's truth table in sample-spectra/ (the fitter and the demo loader skip truth*.csv). */
export const PLATE_TRUTH_NAME = 'truth-plate.csv';

export interface PlateTruthRow {
  fibre: number;
  /** The id readSpectra gives this fibre's spectrum: `${PLATE_NAME}#${fibre}`. */
  id: string;
  /** Invented object id ('' for sky and unused fibres). */
  objectId: string;
  type: 'TARGET' | 'SKY' | 'UNUSED';
  class: SimClass | '';
  subtype: string;
  /** Simulator input redshift (NaN for sky and unused fibres). */
  z: number;
  snr: number;
  raDeg: number;
  decDeg: number;
  /** What a reader should give: a spectrum, nothing (dropped), or an error. */
  expect: 'spectrum' | 'dropped' | 'error';
}

/** Classes of the target fibres in turn (invented proportions, quasar-candidate follow-up). */
const CLASSES: readonly SimClass[] = ['qso', 'qso', 'galaxy-sf', 'star', 'qso', 'galaxy-passive', 'qso', 'galaxy-sf', 'star', 'qso'];

export function buildSamplePlate(seed: number): { file: SampleFile; truth: PlateTruthRow[] } {
  const wl = makeGrid(DEFAULT_GRID);
  const n = wl.length;
  const flux = new Float32Array(PLATE_FIBRES * n);
  const ivar = new Float32Array(PLATE_FIBRES * n);
  const mask = new Int16Array(PLATE_FIBRES * n);
  const truth: PlateTruthRow[] = [];
  const posRng = createRng(mixSeed(seed, 0x9a7e));
  let target = 0;
  for (let f = 1; f <= PLATE_FIBRES; f++) {
    const row = (f - 1) * n;
    const type: PlateTruthRow['type'] = PLATE_SKY_FIBRES.includes(f) ? 'SKY' : PLATE_UNUSED_FIBRES.includes(f) ? 'UNUSED' : 'TARGET';
    const raDeg = FIELD_RA_DEG + posRng.uniform(-0.75, 0.75);
    const decDeg = FIELD_DEC_DEG + posRng.uniform(-0.75, 0.75);
    const rng = createRng(mixSeed(seed, 0x7a00 + f));
    if (type === 'SKY') {
      // Sky-subtracted blank sky: noise about zero.
      const sigma = rng.uniform(0.3, 1.5);
      for (let i = 0; i < n; i++) {
        flux[row + i] = sigma * rng.gaussian();
        ivar[row + i] = 1 / (sigma * sigma);
      }
      truth.push({ fibre: f, id: `${PLATE_NAME}#${f}`, objectId: '', type, class: '', subtype: '', z: NaN, snr: NaN, raDeg, decDeg, expect: 'dropped' });
      continue;
    }
    if (type === 'UNUSED') {
      truth.push({ fibre: f, id: `${PLATE_NAME}#${f}`, objectId: '', type, class: '', subtype: '', z: NaN, snr: NaN, raDeg, decDeg, expect: 'dropped' });
      continue; // zeros everywhere
    }
    const cls = CLASSES[target % CLASSES.length];
    target++;
    const z = drawRedshift(cls, rng.next());
    const snr = rng.logUniform(2, 30);
    const objectId = `${FIELD_CODE}-P01-${String(f).padStart(3, '0')}`;
    const sim = simulateSpectrum({ class: cls, z, snr, grid: wl, objectId, file: `${PLATE_NAME}#${f}`, resolutionR: 2000 }, rng);
    const dead = f === PLATE_DEAD_FIBRE;
    for (let i = 0; i < n; i++) {
      flux[row + i] = sim.spectrum.flux[i];
      ivar[row + i] = dead ? 0 : sim.spectrum.ivar![i];
      mask[row + i] = sim.spectrum.mask[i];
    }
    truth.push({ fibre: f, id: `${PLATE_NAME}#${f}`, objectId, type, class: cls, subtype: sim.truth.subtype, z, snr, raDeg, decDeg, expect: dead ? 'error' : 'spectrum' });
  }

  const wcs: FitsCardInput[] = [
    // Greisen et al. 2006 (Paper III) -LOG: CDELT = CRVAL ln(10) dlog10 for a grid uniform in log10.
    ['CTYPE1', 'WAVE-LOG'],
    ['CUNIT1', 'Angstrom'],
    ['CRPIX1', 1],
    ['CRVAL1', wl[0]],
    ['CDELT1', wl[0] * Math.LN10 * (DEFAULT_GRID.kind === 'log10' ? DEFAULT_GRID.dLog10 : 1e-4)],
    ['OBJECT', 'Marrow Reach plate P01', 'invented field and plate'],
    ['DATE-OBS', '2031-04-15', 'invented date'],
    ['EXPTIME', 5400, '[s]'],
    ['BUNIT', FLUX_UNIT],
    ['COMMENT', 'Synthetic plate from the Shiftmark simulator: not a real observation.'],
  ];
  const bytes = writeFitsFile([
    writeImageHdu({ data: flux, axes: [n, PLATE_FIBRES], cards: wcs }),
    writeImageHdu({ data: ivar, axes: [n, PLATE_FIBRES], primary: false, extname: 'IVAR' }),
    writeImageHdu({ data: mask, axes: [n, PLATE_FIBRES], primary: false, extname: 'MASK' }),
    writeBinTableHdu({
      extname: 'FIBRES',
      nRows: PLATE_FIBRES,
      columns: [
        { name: 'FIBERID', format: 'J', data: Int32Array.from(truth, (t) => t.fibre) },
        { name: 'OBJECT', format: '16A', data: truth.map((t) => t.objectId) },
        { name: 'OBJTYPE', format: '8A', data: truth.map((t) => t.type) },
        { name: 'RA', format: 'D', unit: 'deg', data: Float64Array.from(truth, (t) => t.raDeg) },
        { name: 'DEC', format: 'D', unit: 'deg', data: Float64Array.from(truth, (t) => t.decDeg) },
      ],
    }),
  ]);
  return { file: { name: PLATE_NAME, bytes }, truth };
}

const PLATE_TRUTH_COLUMNS = ['id', 'fibre', 'object_id', 'type', 'class', 'subtype', 'z', 'snr', 'ra_deg', 'dec_deg', 'expect'] as const;

/** The plate's truth as CSV, one row per fibre (numbers fixed-precision; empty cells where not applicable). */
export function plateTruthCsv(rows: readonly PlateTruthRow[]): string {
  const num = (v: number, d: number) => (Number.isFinite(v) ? v.toFixed(d) : '');
  const lines = [PLATE_TRUTH_COLUMNS.join(',')];
  for (const r of rows) {
    lines.push([r.id, String(r.fibre), r.objectId, r.type, r.class, r.subtype, num(r.z, 6), num(r.snr, 1), num(r.raDeg, 7), num(r.decDeg, 7), r.expect].join(','));
  }
  return lines.join('\n') + '\n';
}

/** Parse plateTruthCsv back (no cell holds a comma or a quote). */
export function parsePlateTruthCsv(text: string): PlateTruthRow[] {
  const lines = text.split('\n').filter((l) => l.trim() !== '');
  const head = lines[0].split(',');
  return lines.slice(1).map((line) => {
    const c = line.split(',');
    const get = (k: (typeof PLATE_TRUTH_COLUMNS)[number]) => c[head.indexOf(k)] ?? '';
    const n = (k: (typeof PLATE_TRUTH_COLUMNS)[number]) => (get(k) === '' ? NaN : Number(get(k)));
    return {
      id: get('id'),
      fibre: Number(get('fibre')),
      objectId: get('object_id'),
      type: get('type') as PlateTruthRow['type'],
      class: get('class') as SimClass | '',
      subtype: get('subtype'),
      z: n('z'),
      snr: n('snr'),
      raDeg: n('ra_deg'),
      decDeg: n('dec_deg'),
      expect: get('expect') as PlateTruthRow['expect'],
    };
  });
}
