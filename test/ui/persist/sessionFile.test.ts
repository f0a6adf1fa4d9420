import { describe, it, expect } from 'vitest';
import { encodeSession, parseSession, SESSION_FORMAT, SESSION_VERSION, type SessionFile } from '../../../src/ui/persist/sessionFile';
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
