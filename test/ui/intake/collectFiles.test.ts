// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { collectFromFileList, PART_BYTES, type Collected } from '../../../src/ui/intake/collectFiles';

const MB = 1024 * 1024;
const file = (name: string, bytes: number) => new File([new Uint8Array(bytes)], name);

describe('collectFromFileList(list, sink)', () => {
  it('hands a large pick over in parts of about PART_BYTES, waiting for each, and returns the rest', async () => {
    const size = 12 * MB;
    const list = ['a', 'b', 'c', 'd', 'e'].map((n) => file(`${n}.fits`, size));
    const parts: Collected[] = [];
    let storing = false;
    const done = await collectFromFileList(list, async (p) => {
      expect(storing).toBe(false); // reading waited for the previous part
      storing = true;
      parts.push(p);
      await new Promise((r) => setTimeout(r, 5));
      storing = false;
    });
    const perPart = Math.ceil(PART_BYTES / size);
    expect(parts.map((p) => p.files.length)).toEqual([perPart]);
    expect(parts.every((p) => p.partial)).toBe(true);
    expect(done.partial).toBeFalsy();
    expect([...parts.flatMap((p) => p.files), ...done.files].map((f) => f.path)).toEqual(['a.fits', 'b.fits', 'c.fits', 'd.fits', 'e.fits']);
  });

  it('without a sink returns everything at once', async () => {
    const done = await collectFromFileList([file('x.csv', 10), file('.hidden', 10)]);
    expect(done.files.map((f) => f.path)).toEqual(['x.csv']);
  });
});
