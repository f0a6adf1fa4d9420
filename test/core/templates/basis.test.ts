import { describe, expect, it } from 'vitest';
import { ENCODED_FAMILIES } from '../../../src/core/templates/basisData';
import { publishedFamilies } from '../../../src/core/templates';
import { buildAllFamilies } from '../../../src/core/templates/build/buildAll';
import { encodeVector, decodeVector } from '../../../src/core/templates/build/encode';
import { toLogGrid } from '../../../src/core/templates/build/toLogGrid';
import { publishedTables, table } from '../engine/synth';

describe('template families from the published spectra', () => {
  it('basisData.ts is what `npm run templates` builds from src/core/templates/published (regenerate after changing a recipe)', () => {
    const built = buildAllFamilies(publishedTables());
    expect(built.map((f) => f.id)).toEqual(ENCODED_FAMILIES.map((f) => f.id));
    for (const f of built) {
      const e = ENCODED_FAMILIES.find((x) => x.id === f.id)!;
      expect(e.vectors.map((v) => v.id)).toEqual(f.vectors.map((v) => v.id));
      f.vectors.forEach((v, j) => expect(encodeVector(v.values).data).toBe(e.vectors[j].data));
    }
  });

  it('encoding keeps every vector to 1 part in 30000 of its peak', () => {
    const v = Float64Array.from({ length: 1000 }, (_, i) => Math.sin(i / 7) * (i % 13));
    const back = decodeVector(encodeVector(v), v.length);
    let peak = 0;
    let err = 0;
    for (let i = 0; i < v.length; i++) {
      peak = Math.max(peak, Math.abs(v[i]));
      err = Math.max(err, Math.abs(v[i] - back[i]));
    }
    expect(err / peak).toBeLessThan(1 / 30000);
  });

  it('the stellar eigenspectra are orthonormal and rebuild a library star (Pickles 1998 G2V) to about 2 % rms, as the 0.05 % of the library sum of squares they leave out implies', () => {
    const star = publishedFamilies().find((f) => f.id === 'star')!;
    const eig = star.vectors.filter((v) => v.eigen).map((v) => v.values);
    for (let a = 0; a < 3; a++) {
      for (let b = 0; b <= a; b++) {
        let d = 0;
        for (let k = 0; k < eig[a].length; k++) d += eig[a][k] * eig[b][k];
        expect(d).toBeCloseTo(a === b ? 1 : 0, 3);
      }
    }
    // project the published G2V (on the same grid, mean-normalised as the recipe does) on the eigenspectra
    const t = table('pickles_uk026_g2v');
    const g = toLogGrid(t.wavelengthA, t.flux, star.kStart, star.kStart + eig[0].length - 1);
    let mean = 0;
    let n = 0;
    for (const x of g) if (Number.isFinite(x)) (mean += x), n++;
    mean /= n;
    const y = g.map((x) => (Number.isFinite(x) ? x / mean : 1));
    const rec = new Float64Array(y.length);
    for (const e of eig) {
      let c = 0;
      for (let k = 0; k < y.length; k++) c += e[k] * y[k];
      for (let k = 0; k < y.length; k++) rec[k] += c * e[k];
    }
    let ss = 0;
    for (let k = 0; k < y.length; k++) ss += (y[k] - rec[k]) ** 2;
    expect(Math.sqrt(ss / y.length)).toBeLessThan(0.03);
  });

  it('the quasar family keeps its continuum polynomial above the Lyman limit (911.75 A, from memory) and its lines non-negative', () => {
    const q = publishedFamilies().find((f) => f.id === 'qso')!;
    expect(q.polynomialFromA).toBe(911.75);
    const lines = ['composite', 'forest absorption', 'Ly-alpha + N V', 'Si IV', 'C IV + He II', 'C III]', 'Mg II', 'H-beta + [O III]', 'H-alpha'];
    for (const id of lines) expect(q.vectors.find((v) => v.id === id)?.nonNegative).toBe(true);
    // the only signed ones: the C IV velocity-shift term and the host's second eigenspectrum
    expect(q.vectors.filter((v) => !v.nonNegative).map((v) => v.id).sort()).toEqual(['C IV shift', 'host eigen 2']);
  });
});
