/**
 * The LAMOST DR1 files in test/data/real-spectra/fits (public data release; see
 * the README there) are 2-D images of 5 rows named by EXTEN0 =
 * 'Flux Inverse Subcontinuum Andmask Ormask'. A pixel whose and-mask is non-zero
 * must come out masked; the or-mask alone must not mask a pixel. The expected
 * masks are decoded here from the raw bytes by a minimal reader of this one
 * layout (FITS 4.0: 2880-byte blocks, 80-character cards, big-endian float32),
 * independent of src/core/io.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readFits } from '../../../src/core/io/fits/readFits';

const DIR = join(dirname(fileURLToPath(import.meta.url)), '../../data/real-spectra/fits');
const LAMOST = readdirSync(DIR).filter((f) => /^spec-\d+-B\d+_sp\d+-\d+\.fits$/.test(f)).sort();

interface RawRows {
  cards: Map<string, string>;
  rows: Float32Array[];
}

/** Primary header cards (key -> raw value text) and the image rows, by hand. */
function decodePrimary(bytes: Uint8Array): RawRows {
  const cards = new Map<string, string>();
  let offset = 0;
  for (;;) {
    const card = new TextDecoder('latin1').decode(bytes.subarray(offset, offset + 80));
    offset += 80;
    const key = card.slice(0, 8).trim();
    if (key === 'END') break;
    if (card.slice(8, 10) === '= ') cards.set(key, card.slice(10).split('/')[0].trim());
  }
  const dataStart = Math.ceil(offset / 2880) * 2880;
  const n1 = Number(cards.get('NAXIS1'));
  const n2 = Number(cards.get('NAXIS2'));
  const view = new DataView(bytes.buffer, bytes.byteOffset + dataStart, n1 * n2 * 4);
  const rows: Float32Array[] = [];
  for (let r = 0; r < n2; r++) rows.push(Float32Array.from({ length: n1 }, (_, i) => view.getFloat32(4 * (r * n1 + i), false)));
  return { cards, rows };
}

const load = (f: string) => new Uint8Array(readFileSync(join(DIR, f)));

describe('LAMOST 5-row images: and-mask applied (real files)', () => {
  it('there are 15 LAMOST files, all 5 rows named Flux Inverse Subcontinuum Andmask Ormask, one with an and-mask pixel', () => {
    expect(LAMOST).toHaveLength(15); // MANIFEST.tsv: 15 LAMOST DR1 spectra
    let withAnd = 0;
    for (const f of LAMOST) {
      const raw = decodePrimary(load(f));
      expect(raw.cards.get('NAXIS2'), f).toBe('5');
      expect(raw.cards.get('EXTEN0'), f).toBe("'Flux Inverse Subcontinuum Andmask Ormask'");
      if (raw.rows[3].some((v) => v !== 0)) withAnd++;
    }
    expect(withAnd).toBeGreaterThanOrEqual(1); // otherwise the next test proves nothing
  });

  for (const f of LAMOST) {
    it(`${f}: masked pixels are those with a non-zero and-mask (or a non-finite flux), not the or-mask`, () => {
      const raw = decodePrimary(load(f));
      const s = readFits(load(f), f);
      const n = raw.rows[0].length;
      expect(s.wavelengthA.length).toBe(n);
      // The file's wavelengths increase (COEFF1 > 0), so pixel i of the file is pixel i of the spectrum.
      expect(s.wavelengthA[1]).toBeGreaterThan(s.wavelengthA[0]);
      const expected: number[] = [];
      for (let i = 0; i < n; i++) if (raw.rows[3][i] !== 0 || !Number.isFinite(raw.rows[0][i])) expected.push(i);
      const got = Array.from(s.mask).flatMap((m, i) => (m ? [i] : []));
      expect(got).toEqual(expected);
      for (let i = 0; i < n; i++) if (raw.rows[4][i] !== 0 && raw.rows[3][i] === 0 && Number.isFinite(raw.rows[0][i])) expect(s.mask[i], `or-mask pixel ${i}`).toBe(0);
      // Row 3 (sub-continuum) is not taken as the wavelength: wavelengths follow COEFF0/COEFF1.
      const c0 = Number(raw.cards.get('COEFF0'));
      const c1 = Number(raw.cards.get('COEFF1'));
      expect(Math.abs(s.wavelengthA[n - 1] - 10 ** (c0 + c1 * (n - 1)))).toBeLessThan(1e-6 * s.wavelengthA[n - 1]);
    });
  }
});
