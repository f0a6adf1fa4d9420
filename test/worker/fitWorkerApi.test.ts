import { describe, it, expect, afterEach } from 'vitest';
import { expose, releaseProxy, wrap } from 'comlink';
import { createFitWorkerApi, type FitWorkerApi } from '../../src/worker/fitWorkerApi';
import { poolWorkerOver } from '../../src/worker/createFitWorker';
import type { FitResult } from '../../src/core/types';

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

/**
 * The worker API exposed with comlink on one end of a MessageChannel and
 * wrapped on the other: the same calls and transfer lists as the app's Web
 * Worker, and real moves of buffers between ports (no structuredClone stand-in).
 * `returned` keeps what each call returned on the worker side, so a test can
 * see that those buffers moved away (byteLength 0) instead of being copied.
 */
function overChannel(cacheEntries = 2) {
  const { port1, port2 } = new MessageChannel();
  const api = createFitWorkerApi(cacheEntries);
  const returned: unknown[] = [];
  const recording = new Proxy(api, {
    get(target, prop, receiver) {
      const v = Reflect.get(target, prop, receiver);
      if (typeof v !== 'function') return v;
      // Hand back the very object the API returned: comlink finds its transfer list by that object.
      return (...args: unknown[]) => {
        const r = (v as (...a: unknown[]) => unknown).apply(target, args);
        returned.push(r);
        return r;
      };
    },
  });
  expose(recording, port1);
  const remote = wrap<FitWorkerApi>(port2);
  const close = () => {
    remote[releaseProxy]();
    port1.close();
    port2.close();
  };
  return { api, remote, returned, close };
}

const links: { close: () => void }[] = [];
afterEach(() => {
  for (const l of links.splice(0)) l.close();
});
function link(cacheEntries = 2) {
  const l = overChannel(cacheEntries);
  links.push(l);
  return l;
}

/** Buffers of every typed array of a fit result (its chi-square curves). */
function curveBuffers(r: FitResult): ArrayBufferLike[] {
  return r.curves.flatMap((c) => [c.z.buffer, c.deltaChi2.buffer]);
}

describe('fit worker API over a message channel: what moves and what stays', () => {
  it('fitFile moves the bytes in (pool side empty afterwards) and the curves out (worker side empty afterwards)', async () => {
    const { remote, returned } = link();
    const pool = poolWorkerOver({ api: remote, terminate: () => undefined });
    const bytes = textSpectrum();
    const sent = bytes.byteLength;
    expect(sent).toBeGreaterThan(0);
    const result = await pool.fitFile(bytes, 's.csv');
    expect(bytes.byteLength).toBe(0);
    expect(result.status).toBe('ok');
    expect(result.curves.length).toBeGreaterThan(0);
    for (const c of result.curves) expect(c.z.length).toBeGreaterThan(0);
    const workerSide = returned[0] as FitResult;
    expect(curveBuffers(workerSide).length).toBe(2 * result.curves.length);
    for (const b of curveBuffers(workerSide)) expect(b.byteLength).toBe(0);
  });

  it('openSpectrum moves out a copy: the copy sent is empty afterwards, the cached spectrum is whole', async () => {
    const { api, remote, returned } = link();
    const first = await remote.openSpectrum('k', 's.csv', textSpectrum());
    if (first.kind !== 'spectrum') throw new Error('not read');
    expect(first.spectrum.flux).toHaveLength(800);
    const sentCopy = (returned[0] as { spectrum: { wavelengthA: Float64Array; flux: Float64Array; ivar: Float64Array | null; mask: Uint8Array } }).spectrum;
    expect([sentCopy.wavelengthA, sentCopy.flux, sentCopy.ivar!, sentCopy.mask].map((a) => a.byteLength)).toEqual([0, 0, 0, 0]);
    const cached = api.cache.get('k')!;
    expect(cached.flux).toHaveLength(800);
    expect(cached.ivar).toHaveLength(800);
    // The page may change its copy without harming the cache.
    first.spectrum.flux.fill(0);
    const again = await remote.openSpectrum('k', 's.csv', null);
    expect(again.kind === 'spectrum' && again.spectrum.flux[0]).toBeCloseTo(1, 0);
  });

  it('refitNear and solutionModel move their arrays out', async () => {
    const { remote, returned } = link();
    await remote.openSpectrum('k', 's.csv', textSpectrum());
    const refit = await remote.refitNear('k', 0.03);
    expect(refit!.curves.length).toBeGreaterThan(0);
    for (const b of curveBuffers(returned[1] as FitResult)) expect(b.byteLength).toBe(0);
    const model = await remote.solutionModel('k', 0.03, 'galaxy-sf');
    expect(model).toHaveLength(800);
    expect((returned[2] as Float64Array).byteLength).toBe(0);
  });
});

describe('fit worker API', () => {
  it('asks for bytes once, then answers from its cache', () => {
    const api = createFitWorkerApi(2);
    expect(api.openSpectrum('k', 's.csv', null)).toEqual({ kind: 'need-bytes' });
    const first = api.openSpectrum('k', 's.csv', textSpectrum());
    expect(first.kind).toBe('spectrum');
    const again = api.openSpectrum('k', 's.csv', null);
    expect(again.kind === 'spectrum' && again.spectrum.wavelengthA.length).toBe(800);
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
    // The invented bump at 5000 A is H-beta (4862.68 A vacuum, docs/reference.md sec. 1) at z = 5000/4862.68 - 1.
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

describe('fit worker API and multi-object files (the invented demo plate, src/core/sim/samplePlate.ts)', () => {
  it('a first look splits the plate; openSpectrum of a row id shows that row (readSpectra gives the same spectrum)', async () => {
    const { buildSamplePlate, PLATE_NAME } = await import('../../src/core/sim/samplePlate');
    const { SAMPLE_SEED } = await import('../../src/core/sim/sampleSet');
    const { readSpectra } = await import('../../src/core/io/readSpectra');
    const { file } = buildSamplePlate(SAMPLE_SEED);
    const api = createFitWorkerApi(2);
    const work = api.fitOrSplit(file.bytes.slice(), PLATE_NAME);
    expect(work.kind).toBe('split');
    const id = work.kind === 'split' ? work.ids[3] : '';
    const answer = api.openSpectrum('k#4', id, file.bytes.slice());
    const expected = readSpectra(file.bytes, PLATE_NAME).find((s) => s.file === id)!;
    expect(answer.kind === 'spectrum' && answer.spectrum).toEqual(expected);
  });
});
