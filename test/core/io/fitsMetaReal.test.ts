/**
 * Object ids read from the headers of the real survey files in
 * test/data/real-spectra/fits (SDSS, BOSS/eBOSS and LAMOST public releases;
 * see its README). The expected ids come from outside the header parse:
 * - SDSS/BOSS: the survey names each file spec-PLATE-MJD-FIBRE with the same
 *   zero padding our id uses, so the id is the file name without 'spec-'.
 * - LAMOST: the id is the survey's designation 'LAMOST Jhhmmss.ss+ddmmss.s'
 *   (the DESIG card); the position it spells must agree with the header RA/DEC
 *   (designations truncate to 0.01 s and 0.1 arcsec, common practice).
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readFits } from '../../../src/core/io/fits/readFits';
import { walkHdus } from '../../../src/core/io/fits/hdus';

const DATA = join(dirname(fileURLToPath(import.meta.url)), '../../data/real-spectra');
const manifest = readFileSync(join(DATA, 'MANIFEST.tsv'), 'utf8')
  .trim()
  .split('\n')
  .slice(1)
  .map((l) => l.split('\t'))
  .map((f) => ({ name: f[0], survey: f[1] }));
const bytesOf = (name: string) => new Uint8Array(readFileSync(join(DATA, 'fits', `${name}.fits`)));

const sdss = manifest.filter((r) => !r.survey.startsWith('LAMOST'));
const lamost = manifest.filter((r) => r.survey.startsWith('LAMOST'));

describe('object ids of the real survey files', () => {
  it('the manifest lists both kinds (so the loops below test something)', () => {
    expect(sdss.length).toBeGreaterThan(30);
    expect(lamost.length).toBeGreaterThan(10);
  });

  it('SDSS and BOSS files carry no object name keyword, but plate, MJD and fibre numbers', () => {
    for (const { name } of sdss) {
      const primary = walkHdus(bytesOf(name), name)[0].header;
      for (const k of ['OBJECT', 'OBJNAME', 'DESIG', 'TARGNAME', 'TARGET', 'OBJID']) expect(primary.get(k), `${name} ${k}`).toBeUndefined();
      for (const k of ['PLATEID', 'MJD', 'FIBERID']) expect(typeof primary.get(k), `${name} ${k}`).toBe('number');
    }
  });

  for (const { name } of sdss) {
    it(`${name}: object_id is plate-MJD-fibre as the survey writes its file name`, () => {
      expect(readFits(bytesOf(name), `${name}.fits`).meta.objectId).toBe(name.replace(/^spec-/, ''));
    });
  }

  it('two observations of one quasar on different plates get different ids (an id names a spectrum, not a sky position)', () => {
    // README: spec-1325-52762-0133 and spec-6717-56397-0534 are the same quasar.
    const a = readFits(bytesOf('spec-1325-52762-0133'), 'a.fits').meta.objectId;
    const b = readFits(bytesOf('spec-6717-56397-0534'), 'b.fits').meta.objectId;
    expect(a).not.toBe(b);
  });

  for (const { name } of lamost) {
    it(`${name}: object_id is the LAMOST designation, which spells the header position`, () => {
      const s = readFits(bytesOf(name), `${name}.fits`);
      const m = /^LAMOST J(\d\d)(\d\d)(\d\d\.\d\d)([+-])(\d\d)(\d\d)(\d\d\.\d)$/.exec(s.meta.objectId ?? '');
      expect(m, s.meta.objectId).not.toBeNull();
      const ra = 15 * (Number(m![1]) + Number(m![2]) / 60 + Number(m![3]) / 3600);
      const dec = (m![4] === '-' ? -1 : 1) * (Number(m![5]) + Number(m![6]) / 60 + Number(m![7]) / 3600);
      // Truncation to 0.01 s of RA (0.15 arcsec) and 0.1 arcsec of Dec: within 1e-4 deg.
      expect(Math.abs(ra - s.meta.raDeg!)).toBeLessThan(1e-4);
      expect(Math.abs(dec - s.meta.decDeg!)).toBeLessThan(1e-4);
    });
  }
});
