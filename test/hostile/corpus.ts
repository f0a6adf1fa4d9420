/**
 * The hostile-input corpus: malformed, truncated, damaged and absurd files,
 * built in memory from the valid files of validFiles.ts, the project's FITS
 * writer and plain strings. Every entry must end in a Spectrum or a
 * SpectrumReadError naming the file (see corpus.test.ts and README.md).
 *
 * `bytes` is a function so that the few large entries (10 MB line, a million
 * rows, a 28.8 MB header) exist only while their test runs.
 */
import { gzipSync } from 'fflate';
import { fitsCard, fitsHeaderBytes, writeBinTableHdu, writeFitsFile, writeImageHdu } from '../../src/core/io/fits/write';
import { gzipBomb } from './deflateBomb';
import { concatBytes } from './fitsParts';
import { mulberry32 } from '../../src/core/sim/prng';
import {
  IMAGE_WCS,
  utf8,
  validCsvText,
  validGzipCsv,
  validGzipFits,
  validImageFits,
  validRowOfArraysFits,
  validTableFits,
} from './validFiles';

export interface HostileEntry {
  /** File name handed to the reader; unique within the corpus. */
  name: string;
  bytes: () => Uint8Array;
  /** 'spectrum' or 'error' when the outcome is certain; omitted when either is acceptable. */
  outcome?: 'spectrum' | 'error';
  /** For errors: a pattern the message must match (names the problem). */
  says?: RegExp;
}

const BLOCK = 2880;

/** Mulberry32 (the simulator's), so the corpus is the same on every run. */
export { mulberry32 };

/** An 80-character card from raw text (for values the writer refuses to write). */
export const rawCard = (text: string): string => text.padEnd(80, ' ').slice(0, 80);

/** A header from cards, padded to whole blocks, followed by `dataBytes` bytes of zeros. */
export function headerThenData(cards: string[], dataBytes = 0, withEnd = true): Uint8Array {
  const h = fitsHeaderBytes(cards, withEnd);
  const out = new Uint8Array(h.length + Math.ceil(dataBytes / BLOCK) * BLOCK);
  out.set(h);
  return out;
}

/** Float32 big-endian data of a smooth positive flux, `n` values, padded to blocks. */
function floatData(n: number): Uint8Array {
  const out = new Uint8Array(Math.ceil((n * 4) / BLOCK) * BLOCK);
  const view = new DataView(out.buffer);
  for (let i = 0; i < n; i++) view.setFloat32(4 * i, 1 + 0.01 * i, false);
  return out;
}

const concat = concatBytes;

/** A primary image header (flux, float32) with the given cards replacing or adding to the defaults. */
function imageWithCards(cards: string[], n = 64): Uint8Array {
  return concat(fitsHeaderBytes(cards), floatData(n));
}

const C = fitsCard;
const IMAGE_BASE = (n = 64): string[] => [C('SIMPLE', true), C('BITPIX', -32), C('NAXIS', 1), C('NAXIS1', n)];
const WCS_OK: string[] = [C('CTYPE1', 'WAVE'), C('CUNIT1', 'Angstrom'), C('CRPIX1', 1), C('CRVAL1', 4000), C('CDELT1', 2)];

/** Offsets where the header blocks of a file end (the data starts), found from its END cards. */
function headerRanges(bytes: Uint8Array): { start: number; end: number }[] {
  const out: { start: number; end: number }[] = [];
  let start = 0;
  for (let b = 0; b * BLOCK < bytes.length; b++) {
    for (let k = 0; k < 36; k++) {
      const o = b * BLOCK + k * 80;
      if (bytes[o] === 0x45 && bytes[o + 1] === 0x4e && bytes[o + 2] === 0x44 && bytes[o + 3] === 0x20) {
        out.push({ start, end: (b + 1) * BLOCK });
      }
      if ((bytes[o] === 0x58 && bytes[o + 1] === 0x54 && bytes[o + 2] === 0x45) && k === 0) start = b * BLOCK; // 'XTE'
    }
  }
  return out;
}

function truncations(label: string, make: () => Uint8Array): HostileEntry[] {
  const full = make();
  const out: HostileEntry[] = [];
  const blocks = full.length / BLOCK;
  // A cut exactly where an extension starts leaves a shorter valid file: either outcome.
  const hduStarts = new Set(headerRanges(full).map((r) => r.start));
  for (let k = 0; k < blocks; k++) {
    const atHdu = k > 0 && hduStarts.has(k * BLOCK);
    out.push({ name: `${label}-cut-block-${k}.fits`, bytes: () => make().slice(0, k * BLOCK), outcome: atHdu ? undefined : 'error' });
  }
  for (const at of [1, 9, 80, 2879, 2881, 2880 + 1234, Math.floor(full.length / 2) + 3, full.length - 1]) {
    out.push({ name: `${label}-cut-at-${at}.fits`, bytes: () => make().slice(0, at) });
  }
  out.push({ name: `${label}-whole.fits`, bytes: make, outcome: 'spectrum' });
  return out;
}

/** Seeded byte flips: `count` files with `flips` random bytes replaced, inside the header blocks or the data. */
function flips(label: string, make: () => Uint8Array, where: 'header' | 'data', count: number, flipsPerFile: number, seed: number): HostileEntry[] {
  const base = make();
  const ranges = headerRanges(base);
  const inHeader = (o: number) => ranges.some((r) => o >= r.start && o < r.end);
  const rnd = mulberry32(seed);
  const out: HostileEntry[] = [];
  for (let f = 0; f < count; f++) {
    const edits: [number, number][] = [];
    while (edits.length < flipsPerFile) {
      const at = Math.floor(rnd() * base.length);
      if (inHeader(at) === (where === 'header')) edits.push([at, Math.floor(rnd() * 256)]);
    }
    out.push({
      name: `${label}-flip-${where}-${flipsPerFile}x-${f}.fits`,
      bytes: () => {
        const b = make();
        for (const [at, v] of edits) b[at] = v;
        return b;
      },
    });
  }
  return out;
}

function fitsStructureEntries(): HostileEntry[] {
  const e: HostileEntry[] = [];
  // NAXIS and axis lengths
  e.push({ name: 'naxis-0-with-data.fits', bytes: () => concat(fitsHeaderBytes([C('SIMPLE', true), C('BITPIX', -32), C('NAXIS', 0), ...WCS_OK]), floatData(64)), outcome: 'error', says: /no spectrum/ });
  e.push({ name: 'naxis-999-no-axes.fits', bytes: () => headerThenData([C('SIMPLE', true), C('BITPIX', -32), C('NAXIS', 999)]), outcome: 'error', says: /NAXIS1/ });
  e.push({
    name: 'naxis-999-all-ones.fits',
    bytes: () => headerThenData([C('SIMPLE', true), C('BITPIX', -32), C('NAXIS', 999), ...Array.from({ length: 999 }, (_, i) => C(`NAXIS${i + 1}`, 1))], 4),
    outcome: 'error',
  });
  e.push({ name: 'naxis-1000.fits', bytes: () => headerThenData([C('SIMPLE', true), C('BITPIX', -32), C('NAXIS', 1000)]), outcome: 'error', says: /NAXIS/ });
  e.push({ name: 'naxis-negative.fits', bytes: () => headerThenData([C('SIMPLE', true), C('BITPIX', -32), C('NAXIS', -1)]), outcome: 'error', says: /NAXIS/ });
  e.push({ name: 'naxis-float.fits', bytes: () => headerThenData([C('SIMPLE', true), C('BITPIX', -32), C('NAXIS', 1.5)]), outcome: 'error', says: /NAXIS/ });
  e.push({ name: 'naxis-string.fits', bytes: () => headerThenData([C('SIMPLE', true), C('BITPIX', -32), C('NAXIS', 'one')]), outcome: 'error', says: /NAXIS/ });
  for (const [label, v] of [
    ['2pow31', 2 ** 31],
    ['2pow53', 2 ** 53],
    ['2pow64', 2n ** 64n],
    ['1e30', 10n ** 30n],
    ['400-digits', 10n ** 399n],
  ] as const) {
    e.push({ name: `naxis1-${label}.fits`, bytes: () => headerThenData([...IMAGE_BASE().slice(0, 3), C('NAXIS1', v), ...WCS_OK], 256), outcome: 'error', says: /NAXIS1/ });
  }
  e.push({ name: 'naxis1-negative.fits', bytes: () => headerThenData([...IMAGE_BASE().slice(0, 3), C('NAXIS1', -64), ...WCS_OK], 256), outcome: 'error', says: /negative/ });
  e.push({ name: 'naxis1-zero.fits', bytes: () => headerThenData([...IMAGE_BASE().slice(0, 3), C('NAXIS1', 0), ...WCS_OK]), outcome: 'error' });
  e.push({ name: 'naxis1-one.fits', bytes: () => imageWithCards([...IMAGE_BASE(1), ...WCS_OK], 1), outcome: 'error', says: /one pixel/ });
  e.push({
    name: 'naxis1-above-max-pixels.fits',
    bytes: () => headerThenData([C('SIMPLE', true), C('BITPIX', 8), C('NAXIS', 1), C('NAXIS1', 10_000_001), ...WCS_OK], 10_000_001),
    outcome: 'error',
    says: /pixels/,
  });
  // 40 axes of 2^53 overflow the size product to Infinity; with one zero axis it becomes NaN.
  const hugeAxes = (withZero: boolean) => [
    C('SIMPLE', true),
    C('BITPIX', -32),
    C('NAXIS', 41),
    ...Array.from({ length: 40 }, (_, i) => C(`NAXIS${i + 1}`, 2 ** 53)),
    C('NAXIS41', withZero ? 0 : 2 ** 53),
  ];
  e.push({ name: 'naxis-product-infinite.fits', bytes: () => headerThenData(hugeAxes(false), 64), outcome: 'error' });
  e.push({ name: 'naxis-product-nan.fits', bytes: () => headerThenData(hugeAxes(true), 64), outcome: 'error' });
  e.push({
    name: 'image-ext-naxis2-zero-pcount.fits', // regression: read past the data (DataView RangeError)
    bytes: () =>
      concat(
        fitsHeaderBytes([C('SIMPLE', true), C('BITPIX', 8), C('NAXIS', 0), C('EXTEND', true)]),
        fitsHeaderBytes([C('XTENSION', 'IMAGE'), C('BITPIX', -32), C('NAXIS', 2), C('NAXIS1', 4000), C('NAXIS2', 0), C('PCOUNT', 4), C('GCOUNT', 1), ...WCS_OK]),
        floatData(4),
      ),
    outcome: 'error',
  });
  e.push({
    name: 'image-2d-frame.fits',
    bytes: () => imageWithCards([C('SIMPLE', true), C('BITPIX', -32), C('NAXIS', 2), C('NAXIS1', 32), C('NAXIS2', 32), ...WCS_OK], 32 * 32),
    outcome: 'error',
    says: /frame/,
  });
  e.push({
    name: 'image-cube.fits',
    bytes: () => imageWithCards([C('SIMPLE', true), C('BITPIX', -32), C('NAXIS', 3), C('NAXIS1', 8), C('NAXIS2', 2), C('NAXIS3', 2), ...WCS_OK], 32),
    outcome: 'error',
    says: /several spectra/,
  });
  e.push({ name: 'pcount-negative.fits', bytes: () => withExtension([C('PCOUNT', -5), C('GCOUNT', 1)]), outcome: 'error', says: /PCOUNT/ });
  e.push({ name: 'gcount-zero.fits', bytes: () => withExtension([C('PCOUNT', 0), C('GCOUNT', 0)]), outcome: 'error', says: /GCOUNT/ });
  // GCOUNT = 0 declares no data while NAXIS1 claims 64 values: refused rather than read past the file's end.
  e.push({ name: 'gcount-zero-no-data.fits', bytes: () => withExtension([C('PCOUNT', 0), C('GCOUNT', 0)]).slice(0, 2 * BLOCK), outcome: 'error', says: /GCOUNT/ });
  e.push({ name: 'gcount-huge.fits', bytes: () => withExtension([C('PCOUNT', 0), C('GCOUNT', 2 ** 40)]), outcome: 'error', says: /larger than/ });

  // BITPIX
  for (const [label, v] of [['0', 0], ['7', 7], ['-16', -16], ['24', 24], ['float', 8.5], ['string', 'eight']] as const) {
    e.push({ name: `bitpix-${label}.fits`, bytes: () => imageWithCards([C('SIMPLE', true), C('BITPIX', v), C('NAXIS', 1), C('NAXIS1', 64), ...WCS_OK]), outcome: 'error', says: /BITPIX/ });
  }
  e.push({ name: 'bitpix-missing.fits', bytes: () => imageWithCards([C('SIMPLE', true), C('NAXIS', 1), C('NAXIS1', 64), ...WCS_OK]), outcome: 'error', says: /BITPIX/ });

  // Header structure
  e.push({ name: 'header-no-end.fits', bytes: () => fitsHeaderBytes([...IMAGE_BASE(), ...WCS_OK], false), outcome: 'error', says: /END/ });
  e.push({ name: 'header-no-end-then-data.fits', bytes: () => concat(fitsHeaderBytes([...IMAGE_BASE(), ...WCS_OK], false), floatData(64)), outcome: 'error', says: /END/ });
  e.push({
    name: 'header-10000-blocks-no-end.fits',
    bytes: () => {
      const first = fitsHeaderBytes([...IMAGE_BASE(), ...WCS_OK], false);
      const out = new Uint8Array(10_000 * BLOCK).fill(0x20);
      out.set(first);
      const filler = rawCard("COMMENT   no end in sight");
      for (let o = first.length; o < out.length; o += 80) for (let i = 0; i < 80; i++) out[o + i] = filler.charCodeAt(i);
      return out;
    },
    outcome: 'error',
    says: /END/,
  });
  e.push({ name: 'header-end-mid-block.fits', bytes: () => imageWithCards([...IMAGE_BASE(), ...WCS_OK]), outcome: 'spectrum' });
  e.push({
    name: 'header-cards-after-end.fits',
    bytes: () => imageWithCards([...IMAGE_BASE(), ...WCS_OK, rawCard('END'), C('CDELT1', -999), rawCard('garbage after the END card')]),
    outcome: 'spectrum',
  });
  e.push({
    name: 'header-end-lowercase.fits',
    bytes: () => concat(fitsHeaderBytes([...IMAGE_BASE(), ...WCS_OK, rawCard('end')], false), floatData(64)),
    outcome: 'error',
    says: /END/,
  });
  e.push({
    name: 'header-non-ascii.fits',
    bytes: () => {
      const b = imageWithCards([...IMAGE_BASE(), ...WCS_OK, C('OBJECT', 'HX-0007-xx')]);
      const objectCard = findCard(b, 'OBJECT');
      b[objectCard + 14] = 0xe9; // Latin-1 e-acute inside the string value
      b[objectCard + 15] = 0xff;
      b[findCard(b, 'CRVAL1') + 12] = 0xc3; // a UTF-8 lead byte inside a number
      return b;
    },
  });
  e.push({
    name: 'header-keyword-non-ascii.fits',
    bytes: () => {
      const b = imageWithCards([...IMAGE_BASE(), ...WCS_OK]);
      b[findCard(b, 'CDELT1') + 2] = 0xc5;
      return b;
    },
  });
  e.push({ name: 'header-all-nul.fits', bytes: () => concat(utf8('SIMPLE  ='), new Uint8Array(5 * BLOCK)), outcome: 'error' });
  e.push({ name: 'header-simple-only.fits', bytes: () => utf8('SIMPLE  ='), outcome: 'error', says: /truncated/ });
  e.push({ name: 'header-simple-f.fits', bytes: () => imageWithCards([C('SIMPLE', false), ...IMAGE_BASE().slice(1), ...WCS_OK]), outcome: 'error', says: /SIMPLE/ });
  e.push({
    name: 'header-duplicate-naxis1.fits',
    bytes: () => imageWithCards([...IMAGE_BASE(), rawCard('NAXIS1  =             99999999'), ...WCS_OK]),
    outcome: 'spectrum',
  });
  e.push({
    name: 'header-duplicate-naxis1-larger-first.fits',
    bytes: () => imageWithCards([...IMAGE_BASE().slice(0, 3), C('NAXIS1', 99999999), C('NAXIS1', 64), ...WCS_OK]),
    outcome: 'error',
    says: /larger than/,
  });
  e.push({ name: 'header-duplicate-cdelt1.fits', bytes: () => imageWithCards([...IMAGE_BASE(), ...WCS_OK, C('CDELT1', 0)]), outcome: 'spectrum' });
  e.push({ name: 'header-unclosed-string.fits', bytes: () => imageWithCards([...IMAGE_BASE(), ...WCS_OK, rawCard("OBJECT  = 'HX-0007 no closing quote")]), outcome: 'spectrum' });
  e.push({ name: 'header-ctype-unclosed.fits', bytes: () => imageWithCards([...IMAGE_BASE(), rawCard("CTYPE1  = 'WAVE"), ...WCS_OK.slice(1)]) });
  e.push({ name: 'header-continue-orphan.fits', bytes: () => imageWithCards([...IMAGE_BASE(), rawCard("CONTINUE  'orphan&'"), ...WCS_OK]), outcome: 'spectrum' });
  e.push({ name: 'header-hierarch-junk.fits', bytes: () => imageWithCards([...IMAGE_BASE(), rawCard('HIERARCH = = = / ='), rawCard('HIERARCH'), ...WCS_OK]), outcome: 'spectrum' });
  e.push({ name: 'header-equals-no-space.fits', bytes: () => imageWithCards([...IMAGE_BASE(), rawCard('CRVAL1  =4000'), ...WCS_OK.filter((c) => !c.startsWith('CRVAL1'))]), outcome: 'spectrum' });
  e.push({ name: 'header-complex-value.fits', bytes: () => imageWithCards([...IMAGE_BASE(), rawCard('CDELT1  = (1.0, 2.0)'), ...WCS_OK.filter((c) => !c.startsWith('CDELT1'))]), outcome: 'error', says: /CDELT1/ });
  e.push({ name: 'header-first-card-not-simple.fits', bytes: () => imageWithCards([rawCard('SIMPLE  = T'), ...IMAGE_BASE().slice(1), ...WCS_OK].reverse()), outcome: 'error' });
  // Regression: CONTINUE chains were joined card by card (a minute for this one) and digit strings
  // hit a quadratic regular expression; the long value must also not flood the message.
  const chain = (key: string, piece: string, n: number) => () => {
    const body = piece.repeat(66).slice(0, 66);
    const cards = [...IMAGE_BASE(), ...WCS_OK.filter((c) => !c.startsWith(key.padEnd(8))), rawCard(`${key.padEnd(8)}= '${body}&'`)];
    for (let i = 0; i < n; i++) cards.push(rawCard(`CONTINUE  '${body}&'`));
    cards.push(rawCard("CONTINUE  '1x'"));
    return imageWithCards(cards);
  };
  e.push({ name: 'header-continue-chain-35000-object.fits', bytes: chain('OBJECT', 'ab', 35_000), outcome: 'spectrum' });
  e.push({ name: 'header-continue-chain-35000-cunit1.fits', bytes: chain('CUNIT1', 'n', 35_000), outcome: 'error', says: /CUNIT1/ });
  e.push({ name: 'header-continue-digits-crval1.fits', bytes: chain('CRVAL1', '1', 2_000), outcome: 'error', says: /CRVAL1/ });
  e.push({ name: 'header-continue-digits-exptime.fits', bytes: chain('EXPTIME', '1', 2_000), outcome: 'spectrum' });
  e.push({ name: 'header-continue-digits-ra.fits', bytes: chain('RA', '1', 2_000), outcome: 'spectrum' });
  e.push({
    name: 'trailing-xtension-junk.fits',
    bytes: () => concat(validImageFits(), utf8("XTENSION= 'BINTABLE'  truncated extension")),
    outcome: 'error',
    says: /truncated/,
  });
  e.push({ name: 'trailing-garbage-after-hdus.fits', bytes: () => concat(validImageFits(), utf8('some bytes a copy tool left behind')), outcome: 'spectrum' });
  e.push({
    name: 'extension-without-xtension.fits',
    bytes: () => concat(validImageFits(), fitsHeaderBytes([rawCard("XTENSION"), C('BITPIX', 8), C('NAXIS', 0)])),
  });
  e.push({
    name: 'extension-unknown-type.fits',
    bytes: () => concat(fitsHeaderBytes([C('SIMPLE', true), C('BITPIX', 8), C('NAXIS', 0), C('EXTEND', true)]), fitsHeaderBytes([C('XTENSION', 'FOREIGN'), C('BITPIX', 8), C('NAXIS', 1), C('NAXIS1', 100), C('PCOUNT', 0), C('GCOUNT', 1)]), new Uint8Array(BLOCK)),
    outcome: 'error',
    says: /no spectrum/,
  });
  e.push({
    name: 'ascii-table-only.fits',
    bytes: () => concat(fitsHeaderBytes([C('SIMPLE', true), C('BITPIX', 8), C('NAXIS', 0), C('EXTEND', true)]), fitsHeaderBytes([C('XTENSION', 'TABLE'), C('BITPIX', 8), C('NAXIS', 2), C('NAXIS1', 10), C('NAXIS2', 2), C('PCOUNT', 0), C('GCOUNT', 1), C('TFIELDS', 0)]), new Uint8Array(BLOCK)),
    outcome: 'error',
    says: /ASCII/,
  });
  return e;
}

/** Byte offset of the first card with this keyword. */
function findCard(bytes: Uint8Array, key: string): number {
  const k = key.padEnd(8, ' ');
  for (let o = 0; o + 80 <= bytes.length; o += 80) {
    let ok = true;
    for (let i = 0; i < 8 && ok; i++) ok = bytes[o + i] === k.charCodeAt(i);
    if (ok) return o;
  }
  throw new Error(`no ${key} card`);
}

/** An empty primary followed by a float image extension with the given extra (PCOUNT/GCOUNT) cards. */
function withExtension(extra: string[]): Uint8Array {
  return concat(
    fitsHeaderBytes([C('SIMPLE', true), C('BITPIX', 8), C('NAXIS', 0), C('EXTEND', true)]),
    fitsHeaderBytes([C('XTENSION', 'IMAGE'), C('BITPIX', -32), C('NAXIS', 1), C('NAXIS1', 64), ...extra, ...WCS_OK]),
    floatData(64),
  );
}

/** Binary-table headers with one column's TFORM (or other keywords) replaced by hand. */
function tableWith(tforms: string[], opts: { naxis1?: number | bigint; naxis2?: number; tfields?: string; extra?: string[]; dataBytes?: number; names?: string[] } = {}): Uint8Array {
  const names = opts.names ?? ['WAVELENGTH', 'FLUX'];
  const cards = [
    C('XTENSION', 'BINTABLE'),
    C('BITPIX', 8),
    C('NAXIS', 2),
    C('NAXIS1', opts.naxis1 ?? 8),
    C('NAXIS2', opts.naxis2 ?? 16),
    C('PCOUNT', 0),
    C('GCOUNT', 1),
    opts.tfields ?? C('TFIELDS', tforms.length),
    ...tforms.flatMap((t, i) => [C(`TTYPE${i + 1}`, names[i] ?? `COL${i + 1}`), rawCard(`TFORM${i + 1}`.padEnd(8) + `= '${t}'`)]),
    ...(opts.extra ?? []),
  ];
  const data = new Uint8Array(Math.ceil((opts.dataBytes ?? 8 * 16) / BLOCK) * BLOCK);
  const view = new DataView(data.buffer);
  // Plausible rows of (float wavelength, float flux) for the default shape.
  for (let r = 0; r + 8 <= Math.min(data.length, 8 * 16); r += 8) {
    view.setFloat32(r, 4000 + r, false);
    view.setFloat32(r + 4, 1, false);
  }
  return concat(fitsHeaderBytes([C('SIMPLE', true), C('BITPIX', 8), C('NAXIS', 0), C('EXTEND', true)]), fitsHeaderBytes(cards), data);
}

function tformEntries(): HostileEntry[] {
  const e: HostileEntry[] = [];
  e.push({ name: 'tform-baseline.fits', bytes: () => tableWith(['E', 'E']), outcome: 'spectrum' });
  e.push({ name: 'tform-repeat-1e12.fits', bytes: () => tableWith(['1000000000000E', 'E']), outcome: 'error', says: /TFORM1/ });
  e.push({ name: 'tform-repeat-2pow53.fits', bytes: () => tableWith(['9007199254740993E', 'E']), outcome: 'error', says: /TFORM1/ });
  e.push({ name: 'tform-repeat-400-digits.fits', bytes: () => tableWith([`${'9'.repeat(60)}E`, 'E']), outcome: 'error', says: /TFORM1/ });
  e.push({ name: 'tform-unknown-letter.fits', bytes: () => tableWith(['Z', 'E']), outcome: 'error', says: /TFORM1/ });
  e.push({ name: 'tform-empty.fits', bytes: () => tableWith(['', 'E']), outcome: 'error', says: /TFORM1/ });
  e.push({ name: 'tform-negative.fits', bytes: () => tableWith(['-4E', 'E']), outcome: 'error', says: /TFORM1/ });
  e.push({ name: 'tform-0E.fits', bytes: () => tableWith(['0E', '0E'], { naxis1: 0 }), outcome: 'error' });
  e.push({ name: 'tform-0E-flux.fits', bytes: () => tableWith(['E', '0E', 'E'], { names: ['WAVELENGTH', 'FLUX', 'FLUX'] }), outcome: 'spectrum' });
  e.push({ name: 'tform-p-descriptor.fits', bytes: () => tableWith(['E', '1PE(100)'], { naxis1: 12, dataBytes: 12 * 16 }), outcome: 'error', says: /TFORM2 = '1PE\(100\)'/ });
  e.push({ name: 'tform-q-descriptor.fits', bytes: () => tableWith(['1QD(10)', 'E'], { naxis1: 20, dataBytes: 20 * 16 }), outcome: 'error' });
  e.push({ name: 'tform-lowercase.fits', bytes: () => tableWith(['e', 'e']), outcome: 'spectrum' });
  e.push({ name: 'tform-width-mismatch.fits', bytes: () => tableWith(['D', 'E']), outcome: 'error', says: /NAXIS1/ });
  e.push({ name: 'tform-string-columns.fits', bytes: () => tableWith(['4A', '4A']), outcome: 'error', says: /column/ });
  e.push({ name: 'tform-bits.fits', bytes: () => tableWith(['32X', '32X']), outcome: 'error' });
  e.push({ name: 'tform-missing.fits', bytes: () => tableWith(['E', 'E'], { tfields: C('TFIELDS', 3) }), outcome: 'error', says: /TFORM3/ });
  e.push({ name: 'tfields-negative.fits', bytes: () => tableWith(['E', 'E'], { tfields: C('TFIELDS', -1) }), outcome: 'error', says: /TFIELDS/ });
  e.push({ name: 'tfields-huge.fits', bytes: () => tableWith(['E', 'E'], { tfields: C('TFIELDS', 2 ** 40) }), outcome: 'error', says: /TFIELDS/ });
  e.push({ name: 'tfields-missing.fits', bytes: () => tableWith(['E', 'E'], { tfields: C('COMMENT', 'no TFIELDS') }), outcome: 'error', says: /TFIELDS/ });
  e.push({ name: 'table-naxis2-zero.fits', bytes: () => tableWith(['E', 'E'], { naxis2: 0 }), outcome: 'error', says: /no rows/ });
  e.push({ name: 'table-naxis2-huge.fits', bytes: () => tableWith(['E', 'E'], { naxis2: 2 ** 31 }), outcome: 'error', says: /larger than/ });
  e.push({ name: 'table-naxis1-2pow31.fits', bytes: () => tableWith(['2147483648B'], { naxis1: 2 ** 31, naxis2: 0 }), outcome: 'error' });
  e.push({ name: 'table-naxis1-2pow53-no-rows.fits', bytes: () => tableWith(['1125899906842624E', '1125899906842624E'], { naxis1: 2 ** 53, naxis2: 0 }), outcome: 'error' });
  e.push({ name: 'table-bitpix-16.fits', bytes: () => replaceCard(tableWith(['E', 'E']), 'BITPIX', C('BITPIX', 16), 1), outcome: 'error', says: /BITPIX/ });
  // Regression: a TNULL or BLANK that is not an integer threw a RangeError from BigInt().
  e.push({ name: 'table-tnull-fraction.fits', bytes: () => tableWith(['E', 'J'], { extra: [C('TNULL2', 1.5)] }) });
  e.push({ name: 'table-tnull-infinite.fits', bytes: () => tableWith(['E', 'J'], { extra: [rawCard('TNULL2  = 1E400')] }) });
  e.push({ name: 'table-tscal-nan.fits', bytes: () => tableWith(['E', 'E'], { extra: [rawCard('TSCAL2  = NaN')] }), outcome: 'error', says: /TSCAL2/ });
  e.push({ name: 'table-tzero-huge.fits', bytes: () => tableWith(['E', 'E'], { extra: [rawCard('TZERO1  = 1E308'), rawCard('TSCAL1  = 1E308')] }), outcome: 'error' });
  e.push({ name: 'table-tunit-unknown.fits', bytes: () => tableWith(['E', 'E'], { extra: [C('TUNIT1', 'furlong')] }), outcome: 'error', says: /furlong/ });
  e.push({
    name: 'table-rows-of-arrays.fits',
    bytes: () => tableWith(['4E', '4E'], { naxis1: 32, naxis2: 4, dataBytes: 128 }),
    outcome: 'error',
    says: /several spectra/,
  });
  return e;
}

/** Replace the first card with keyword `key` in HDU number `hdu` (counting END cards) with `card`. */
function replaceCard(bytes: Uint8Array, key: string, card: string, hdu = 0): Uint8Array {
  const k = key.padEnd(8, ' ');
  let seen = 0;
  for (let o = 0; o + 80 <= bytes.length; o += 80) {
    const head = String.fromCharCode(...bytes.subarray(o, o + 8));
    if (head === 'END     ') seen++;
    if (seen === hdu && head === k) {
      for (let i = 0; i < 80; i++) bytes[o + i] = card.charCodeAt(i);
      return bytes;
    }
  }
  throw new Error(`no ${key} in HDU ${hdu}`);
}

function wcsEntries(): HostileEntry[] {
  const e: HostileEntry[] = [];
  const without = (...keys: string[]) => WCS_OK.filter((c) => !keys.some((k) => c.startsWith(k.padEnd(8))));
  const img = (cards: string[]) => () => imageWithCards([...IMAGE_BASE(), ...cards]);
  e.push({ name: 'wcs-cdelt1-negative.fits', bytes: img([...without('CDELT1'), C('CDELT1', -2)]), outcome: 'spectrum' });
  e.push({ name: 'wcs-cdelt1-zero.fits', bytes: img([...without('CDELT1'), C('CDELT1', 0)]), outcome: 'error', says: /CDELT1/ });
  e.push({ name: 'wcs-cdelt1-nan.fits', bytes: img([...without('CDELT1'), rawCard('CDELT1  =                  NaN')]), outcome: 'error', says: /CDELT1/ });
  e.push({ name: 'wcs-cdelt1-string-nan.fits', bytes: img([...without('CDELT1'), C('CDELT1', 'NaN')]), outcome: 'error', says: /CDELT1/ });
  e.push({ name: 'wcs-cdelt1-tiny.fits', bytes: img([...without('CDELT1'), C('CDELT1', 1e-300)]), outcome: 'error', says: /increasing/ });
  e.push({ name: 'wcs-cdelt1-overflow.fits', bytes: img([...without('CDELT1'), rawCard('CDELT1  = 1E400')]), outcome: 'error' });
  e.push({ name: 'wcs-cdelt1-missing.fits', bytes: img(without('CDELT1')), outcome: 'error', says: /CDELT1/ });
  e.push({ name: 'wcs-cd11-negative.fits', bytes: img([...without('CDELT1'), C('CD1_1', -2)]), outcome: 'spectrum' });
  e.push({ name: 'wcs-cd11-zero.fits', bytes: img([...WCS_OK, C('CD1_1', 0)]), outcome: 'error', says: /CD1_1/ });
  e.push({ name: 'wcs-cd11-nan.fits', bytes: img([...WCS_OK, rawCard('CD1_1   = NAN')]), outcome: 'error', says: /CD1_1/ });
  e.push({ name: 'wcs-crval1-nan.fits', bytes: img([...without('CRVAL1'), rawCard('CRVAL1  = nan')]), outcome: 'error', says: /CRVAL1/ });
  e.push({ name: 'wcs-crval1-infinite.fits', bytes: img([...without('CRVAL1'), rawCard('CRVAL1  = 1D999')]), outcome: 'error' });
  e.push({ name: 'wcs-crval1-negative.fits', bytes: img([...without('CRVAL1'), C('CRVAL1', -9000)]), outcome: 'error', says: /positive/ });
  e.push({ name: 'wcs-crpix1-huge.fits', bytes: img([...without('CRPIX1'), C('CRPIX1', 1e300)]), outcome: 'error' });
  e.push({ name: 'wcs-log-crval-negative.fits', bytes: img([C('CTYPE1', 'WAVE-LOG'), ...without('CTYPE1', 'CRVAL1'), C('CRVAL1', -1)]), outcome: 'error', says: /CRVAL1/ });
  e.push({ name: 'wcs-log-step-huge.fits', bytes: img([C('CTYPE1', 'WAVE-LOG'), ...without('CTYPE1', 'CDELT1'), C('CDELT1', 1e6)]), outcome: 'error' });
  e.push({ name: 'wcs-ctype-freq.fits', bytes: img([C('CTYPE1', 'FREQ'), ...without('CTYPE1')]), outcome: 'error', says: /FREQ/ });
  e.push({ name: 'wcs-ctype-tab.fits', bytes: img([C('CTYPE1', 'WAVE-TAB'), ...without('CTYPE1')]), outcome: 'error', says: /TAB/ });
  e.push({ name: 'wcs-ctype-garbage.fits', bytes: img([C('CTYPE1', '??/\\%'), ...without('CTYPE1')]), outcome: 'error', says: /wavelength/ });
  e.push({ name: 'wcs-cunit-unknown.fits', bytes: img([C('CUNIT1', 'furlong'), ...without('CUNIT1')]), outcome: 'error', says: /furlong/ });
  e.push({ name: 'wcs-dcflag-7.fits', bytes: img([C('CTYPE1', 'LINEAR'), C('DC-FLAG', 7), ...without('CTYPE1')]), outcome: 'error', says: /DC-FLAG/ });
  e.push({ name: 'wcs-dcflag-minus-1.fits', bytes: img([C('CTYPE1', 'LINEAR'), C('DC-FLAG', -1), ...without('CTYPE1')]), outcome: 'error', says: /keyword DC-FLAG\): DC-FLAG = -1: .*not dispersion-corrected/ });
  e.push({ name: 'wcs-dcflag-log-overflow.fits', bytes: img([C('CTYPE1', 'LINEAR'), C('DC-FLAG', 1), ...without('CTYPE1')]), outcome: 'error' });
  e.push({ name: 'wcs-coeff1-zero.fits', bytes: img([C('COEFF0', 3.6), C('COEFF1', 0)]), outcome: 'error', says: /COEFF1/ });
  e.push({ name: 'wcs-coeff0-huge.fits', bytes: img([C('COEFF0', 400), C('COEFF1', 1e-4)]), outcome: 'error' });
  e.push({ name: 'wcs-none.fits', bytes: img([]), outcome: 'error', says: /wavelength/ });
  // Regression: BLANK = 1.5 or 1E400 threw a RangeError from BigInt().
  e.push({ name: 'blank-fraction.fits', bytes: () => concat(fitsHeaderBytes([C('SIMPLE', true), C('BITPIX', 16), C('NAXIS', 1), C('NAXIS1', 64), C('BLANK', 1.5), ...WCS_OK]), new Uint8Array(BLOCK).fill(1)) });
  e.push({ name: 'blank-infinite.fits', bytes: () => concat(fitsHeaderBytes([C('SIMPLE', true), C('BITPIX', 32), C('NAXIS', 1), C('NAXIS1', 64), rawCard('BLANK   = 1E400'), ...WCS_OK]), new Uint8Array(BLOCK).fill(1)) });
  e.push({ name: 'blank-huge-int.fits', bytes: () => concat(fitsHeaderBytes([C('SIMPLE', true), C('BITPIX', 64), C('NAXIS', 1), C('NAXIS1', 64), C('BLANK', 10n ** 30n), ...WCS_OK]), new Uint8Array(BLOCK).fill(1)) });
  e.push({ name: 'bscale-zero.fits', bytes: img([...WCS_OK, rawCard('BSCALE  = 0')]), outcome: 'spectrum' });
  e.push({ name: 'bscale-string.fits', bytes: img([...WCS_OK, C('BSCALE', 'big')]), outcome: 'error', says: /BSCALE/ });
  e.push({ name: 'bscale-nan.fits', bytes: img([...WCS_OK, rawCard('BSCALE  = NaN')]), outcome: 'error', says: /BSCALE/ });
  e.push({ name: 'flux-all-nan.fits', bytes: () => writeFitsFile([writeImageHdu({ data: new Float32Array(64).fill(NaN), cards: IMAGE_WCS })]), outcome: 'error', says: /NaN/ });
  e.push({
    name: 'companion-ivar-wrong-length.fits',
    bytes: () => writeFitsFile([writeImageHdu({ data: new Float32Array(64).fill(1), cards: IMAGE_WCS }), writeImageHdu({ data: new Float32Array(63).fill(1), primary: false, extname: 'IVAR' })]),
    outcome: 'error',
    says: /IVAR/,
  });
  e.push({
    name: 'companion-wave-decreasing-mess.fits',
    bytes: () => writeFitsFile([writeImageHdu({ data: new Float32Array(4).fill(1) }), writeImageHdu({ data: new Float64Array([4000, 3000, 5000, 4500]), primary: false, extname: 'WAVELENGTH' })]),
    outcome: 'error',
    says: /increasing/,
  });
  const table = (wl: number[]) => () =>
    writeFitsFile([writeBinTableHdu({ columns: [{ name: 'wave', format: 'D', data: wl }, { name: 'flux', format: 'E', data: wl.map(() => 1) }], nRows: wl.length })]);
  e.push({ name: 'table-wave-nan.fits', bytes: table([4000, NaN, 4002]), outcome: 'error', says: /finite/ });
  e.push({ name: 'table-wave-repeats.fits', bytes: table([4000, 4000, 4002]), outcome: 'error', says: /increasing/ });
  e.push({ name: 'table-wave-negative.fits', bytes: table([-3, -2, -1]), outcome: 'error' });
  e.push({ name: 'table-wave-infinite.fits', bytes: table([4000, Infinity, 4002]), outcome: 'error' });
  return e;
}

/** A text entry from a string. */
const text = (name: string, s: string, outcome?: 'spectrum' | 'error', says?: RegExp): HostileEntry => ({ name, bytes: () => utf8(s), outcome, says });

function textEntries(): HostileEntry[] {
  const e: HostileEntry[] = [];
  const rows = (f: (i: number) => string, n = 20) => Array.from({ length: n }, (_, i) => f(i)).join('\n') + '\n';
  e.push(text('csv-baseline.csv', validCsvText(), 'spectrum'));
  e.push(text('csv-mixed-delimiters.csv', 'wavelength,flux\n4000,1\n4001;2\n4002\t3\n4003 4\n', 'error', /line 3/));
  e.push(text('csv-mixed-delimiters-first-semicolon.csv', '4000;1\n4001,2\n4002;3\n', 'error'));
  e.push(text('csv-quoted-fields.csv', '"wavelength","flux"\n' + rows((i) => `"${4000 + i}","${1 + i / 10}"`), 'spectrum'));
  e.push(text('csv-quote-inside.csv', '"wave""length",flux\n' + rows((i) => `${4000 + i},"1""5"`), 'error'));
  e.push(text('csv-unterminated-quote.csv', 'wavelength,flux\n4000,"1\n4001,2\n4002,3\n'));
  e.push(text('csv-quoted-separator.csv', '"wave,length",flux\n' + rows((i) => `${4000 + i},1`)));
  e.push(text('csv-blank-lines.csv', '\n\n   \nwavelength,flux\n\n4000,1\n\n\n4001,2\n \t \n4002,3\n\n', 'spectrum'));
  e.push(text('csv-utf8-bom.csv', '\ufeff' + validCsvText(), 'spectrum'));
  e.push(text('csv-bom-twice.csv', '\ufeff\ufeff' + validCsvText()));
  e.push({ name: 'csv-utf16le-bom.csv', bytes: () => utf16(validCsvText(), true, true), outcome: 'error', says: /UTF-16/ });
  e.push({ name: 'csv-utf16be-bom.csv', bytes: () => utf16(validCsvText(), false, true), outcome: 'error', says: /UTF-16/ });
  e.push({ name: 'csv-utf16le-no-bom.csv', bytes: () => utf16(validCsvText(), true, false), outcome: 'error', says: /binary/ });
  // Regression: CR-only line ends were one long line ('no numeric rows after the header').
  e.push(text('csv-cr-only.csv', validCsvText().replace(/\n/g, '\r'), 'spectrum'));
  e.push(text('csv-crlf.csv', validCsvText().replace(/\n/g, '\r\n'), 'spectrum'));
  e.push(text('csv-cr-cr-lf.csv', validCsvText().replace(/\n/g, '\r\r\n')));
  e.push(text('csv-mixed-line-ends.csv', 'wavelength,flux\r\n4000,1\n4001,2\r4002,3\r\n4003,4\n'));
  e.push({ name: 'csv-10mb-single-line.csv', bytes: () => utf8('4000,1,'.repeat(1_500_000)), outcome: 'error', says: /longer than/ });
  e.push({ name: 'csv-10mb-no-separators.txt', bytes: () => new Uint8Array(10_000_000).fill(0x37), outcome: 'error', says: /longer than/ });
  e.push({
    name: 'csv-1e6-tiny-rows.csv',
    bytes: () => {
      const parts: string[] = ['wavelength,flux'];
      for (let i = 0; i < 1_000_000; i++) parts.push(`${1000 + i},${i % 10}`);
      return utf8(parts.join('\n'));
    },
    outcome: 'spectrum',
  });
  e.push(text('csv-nan-everywhere.csv', 'wavelength,flux,ivar\n' + rows(() => 'nan,nan,nan'), 'error', /finite/));
  e.push(text('csv-inf-everywhere.csv', 'wavelength,flux,ivar\n' + rows(() => 'inf,-inf,inf'), 'error', /finite/));
  e.push(text('csv-flux-all-nan.csv', 'wavelength,flux,ivar\n' + rows((i) => `${4000 + i},NaN,inf`), 'error', /NaN/));
  e.push(text('csv-flux-some-nan.csv', 'wavelength,flux,ivar\n' + rows((i) => `${4000 + i},${i % 2 ? 'nan' : '1'},${i % 3 ? 'inf' : '2'}`), 'spectrum'));
  // Decision: a spectrum with no pixel of non-zero weight is refused, never fitted (issue 11).
  e.push(text('csv-ivar-inf-or-negative.csv', 'wavelength,flux,ivar\n' + rows((i) => `${4000 + i},1,${i % 3 ? 'inf' : '-1'}`), 'error', /no usable pixel/));
  e.push(text('csv-ivar-all-zero.csv', 'wavelength,flux,ivar\n' + rows((i) => `${4000 + i},${1 + i / 10},0`), 'error', /no usable pixel.*zero weight/));
  e.push(text('csv-all-masked.csv', 'wavelength,flux,ivar,mask\n' + rows((i) => `${4000 + i},1,1,${1 + (i % 4)}`), 'error', /no usable pixel.*masked/));
  e.push(text('csv-weight-and-mask-disjoint.csv', 'wavelength,flux,ivar,mask\n' + rows((i) => `${4000 + i},1,${i % 2},${i % 2}`), 'error', /no usable pixel/));
  e.push(text('csv-flux-nan-where-weighted.csv', 'wavelength,flux,ivar\n' + rows((i) => `${4000 + i},${i % 2 ? 'nan' : '1'},${i % 2}`), 'error', /no usable pixel/));
  e.push(text('txt-error-all-zero.txt', rows((i) => `${4000 + i} 1 0`), 'error', /no usable pixel/));
  e.push(text('csv-header-only.csv', 'wavelength,flux,ivar\n', 'error', /no numeric rows/));
  e.push(text('csv-header-only-no-newline.csv', 'wavelength,flux', 'error'));
  e.push(text('csv-comments-only.csv', '# just a comment\n% another\n; and another\n', 'error', /no numeric rows/));
  e.push(text('csv-whitespace-only.csv', '   \n\t\n  \r\n', 'error'));
  e.push(text('csv-thousands-quoted.csv', 'wavelength,flux\n' + rows((i) => `"4,${String(i).padStart(3, '0')}.5",1`), 'error', /not a number/));
  e.push(text('csv-thousands-unquoted.csv', rows((i) => `4,${String(100 + i)}.5,1.0`), 'error'));
  e.push(text('csv-thousands-space.txt', rows((i) => `4 ${String(100 + i)}.5 1.0`)));
  // Decision: a decimal comma is refused, with a message that says so (regression for the hint).
  e.push(text('csv-decimal-comma-semicolon.csv', 'wavelength;flux\n' + rows((i) => `${4000 + i},5;1,${i % 10}`), 'error', /decimal comma/));
  e.push(text('csv-decimal-comma-tab.txt', rows((i) => `${4000 + i},5\t1,${i % 10}`), 'error', /decimal comma/));
  e.push(text('csv-trailing-garbage.csv', validCsvText() + 'end of file, thank you\n', 'error', /line 202/));
  e.push(text('csv-trailing-binaryish.csv', validCsvText() + '\x01\x02\x03\x04', 'error'));
  e.push(text('csv-one-row.csv', 'wavelength,flux\n4000,1\n', 'error', /one pixel/));
  e.push(text('csv-one-column.csv', rows((i) => `${4000 + i}`), 'error', /one column/));
  e.push(text('csv-five-columns-no-header.csv', rows((i) => `${4000 + i},1,1,0,9`), 'error', /columns/));
  e.push(text('csv-10000-columns.csv', 'wavelength,flux,' + Array.from({ length: 10000 }, (_, i) => `c${i}`).join(',') + '\n' + rows((i) => `${4000 + i},1,` + '0,'.repeat(9999) + '0', 5), 'spectrum'));
  e.push(text('csv-wave-decreasing.csv', rows((i) => `${5000 - i},1`), 'spectrum'));
  e.push(text('csv-wave-zigzag.csv', rows((i) => `${4000 + (i % 2 ? -i : i)},1`), 'error', /wavelength/));
  e.push(text('csv-wave-negative.csv', rows((i) => `${-4000 + i},1`), 'error', /positive/));
  e.push(text('csv-overflow-numbers.csv', rows((i) => `${4000 + i},1e400`), 'error', /NaN/));
  e.push(text('csv-huge-wavelength.csv', rows((i) => `${i + 1}e307,1`), 'error'));
  e.push(text('csv-hex-numbers.csv', rows((i) => `0x${(4000 + i).toString(16)},1`), 'error', /wavelength/));
  e.push(text('csv-fortran-d.csv', rows((i) => `${4000 + i}.0D0,1.5d-1`), 'spectrum'));
  e.push(text('csv-latin1.csv', 'wavelength [\u00c5],flux\n' + rows((i) => `${4000 + i},1`)));
  e.push({ name: 'csv-latin1-raw-bytes.csv', bytes: () => concat(new Uint8Array([0x77, 0x61, 0x76, 0x65, 0x20, 0xc5, 0x2c]), utf8('flux\n' + rows((i) => `${4000 + i},1`))) });
  e.push(text('csv-control-chars.csv', '\x07\x08wavelength,flux\n' + rows((i) => `${4000 + i},1`)));
  // Regression: the bracket-unit regular expression took ~5 s on this header (quadratic backtracking).
  e.push(text('csv-header-many-brackets.csv', 'wavelength,flux' + '('.repeat(60_000) + '\n' + rows((i) => `${4000 + i},1`), 'spectrum'));
  e.push(text('csv-header-many-quotes.csv', 'wavelength,"' + '"'.repeat(60_000) + '\n' + rows((i) => `${4000 + i},1`)));
  e.push(text('csv-line-just-under-limit.csv', 'wavelength,flux\n' + `4000,1${' '.repeat(65_000)}\n` + rows((i) => `${4001 + i},1`), 'spectrum'));
  // Regression: three comment regular expressions backtracked quadratically (~3-4 s each on these lines).
  const long = (comment: string) => `${comment}\nwavelength,flux\n${rows((i) => `${4000 + i},1`)}`;
  e.push(text('csv-comment-long-quoted.csv', long(`# object: '${' '.repeat(60_000)}'/'`), 'spectrum'));
  e.push(text('csv-comment-long-ra.csv', long(`# ra: 1 ${' '.repeat(60_000)}1`), 'spectrum'));
  e.push(text('csv-comment-long-exptime.csv', long(`# exptime: ${'1'.repeat(30_000)}.${'1'.repeat(30_000)}x`), 'spectrum'));
  e.push(text('csv-comment-conflict.csv', '# wavelength: air, vacuum\nwavelength,flux\n' + rows((i) => `${4000 + i},1`), 'error', /contradicts/));
  e.push(text('csv-comment-bad-ra.csv', '# ra: 99:99:99\n# exptime: forever\nwavelength,flux\n' + rows((i) => `${4000 + i},1`), 'spectrum'));
  e.push(text('csv-two-wavelength-columns.csv', 'wavelength,wave,flux\n' + rows((i) => `${4000 + i},${4000 + i},1`), 'error', /wavelength/));
  e.push(text('csv-no-flux-column.csv', 'wavelength,colour\n' + rows((i) => `${4000 + i},1`), 'error', /flux/));
  e.push(text('csv-header-mismatch.csv', 'wavelength,flux,ivar\n' + rows((i) => `${4000 + i},1`), 'error', /columns/));
  e.push(text('csv-loglam-huge.csv', 'loglam,flux\n' + rows((i) => `${400 + i},1`), 'error'));
  e.push(text('csv-form-feed.csv', 'wavelength,flux\n\f\n' + rows((i) => `${4000 + i},1`)));
  e.push(text('csv-nbsp-separated.txt', rows((i) => `${4000 + i}\u00a01`)));
  e.push(text('csv-html.csv', '<html><body><script>alert(1)</script></body></html>\n', 'error'));
  e.push(text('csv-json.json', JSON.stringify({ wavelength: [4000, 4001], flux: [1, 2] }), 'error'));
  return e;
}

/** UTF-16 encoding of a string, little- or big-endian, with or without a byte-order mark. */
function utf16(s: string, little: boolean, bom: boolean): Uint8Array {
  const body = (bom ? '\ufeff' : '') + s;
  const out = new Uint8Array(body.length * 2);
  const view = new DataView(out.buffer);
  for (let i = 0; i < body.length; i++) view.setUint16(2 * i, body.charCodeAt(i), little);
  return out;
}

function gzipEntries(): HostileEntry[] {
  const e: HostileEntry[] = [];
  const gz = validGzipCsv();
  e.push({ name: 'gzip-baseline.csv.gz', bytes: () => validGzipCsv(), outcome: 'spectrum' });
  e.push({ name: 'gzip-fits-baseline.fits.gz', bytes: () => validGzipFits(), outcome: 'spectrum' });
  for (const at of [2, 3, 10, 11, 19, 20, 64, Math.floor(gz.length / 2), gz.length - 9, gz.length - 8, gz.length - 4, gz.length - 1]) {
    e.push({ name: `gzip-cut-at-${at}.csv.gz`, bytes: () => validGzipCsv().slice(0, at), outcome: 'error', says: /gzip|empty|truncated/ });
  }
  const patched = (label: string, f: (b: Uint8Array) => void, says?: RegExp): HostileEntry => ({
    name: `gzip-${label}.csv.gz`,
    bytes: () => {
      const b = validGzipCsv();
      f(b);
      return b;
    },
    outcome: 'error',
    says,
  });
  e.push(patched('bad-crc', (b) => (b[b.length - 8] ^= 0xff), /CRC/));
  e.push(patched('bad-isize', (b) => (b[b.length - 4] ^= 0x01), /gzip/));
  e.push(patched('isize-huge', (b) => new DataView(b.buffer).setUint32(b.length - 4, 0xffffffff, true), /gzip/));
  e.push(patched('bad-method', (b) => (b[2] = 7), /gzip/));
  e.push({ ...patched('reserved-flags', (b) => (b[3] = 0xe0)), outcome: undefined });
  e.push(patched('fextra-overrun', (b) => {
    b[3] = 0x04;
    b[10] = 0xff;
    b[11] = 0xff;
  }, /gzip/));
  e.push(patched('fname-unterminated', (b) => {
    b[3] = 0x08;
    b.fill(0x41, 10);
  }, /gzip/));
  const rnd = mulberry32(0x9e3779b9);
  for (let k = 0; k < 12; k++) {
    const at = 10 + Math.floor(rnd() * (gz.length - 18));
    const v = Math.floor(rnd() * 256);
    e.push({ name: `gzip-flip-deflate-${k}.csv.gz`, bytes: () => {
      const b = validGzipCsv();
      b[at] = b[at] === v ? v ^ 1 : v;
      return b;
    }, outcome: 'error' });
  }
  e.push({ name: 'gzip-bomb-520mib.csv.gz', bytes: () => gzipBomb(520), outcome: 'error', says: /limit/ });
  e.push({ name: 'gzip-bomb-16mib-zeros.gz', bytes: () => gzipBomb(16), outcome: 'error', says: /binary/ });
  e.push({ name: 'gzip-bomb-lying-trailer-small.gz', bytes: () => gzipBomb(16, 1000), outcome: 'error', says: /CRC/ });
  e.push({ name: 'gzip-of-gzip.csv.gz.gz', bytes: () => gzipSync(validGzipCsv()), outcome: 'error', says: /gzip data inside gzip/ });
  e.push({ name: 'gzip-empty.gz', bytes: () => gzipSync(new Uint8Array(0)), outcome: 'error', says: /empty/ });
  e.push({ name: 'gzip-header-only.gz', bytes: () => validGzipCsv().slice(0, 10), outcome: 'error', says: /truncated/ });
  e.push({ name: 'gzip-magic-only.gz', bytes: () => new Uint8Array([0x1f, 0x8b]), outcome: 'error', says: /truncated/ });
  e.push({
    name: 'gzip-two-members.csv.gz',
    bytes: () => {
      const t = validCsvText();
      const cut = t.indexOf('\n', t.length >> 1) + 1;
      return concat(gzipSync(utf8(t.slice(0, cut))), gzipSync(utf8(t.slice(cut))));
    },
    outcome: 'spectrum',
  });
  e.push({ name: 'gzip-member-then-junk.csv.gz', bytes: () => concat(validGzipCsv(), utf8('junk after the member')), outcome: 'error' });
  e.push({ name: 'gzip-of-binary.gz', bytes: () => gzipSync(new Uint8Array(4096).map((_, i) => (i * 7919) & 0xff)), outcome: 'error' });
  e.push({ name: 'gzip-of-truncated-fits.fits.gz', bytes: () => gzipSync(validTableFits(300).slice(0, 4000)), outcome: 'error', says: /truncated|END|larger than/ });
  return e;
}

function miscEntries(): HostileEntry[] {
  const e: HostileEntry[] = [];
  e.push({ name: 'empty.dat', bytes: () => new Uint8Array(0), outcome: 'error', says: /empty/ });
  e.push({ name: 'one-byte.dat', bytes: () => new Uint8Array([0x34]), outcome: 'error' });
  e.push({ name: 'one-nul.dat', bytes: () => new Uint8Array([0]), outcome: 'error', says: /binary/ });
  e.push({ name: 'zip-signature.zip', bytes: () => concat(new Uint8Array([0x50, 0x4b, 3, 4]), utf8(validCsvText())), outcome: 'error', says: /zip/ });
  e.push({ name: 'pdf-signature.pdf', bytes: () => utf8('%PDF-1.4\n' + validCsvText()), outcome: 'error', says: /PDF/ });
  e.push({ name: 'random-binary.bin', bytes: () => { const r = mulberry32(7); return new Uint8Array(20_000).map(() => Math.floor(r() * 256)); }, outcome: 'error' });
  e.push({ name: 'almost-fits-simple-lowercase.fits', bytes: () => { const b = validImageFits(); b[0] = 0x73; return b; }, outcome: 'error' });
  e.push({ name: 'name with spaces & <tags>.csv', bytes: () => utf8('nothing to see\n'), outcome: 'error' });
  e.push({ name: '', bytes: () => utf8('nothing to see\n'), outcome: 'error' });
  return e;
}

function validFitsDamage(): HostileEntry[] {
  const e: HostileEntry[] = [];
  const bases: [string, () => Uint8Array][] = [
    ['image', () => validImageFits()],
    ['table', () => validTableFits()],
    ['rowarrays', () => validRowOfArraysFits()],
  ];
  bases.forEach(([label, make], i) => {
    e.push(...truncations(label, make));
    e.push(...flips(label, make, 'header', 25, 1, 1000 + i));
    e.push(...flips(label, make, 'header', 10, 8, 2000 + i));
    e.push(...flips(label, make, 'data', 15, 1, 3000 + i));
    e.push(...flips(label, make, 'data', 10, 50, 4000 + i));
  });
  return e;
}

/** The whole corpus, in a fixed order. */
export function hostileCorpus(): HostileEntry[] {
  const all = [...validFitsDamage(), ...fitsStructureEntries(), ...tformEntries(), ...wcsEntries(), ...textEntries(), ...gzipEntries(), ...miscEntries()];
  const seen = new Set<string>();
  for (const x of all) {
    if (seen.has(x.name)) throw new Error(`duplicate corpus name ${x.name}`);
    seen.add(x.name);
  }
  return all;
}

