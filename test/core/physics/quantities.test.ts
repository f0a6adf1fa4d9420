import { describe, expect, it } from 'vitest';
import { quasarQuantities } from '../../../src/core/physics/quantities';
import type { QuasarMeasurement } from '../../../src/core/physics/types';

const FLAT_70_03 = { h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 };

function measurement(over: Partial<QuasarMeasurement> = {}): QuasarMeasurement {
  return {
    z: 2,
    fluxScale: { ok: true, ergPerSCm2A: 1e-17, unit: '1e-17 erg/s/cm2/A' },
    continua: [{ restA: 1350, ok: true, flux: 10, fluxErr: 0.1 }],
    lines: [{ id: 'CIV', ok: true, fwhmKms: 5000, fwhmErrKms: 100 }],
    absorption: { ok: false, reason: 'x', troughs: [] },
    draws: 0,
    noiseEstimated: false,
    ...over,
  };
}

describe('quasarQuantities(measurement, cosmology)', () => {
  it('lambda L_lambda at 1350 A against astropy FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0): D_L(z = 2) = 15539.59 Mpc', () => {
    // Check value: astropy 5.2.1 luminosity_distance(2) = 15539.59 Mpc (docs/reference.md sec. 4, case A);
    // 4 pi D_L^2 (1 + z) 1350 A x 1e-16 erg/s/cm2/A with 1 Mpc = 3.085677581491367e24 cm gives log10 = 46.068245.
    const q = quasarQuantities(measurement(), FLAT_70_03);
    const L = q.logLambdaL[1350] as { value: number; err: number };
    expect(L.value).toBeCloseTo(46.068245, 4);
    // 1 % flux error = 0.004343 dex (0.01 / ln 10).
    expect(L.err).toBeCloseTo(0.0043429, 6);
  });
  it('C IV mass, bolometric luminosity and Eddington ratio follow from it (VP06 eq. 7, BC 3.81, L_Edd = 1.26e38 M)', () => {
    const q = quasarQuantities(measurement(), FLAT_70_03);
    // By hand: 6.66 + 0.53 (46.068245 - 44) + 2 log10(5) = 6.66 + 1.096170 + 1.397940 = 9.154110.
    expect(q.preferred?.id).toBe('civ_vp06');
    expect(q.preferred?.logM).toBeCloseTo(9.15411, 4);
    expect(q.preferred?.sysDex).toBe(0.4);
    // log L_bol = 46.068245 + log10(3.81) = 46.649155; log L_Edd = log10(1.26e38) + 9.154110 = 47.254459.
    expect(q.logLbol?.value).toBeCloseTo(46.649155, 4);
    expect(q.logEddRatio?.value).toBeCloseTo(46.649155 - 47.254459, 4);
  });
  it('an uncalibrated flux gives no luminosity and no mass, with the reason', () => {
    const q = quasarQuantities(measurement({ fluxScale: { ok: false, reason: 'the file states no flux unit, so the flux scale is unknown' } }), FLAT_70_03);
    expect(q.logLambdaL[1350]).toEqual({ reason: expect.stringContaining('no flux unit') });
    expect(q.masses).toEqual([]);
    expect(q.massReason).toContain('no flux unit');
    expect(q.logLbol).toBeUndefined();
  });
});
