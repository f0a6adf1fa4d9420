/** Line measurements at the solution shown (Gaussian plus local continuum per line, from core). */
import type { LineMeasurement } from '../../core/types';
import { fmtNum, fmtZ } from '../format';

export function LineTable({ lines }: { lines: readonly LineMeasurement[] | null }) {
  if (lines === null) return <p className="muted">Measuring lines…</p>;
  if (!lines.length) return <p className="muted">No catalogue line falls in the observed range at this redshift.</p>;
  return (
    <table className="line-table" aria-label="Line measurements" data-testid="line-table">
      <thead>
        <tr>
          <th scope="col">line</th>
          <th scope="col">rest Å</th>
          <th scope="col">observed Å</th>
          <th scope="col">z</th>
          <th scope="col">FWHM km/s</th>
          <th scope="col" title="rest-frame equivalent width, positive for emission">EW Å</th>
          <th scope="col">S/N</th>
          <th scope="col">detected</th>
        </tr>
      </thead>
      <tbody>
        {lines.map((l) => (
          <tr key={l.id} className={l.detected ? undefined : 'muted'}>
            <td>
              {l.label} <span className="muted">{l.kind === 'absorption' ? '(abs.)' : ''}</span>
            </td>
            <td>{fmtNum(l.restA, 1)}</td>
            <td>
              {fmtNum(l.observedA, 1)} ± {fmtNum(l.observedErrA, 1)}
            </td>
            <td>{fmtZ(l.z)}</td>
            <td>{fmtNum(l.fwhmKms, 0)}</td>
            <td>{fmtNum(l.ewRestA, 1)}</td>
            <td>{fmtNum(l.snr, 1)}</td>
            <td>{l.detected ? 'yes' : 'no'}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
