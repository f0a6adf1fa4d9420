import { describe, it, expect } from 'vitest';
import { encodeSession, parseSession, thinCurve, SESSION_CURVE_POINTS, SESSION_FORMAT, SESSION_VERSION, type SessionFile } from '../../../src/ui/persist/sessionFile';
import { makeResult, makeFailed, makeDecision } from '../fixtures';

function session(over: Partial<SessionFile> = {}): SessionFile {
  return {
    format: SESSION_FORMAT,
    version: SESSION_VERSION,
    exportedAt: '2026-01-02T10:00:00.000Z',
    software: 'Shiftmark test',
    reviewer: 'Tester',
    cosmology: { h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 },
    entries: [
      { key: 'a|3|00000001', file: 'a.fits', order: 0, result: makeResult('a.fits'), decision: makeDecision('a.fits'), bytes: new Uint8Array([0, 255, 7]) },
      { key: 'b|3|00000002', file: 'b.fits', order: 1, result: makeFailed('b.fits', 'b.fits: empty file'), decision: null },
    ],
    ...over,
  };
}

describe('session file', () => {
  it('round-trips typed arrays, bytes, NaN and Infinity', () => {
    const s = session();
    s.entries[0].result!.chi2Gap = Infinity;
    const back = parseSession(encodeSession(s));
    expect(back.ok).toBe(true);
    if (!back.ok) return;
    const [a, b] = back.session.entries;
    expect(a.result!.curves[0].z).toBeInstanceOf(Float64Array);
    expect(Array.from(a.result!.curves[0].deltaChi2)).toEqual([50, 0, 60]);
    expect(a.result!.chi2Gap).toBe(Infinity);
    expect(Array.from(a.bytes!)).toEqual([0, 255, 7]);
    expect(Number.isNaN(b.result!.z)).toBe(true);
    expect(a.decision).toEqual(makeDecision('a.fits'));
  });

  it('refuses text that is not JSON, or not a session', () => {
    expect(parseSession('{not json').ok).toBe(false);
    const other = parseSession(JSON.stringify({ format: 'something-else' }));
    expect(other.ok === false && other.problems[0]).toMatch(/not a Shiftmark session file/);
  });

  it('refuses a decision with an unknown state, a bad time, or a redshift on a rejection', () => {
    const bad = session();
    (bad.entries[0].decision as unknown as Record<string, unknown>).state = 'maybe';
    const r1 = parseSession(encodeSession(bad));
    expect(r1.ok === false && r1.problems.join('\n')).toMatch(/entry 1: decision.state 'maybe'/);

    const bad2 = session();
    bad2.entries[0].decision!.decidedAt = 'yesterday';
    const r2 = parseSession(encodeSession(bad2));
    expect(r2.ok === false && r2.problems.join('\n')).toMatch(/decidedAt is not an ISO 8601 time/);

    const bad3 = session();
    bad3.entries[0].decision = makeDecision('a.fits', { state: 'rejected', z: 1.2 });
    const r3 = parseSession(encodeSession(bad3));
    expect(r3.ok === false && r3.problems.join('\n')).toMatch(/rejected decision carries a redshift/);
  });

  it('refuses duplicate keys and malformed results', () => {
    const dup = session();
    dup.entries[1].key = dup.entries[0].key;
    const r = parseSession(encodeSession(dup));
    expect(r.ok === false && r.problems.join('\n')).toMatch(/appears twice/);

    const broken = JSON.parse(encodeSession(session()));
    broken.entries[0].result.candidates = 'none';
    const r2 = parseSession(JSON.stringify(broken));
    expect(r2.ok === false && r2.problems.join('\n')).toMatch(/candidates is not a list/);
  });

  it('refuses bytes that are not base64', () => {
    const raw = JSON.parse(encodeSession(session()));
    raw.entries[0].bytes = { $b64: '<script>' };
    const r = parseSession(JSON.stringify(raw));
    expect(r.ok).toBe(false);
  });
});

describe('session file size', () => {
  // Invented curves of the engine's size: 1500 points per family, four families, a well in each.
  const n = 1500;
  const z = Float64Array.from({ length: n }, (_, i) => (i * 6.5) / (n - 1));
  const wells = [2.3456, 0.7321, 1.111, 0.0004];
  const curves = wells.map((w, f) => ({ family: `fam${f}`, z, deltaChi2: z.map((v) => 50 + 2000 * Math.abs(v - w)) }));
  const big = (): SessionFile => session({ entries: [{ key: 'a|3|1', file: 'a.fits', order: 0, result: makeResult('a.fits', { curves }), decision: null }] });

  it('thins the curves and writes them compactly, keeping every well', () => {
    const text = encodeSession(big());
    const plain = JSON.stringify(big().entries[0].result!.curves.map((c) => [Array.from(c.z), Array.from(c.deltaChi2)]));
    expect(text.length).toBeLessThan(plain.length / 8);
    const back = parseSession(text);
    expect(back.ok).toBe(true);
    if (!back.ok) return;
    back.session.entries[0].result!.curves.forEach((c, f) => {
      expect(c.z.length).toBeLessThanOrEqual(SESSION_CURVE_POINTS);
      const k = c.deltaChi2.indexOf(Math.min(...c.deltaChi2));
      // The lowest point kept is the lowest grid point of the original (within float32 rounding).
      const orig = curves[f];
      const ko = orig.deltaChi2.indexOf(Math.min(...orig.deltaChi2));
      expect(c.z[k]).toBeCloseTo(orig.z[ko], 5);
    });
  });

  it('still reads version 1 files (curves as number lists)', () => {
    const s = session({ version: 1 });
    // Version 1 wrote typed arrays as number lists and non-finite numbers as tagged text.
    const v1 = JSON.stringify(s, (_k, v) =>
      typeof v === 'number' && !Number.isFinite(v) ? { $num: String(v) } : v instanceof Float64Array ? { $f64: Array.from(v) } : v instanceof Uint8Array ? { $b64: 'AP8H' } : v,
    );
    const back = parseSession(v1);
    expect(back.ok).toBe(true);
    if (back.ok) expect(Array.from(back.session.entries[0].result!.curves[0].deltaChi2)).toEqual([50, 0, 60]);
  });

  it('decisions keep their flags and named line; files of earlier versions, written before flags were on the decision, still load', () => {
    const withFlags = session();
    withFlags.entries[0].decision = makeDecision('a.fits', { howSet: 'line', lineId: { id: 'CIV', observedA: 5338.8 }, flags: ['low-snr', 'blend'] });
    const back = parseSession(encodeSession(withFlags));
    expect(back.ok).toBe(true);
    if (back.ok) expect(back.session.entries[0].decision).toMatchObject({ lineId: { id: 'CIV', observedA: 5338.8 }, flags: ['low-snr', 'blend'] });

    // A version 1 file from before flags: the decision has no flags field at all.
    const old = session({ version: 1 });
    const v1 = JSON.stringify(old, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? { $num: String(v) } : v instanceof Float64Array ? { $f64: Array.from(v) } : v instanceof Uint8Array ? { $b64: 'AP8H' } : v));
    expect(v1).not.toContain('"flags"');
    const oldBack = parseSession(v1);
    expect(oldBack.ok).toBe(true);
    if (oldBack.ok) expect(oldBack.session.entries[0].decision!.flags).toBeUndefined();
  });

  it('refuses a decision with a word that is no review flag', () => {
    const bad = session();
    (bad.entries[0].decision as unknown as Record<string, unknown>).flags = ['low-snr', 'looks-odd'];
    const r = parseSession(encodeSession(bad));
    expect(r.ok === false && r.problems.join('\n')).toMatch(/decision.flags holds an unknown flag/);
  });

  it('thinCurve keeps short curves as they are', () => {
    const short = thinCurve(Float64Array.from([0, 1, 2]), Float64Array.from([3, 0, 4]), 10);
    expect(Array.from(short.deltaChi2)).toEqual([3, 0, 4]);
  });
});
