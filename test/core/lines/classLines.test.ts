import { describe, expect, it } from 'vitest';
import { classHasLine, classLines, classOfLine, markersForClass } from '../../../src/core/lines/classLines';
import { LINES } from '../../../src/core/lines/catalogue';
import { linesForClass } from '../../../src/core/engine/measureLines';
import type { SpectrumClass } from '../../../src/core/types';

const CLASSES: SpectrumClass[] = ['qso', 'galaxy', 'star', 'unknown'];
const ids = (cls: SpectrumClass) => classLines(cls).map((l) => l.line.id);

describe('classLines(cls): which catalogue lines a class has', () => {
  // Which lines are seen in which kind of object is common practice (e.g. the
  // composite quasar spectrum of Vanden Berk et al. 2001, AJ 122, 549: broad
  // Ly-alpha, C IV, C III], Mg II; galaxies: narrow [O II], [O III], H-alpha and
  // the Ca II H and K absorption of their stars; stars: absorption only).
  it('quasars: the broad lines broad, narrow forbidden lines narrow, no stellar absorption', () => {
    const qso = new Map(classLines('qso').map((l) => [l.line.id, l.profile]));
    for (const id of ['LyA', 'CIV', 'CIII', 'MgII', 'Hbeta', 'Halpha']) expect(qso.get(id), id).toBe('broad');
    for (const id of ['OII', 'OIII_5008', 'NeV']) expect(qso.get(id), id).toBe('narrow');
    for (const id of ['CaK', 'CaH', 'Mgb', 'NaD']) expect(qso.has(id), id).toBe(false);
  });
  it('galaxies: narrow emission (Balmer lines narrow, not broad) and the absorption features, no quasar-only broad line', () => {
    const gal = new Map(classLines('galaxy').map((l) => [l.line.id, l.profile]));
    for (const id of ['OII', 'OIII_5008', 'Hbeta', 'Halpha', 'NII_6585']) expect(gal.get(id), id).toBe('narrow');
    for (const id of ['CaK', 'CaH', 'Gband', 'Mgb', 'NaD']) expect(gal.get(id), id).toBe('absorption');
    for (const id of ['LyA', 'CIV', 'MgII']) expect(gal.has(id), id).toBe(false);
  });
  it('stars: absorption features only', () => {
    expect(classLines('star').length).toBeGreaterThan(0);
    expect(classLines('star').every((l) => l.profile === 'absorption' && l.line.kind === 'absorption')).toBe(true);
    expect(ids('star')).toEqual(expect.arrayContaining(['CaK', 'CaH', 'NaD']));
  });
  it('unknown is read like a galaxy (the engine measures both narrow and absorption there)', () => {
    expect(classLines('unknown')).toEqual(classLines('galaxy'));
  });
  it('keeps catalogue order and lists each line once', () => {
    const order = LINES.map((l) => l.id);
    for (const c of CLASSES) {
      const got = ids(c);
      expect(new Set(got).size, c).toBe(got.length);
      expect(got, c).toEqual(order.filter((id) => got.includes(id)));
    }
  });
});

describe('one rule for the engine and the plot', () => {
  it("the engine's line measurement plan has exactly these lines, with the same profile, for every class", () => {
    for (const c of CLASSES) {
      const engine = linesForClass(c).map((p) => `${p.line.id}:${p.profile.name}`);
      const core = classLines(c).map((l) => `${l.line.id}:${l.profile}`);
      expect(engine, c).toEqual(core);
    }
  });
  it('markersForClass marks exactly the lines of the class, absorption profiles as troughs', () => {
    for (const c of CLASSES) {
      const m = markersForClass(c);
      expect(m.map((x) => x.id), c).toEqual(ids(c));
      classLines(c).forEach((l, i) => {
        expect(m[i].kind).toBe(l.profile === 'absorption' ? 'absorption' : 'emission');
        expect(m[i].restA).toBe(l.line.restA);
        expect(m[i].label).toBe(l.line.label);
      });
    }
  });
  it('gives the same marker array on every call (views compare by identity); no class means unknown', () => {
    expect(markersForClass('qso')).toBe(markersForClass('qso'));
    expect(markersForClass(undefined)).toBe(markersForClass('unknown'));
    expect(markersForClass('qso')).not.toBe(markersForClass('galaxy'));
  });
});

describe('classOfLine / classHasLine', () => {
  it('a broad quasar line speaks for a quasar, a narrow line or absorption feature for a galaxy', () => {
    expect(classOfLine('CIV')).toBe('qso');
    expect(classOfLine('Hbeta')).toBe('qso'); // broad in quasars first: it has the broad role
    expect(classOfLine('OIII_5008')).toBe('galaxy');
    expect(classOfLine('CaK')).toBe('galaxy');
    expect(classOfLine('no-such-line')).toBeNull();
  });
  it('classHasLine follows classLines', () => {
    expect(classHasLine('star', 'CaK')).toBe(true);
    expect(classHasLine('star', 'Halpha')).toBe(false);
    expect(classHasLine('qso', 'OIII_5008')).toBe(true);
    expect(classHasLine('galaxy', 'LyA')).toBe(false);
  });
});
