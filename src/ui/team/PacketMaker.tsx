/** Make review packets from the batch here: names, reviewers per spectrum, seed, with or without the spectra. */
import { useState } from 'react';
import { DEFAULT_PER_SPECTRUM } from '../../core/team';
import { useServices, useSessionSnapshot } from '../state/SessionContext';
import { downloadBlob } from '../download';
import { buildPackets } from './makePackets';

/** Names typed one per line or comma-separated. */
export function parseNames(text: string): string[] {
  return text
    .split(/[\n,]/)
    .map((s) => s.trim())
    .filter(Boolean);
}

export function PacketMaker() {
  const { session } = useServices();
  const snap = useSessionSnapshot();
  const [names, setNames] = useState('');
  const [perSpectrum, setPerSpectrum] = useState(DEFAULT_PER_SPECTRUM);
  const [seed, setSeed] = useState(1);
  const [withSpectra, setWithSpectra] = useState(true);
  const [status, setStatus] = useState<string | null>(null);
  const fitted = snap.rows.filter((r) => r.status === 'ok' && r.hasBytes).length;

  const make = async () => {
    setStatus('Making packets…');
    try {
      const built = await buildPackets(session, { reviewers: parseNames(names), perSpectrum, seed, withSpectra });
      for (const f of built.files) downloadBlob(f.text, f.name, 'application/json');
      setStatus(
        `Batch ${built.batchId}: ${built.files.map((f) => `${f.reviewer} ${f.spectra}`).join(', ')} spectra.` +
          (built.leftOut ? ` ${built.leftOut} files not fitted (or failed) were left out.` : ''),
      );
    } catch (e) {
      setStatus(`No packets made: ${(e as Error).message}`);
    }
  };

  return (
    <form
      className="team-form"
      onSubmit={(e) => {
        e.preventDefault();
        void make();
      }}
      data-testid="packet-maker"
    >
      <p className="muted small">
        Deals the {fitted} fitted spectra of this batch to the reviewers, the same way for the same seed, and saves one packet per reviewer. A
        packet is a session file: the reviewer opens it on the start page and reviews as usual, then saves the session and sends it back.
      </p>
      <label>
        Reviewers (one per line or comma-separated)
        <textarea value={names} onChange={(e) => setNames(e.target.value)} rows={3} aria-label="Reviewer names" />
      </label>
      <label>
        Reviewers per spectrum{' '}
        <input type="number" min={1} max={9} value={perSpectrum} onChange={(e) => setPerSpectrum(Number(e.target.value))} aria-label="Reviewers per spectrum" />
      </label>{' '}
      <label>
        Seed <input type="number" step={1} value={seed} onChange={(e) => setSeed(Math.trunc(Number(e.target.value)))} aria-label="Seed" />
      </label>
      <label className="radio">
        <input type="checkbox" checked={withSpectra} onChange={(e) => setWithSpectra(e.target.checked)} /> Put the spectra in the packets (else each
        reviewer adds their own copies, checked by content hash)
      </label>
      <button type="submit" className="primary" disabled={parseNames(names).length < perSpectrum || !fitted} data-testid="make-packets">
        Make packets
      </button>
      {status && (
        <p role="status" data-testid="packet-status">
          {status}
        </p>
      )}
    </form>
  );
}
