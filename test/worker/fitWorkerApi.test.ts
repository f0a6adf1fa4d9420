import { describe, it, expect } from 'vitest';
import { createFitWorkerApi } from '../../src/worker/fitWorkerApi';

/**
 * A text spectrum: 800 pixels from 4000 A, one emission bump at 5000 A and
 * sigma = 0.05 noise from a fixed-seed generator (all invented).
 */
function textSpectrum(): Uint8Array {
  const lines = ['wavelength,flux,error'];
  let seed = 12345;
  // Park-Miller minimal standard generator (Park & Miller 1988, CACM 31, 1192); Box-Muller for Gaussian noise.
  const uniform = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
  const gauss = () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
  for (let i = 0; i < 800; i++) {
    const w = 4000 + 2.5 * i;
    const f = 1 + 2 * Math.exp(-0.5 * ((w - 5000) / 6) ** 2) + 0.05 * gauss();
    lines.push(`${w},${f.toFixed(5)},0.05`);
  }
  return new TextEncoder().encode(lines.join('\n'));
}

describe('fit worker API', () => {
  it('asks for bytes once, then answers from its cache', () => {
    const api = createFitWorkerApi(2);
    expect(api.openSpectrum('k', 's.csv', null)).toEqual({ kind: 'need-bytes' });
    const first = api.openSpectrum('k', 's.csv', textSpectrum());
    expect(first.kind).toBe('spectrum');
    const again = api.openSpectrum('k', 's.csv', null);
    expect(again.kind === 'spectrum' && again.spectrum.wavelengthA.length).toBe(800);
  });

  it('hands out copies, so the page may keep or move them without harming the cache', () => {
    const api = createFitWorkerApi(2);
    const a = api.openSpectrum('k', 's.csv', textSpectrum());
    if (a.kind !== 'spectrum') throw new Error('not read');
    a.spectrum.flux.fill(0);
    // Moving a buffer (what comlink.transfer does) leaves it empty on this side.
    structuredClone(a.spectrum.flux.buffer, { transfer: [a.spectrum.flux.buffer] });
    expect(a.spectrum.flux.byteLength).toBe(0);
    const b = api.openSpectrum('k', 's.csv', null);
    expect(b.kind === 'spectrum' && b.spectrum.flux[0]).toBeCloseTo(1, 0);
    expect(b.kind === 'spectrum' && b.spectrum.flux[0]).not.toBe(0);
  });

  it('evicts the least recently used spectrum beyond its capacity', () => {
    const api = createFitWorkerApi(1);
    api.openSpectrum('a', 'a.csv', textSpectrum());
    api.openSpectrum('b', 'b.csv', textSpectrum());
    expect(api.openSpectrum('a', 'a.csv', null)).toEqual({ kind: 'need-bytes' });
    expect(api.refitNear('a', 1)).toBeNull();
    expect(api.nameFeature('a', 5000)).toBeNull();
    expect(api.measureLines('a', 0, 'galaxy')).toBeNull();
    expect(api.solutionModel('a', 0, 'galaxy-sf')).toBeNull();
  });

  it('gives the model of a solution on the spectrum\'s own grid, closer to the data at the true z', () => {
    const api = createFitWorkerApi(2);
    api.openSpectrum('k', 's.csv', textSpectrum());
    const bytes = textSpectrum();
    const text = new TextDecoder().decode(bytes).split('\n').slice(1);
    const flux = text.map((l) => Number(l.split(',')[1]));
    // The invented bump at 5000 A is H-beta (4862.68 A vacuum, reference sheet sec. 1) at z = 5000/4862.68 - 1.
    const zTrue = 5000 / 4862.68 - 1;
    const rms = (m: Float64Array) => {
      let s = 0;
      let n = 0;
      for (let i = 0; i < m.length; i++) if (Number.isFinite(m[i])) (s += (m[i] - flux[i]) ** 2), n++;
      return Math.sqrt(s / n);
    };
    const atTrue = api.solutionModel('k', zTrue, 'galaxy-sf')!;
    const offTrue = api.solutionModel('k', zTrue + 0.01, 'galaxy-sf')!;
    expect(atTrue).toHaveLength(800);
    expect(rms(atTrue)).toBeLessThan(rms(offTrue));
  });

  it('a broken file gives its read error, and fitFile marks it failed', () => {
    const api = createFitWorkerApi(2);
    const bad = new TextEncoder().encode('no numbers here');
    const ans = api.openSpectrum('x', 'bad.csv', bad);
    expect(ans.kind).toBe('read-error');
    expect(ans.kind === 'read-error' && ans.message).toMatch(/^bad\.csv/);
    const r = api.fitFile(bad, 'bad.csv');
    expect(r.status).toBe('failed');
    expect(r.error).toMatch(/^bad\.csv/);
  });

  it('finds the bump at 5000 A and suggests lines for it', () => {
    const api = createFitWorkerApi(2);
    api.openSpectrum('k', 's.csv', textSpectrum());
    const ans = api.nameFeature('k', 5003);
    expect(ans?.feature?.kind).toBe('emission');
    // The bump was placed at 5000 A by construction; allow a pixel (2.5 A).
    expect(Math.abs((ans?.feature?.centreA ?? 0) - 5000)).toBeLessThan(2.5);
    expect(ans!.suggestions.length).toBeGreaterThan(0);
    // Each suggestion's z is centre / rest - 1 (definition of redshift).
    for (const s of ans!.suggestions) expect(s.z).toBeCloseTo(ans!.feature!.centreA / s.restA - 1, 6);
  });
});
