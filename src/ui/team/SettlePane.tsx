/**
 * One disagreement: the spectrum with two reviewers' solutions over it (the
 * first as the model and markers, the second dashed with markers from the
 * bottom), each reviewer's verdict with a button to take it, and a form for
 * the arbiter's own decision. Settling adds a record; no verdict changes.
 */
import { useEffect, useState } from 'react';
import type { Consensus, Settlement } from '../../core/team';
import type { FitResult, ReviewDecision, Spectrum, SpectrumClass } from '../../core/types';
import { SpectrumView } from '../plots';
import { markersFor, SKY } from '../review/markers';
import { useServices } from '../state/SessionContext';
import { verdictText } from './VerdictTable';

const CLASS_FAMILY: Record<SpectrumClass, string | null> = { qso: 'qso', galaxy: 'galaxy', star: 'star', unknown: null };

/** Template family to draw a verdict with: the fit candidate it came from, else its class's. */
export function familyOf(d: ReviewDecision, result: FitResult | undefined): string | null {
  const c = result?.candidates.find((x) => x.class === d.class && d.z !== null && Math.abs(x.z - d.z) < 1e-6);
  return c?.family ?? CLASS_FAMILY[d.class];
}

type Loaded = { kind: 'loading' } | { kind: 'ready'; spectrum: Spectrum } | { kind: 'missing' } | { kind: 'error'; message: string };

export interface SettlePaneProps {
  item: Consensus;
  file: string;
  arbiter: string;
  onSettle: (s: Settlement) => void;
}

export function SettlePane({ item, file, arbiter, onSettle }: SettlePaneProps) {
  const { session, review } = useServices();
  const [spec, setSpec] = useState<Loaded>({ kind: 'loading' });
  const [result, setResult] = useState<FitResult | undefined>(undefined);
  const names = item.verdicts.map((v) => v.reviewer);
  const [pair, setPair] = useState<[number, number]>([0, Math.min(1, names.length - 1)]);
  const [models, setModels] = useState<(Float64Array | null)[]>([null, null]);
  const [cls, setCls] = useState<SpectrumClass>(item.verdicts[0]?.decision.class ?? 'galaxy');
  const [zText, setZText] = useState(item.verdicts[0]?.decision.z?.toFixed(5) ?? '');
  const [note, setNote] = useState('');
  const [problem, setProblem] = useState<string | null>(null);

  useEffect(() => {
    let stale = false;
    setSpec({ kind: 'loading' });
    void (async () => {
      setResult(await session.getResult(item.id));
      let ans = await review.openSpectrum(item.id, file, null);
      if (ans.kind === 'need-bytes') {
        const bytes = await session.getBytes(item.id);
        if (!bytes) return !stale && setSpec({ kind: 'missing' });
        ans = await review.openSpectrum(item.id, file, bytes);
      }
      if (stale) return;
      setSpec(ans.kind === 'spectrum' ? { kind: 'ready', spectrum: ans.spectrum } : ans.kind === 'read-error' ? { kind: 'error', message: ans.message } : { kind: 'missing' });
    })();
    return () => {
      stale = true;
    };
  }, [item.id, file, session, review]);

  const shown = pair.map((i) => item.verdicts[i]?.decision ?? null);
  useEffect(() => {
    if (spec.kind !== 'ready') return;
    let stale = false;
    void Promise.all(
      shown.map((d) => {
        const fam = d ? familyOf(d, result) : null;
        return d && d.z !== null && fam ? review.solutionModel(item.id, d.z, fam) : Promise.resolve(null);
      }),
    ).then((m) => !stale && setModels(m));
    return () => {
      stale = true;
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [spec.kind, item.id, result, pair[0], pair[1], review]);

  const now = () => new Date().toISOString();
  const take = (i: number) => {
    const v = item.verdicts[i];
    if (v) onSettle({ id: item.id, arbiter, settledAt: now(), picked: v.reviewer, decision: { ...v.decision } });
  };
  const decideNew = (reject: boolean) => {
    const z = Number(zText);
    if (!reject && !(zText.trim() && Number.isFinite(z) && z > -1)) return setProblem('Type a redshift above -1, or reject.');
    setProblem(null);
    const decision: ReviewDecision = reject
      ? { file, state: 'rejected', z: null, zErr: null, class: 'unknown', reviewerGrade: null, howSet: 'typed', reviewer: arbiter, decidedAt: now(), note }
      : { file, state: 'changed', z, zErr: null, class: cls, reviewerGrade: null, howSet: 'typed', reviewer: arbiter, decidedAt: now(), note };
    onSettle({ id: item.id, arbiter, settledAt: decision.decidedAt, picked: null, decision });
  };

  const [a, b] = shown;
  return (
    <section className="settle-pane" data-testid="settle-pane">
      <h3>
        {file} <span className={`team-state state-${item.state}`}>{item.state}</span>
        {item.settledBy && <span className="muted"> · settled by {item.settledBy}</span>}
      </h3>
      {names.length > 2 && (
        <p>
          Drawn:{' '}
          {[0, 1].map((slot) => (
            <select key={slot} value={pair[slot]} onChange={(e) => setPair((p) => (slot === 0 ? [Number(e.target.value), p[1]] : [p[0], Number(e.target.value)]))} aria-label={`Drawn solution ${slot + 1}`}>
              {names.map((n, i) => (
                <option key={n} value={i}>
                  {n}
                </option>
              ))}
            </select>
          ))}
        </p>
      )}
      {spec.kind === 'ready' ? (
        <SpectrumView
          wavelengthA={spec.spectrum.wavelengthA}
          flux={spec.spectrum.flux}
          ivar={spec.spectrum.ivar}
          mask={spec.spectrum.mask}
          model={models[0]}
          z={a?.z ?? null}
          markers={markersFor(a?.class)}
          skyRegions={SKY}
          smoothingPx={1}
          height={260}
          resetKey={item.id}
          fluxUnit={spec.spectrum.meta.fluxUnit}
          compare={b && b.z !== null && pair[1] !== pair[0] ? { z: b.z, markers: markersFor(b.class), model: models[1] } : null}
        />
      ) : (
        <p className="muted">
          {spec.kind === 'loading' ? 'Opening the spectrum…' : spec.kind === 'missing' ? 'This spectrum is not stored in this browser: add its file to see it.' : spec.message}
        </p>
      )}
      <p className="muted small">
        Solid model and top markers: {names[pair[0]] ?? '—'}; dashed model and bottom markers: {pair[1] !== pair[0] ? names[pair[1]] : '—'}.
      </p>
      <ol className="settle-verdicts">
        {item.verdicts.map((v, i) => (
          <li key={`${v.reviewer}-${v.source}`}>
            <button type="button" onClick={() => take(i)} disabled={!arbiter} data-testid="take-verdict">
              Take {v.reviewer}&apos;s <kbd>{i + 1}</kbd>
            </button>{' '}
            {verdictText(v.decision)}
          </li>
        ))}
      </ol>
      <form
        className="inline-form"
        onSubmit={(e) => {
          e.preventDefault();
          decideNew(false);
        }}
      >
        Own decision: class{' '}
        <select value={cls} onChange={(e) => setCls(e.target.value as SpectrumClass)} aria-label="Arbiter class">
          {(['qso', 'galaxy', 'star'] as const).map((c) => (
            <option key={c}>{c}</option>
          ))}
        </select>{' '}
        z <input value={zText} onChange={(e) => setZText(e.target.value)} size={9} aria-label="Arbiter redshift" /> note{' '}
        <input value={note} onChange={(e) => setNote(e.target.value)} aria-label="Arbiter note" />{' '}
        <button type="submit" disabled={!arbiter} data-testid="settle-new">
          Record
        </button>{' '}
        <button type="button" disabled={!arbiter} onClick={() => decideNew(true)}>
          Reject
        </button>
      </form>
      {!arbiter && <p className="caution">Type your name as arbiter above first: every settlement records it.</p>}
      {problem && <p className="error-text">{problem}</p>}
    </section>
  );
}
