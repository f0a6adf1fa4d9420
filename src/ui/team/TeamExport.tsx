/** Download the team review: final catalogue, every verdict (same format) and the report; or the merge itself. */
import { useState } from 'react';
import { buildTeamExport, TEAM_FORMATS, type TeamFormat } from '../../core/team';
import type { FitResult } from '../../core/types';
import { useServices, useSessionSnapshot } from '../state/SessionContext';
import { downloadBlob, stamp } from '../download';
import { SOFTWARE_VERSION } from '../version';
import { SOFTWARE_NAME } from '../../core/version';
import type { MergeState } from './useMergeWork';
import { encodeMergeWork } from './mergeWork';

const MIME: Record<TeamFormat, string> = { csv: 'text/csv', json: 'application/json', fits: 'application/fits' };

export function TeamExport({ state }: { state: MergeState }) {
  const { session } = useServices();
  const snap = useSessionSnapshot();
  const [format, setFormat] = useState<TeamFormat>('csv');
  const [status, setStatus] = useState<string | null>(null);
  const merged = state.merged;

  const run = async () => {
    if (!merged) return;
    const results = new Map<string, FitResult>();
    for (const s of merged.spectra) {
      const r = (await session.getResult(s.id)) ?? state.results.get(s.id);
      if (r) results.set(s.id, r);
    }
    const built = buildTeamExport(
      {
        merged,
        settlements: state.work.settlements,
        rule: { tolerance: state.work.tolerance },
        resultOf: (id) => results.get(id),
        cosmology: snap.cosmology,
        software: SOFTWARE_NAME,
        version: SOFTWARE_VERSION,
        createdAt: new Date().toISOString(),
      },
      format,
    );
    const base = `shiftmark-team-${merged.batchId}-${stamp()}`;
    downloadBlob(built.final as BlobPart, `${base}-final.${format}`, MIME[format]);
    downloadBlob(built.verdicts as BlobPart, `${base}-verdicts.${format}`, MIME[format]);
    downloadBlob(built.report, `${base}-report.txt`, 'text/plain');
    setStatus(`Saved the final catalogue (${built.finalRows} spectra), every verdict (${built.verdictRows} rows) and the report.`);
  };

  return (
    <div className="team-export">
      <label>
        Format{' '}
        <select value={format} onChange={(e) => setFormat(e.target.value as TeamFormat)} aria-label="Team export format">
          {TEAM_FORMATS.map((f) => (
            <option key={f} value={f}>
              {f === 'fits' ? 'FITS binary table' : f.toUpperCase()}
            </option>
          ))}
        </select>
      </label>{' '}
      <button type="button" className="primary" disabled={!merged} onClick={() => void run()} data-testid="team-export">
        Download catalogue, verdicts and report
      </button>{' '}
      <button
        type="button"
        disabled={!merged}
        onClick={() => downloadBlob(encodeMergeWork(state.work), `shiftmark-team-merge-${merged?.batchId ?? ''}-${stamp()}.json`, 'application/json')}
        data-testid="save-merge"
      >
        Save the merge (for npm run reconcile or another browser)
      </button>
      {state.work.settlements.length > 0 && state.stats && state.stats.open > 0 && (
        <p className="caution">{state.stats.open} disagreements are still open: their rows have no final verdict (agreement = disagree, settled_by empty).</p>
      )}
      {status && (
        <p role="status" data-testid="team-export-status">
          {status}
        </p>
      )}
    </div>
  );
}
