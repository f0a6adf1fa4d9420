/**
 * The worker calls behind the quasar box's resampling button and the export's
 * measurements, on a real SDSS quasar (test/data/real-spectra, MANIFEST.tsv:
 * catalogue z 0.876162): each answers exactly what the core call gives, and a
 * file the reader refuses comes back as a message naming it.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createFitWorkerApi } from '../../../src/worker/fitWorkerApi';
import { readSpectrum } from '../../../src/core/io/readSpectrum';
import { measureQuasar } from '../../../src/core/physics/measure';

const NAME = 'spec-3655-55240-0436.fits';
const BYTES = new Uint8Array(readFileSync(`test/data/real-spectra/fits/${NAME}`));
const SPECTRUM = readSpectrum(BYTES, NAME);

describe('worker quasar measurements', () => {
  it('measureQuasarFile reads the bytes and measures at z, without caching the spectrum', () => {
    const api = createFitWorkerApi();
    expect(api.measureQuasarFile(BYTES, NAME, 0.88)).toEqual(measureQuasar(SPECTRUM, 0.88));
    expect(api.cache.get(NAME)).toBeUndefined();
  });
  it('a file the reader refuses is a message naming it', () => {
    const api = createFitWorkerApi();
    const ans = api.measureQuasarFile(new TextEncoder().encode('not a spectrum'), 'broken.fits', 1);
    expect(ans).toEqual({ error: expect.stringContaining('broken.fits') });
  });
  it('measureQuasar with draws on an open spectrum is the core call with that many seeded draws', () => {
    const api = createFitWorkerApi();
    api.openSpectrum('k', NAME, BYTES);
    const m = api.measureQuasar('k', 0.876162, 4)!;
    expect(m.draws).toBe(4);
    expect(m).toEqual(measureQuasar(SPECTRUM, 0.876162, { draws: 4 }));
    expect(api.measureQuasar('k', 0.876162)).toEqual(measureQuasar(SPECTRUM, 0.876162));
    expect(api.measureQuasar('closed', 0.876162, 4)).toBeNull();
  });
});
