/** Distances and times at the shown redshift for the session's cosmology (all numbers from core/cosmology). */
import type { CosmologyParams, SpectrumClass } from '../../core/types';
import { derivedQuantities, describeCosmology } from '../../core/cosmology';
import { fmtNum } from '../format';

export function DerivedPanel({ z, cls, cosmology, reviewed }: { z: number | null; cls: SpectrumClass; cosmology: CosmologyParams; reviewed: boolean }) {
  let body;
  if (z === null || !Number.isFinite(z)) body = <p className="muted">No redshift.</p>;
  else if (cls === 'star') body = <p className="muted">A star: its shift is a velocity, not a distance, so no distances are given.</p>;
  else if (z < 0) body = <p className="muted">Negative redshift: no distances.</p>;
  else {
    try {
      const d = derivedQuantities(z, cosmology);
      body = (
        <dl className="derived" data-testid="derived">
          <dt>Lookback time</dt>
          <dd>{fmtNum(d.lookbackTimeGyr, 3)} Gyr</dd>
          <dt>Age of the universe at z</dt>
          <dd>{fmtNum(d.ageGyr, 3)} Gyr</dd>
          <dt>Luminosity distance</dt>
          <dd>{fmtNum(d.luminosityDistanceMpc, 1)} Mpc</dd>
          <dt>Angular diameter distance</dt>
          <dd>{fmtNum(d.angularDiameterDistanceMpc, 1)} Mpc</dd>
          <dt>Distance modulus</dt>
          <dd>{fmtNum(d.distanceModulusMag, 3)} mag</dd>
          <dt>Scale</dt>
          <dd>{fmtNum(d.kpcPerArcsec, 3)} kpc/″</dd>
        </dl>
      );
    } catch (e) {
      body = <p className="muted">{(e as Error).message}</p>;
    }
  }
  return (
    <section className="derived-panel" aria-label="Derived quantities">
      <h3>At z = {z === null || !Number.isFinite(z) ? '—' : z.toFixed(4)}</h3>
      {!reviewed && z !== null && Number.isFinite(z) && <p className="caution">From an automatic redshift nobody has reviewed yet.</p>}
      {body}
      <p className="muted small">Cosmology: {describeCosmology(cosmology)}</p>
    </section>
  );
}
