/**
 * Property-based fuzzing of every reader through readSpectrum, with fast-check.
 * Seeds are fixed so that a failure replays: fast-check prints the seed and
 * the shrunk counterexample (path) to rerun with.
 *
 * Every property: readSpectrum returns a Spectrum that keeps the contract of
 * types.ts (see invariants.ts), or throws a SpectrumReadError whose message
 * starts with the file name and is not an "internal reader error".
 */
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { gzipSync } from 'fflate';
import { MAX_REASON_CHARS, readSpectrum } from '../../src/core/io/readSpectrum';
import { trailingBracket } from '../../src/core/io/text/columnNames';
import { fitsHeaderBytes, writeBinTableHdu, writeEmptyPrimaryHdu, writeImageHdu } from '../../src/core/io/fits/write';
import { SpectrumReadError, type Spectrum } from '../../src/core/types';
import { rawCard } from './corpus';
import { checkSpectrumInvariants } from './invariants';
import { joinHdus, splitHdu, withCardEdits, type HduParts } from './fitsParts';
import { IMAGE_WCS, utf8, validArrays, validCsvText, validImageFits, validTableFits } from './validFiles';

/** Pixels of the fuzzed FITS files: small, so one read is fast and mutations hit headers often. */
const N = 200;
let iterations = 0;
/**
 * Seeds are fixed so failures replay; FUZZ_SEED_OFFSET shifts them all to explore
 * new inputs by hand (e.g. FUZZ_SEED_OFFSET=17 npx vitest run test/hostile/fuzz.test.ts).
 */
const SEED_OFFSET = Number(process.env.FUZZ_SEED_OFFSET ?? 0);

/** Read and judge one input; returns the spectrum when there is one. */
function readOrRefuse(bytes: Uint8Array, name: string): Spectrum | null {
  iterations++;
  try {
    const s = readSpectrum(bytes, name);
    const problems = checkSpectrumInvariants(s);
    if (problems.length) throw new Error(`${name}: spectrum breaks its contract: ${problems.join('; ')}`);
    if (s.file !== name) throw new Error(`${name}: spectrum names file '${s.file}'`);
    return s;
  } catch (e) {
    if (!(e instanceof SpectrumReadError)) throw e;
    if (!e.message.startsWith(name)) throw new Error(`message does not start with the file name: ${e.message}`);
    if (/internal reader error/.test(e.reason)) throw new Error(`reader bug: ${e.message}`);
    if (e.reason.length > MAX_REASON_CHARS) throw new Error(`reason of ${e.reason.length} characters`);
    return null;
  }
}

afterAll(() => {
  console.log(`fuzz: ${iterations} inputs read`);
});

/** The valid files as HDU parts: an image with IVAR extension, a per-row table, a row-of-arrays table. */
function validHduSets(): HduParts[][] {
  const { wavelengthA, flux, ivar } = validArrays(N);
  const image = [writeImageHdu({ data: flux, cards: IMAGE_WCS }), writeImageHdu({ data: Float32Array.from(ivar), primary: false, extname: 'IVAR' })];
  const table = [
    writeEmptyPrimaryHdu(),
    writeBinTableHdu({
      columns: [
        { name: 'WAVELENGTH', format: 'D', unit: 'Angstrom', data: wavelengthA },
        { name: 'FLUX', format: 'E', data: flux },
        { name: 'IVAR', format: 'E', data: ivar },
        { name: 'MASK', format: 'J', data: new Int32Array(N) },
      ],
      nRows: N,
    }),
  ];
  const arrays = [
    writeEmptyPrimaryHdu(),
    writeBinTableHdu({
      columns: [
        { name: 'LOGLAM', format: `${N}D`, data: wavelengthA.map(Math.log10) },
        { name: 'FLUX', format: `${N}E`, data: flux },
        { name: 'IVAR', format: `${N}E`, data: ivar },
      ],
      nRows: 1,
    }),
  ];
  return [image, table, arrays].map((set) => set.map(splitHdu));
}

/** Keywords whose values steer the readers; the fuzzer gives them absurd values. */
const KEYWORDS = [
  'SIMPLE', 'XTENSION', 'BITPIX', 'NAXIS', 'NAXIS1', 'NAXIS2', 'NAXIS3', 'PCOUNT', 'GCOUNT', 'EXTNAME', 'TFIELDS',
  'TFORM1', 'TFORM2', 'TFORM3', 'TTYPE1', 'TTYPE2', 'TTYPE3', 'TUNIT1', 'TSCAL2', 'TZERO2', 'TNULL4', 'TFORM4',
  'CTYPE1', 'CUNIT1', 'CRVAL1', 'CRPIX1', 'CDELT1', 'CD1_1', 'PC1_1', 'DC-FLAG', 'COEFF0', 'COEFF1',
  'BSCALE', 'BZERO', 'BLANK', 'BANDID1', 'BANDID2', 'EXTEN0', 'VACUUM', 'AIRORVAC', 'WAT1_001', 'OBJECT', 'RA', 'DEC', 'EXPTIME', 'END',
];

/** Value-field text (columns 11-80): numbers of every size, strings, logicals, junk. */
const valueText: fc.Arbitrary<string> = fc.oneof(
  fc.integer({ min: -3, max: 3000 }).map(String),
  fc.integer().map(String),
  fc.bigInt({ min: -(2n ** 80n), max: 2n ** 80n }).map(String),
  fc.constantFrom('0', '-1', '999', '1000', '2147483648', '9007199254740993', '1E400', '-1E400', 'NaN', 'nan', 'Inf', '1D5', '.5', '5.', '1e-320'),
  fc.double().map((d) => (Number.isFinite(d) ? d.toExponential().toUpperCase() : String(d))),
  fc.constantFrom("'WAVE'", "'WAVE-LOG'", "'AWAV'", "'LINEAR'", "'FREQ'", "'nm'", "'um'", "'furlong'", "'BINTABLE'", "'IMAGE'", "'TABLE'"),
  fc.constantFrom("'E'", "'D'", "'J'", "'1000000000000E'", "'0E'", "'1PE(10)'", "'200D'", "'Z'", "'200E'", "'4A'", "'wave'", "'flux'", "'ivar'", "'air'"),
  fc.string({ maxLength: 20 }).map((s) => `'${s.replace(/'/g, "''")}'`),
  fc.constantFrom('T', 'F', '', "'", "'unclosed", '(1, 2)', '= = =', '/ only a comment'),
  fc.string({ maxLength: 70 }),
);

const sets = validHduSets();
const validFits = sets.map(joinHdus);
/** Byte offset of each HDU's header in each valid file. */
const headerStarts = sets.map((hdus) => {
  const starts: number[] = [];
  let o = 0;
  for (const h of hdus) {
    starts.push(o);
    o += fitsHeaderBytes(h.cards).length + h.data.length;
  }
  return starts;
});
const validGzips = [gzipSync(utf8(validCsvText(120))), gzipSync(validTableFits(60)), gzipSync(validImageFits(60))];

describe('fuzz: every reader, seeded', () => {
  it('(a) arbitrary bytes, bare and behind FITS and gzip signatures', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 6000 }), fc.constantFrom('', 'SIMPLE  =', '\x1f\x8b', 'wavelength,flux\n'), (body, prefix) => {
        const bytes = new Uint8Array(prefix.length + body.length);
        for (let i = 0; i < prefix.length; i++) bytes[i] = prefix.charCodeAt(i);
        bytes.set(body, prefix.length);
        readOrRefuse(bytes, 'arbitrary.bin');
      }),
      { seed: 4101 + SEED_OFFSET, numRuns: 4000 },
    );
  });

  it('(b) valid FITS files with k random byte mutations', () => {
    fc.assert(
      fc.property(
        fc.nat({ max: validFits.length - 1 }),
        fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 255 })), { minLength: 1, maxLength: 24 }),
        fc.boolean(),
        (which, edits, headerOnly) => {
          const bytes = validFits[which].slice();
          // Half the runs aim at the first header block of an HDU, where one byte matters most.
          const starts = headerStarts[which];
          for (const [at, v] of edits) {
            const pos = headerOnly ? starts[at % starts.length] + ((at >>> 2) % 2880) : at % bytes.length;
            bytes[pos] = v;
          }
          readOrRefuse(bytes, 'mutated.fits');
        },
      ),
      { seed: 4102 + SEED_OFFSET, numRuns: 5000 },
    );
  });

  it('(c) valid FITS headers with random card values substituted', () => {
    fc.assert(
      fc.property(
        fc.nat({ max: sets.length - 1 }),
        fc.array(fc.tuple(fc.nat(), fc.constantFrom(...KEYWORDS), valueText, fc.boolean()), { minLength: 1, maxLength: 4 }),
        (which, edits) => {
          readOrRefuse(joinHdus(withCardEdits(sets[which], edits, rawCard)), 'cards.fits');
        },
      ),
      { seed: 4103 + SEED_OFFSET, numRuns: 6000 },
    );
  });

  it('(d) random text tables: delimiters, tokens, column counts, line ends', () => {
    const token = fc.oneof(
      { weight: 4, arbitrary: fc.double({ noNaN: false }).map(String) },
      { weight: 3, arbitrary: fc.integer({ min: -10, max: 20000 }).map(String) },
      { weight: 2, arbitrary: fc.constantFrom('nan', 'NaN', 'inf', '-inf', '', 'null', 'NA', '--', '1,5', '4,000.5', '1e999', '-0', '0x10', '1d3', '"7"', "'8'", '"a,b"', '""', '"') },
      { weight: 1, arbitrary: fc.constantFrom('wavelength', 'wave', 'loglam', 'flux', 'ivar', 'err', 'variance', 'mask', 'Wavelength [nm]', 'wavelength_air', 'flux (1e-17)', 'and_mask') },
      { weight: 1, arbitrary: fc.string({ maxLength: 8 }) },
    );
    const sep = fc.constantFrom(',', ';', '\t', ' ', '  ', '|', ', ');
    const eol = fc.constantFrom('\n', '\r\n', '\r');
    fc.assert(
      fc.property(
        fc.array(fc.array(token, { maxLength: 6 }), { maxLength: 30 }),
        sep,
        eol,
        fc.option(fc.constantFrom('# wavelength: air, nm', '# columns: wavelength flux err', '% object: HX-0007', '# ra: 10:00:00', '#'), { nil: undefined }),
        fc.boolean(),
        (rows, s, e, comment, bom) => {
          const lines = rows.map((r) => r.join(s));
          if (comment) lines.unshift(comment);
          readOrRefuse(utf8((bom ? '\ufeff' : '') + lines.join(e)), 'random.csv');
        },
      ),
      { seed: 4104 + SEED_OFFSET, numRuns: 5000 },
    );
  });

  it('(d2) text tables that mostly read: increasing wavelength, random flux and uncertainty', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 60 }),
        fc.double({ min: 1, max: 1e5, noNaN: true }),
        fc.array(fc.oneof(fc.double(), fc.constantFrom(NaN, Infinity, -Infinity, 0)), { minLength: 60, maxLength: 60 }),
        fc.constantFrom('wavelength,flux,err', 'wave flux ivar', 'lambda;flux;var;mask', ''),
        fc.boolean(),
        (n, start, values, header, descending) => {
          const cols = header === '' ? 2 : header.split(/[ ,;]/).length;
          const sepChar = header.includes(';') ? ';' : header.includes(' ') ? ' ' : ',';
          const rows: string[] = header ? [header] : [];
          for (let i = 0; i < n; i++) {
            const wl = descending ? start + (n - i) * 1.5 : start + i * 1.5;
            const rest = Array.from({ length: cols - 1 }, (_, k) => String(values[(i + 7 * k) % values.length]));
            rows.push([String(wl), ...rest].join(sepChar));
          }
          const s = readOrRefuse(utf8(rows.join('\n')), 'mostly.csv');
          if (s) expect(s.wavelengthA.length).toBe(n);
        },
      ),
      { seed: 4105 + SEED_OFFSET, numRuns: 2000 },
    );
  });

  it('(e) valid gzip files truncated at random and with random byte flips', () => {
    fc.assert(
      fc.property(
        fc.nat({ max: validGzips.length - 1 }),
        fc.nat(),
        fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 255 })), { maxLength: 3 }),
        (which, cut, flips) => {
          const g = validGzips[which];
          const bytes = g.slice(0, cut % (g.length + 1));
          for (const [at, v] of flips) if (bytes.length) bytes[at % bytes.length] = v;
          const s = readOrRefuse(bytes, 'cut.gz');
          // A gzip cut short can never be read: its trailer is what proves it complete.
          if (bytes.length < g.length) expect(s).toBeNull();
        },
      ),
      { seed: 4106 + SEED_OFFSET, numRuns: 3000 },
    );
  });
});

describe('fuzz: fast paths against their slow obvious versions', () => {
  it('trailingBracket equals the regular expression it replaces', () => {
    const slow = (name: string): string | undefined => {
      const m = /[[(]([^\])]*)[\])]\s*$/.exec(name);
      return m ? m[1].trim() : undefined;
    };
    fc.assert(
      fc.property(fc.array(fc.constantFrom('[', ']', '(', ')', 'a', 'n', 'm', ' ', '\t', '1'), { maxLength: 16 }), (chars) => {
        iterations++;
        const s = chars.join('');
        expect(trailingBracket(s)).toBe(slow(s));
      }),
      { seed: 4107 + SEED_OFFSET, numRuns: 2000 },
    );
  });
});
