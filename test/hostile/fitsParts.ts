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
  return concatBytes(...hdus.flatMap((h) => [fitsHeaderBytes(h.cards), h.data]));
}

/** The byte arrays one after another. */
export function concatBytes(...parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((a, p) => a + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

/**
 * A copy of a set of HDUs with header-card edits applied: each edit
 * [pick, keyword, value, replace] replaces that keyword's card in HDU
 * pick % n when `replace` and the card exists, and otherwise inserts the card
 * anywhere after the first one. makeCard turns "KEY     = value" (or "END")
 * into an 80-character card.
 */
export function withCardEdits(
  set: readonly HduParts[], edits: readonly [number, string, string, boolean][], makeCard: (text: string) => string,
): HduParts[] {
  const hdus = set.map((h) => ({ cards: [...h.cards], data: h.data }));
  for (const [pick, key, value, replace] of edits) {
    const h = hdus[pick % hdus.length];
    const card = key === 'END' ? makeCard('END') : makeCard(`${key.padEnd(8)}= ${value}`);
    const at = h.cards.findIndex((c) => c.startsWith(key.padEnd(8)));
    if (replace && at >= 0) h.cards[at] = card;
    else h.cards.splice(1 + (pick % h.cards.length), 0, card);
  }
  return hdus;
}
