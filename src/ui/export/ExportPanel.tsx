/** Download the catalogue: format, which rows, and a reminder of what the columns mean. */
import { useState } from 'react';
import { describeCosmology } from '../../core/cosmology';
import { useServices, useSessionSnapshot } from '../state/SessionContext';
import { Overlay } from '../panels/Overlay';
import { buildExport, EXPORT_FORMATS, type ExportFormat, type ExportScope } from './buildExport';
import { workerMeasurer } from './measureMissing';
import { downloadBlob, stamp } from '../download';

export function ExportPanel({ onClose }: { onClose: () => void }) {
  const { session, review } = useServices();
  const snap = useSessionSnapshot();
  const [format, setFormat] = useState<ExportFormat>('csv');
  const [scope, setScope] = useState<ExportScope>('all');
  const [status, setStatus] = useState<string | null>(null);
  const unreviewed = snap.rows.filter((r) => !r.decision || r.decision.state === 'unreviewed').length;

  const run = async () => {
    setStatus('Building the table…');
    try {
      const built = await buildExport(
        {
          rows: snap.rows,
          getResult: (k) => session.getResult(k),
          team: session.teamTag(),
          measureQuasar: workerMeasurer(session, review),
          onMeasureProgress: (done, total) => setStatus(`Measuring quasar physics at reviewed redshifts: ${done} of ${total}…`),
        },
        format,
        snap.cosmology,
        scope,
      );
      const f = EXPORT_FORMATS.find((x) => x.id === format)!;
      const what = format === 'lines-csv' ? 'lines' : 'catalogue';
      downloadBlob(built.data as BlobPart, `shiftmark-${what}-${stamp()}.${f.ext}`, f.mime);
      const saved = format === 'lines-csv' ? `Saved ${built.lineCount} line rows from ${built.rowCount} spectra.` : `Saved ${built.rowCount} rows.`;
      const measured = built.physicsMeasured ? ` Quasar physics measured now for ${built.physicsMeasured} decisions at their redshift.` : '';
      const unmeasured = built.physicsUnmeasured
        ? ` ${built.physicsUnmeasured} quasar decisions could not be measured (file not stored or not readable): their physics cells are empty, with a note.`
        : '';
      setStatus(`${saved}${built.notFitted ? ` ${built.notFitted} files not yet fitted were left out.` : ''}${measured}${unmeasured}`);
    } catch (e) {
      setStatus(`Export failed: ${(e as Error)?.message ?? e}`);
    }
  };

  return (
    <Overlay title="Export catalogue" onClose={onClose} testId="export-panel">
      <form
        onSubmit={(e) => {
          e.preventDefault();
          void run();
        }}
      >
        <fieldset>
          <legend>Format</legend>
          {EXPORT_FORMATS.map((f) => (
            <label key={f.id} className="radio">
              <input type="radio" name="format" value={f.id} checked={format === f.id} onChange={() => setFormat(f.id)} /> {f.label}
            </label>
          ))}
        </fieldset>
        <fieldset>
          <legend>Rows</legend>
          <label className="radio">
            <input type="radio" name="scope" checked={scope === 'all'} onChange={() => setScope('all')} /> Every spectrum ({snap.rows.length})
          </label>
          <label className="radio">
            <input type="radio" name="scope" checked={scope === 'reviewed'} onChange={() => setScope('reviewed')} /> Reviewed only (
            {snap.rows.length - unreviewed})
          </label>
        </fieldset>
        <p className="muted small">
          Columns: the automatic fit (as the command line writes it), the review (final z and class, state, how set, the named line and its
          observed wavelength, grades, reviewer, time, note, review flags) and derived quantities for {describeCosmology(snap.cosmology)}.
          Line measurements (centre, FWHM, flux, equivalent width, S/N, each with its error) at the automatic solution go into JSON, FITS
          and VOTable, and into the separate line measurements CSV.
        </p>
        {scope === 'all' && unreviewed > 0 && (
          <p className="caution">{unreviewed} rows are not reviewed: their redshifts are automatic hypotheses (review_state = unreviewed).</p>
        )}
        <button type="submit" className="primary" data-testid="export-download">
          Download
        </button>
        {status && (
          <p role="status" data-testid="export-status">
            {status}
          </p>
        )}
      </form>
    </Overlay>
  );
}
