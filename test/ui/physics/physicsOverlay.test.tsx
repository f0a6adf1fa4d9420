// @vitest-environment jsdom
/**
 * The broad-line fits on the plot: the box turns the worker's measurement into
 * a curve on the open spectrum's grid (hand-computed values), and the frame
 * draws it in its own style, only over the fitted ranges.
 */
import { describe, it, expect, afterEach, vi } from 'vitest';
import { render, cleanup, waitFor } from '@testing-library/react';
import { ServicesContext } from '../../../src/ui/state/SessionContext';
import { QuasarPhysicsBox } from '../../../src/ui/physics/QuasarPhysicsBox';
import { drawSpectrumFrame } from '../../../src/ui/plots/drawSpectrumFrame';
import { buildDisplaySeries } from '../../../src/ui/plots/displaySeries';
import { SPECTRUM_COLOURS } from '../../../src/ui/plots/palette';
import { RecordingContext } from '../plots/recordingContext';
import { fakeReview } from '../harness';
import type { QuasarMeasurement } from '../../../src/core/physics/types';
import type { Session } from '../../../src/ui/state/session';

afterEach(cleanup);

// One fitted C IV line at z = 2: continuum 10 (flat, alpha 0) plus a broad Gaussian of peak 5 at 1549.06 A, fitted over 1500-1600 A rest.
const measured: QuasarMeasurement = {
  z: 2,
  fluxScale: { ok: true, ergPerSCm2A: 1e-17, unit: '1e-17 erg/s/cm2/A' },
  continua: [],
  lines: [
    {
      id: 'CIV',
      ok: true,
      fwhmKms: 4710,
      fwhmErrKms: 100,
      sigmaKms: 2000,
      gaussians: [{ restA: 1549.06, amp: 5, velKms: 0, sigmaKms: 2000, broad: true }],
      continuum: { refA: 1350, a: 10, alpha: 0, fe: 0 },
      rangeA: [1500, 1600],
    },
  ],
  absorption: { ok: false, reason: 'not covered', troughs: [] },
  draws: 0,
  noiseEstimated: false,
};

describe('broad-line fits drawn on the plot', () => {
  it('the box hands the panel the fits on the spectrum grid: continuum + Gaussian inside the range, NaN outside', async () => {
    const onCurve = vi.fn();
    // 1400 A rest is outside the range; 1549.06 A is the line centre; 1700 A is outside.
    const wavelengthA = Float64Array.from([1400 * 3, 1549.06 * 3, 1700 * 3]);
    render(
      <ServicesContext.Provider value={{ session: { noteQuasarMeasurement: vi.fn() } as unknown as Session, review: fakeReview({ measureQuasar: vi.fn(async () => measured) }) }}>
        <QuasarPhysicsBox rowKey="k" z={2} cls="qso" ready cosmology={{ h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 }} onTroughs={() => {}} onUseZ={() => {}} wavelengthA={wavelengthA} onCurve={onCurve} />
      </ServicesContext.Provider>,
    );
    await waitFor(() => expect(onCurve.mock.calls.some((c) => c[0] instanceof Float64Array)).toBe(true));
    const curve = onCurve.mock.calls.map((c) => c[0]).find((c) => c instanceof Float64Array) as Float64Array;
    expect(Number.isNaN(curve[0])).toBe(true);
    // By hand: 10 x (1549.06 / 1350)^0 + 5 x exp(0) = 15.
    expect(curve[1]).toBeCloseTo(15, 10);
    expect(Number.isNaN(curve[2])).toBe(true);
  });

  it('a galaxy gets no curve', async () => {
    const onCurve = vi.fn();
    render(
      <ServicesContext.Provider value={{ session: {} as Session, review: fakeReview() }}>
        <QuasarPhysicsBox rowKey="k" z={0.1} cls="galaxy" ready cosmology={{ h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 }} onTroughs={() => {}} onUseZ={() => {}} wavelengthA={new Float64Array(3)} onCurve={onCurve} />
      </ServicesContext.Provider>,
    );
    expect(onCurve.mock.calls.every((c) => c[0] === null)).toBe(true);
  });

  it('the frame strokes it in the physics colour after the model, only across the fitted pixels', () => {
    const n = 400;
    const w = Float64Array.from({ length: n }, (_, i) => 4000 + i);
    const flux = new Float64Array(n).fill(10);
    const series = buildDisplaySeries(w, flux, new Float64Array(n).fill(1), new Uint8Array(n), 1);
    const physics = new Float64Array(n).fill(NaN);
    for (let i = 100; i < 200; i++) physics[i] = 20;
    const ctx = new RecordingContext();
    drawSpectrumFrame(ctx, {
      widthPx: 1000,
      heightPx: 300,
      pixelRatio: 1,
      plot: { left: 0, top: 0, width: 1000, height: 300 },
      xDomainA: [4000, 4399],
      yDomain: [0, 40],
      series,
      model: flux.map((v) => v + 1),
      physicsModel: physics,
    });
    const strokes = ctx.paths.filter((p) => p.op === 'stroke');
    const styles = strokes.map((p) => p.style);
    expect(styles.indexOf(SPECTRUM_COLOURS.physics)).toBeGreaterThan(styles.indexOf(SPECTRUM_COLOURS.model));
    const xs = strokes.find((p) => p.style === SPECTRUM_COLOURS.physics)!.subpaths.flat().map((q) => q[0]);
    // x = (lambda - 4000) / 399 x 1000: pixels 100-199 span 250.6-498.7 px.
    expect(Math.min(...xs)).toBeGreaterThanOrEqual(250);
    expect(Math.max(...xs)).toBeLessThanOrEqual(499);
    const wrong = new RecordingContext();
    drawSpectrumFrame(wrong, { widthPx: 1000, heightPx: 300, pixelRatio: 1, plot: { left: 0, top: 0, width: 1000, height: 300 }, xDomainA: [4000, 4399], yDomain: [0, 40], series, model: null, physicsModel: new Float64Array(10) });
    expect(wrong.paths.some((p) => p.style === SPECTRUM_COLOURS.physics)).toBe(false);
  });
});
