/**
 * The "physical quantities" box for a quasar: measured in the worker at the
 * shown z when the spectrum is open (never on the page's thread), turned into
 * luminosities and masses for the session's cosmology by core. Troughs go back
 * to the panel for shading and the broad-line fits as a curve on the
 * spectrum's grid for the plot; the reviewer can ask for a fit with the
 * troughs masked, or for errors from seeded resampling (slow, so on request).
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import type { CosmologyParams, FitResult, SpectrumClass } from '../../core/types';
import type { QuasarMeasurement } from '../../core/physics/types';
import { quasarQuantities } from '../../core/physics/quantities';
import { MASS_SYSTEMATIC_DEX } from '../../core/physics/calibrations';
import { physicsModelAt, troughMaskRangesA } from '../../core/physics/draw';
import { useServices } from '../state/SessionContext';
import { fmtNum, fmtZ } from '../format';

/** An error too small to show at `decimals` reads '< 0.01' rather than a misleading '0.00'. */
export function fmtErr(err: number, decimals: number): string {
  const step = 10 ** -decimals;
  return err > 0 && err < step / 2 ? `< ${step.toFixed(decimals)}` : fmtNum(err, decimals);
}

export interface QuasarPhysicsBoxProps {
  rowKey: string;
  z: number | null;
  cls: SpectrumClass;
  /** True once the worker holds the spectrum. */
  ready: boolean;
  cosmology: CosmologyParams;
  /** Observed trough ranges (Angstrom) to shade; [] when none. */
  onTroughs: (rangesA: [number, number][]) => void;
  /** The open spectrum's observed wavelengths (Angstrom), null until it is open. */
  wavelengthA?: Float64Array | null;
  /** The broad-line fits on that grid (NaN outside their ranges) for the plot; null when none. */
  onCurve?: (curve: Float64Array | null) => void;
  /** Take a redshift found with the troughs masked (the panel refits there). */
  onUseZ: (z: number) => void;
}

/** Resampled spectra for errors on request: the spread of 32 draws is known to about 13 % (1 / sqrt(2 x 31), normal sampling theory). */
export const RESAMPLING_DRAWS = 32;

const LINE_LABEL: Record<string, string> = { CIV: 'C IV', MgII: 'Mg II', Hbeta: 'H\u03b2', Halpha: 'H\u03b1' };

export function QuasarPhysicsBox({ rowKey, z, cls, ready, cosmology, onTroughs, onUseZ, wavelengthA = null, onCurve }: QuasarPhysicsBoxProps) {
  const { review, session } = useServices();
  const [m, setM] = useState<QuasarMeasurement | null>(null);
  const [busy, setBusy] = useState(false);
  const [masked, setMasked] = useState<FitResult | null>(null);
  const active = cls === 'qso' && ready && z !== null && z > 0;
  /** Bumped whenever the row or z changes, so a late answer for an earlier one is dropped. */
  const asked = useRef(0);

  useEffect(() => {
    const ask = ++asked.current;
    setM(null);
    setMasked(null);
    onTroughs([]);
    if (!active) return;
    let live = true;
    setBusy(true);
    void review.measureQuasar(rowKey, z!).then((ans) => {
      if (!live || ask !== asked.current) return;
      setBusy(false);
      setM(ans);
      if (ans) {
        onTroughs(troughMaskRangesA(ans));
        // A decision at this z keeps the measurement, so exports carry the physics at a reviewed z.
        session.noteQuasarMeasurement(rowKey, ans);
      }
    });
    return () => {
      live = false;
    };
    // onTroughs is the panel's state setter; rowKey and z decide what is measured.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [rowKey, z, active, review, session]);

  const curve = useMemo(() => (m && wavelengthA && m.lines.some((l) => l.ok) ? physicsModelAt(m, wavelengthA) : null), [m, wavelengthA]);
  useEffect(() => {
    onCurve?.(curve);
    // onCurve is the panel's state setter.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [curve]);

  const resample = () => {
    const ask = asked.current;
    setBusy(true);
    void review.measureQuasar(rowKey, z!, RESAMPLING_DRAWS).then((ans) => {
      if (ask !== asked.current) return;
      setBusy(false);
      if (!ans) return;
      setM(ans);
      onTroughs(troughMaskRangesA(ans));
      session.noteQuasarMeasurement(rowKey, ans);
    });
  };

  if (cls !== 'qso') return null;
  const q = m ? quasarQuantities(m, cosmology) : null;
  const sys = `\u00b1 ${MASS_SYSTEMATIC_DEX} dex sys.`;
  return (
    <section className="physics-box" aria-label="Physical quantities" data-testid="physics-box">
      <h3>Physical quantities</h3>
      {!active && <p className="muted">Measured once the spectrum is open at a positive redshift.</p>}
      {busy && <p className="muted" role="status">Measuring…</p>}
      {m && q && (
        <>
          <dl className="derived">
            {([1350, 3000, 5100] as const).map((a) => {
              const L = q.logLambdaL[a];
              return (
                <div key={a} style={{ display: 'contents' }}>
                  <dt>log λL<sub>{a}</sub></dt>
                  <dd>{'value' in L ? `${fmtNum(L.value, 2)} ± ${fmtErr(L.err, 2)} [erg/s]` : <span className="muted">{L.reason}</span>}</dd>
                </div>
              );
            })}
            {m.lines.filter((l) => l.ok).map((l) => (
              <div key={l.id} style={{ display: 'contents' }}>
                <dt>FWHM {LINE_LABEL[l.id]}</dt>
                <dd>
                  {fmtNum(l.fwhmKms, 0)} ± {fmtNum(l.fwhmErrKms, 0)} km/s (σ<sub>line</sub> {fmtNum(l.sigmaKms, 0)})
                </dd>
              </div>
            ))}
            {q.masses.map((e) => (
              <div key={e.id} style={{ display: 'contents' }}>
                <dt title={e.source}>log M<sub>BH</sub> {e.id}{q.preferred?.id === e.id ? ' (preferred)' : ''}</dt>
                <dd>
                  {fmtNum(e.logM, 2)} ± {fmtErr(e.logMErr, 2)} stat. {sys}
                </dd>
              </div>
            ))}
            {q.logLbol && (
              <>
                <dt>log L<sub>bol</sub></dt>
                <dd>{fmtNum(q.logLbol.value, 2)} [erg/s] (BC {q.logLbol.bc} at {q.logLbol.fromA} Å)</dd>
              </>
            )}
            {q.logEddRatio && (
              <>
                <dt>log L<sub>bol</sub>/L<sub>Edd</sub></dt>
                <dd>
                  {fmtNum(q.logEddRatio.value, 2)} ± {fmtErr(q.logEddRatio.err, 2)} {sys}
                </dd>
              </>
            )}
            <dt>C IV absorption</dt>
            <dd data-testid="physics-bal">
              {m.absorption.ok
                ? `BI ${fmtNum(m.absorption.biKms, 0)} km/s, AI ${fmtNum(m.absorption.aiKms, 0)} km/s, ${m.absorption.troughs.length} trough(s) shaded`
                : <span className="muted">{m.absorption.reason}</span>}
            </dd>
          </dl>
          {q.massReason && <p className="muted small">No mass: {q.massReason}</p>}
          {curve && <p className="muted small" data-testid="physics-curve-note">The broad-line fits (continuum plus Gaussians over each fitted range) are drawn on the plot in short thick dashes.</p>}
          <p className="muted small" data-testid="physics-errors-from">
            {m.draws > 0
              ? `Errors: the larger of the fit's and the spread over ${m.draws} resampled spectra (seeded: the same numbers every time).`
              : "Errors from the fits' covariances."}
            {m.draws === 0 && (
              <>
                {' '}
                <button type="button" disabled={busy} onClick={resample}>
                  Errors by resampling (slow)
                </button>
              </>
            )}
          </p>
          <p className="muted small">
            Single-epoch masses carry about {MASS_SYSTEMATIC_DEX} dex systematic uncertainty; luminosities are not corrected for extinction or host light.
          </p>
          {m.absorption.troughs.length > 0 && (
            <p>
              <button
                type="button"
                disabled={busy}
                onClick={() => {
                  setBusy(true);
                  void review.refitMasked(rowKey, troughMaskRangesA(m), null).then((r) => {
                    setBusy(false);
                    setMasked(r);
                  });
                }}
              >
                Fit again with the troughs masked
              </button>
              {masked && masked.status === 'ok' && (
                <span data-testid="physics-masked">
                  {' '}
                  gives z = {fmtZ(masked.z)} ({masked.class}).{' '}
                  <button type="button" onClick={() => onUseZ(masked.z)}>
                    Refit there
                  </button>
                </span>
              )}
              {masked && masked.status !== 'ok' && <span className="error-text"> {masked.error}</span>}
            </p>
          )}
        </>
      )}
    </section>
  );
}
