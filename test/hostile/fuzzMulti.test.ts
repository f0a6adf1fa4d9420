/**
 * Seeded fuzzing of readSpectra (files with many spectra). Every input gives an
 * array, never a throw; each item is a Spectrum keeping the contract of
 * types.ts, named `name` or `name#k`, or a SpectrumReadError whose message
 * starts with the file name and is not an "internal reader error".
 */
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { gzipSync } from 'fflate';
import { readSpectra } from '../../src/core/io/readSpectra';
import { MAX_REASON_CHARS } from '../../src/core/io/readSpectrum';
import { writeBinTableHdu, writeEmptyPrimaryHdu } from '../../src/core/io/fits/write';
import { SpectrumReadError } from '../../src/core/types';
import { rawCard } from './corpus';
import { joinHdus, splitHdu, withCardEdits } from './fitsParts';
import { checkSpectrumInvariants } from './invariants';
import { validMultiObjectFiles } from './validFiles';

const SEED_OFFSET = Number(process.env.FUZZ_SEED_OFFSET ?? 0);
let iterations = 0;
let spectraSeen = 0;

function judge(bytes: Uint8Array, name: string): void {
  iterations++;
  const items = readSpectra(bytes, name);
  if (!Array.isArray(items) || items.length === 0) throw new Error(`${name}: readSpectra gave no items`);
  for (const item of items) {
    if (item instanceof SpectrumReadError) {
      if (!item.message.startsWith(name)) throw new Error(`message does not start with the file name: ${item.message}`);
      if (/internal reader error/.test(item.reason)) throw new Error(`reader bug: ${item.message}`);
      if (item.reason.length > MAX_REASON_CHARS) throw new Error(`reason of ${item.reason.length} characters`);
      continue;
    }
    spectraSeen++;
    const problems = checkSpectrumInvariants(item);
    if (problems.length) throw new Error(`${item.file}: spectrum breaks its contract: ${problems.join('; ')}`);
    if (item.file !== name && !new RegExp(`^${name.replace(/\./g, '\\.')}#\\d+$`).test(item.file)) throw new Error(`spectrum named '${item.file}'`);
  }
}

afterAll(() => {
  console.log(`fuzz (readSpectra): ${iterations} inputs read, ${spectraSeen} spectra returned`);
});

const files = validMultiObjectFiles();
const valid = [files.imageRows, files.tableRows, files.cube];
const sets = valid.map((f) => {
  // Split a whole file into HDUs (each a writer-made header + data blocks).
  const parts = [];
  let o = 0;
  while (o < f.length) {
    const rest = f.subarray(o);
    const hdu = splitHdu(rest);
    const headerBytes = rest.length - hdu.data.length;
    const dataBlocks = dataBlocksOf(hdu.cards);
    parts.push({ cards: hdu.cards, data: rest.slice(headerBytes, headerBytes + dataBlocks) });
    o += headerBytes + dataBlocks;
  }
  return parts;
});

/** Padded data size of a writer-made HDU from its NAXISn and BITPIX cards. */
function dataBlocksOf(cards: string[]): number {
  const val = (k: string) => Number(cards.find((c) => c.startsWith(k.padEnd(8)))?.slice(10, 30).trim());
  const naxis = val('NAXIS');
  let n = naxis > 0 ? 1 : 0;
  for (let i = 1; i <= naxis; i++) n *= val(`NAXIS${i}`);
  return Math.ceil((n * Math.abs(val('BITPIX'))) / 8 / 2880) * 2880;
}

const KEYWORDS = [
  'NAXIS', 'NAXIS1', 'NAXIS2', 'NAXIS3', 'EXTNAME', 'TFORM1', 'TFORM2', 'TFORM3', 'TFORM4', 'TTYPE1', 'TTYPE2', 'TTYPE3', 'TTYPE4',
  'TUNIT3', 'CTYPE1', 'CRVAL1', 'CDELT1', 'BANDID1', 'BANDID2', 'EXTEN0', 'APID1', 'APNUM1', 'VACUUM', 'TFIELDS', 'BITPIX',
];
const valueText = fc.oneof(
  fc.integer({ min: -3, max: 300 }).map(String),
  fc.constantFrom('0', '1', '2', '8', '120', '1E400', "'IVAR'", "'ERROR'", "'MASK'", "'WAVELENGTH'", "'FLUX'", "'FIBRES'", "'SKY'", "'120E'", "'120D'", "'8A'", "'J'", "'K'", "'sigma'", "'spectrum'", "'Flux Inverse'"),
  fc.string({ maxLength: 20 }).map((s) => `'${s.replace(/'/g, "''")}'`),
);

describe('fuzz: readSpectra on multi-object files, seeded', () => {
  it('the valid files read into several spectra (so the fuzzing starts from real multi-object input)', () => {
    for (const f of valid) {
      const items = readSpectra(f, 'plate.fits');
      expect(items.length).toBe(7); // 8 rows, one sky
      expect(items.every((x) => !(x instanceof SpectrumReadError))).toBe(true);
    }
    expect(sets.map((s) => s.length)).toEqual([3, 2, 2]);
    expect(joinHdus(sets[0])).toEqual(files.imageRows);
  });

  it('(a) random byte mutations', () => {
    fc.assert(
      fc.property(fc.nat({ max: valid.length - 1 }), fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 255 })), { minLength: 1, maxLength: 16 }), (which, edits) => {
        const bytes = valid[which].slice();
        for (const [at, v] of edits) bytes[at % bytes.length] = v;
        judge(bytes, 'plate.fits');
      }),
      { seed: 5101 + SEED_OFFSET, numRuns: 3000 },
    );
  });

  it('(b) header cards replaced or added with absurd values', () => {
    fc.assert(
      fc.property(
        fc.nat({ max: sets.length - 1 }),
        fc.array(fc.tuple(fc.nat(), fc.constantFrom(...KEYWORDS), valueText, fc.boolean()), { minLength: 1, maxLength: 4 }),
        (which, edits) => {
          judge(joinHdus(withCardEdits(sets[which], edits, rawCard)), 'plate.fits');
        },
      ),
      { seed: 5102 + SEED_OFFSET, numRuns: 3000 },
    );
  });

  it('(c) truncated at random, bare and gzipped; arbitrary bytes', () => {
    fc.assert(
      fc.property(fc.nat({ max: valid.length - 1 }), fc.nat(), fc.boolean(), (which, cut, gz) => {
        const bytes = valid[which].slice(0, cut % (valid[which].length + 1));
        judge(gz ? gzipSync(bytes) : bytes, 'plate.fits');
      }),
      { seed: 5103 + SEED_OFFSET, numRuns: 1000 },
    );
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 4000 }), (b) => judge(b, 'plate.fits')),
      { seed: 5104 + SEED_OFFSET, numRuns: 1000 },
    );
  });

  it('(d) a huge declared row count is refused before anything is allocated', () => {
    const big = writeBinTableHdu({
      nRows: 2,
      columns: [
        { name: 'WAVE', format: '2D', data: [4000, 4001, 4000, 4001] },
        { name: 'FLUX', format: '2E', data: [1, 1, 1, 1] },
      ],
    });
    const parts = splitHdu(big);
    parts.cards = parts.cards.map((c) => (c.startsWith('NAXIS2  ') ? rawCard('NAXIS2  =               200000') : c));
    const file = joinHdus([splitHdu(writeEmptyPrimaryHdu()), { cards: parts.cards, data: new Uint8Array(Math.ceil((200000 * 24) / 2880) * 2880) }]);
    const items = readSpectra(file, 'huge.fits');
    expect(items).toHaveLength(1);
    expect((items[0] as SpectrumReadError).message).toMatch(/^huge\.fits \(HDU 1, keyword NAXIS2\): holds 200000 spectra, more than the limit/);
  });
});
