// @vitest-environment jsdom
import { describe, it, expect, afterEach, vi } from 'vitest';
import { render, screen, cleanup, fireEvent, waitFor } from '@testing-library/react';
import { ServicesContext } from '../../../src/ui/state/SessionContext';
import { QuasarPhysicsBox, fmtErr } from '../../../src/ui/physics/QuasarPhysicsBox';
import { fakeReview } from '../harness';
import { makeResult } from '../fixtures';
import type { QuasarMeasurement } from '../../../src/core/physics/types';
import type { Session } from '../../../src/ui/state/session';

afterEach(cleanup);

const COSMO = { h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 };
// A measurement as the worker would send it (numbers of the quantities test: z = 2, C IV 5000 km/s, 1e-16 erg/s/cm2/A at 1350 A).
const measured: QuasarMeasurement = {
  z: 2,
  fluxScale: { ok: true, ergPerSCm2A: 1e-17, unit: '1e-17 erg/s/cm2/A' },
  continua: [{ restA: 1350, ok: true, flux: 10, fluxErr: 0.1 }],
  lines: [{ id: 'CIV', ok: true, fwhmKms: 5000, fwhmErrKms: 100, sigmaKms: 2100 }],
  absorption: { ok: true, biKms: 3556, aiKms: 5000, troughs: [{ vFromKms: 5000, vToKms: 15000, restFromA: 1474.4, restToA: 1523.5, depth: 0.5, inBi: true }] },
  draws: 8,
  noiseEstimated: false,
};

function renderBox(onTroughs = vi.fn(), onUseZ = vi.fn()) {
  const session = { noteQuasarMeasurement: vi.fn() };
  const review = fakeReview({
    measureQuasar: vi.fn(async () => measured),
    refitMasked: vi.fn(async () => makeResult('q', { z: 2.01, class: 'qso' })),
  });
  render(
    <ServicesContext.Provider value={{ session: session as unknown as Session, review }}>
      <QuasarPhysicsBox rowKey="k" z={2} cls="qso" ready cosmology={COSMO} onTroughs={onTroughs} onUseZ={onUseZ} />
    </ServicesContext.Provider>,
  );
  return { review, session, onTroughs, onUseZ };
}

describe('QuasarPhysicsBox', () => {
  it('asks the worker to measure at the shown z and shows the mass with its 0.4 dex systematic', async () => {
    const { review, session, onTroughs } = renderBox();
    expect(review.measureQuasar).toHaveBeenCalledWith('k', 2);
    const box = await screen.findByTestId('physics-box');
    await waitFor(() => expect(box.textContent).toContain('civ_vp06'));
    // log M = 9.15 (hand-worked in test/core/physics/quantities.test.ts from VP06 eq. 7).
    expect(box.textContent).toMatch(/9\.15 ± 0\.\d\d stat\. ± 0\.4 dex sys\./);
    expect(screen.getByTestId('physics-bal').textContent).toContain('BI 3556 km/s');
    // Troughs are handed to the plot in observed Angstrom: rest x (1 + z).
    expect(onTroughs).toHaveBeenLastCalledWith([[1474.4 * 3, 1523.5 * 3]]);
    // The session keeps it for a decision at this z (exports then carry the physics at a reviewed z).
    expect(session.noteQuasarMeasurement).toHaveBeenCalledWith('k', measured);
  });
  it('fits again with the troughs masked on request and offers to refit at the answer', async () => {
    const { review, onUseZ } = renderBox();
    fireEvent.click(await screen.findByRole('button', { name: 'Fit again with the troughs masked' }));
    expect(review.refitMasked).toHaveBeenCalledWith('k', [[1474.4 * 3, 1523.5 * 3]], null);
    expect((await screen.findByTestId('physics-masked')).textContent).toContain('z = 2.0100');
    fireEvent.click(screen.getByRole('button', { name: 'Refit there' }));
    expect(onUseZ).toHaveBeenCalledWith(2.01);
  });
  it('re-measures with 32 seeded draws on request and says the errors now come from resampling', async () => {
    // The batch's measurement has no draws; the worker's answer with draws carries a wider FWHM error (as core reports the larger of the two).
    const fromFit: QuasarMeasurement = { ...measured, draws: 0 };
    const resampled: QuasarMeasurement = { ...measured, draws: 32, lines: [{ ...measured.lines[0], fwhmErrKms: 250 }] };
    const session = { noteQuasarMeasurement: vi.fn() };
    const review = fakeReview({ measureQuasar: vi.fn(async (_k: string, _z: number, draws?: number) => (draws ? resampled : fromFit)) });
    render(
      <ServicesContext.Provider value={{ session: session as unknown as Session, review }}>
        <QuasarPhysicsBox rowKey="k" z={2} cls="qso" ready cosmology={COSMO} onTroughs={() => {}} onUseZ={() => {}} />
      </ServicesContext.Provider>,
    );
    const from = await screen.findByTestId('physics-errors-from');
    expect(from.textContent).toContain("fits' covariances");
    expect(screen.getByTestId('physics-box').textContent).toContain('5000 ± 100 km/s');
    fireEvent.click(screen.getByRole('button', { name: 'Errors by resampling (slow)' }));
    expect(review.measureQuasar).toHaveBeenLastCalledWith('k', 2, 32);
    await waitFor(() => expect(screen.getByTestId('physics-errors-from').textContent).toContain('spread over 32 resampled spectra'));
    expect(screen.getByTestId('physics-box').textContent).toContain('5000 ± 250 km/s');
    expect(screen.queryByRole('button', { name: 'Errors by resampling (slow)' })).toBeNull();
    // A decision at this z takes the resampled measurement along.
    expect(session.noteQuasarMeasurement).toHaveBeenLastCalledWith('k', resampled);
  });
  it('shows nothing for a galaxy', () => {
    render(
      <ServicesContext.Provider value={{ session: {} as Session, review: fakeReview() }}>
        <QuasarPhysicsBox rowKey="k" z={0.1} cls="galaxy" ready cosmology={COSMO} onTroughs={() => {}} onUseZ={() => {}} />
      </ServicesContext.Provider>,
    );
    expect(screen.queryByTestId('physics-box')).toBeNull();
  });
});

describe('fmtErr', () => {
  it('shows an error below half the last shown digit as "< 0.01", not a misleading 0.00', () => {
    expect(fmtErr(0.001, 2)).toBe('< 0.01');
    expect(fmtErr(0.004999, 2)).toBe('< 0.01');
    expect(fmtErr(0.02, 2)).toBe('0.02');
    expect(fmtErr(3.7, 0)).toBe('4');
  });
});
