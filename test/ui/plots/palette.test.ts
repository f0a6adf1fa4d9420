import { describe, expect, it } from 'vitest';
import { FAMILY_COLOURS, familyStyle, OKABE_ITO, SPECTRUM_COLOURS } from '../../../src/ui/plots/palette';

describe('palette', () => {
  it('family styles differ in colour and dash for the first six families', () => {
    const styles = Array.from({ length: 6 }, (_, i) => familyStyle(i));
    expect(new Set(styles.map((s) => s.colour)).size).toBe(6);
    expect(new Set(styles.map((s) => s.dash)).size).toBe(6);
    // seven colours and six dashes cycle independently: 42 distinct pairs before a repeat
    const pairs = new Set(Array.from({ length: 42 }, (_, i) => JSON.stringify(familyStyle(i))));
    expect(pairs.size).toBe(42);
  });

  it('uses only Okabe-Ito hues for coloured meanings (Okabe & Ito 2008; Wong 2011, Nature Methods 8, 441)', () => {
    const okabe = new Set<string>(Object.values(OKABE_ITO));
    for (const c of FAMILY_COLOURS) expect(okabe.has(c)).toBe(true);
    for (const k of ['flux', 'band', 'model', 'emission', 'absorption', 'sky', 'highlight'] as const) expect(okabe.has(SPECTRUM_COLOURS[k])).toBe(true);
    expect(SPECTRUM_COLOURS.emission).not.toBe(SPECTRUM_COLOURS.absorption);
  });
});
