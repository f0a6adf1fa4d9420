/** Writer-made FITS HDUs taken apart into editable cards and data, and joined again (for the fuzzers). */
import { fitsHeaderBytes } from '../../src/core/io/fits/write';

/** One HDU as editable header cards (without END) plus its data blocks. */
export interface HduParts {
  cards: string[];
  data: Uint8Array;
}

/** Split a writer-made HDU into its cards and data (the header ends with the block holding END). */
export function splitHdu(hdu: Uint8Array): HduParts {
  const cards: string[] = [];
  for (let o = 0; o < hdu.length; o += 80) {
    const card = String.fromCharCode(...hdu.subarray(o, o + 80));
    if (card.startsWith('END ')) return { cards, data: hdu.slice(Math.ceil((o + 80) / 2880) * 2880) };
    cards.push(card);
  }
  throw new Error('no END in a writer-made HDU');
}

export function joinHdus(hdus: HduParts[]): Uint8Array {
  const parts = hdus.flatMap((h) => [fitsHeaderBytes(h.cards), h.data]);
  const out = new Uint8Array(parts.reduce((a, p) => a + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}
