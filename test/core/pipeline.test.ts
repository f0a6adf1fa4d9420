/**
 * The pipeline over multi-object files: a first look splits the invented demo
 * plate (src/core/sim/samplePlate.ts) into one id per target fibre; each id is
 * then fitted on its own, exactly as the spectrum readSpectra gives for that
 * row; a bad row fails alone, naming file and row. Files of one spectrum are
 * fitted at the first look, as before. Check values: the plate's own truth
 * (which fibres are sky, unused or dead) and readSpectra, the reader tested
 * in test/core/io/readSpectra.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { gzipSync } from 'fflate';
import { fitBytes, fitOrSplit } from '../../src/core/pipeline';
import { readSpectra } from '../../src/core/io/readSpectra';
import { fitSpectrum } from '../../src/core/engine';
import { buildSamplePlate, PLATE_DEAD_FIBRE, PLATE_NAME } from '../../src/core/sim/samplePlate';
import { SAMPLE_SEED } from '../../src/core/sim/sampleSet';
import { SpectrumReadError, type Spectrum } from '../../src/core/types';

const { file, truth } = buildSamplePlate(SAMPLE_SEED);
const kept = truth.filter((t) => t.expect !== 'dropped');

describe('fitOrSplit(bytes, file) and fitBytes(bytes, id) on a multi-object file', () => {
  it('splits the plate into the ids of its kept rows (sky and unused fibres dropped, the dead fibre kept to fail alone)', () => {
    const work = fitOrSplit(file.bytes, PLATE_NAME);
    expect(work).toEqual({ kind: 'split', ids: kept.map((t) => t.id) });
    // Gzip changes nothing.
    expect(fitOrSplit(gzipSync(file.bytes), PLATE_NAME)).toEqual(work);
  });

  it('fits one row as the spectrum readSpectra gives for it, under its id and with its object id', () => {
    const items = readSpectra(file.bytes, PLATE_NAME);
    const spectra = items.filter((x): x is Spectrum => !(x instanceof SpectrumReadError));
    for (const s of [spectra[0], spectra[spectra.length - 1]]) {
      const result = fitBytes(file.bytes, s.file);
      expect(result.file).toBe(s.file);
      expect(result.input.meta.objectId).toBe(truth.find((t) => t.id === s.file)!.objectId);
      // The engine's answer for that spectrum, plus the quasar physics the pipeline adds to quasars.
      const { quasar, ...fit } = result;
      expect(fit).toEqual(fitSpectrum(s));
      expect(quasar !== undefined).toBe(result.class === 'qso' && result.z > 0);
    }
  });

  it('a bad row fails alone with a message naming file and row', () => {
    const dead = `${PLATE_NAME}#${PLATE_DEAD_FIBRE}`;
    const result = fitBytes(file.bytes, dead);
    expect(result.status).toBe('failed');
    expect(result.file).toBe(dead);
    expect(result.error).toMatch(new RegExp(`^${dead.replace(/[.#]/g, '\\$&')}.*: no usable pixel`));
    // The fibre table still says which object failed, and where it is.
    const t = truth.find((x) => x.id === dead)!;
    expect(result.input.meta).toEqual({ objectId: t.objectId, raDeg: t.raDeg, decDeg: t.decDeg });
    const next = kept.find((t) => t.fibre > PLATE_DEAD_FIBRE && t.expect === 'spectrum')!;
    expect(fitBytes(file.bytes, next.id).status).toBe('ok');
  });

  it('says why a row cannot be fitted: a dropped row, a row that does not exist, the whole file', () => {
    expect(fitBytes(file.bytes, `${PLATE_NAME}#5`).error).toMatch(/#5 \(HDU 0\): image row 5 is marked SKY$/);
    expect(fitBytes(file.bytes, `${PLATE_NAME}#99`).error).toMatch(/image row 99 does not exist \(the file has 64 rows\)$/);
    expect(fitBytes(file.bytes, PLATE_NAME).error).toMatch(/the file holds 54 spectra \(one per image row\); each is read on its own as mrx-plate-p01\.fits#n$/);
  });
});

describe('files of one spectrum', () => {
  it('are fitted at the first look, with the same result as before (fitBytes)', () => {
    const name = 'sample-spectra/mrx-0877.csv';
    const bytes = new Uint8Array(readFileSync(new URL('../../sample-spectra/mrx-0877.csv', import.meta.url)));
    const work = fitOrSplit(bytes, name);
    expect(work.kind).toBe('fitted');
    expect(work.kind === 'fitted' && work.result).toEqual(fitBytes(bytes, name));
    expect(work.kind === 'fitted' && work.result.status).toBe('ok');
  });

  it('a name that happens to end in #n names the file, not a row', () => {
    const bytes = new Uint8Array(readFileSync(new URL('../../sample-spectra/mrx-0877.csv', import.meta.url)));
    const result = fitBytes(bytes, 'night#3');
    expect(result.status).toBe('ok');
    expect(result.file).toBe('night#3');
  });

  it('an unreadable file is one failed result naming the file', () => {
    const work = fitOrSplit(new Uint8Array(0), 'empty.csv');
    expect(work.kind === 'fitted' && work.result.error).toBe('empty.csv: empty file');
  });
});
