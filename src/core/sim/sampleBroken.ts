/**
 * Deliberately broken files for the demo set's broken/ folder: each one
 * exercises one refusal of the readers. `expected` is a phrase the reader's
 * message must contain (checked by test/core/io/samples.test.ts).
 */
import { strToU8, gzipSync } from 'fflate';
import { fitsCard, fitsHeaderBytes, writeBinTableHdu, writeFitsFile, writeImageHdu } from '../io/fits/write';
import { createRng } from './prng';

export interface BrokenFile {
  name: string;
  bytes: Uint8Array;
  /** What is wrong, for the truth table and the README. */
  what: string;
  /** Phrase the read error's message must contain. */
  expected: string;
}

function smallCsv(n: number, seed: number): string {
  const r = createRng(seed);
  const rows = ['wavelength,flux,ivar'];
  for (let i = 0; i < n; i++) rows.push(`${(4000 + 2 * i).toFixed(1)},${(5 + r.gaussian()).toFixed(4)},1.0`);
  return rows.join('\n') + '\n';
}

function goodImageFits(n: number): Uint8Array {
  const flux = Float32Array.from({ length: n }, (_, i) => 10 + Math.sin(i / 7));
  return writeFitsFile([
    writeImageHdu({ data: flux, cards: [['CTYPE1', 'WAVE'], ['CUNIT1', 'Angstrom'], ['CRPIX1', 1], ['CRVAL1', 4000], ['CDELT1', 2], ['OBJECT', 'MRX-BROKEN']] }),
  ]);
}

export function brokenFiles(): BrokenFile[] {
  const out: BrokenFile[] = [];
  out.push({ name: 'empty.csv', bytes: new Uint8Array(0), what: 'an empty file', expected: 'empty file' });

  const good = goodImageFits(3000); // one header block + 12000 data bytes (padded to 14400)
  out.push({ name: 'truncated.fits', bytes: good.slice(0, 2880 + 5000), what: 'a FITS file cut short in the middle of its data', expected: 'truncated' });

  const noEndHeader = fitsHeaderBytes(
    [fitsCard('SIMPLE', true), fitsCard('BITPIX', -32), fitsCard('NAXIS', 1), fitsCard('NAXIS1', 100), fitsCard('CRVAL1', 4000), fitsCard('CDELT1', 2)],
    false,
  );
  out.push({ name: 'no-end-card.fits', bytes: concat(noEndHeader, new Uint8Array(2880)), what: 'a FITS header without an END card', expected: 'no END card' });

  const badBitpix = fitsHeaderBytes([fitsCard('SIMPLE', true), fitsCard('BITPIX', 24), fitsCard('NAXIS', 1), fitsCard('NAXIS1', 100)]);
  out.push({ name: 'bitpix-24.fits', bytes: concat(badBitpix, new Uint8Array(2880)), what: 'a FITS image with BITPIX = 24, which FITS does not allow', expected: 'unsupported BITPIX 24' });

  const huge = fitsHeaderBytes([
    fitsCard('SIMPLE', true),
    fitsCard('BITPIX', -32),
    fitsCard('NAXIS', 1),
    fitsCard('NAXIS1', 2 ** 31),
    fitsCard('CTYPE1', 'WAVE'),
    fitsCard('CRVAL1', 4000),
    fitsCard('CDELT1', 1),
  ]);
  out.push({ name: 'claims-2e31-pixels.fits', bytes: concat(huge, new Uint8Array(2880)), what: 'a FITS header claiming 2^31 pixels with 2880 bytes of data', expected: '2147483648' });

  const noFlux = writeFitsFile([
    writeBinTableHdu({
      nRows: 50,
      extname: 'SPECTRUM',
      columns: [
        { name: 'WAVELENGTH', format: 'D', unit: 'Angstrom', data: Float64Array.from({ length: 50 }, (_, i) => 4000 + i) },
        { name: 'IVAR', format: 'E', data: new Float32Array(50).fill(1) },
      ],
    }),
  ]);
  out.push({ name: 'table-without-flux.fits', bytes: noFlux, what: 'a FITS binary table with wavelength and ivar columns but no flux', expected: 'no flux column' });

  const words = smallCsv(40, 1).split('\n');
  words[12] = '4022.0,bright,1.0';
  out.push({ name: 'words-for-numbers.csv', bytes: strToU8(words.join('\n')), what: "a CSV with a word ('bright') where a flux should be", expected: "'bright' is not a number" });

  const nonMono = smallCsv(40, 2).split('\n');
  nonMono[20] = nonMono[20].replace(/^[^,]+/, '4010.0');
  out.push({ name: 'wavelength-goes-back.csv', bytes: strToU8(nonMono.join('\n')), what: 'a CSV whose wavelength goes back down half-way', expected: 'strictly increasing' });

  const nanRows = ['wavelength,flux,ivar'];
  for (let i = 0; i < 40; i++) nanRows.push(`${4000 + 2 * i},nan,1`);
  out.push({ name: 'all-nan-flux.csv', bytes: strToU8(nanRows.join('\n') + '\n'), what: 'a CSV whose flux is NaN everywhere', expected: 'all flux values are NaN' });

  const ragged = smallCsv(40, 3).split('\n');
  ragged[30] = ragged[30].replace(/,[^,]*$/, '');
  out.push({ name: 'ragged-columns.csv', bytes: strToU8(ragged.join('\n')), what: 'a CSV where one row has fewer columns than the header', expected: 'row has 2 columns' });

  const r = createRng(0xb10b);
  const blob = new Uint8Array(4096);
  for (let i = 0; i < blob.length; i++) blob[i] = Math.floor(r.next() * 256);
  blob[0] = 0x00; // start like no text and no known format
  out.push({ name: 'binary-blob.dat', bytes: blob, what: 'random binary bytes', expected: 'binary data' });

  const gz = gzipSync(strToU8(smallCsv(400, 4)), { level: 9, mtime: 0 });
  out.push({ name: 'truncated.csv.gz', bytes: gz.slice(0, Math.floor(gz.length / 2)), what: 'a gzip file cut in half', expected: 'gzip data is truncated or corrupt' });
  return out;
}

function concat(a: Uint8Array, b: Uint8Array): Uint8Array {
  const o = new Uint8Array(a.length + b.length);
  o.set(a, 0);
  o.set(b, a.length);
  return o;
}
