/**
 * Review of one spectrum: the data and fit, the fit quality against z, the
 * candidates, naming a line, a typed z, the decision, the line table and
 * derived quantities. Every number comes from the worker (core); this
 * component only moves it. Keys reach it from the workbench through `handle`.
 */
import { useCallback, useEffect, useImperativeHandle, useRef, useState, type Ref } from 'react';
import type { CosmologyParams, FitResult, Grade, Spectrum } from '../../core/types';
import type { LineSuggestion } from '../../core/engine/identify';
import { LINES, SKY_REGIONS_A, lineById } from '../../core/lines/catalogue';
import type { FeatureAnswer } from '../../worker/fitWorkerApi';
import { useServices } from '../state/SessionContext';
import type { Row } from '../state/session';
import type { ActionId } from '../keys/keyMap';
import { SpectrumView, FitQualityPlot } from '../plots';
import type { LineMarker } from '../plots/markerLayout';
import type { SkyRegion } from '../plots/SpectrumPlotController';
import { CandidateList } from './CandidateList';
import { LineNamingList } from './LineNamingList';
import { LineTable } from './LineTable';
import { DerivedPanel } from './DerivedPanel';
import {
  acceptDraft,
  autoSolution,
  candidateSolution,
  nextGrade,
  refitSolution,
  modelFamily,
  rejectDraft,
  solutionFromDecision,
  type DecisionDraft,
  type Solution,
} from './solution';
import { fmtNum, fmtRangeA, fmtZ, REVIEW_LABEL } from '../format';

export interface ReviewHandle {
  /** Run a key action; true when the panel used it. */
  handle(action: ActionId, key: string): boolean;
}

export interface ReviewPanelProps {
  row: Row;
  cosmology: CosmologyParams;
  onDecision: (draft: DecisionDraft) => void;
  onReopen: () => void;
  ref?: Ref<ReviewHandle>;
}

type SpectrumState = { kind: 'loading' } | { kind: 'ready'; spectrum: Spectrum } | { kind: 'missing' } | { kind: 'error'; message: string };

/** Catalogue lines and night-sky regions as the plot takes them (built once). */
const MARKERS: LineMarker[] = LINES.map((l) => ({ id: l.id, label: l.label, restA: l.restA, kind: l.kind, strength: l.strength }));
const BALMER = new Set(['Hbeta', 'Hgam', 'Hdel', 'Heps', 'Halpha']);
/**
 * Markers for the class of the shown solution, so the plot shows the lines that
 * class would have: quasars broad and narrow emission; galaxies narrow emission
 * and stellar absorption; stars absorption, with the Balmer lines as troughs.
 */
const MARKERS_BY_CLASS: Record<string, LineMarker[]> = {
  qso: MARKERS.filter((m) => LINES.find((l) => l.id === m.id)!.roles.some((r) => r === 'qso-broad' || r === 'narrow')),
  galaxy: MARKERS.filter((m) => LINES.find((l) => l.id === m.id)!.roles.some((r) => r === 'narrow' || r === 'absorption')),
  star: MARKERS.filter((m) => m.kind === 'absorption' || BALMER.has(m.id)).map((m) => ({ ...m, kind: 'absorption' as const })),
  unknown: MARKERS,
};
const SKY: SkyRegion[] = SKY_REGIONS_A.map((r) => ({ label: r.label, fromA: r.fromA, toA: r.toA }));

const GRADES: (Grade | '')[] = ['', 'high', 'medium', 'low', 'none'];
const SMOOTHING_PX = [1, 3, 5, 9, 15];

export function ReviewPanel({ row, cosmology, onDecision, onReopen, ref }: ReviewPanelProps) {
  const { session, review } = useServices();
  const key = row.key;
  const [result, setResult] = useState<FitResult | null>(null);
  const [spec, setSpec] = useState<SpectrumState>({ kind: 'loading' });
  const [solution, setSolution] = useState<Solution | null>(null);
  const [grade, setGrade] = useState<Grade | null>(row.decision?.reviewerGrade ?? null);
  const [note, setNote] = useState(row.decision?.note ?? '');
  const [naming, setNaming] = useState<{ clickA: number; answer: FeatureAnswer | null } | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const [smoothingPx, setSmoothingPx] = useState(1);
  const [typedZ, setTypedZ] = useState('');
  const [typedA, setTypedA] = useState('');
  const [refine, setRefine] = useState(true);
  const [message, setMessage] = useState<string | null>(null);
  const zInput = useRef<HTMLInputElement>(null);
  const lambdaInput = useRef<HTMLInputElement>(null);
  const noteInput = useRef<HTMLTextAreaElement>(null);
  const plotBox = useRef<HTMLDivElement>(null);
  const alive = useRef(key);
  alive.current = key;

  // A spectrum opened while its fit was still running is loaded again when the fit lands.
  const fitted = row.summary !== undefined;

  // Load the stored fit and the spectrum for display (bytes from the database when the worker has not got them).
  useEffect(() => {
    let stale = false;
    setResult(null);
    setSpec({ kind: 'loading' });
    setNaming(null);
    setMessage(null);
    void (async () => {
      const r = (await session.getResult(key)) ?? null;
      if (stale) return;
      setResult(r);
      const fromDecision = row.decision && r ? solutionFromDecision(row.decision, r) : null;
      setSolution(fromDecision ?? (r ? autoSolution(r) : null));
      try {
        let ans = await review.openSpectrum(key, row.file, null);
        if (ans.kind === 'need-bytes') {
          const bytes = await session.getBytes(key);
          if (stale) return;
          if (!bytes) {
            setSpec({ kind: 'missing' });
            return;
          }
          ans = await review.openSpectrum(key, row.file, bytes);
        }
        if (stale) return;
        if (ans.kind === 'spectrum') setSpec({ kind: 'ready', spectrum: ans.spectrum });
        else if (ans.kind === 'read-error') setSpec({ kind: 'error', message: ans.message });
        else setSpec({ kind: 'missing' });
      } catch (e) {
        if (!stale) setSpec({ kind: 'error', message: (e as Error)?.message ?? String(e) });
      }
    })();
    return () => {
      stale = true;
    };
    // The decision is read once per spectrum (and fit); later decisions come from this panel.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key, session, review, fitted]);

  // The model of the shown solution, drawn over the data.
  const [model, setModel] = useState<Float64Array | null>(null);
  const family = solution ? modelFamily(solution) : null;
  const modelZ = solution?.z ?? NaN;
  useEffect(() => {
    setModel(null);
    if (!family || !Number.isFinite(modelZ) || spec.kind !== 'ready') return;
    const forKey = key;
    let stale = false;
    void review.solutionModel(key, modelZ, family).then((m) => {
      if (!stale && alive.current === forKey) setModel(m);
    });
    return () => {
      stale = true;
    };
  }, [family, modelZ, spec.kind, key, review]);

  // Measure lines for a solution that has none yet.
  useEffect(() => {
    if (!solution || solution.lines !== null || spec.kind !== 'ready') return;
    const forKey = key;
    const s = solution;
    void review.measureLines(key, s.z, s.cls).then((lines) => {
      if (alive.current !== forKey) return;
      setSolution((cur) => (cur === s ? { ...s, lines: lines ?? [] } : cur));
    });
  }, [solution, spec.kind, key, review]);

  const ready = spec.kind === 'ready';

  const pickCandidate = useCallback(
    (i: number) => {
      if (!result) return;
      const s = candidateSolution(result, i);
      if (s) {
        setSolution(s);
        setMessage(null);
      }
    },
    [result],
  );

  const refitAt = useCallback(
    async (z: number, howSet: 'typed' | 'refit' | 'line', lineId?: { id: string; observedA: number }, doRefine = true) => {
      const forKey = key;
      if (!doRefine || !ready) {
        setSolution({ z, zErr: NaN, cls: solution?.cls ?? result?.class ?? 'unknown', howSet, candidateIndex: null, lineId, lines: null });
        return;
      }
      setBusy('Refitting near that redshift…');
      try {
        const r = await review.refitNear(key, z);
        if (alive.current !== forKey) return;
        if (!r) setMessage('The spectrum is not open in the worker; try again.');
        else {
          if (r.status !== 'ok') setMessage(`No fit near z = ${fmtZ(z)}: ${r.error ?? r.status}. The redshift is kept as given.`);
          setSolution(refitSolution(r, howSet, z, solution?.cls ?? result?.class ?? 'unknown', lineId));
        }
      } finally {
        if (alive.current === forKey) setBusy(null);
      }
    },
    [key, ready, review, solution, result],
  );

  const nameFeatureAt = useCallback(
    async (clickA: number) => {
      if (!ready) return;
      const forKey = key;
      setNaming({ clickA, answer: null });
      const answer = await review.nameFeature(key, clickA);
      if (alive.current !== forKey) return;
      setNaming({ clickA, answer: answer ?? { feature: null, suggestions: [] } });
    },
    [key, ready, review],
  );

  const chooseLine = useCallback(
    (s: LineSuggestion) => {
      const observedA = naming?.answer?.feature?.centreA ?? naming?.clickA ?? NaN;
      setNaming(null);
      void refitAt(s.z, 'line', { id: s.lineId, observedA });
    },
    [naming, refitAt],
  );

  const accept = useCallback(() => {
    if (!solution) {
      setMessage(result?.status === 'ok' ? 'No solution to accept.' : 'This file has no fit: reject it as unusable (x), or set a redshift.');
      return;
    }
    onDecision(acceptDraft(row.file, solution, grade, note));
  }, [solution, result, row.file, grade, note, onDecision]);

  const reject = useCallback(() => onDecision(rejectDraft(row.file, grade, note)), [row.file, grade, note, onDecision]);

  useImperativeHandle(
    ref,
    () => ({
      handle(action, k) {
        switch (action) {
          case 'accept':
            accept();
            return true;
          case 'reject':
            reject();
            return true;
          case 'reopen':
            onReopen();
            return true;
          case 'candidate':
            pickCandidate(Number(k) - 1);
            return true;
          case 'typeZ':
            zInput.current?.focus();
            zInput.current?.select();
            return true;
          case 'nameLine':
            lambdaInput.current?.focus();
            lambdaInput.current?.select();
            return true;
          case 'grade':
            setGrade((g) => nextGrade(g));
            return true;
          case 'note':
            noteInput.current?.focus();
            return true;
          case 'focusPlot':
            plotBox.current?.querySelector<HTMLElement>('[tabindex]')?.focus();
            return true;
          case 'escape':
            if (naming) {
              setNaming(null);
              return true;
            }
            return false;
          default:
            return false;
        }
      },
    }),
    [accept, reject, onReopen, pickCandidate, naming],
  );

  const decided = row.decision && row.decision.state !== 'unreviewed' ? row.decision : null;
  const shownIsAuto = solution?.howSet === 'auto' && solution.candidateIndex === 0;
  const summary = row.summary;

  return (
    <section className="review-panel" aria-label="Review" data-testid="review-panel">
      <header className="review-head">
        <h2 data-testid="review-title">{summary?.objectId || row.file}</h2>
        <span className="muted">{row.file}</span>
        {summary && summary.nPix > 0 && (
          <span className="muted">
            {summary.nPix} pixels, {fmtRangeA(summary.lambdaMinA, summary.lambdaMaxA)}
          </span>
        )}
      </header>

      <div className="solution-line" data-testid="solution">
        {solution ? (
          <>
            <strong>
              z = <span data-testid="solution-z">{fmtZ(solution.z, 5)}</span>
              {Number.isFinite(solution.zErr) ? ` ± ${fmtZ(solution.zErr, 5)}` : ''}
            </strong>{' '}
            <span>{solution.cls}</span> <span className="muted">set by: {describeHow(solution)}</span>
          </>
        ) : (
          <strong>No redshift</strong>
        )}
        {decided ? (
          <span className={`state-badge review-${decided.state}`} data-testid="decision-state">
            {REVIEW_LABEL[decided.state]} by {decided.reviewer} at {decided.decidedAt.slice(0, 16).replace('T', ' ')}
          </span>
        ) : solution ? (
          <span className="caution" data-testid="unreviewed-caution">
            {shownIsAuto ? 'Automatic redshift, not reviewed: a hypothesis until accepted.' : 'Not yet saved: accept (a) to keep it.'}
          </span>
        ) : null}
        {summary?.status === 'ok' && shownIsAuto && (
          <span className="muted">
            machine confidence {summary.confidence} (score {fmtNum(summary.score, 2)})
          </span>
        )}
      </div>

      {row.status !== 'ok' && summary?.error && (
        <p className="error-text" role="alert" data-testid="review-error">
          {summary.error}
        </p>
      )}
      {message && (
        <p className="caution" role="status">
          {message}
        </p>
      )}
      {busy && (
        <p className="muted" role="status">
          {busy}
        </p>
      )}

      <div className="plot-box" ref={plotBox}>
        {spec.kind === 'ready' ? (
          <SpectrumView
            wavelengthA={spec.spectrum.wavelengthA}
            flux={spec.spectrum.flux}
            ivar={spec.spectrum.ivar}
            mask={spec.spectrum.mask}
            model={model}
            z={solution ? solution.z : null}
            markers={MARKERS_BY_CLASS[solution?.cls ?? 'unknown'] ?? MARKERS}
            skyRegions={SKY}
            smoothingPx={smoothingPx}
            height={300}
            onFeatureClick={(a) => void nameFeatureAt(a)}
            highlightA={naming?.answer?.feature?.centreA ?? naming?.clickA ?? null}
            resetKey={key}
            fluxUnit={spec.spectrum.meta.fluxUnit}
          />
        ) : spec.kind === 'loading' ? (
          <p className="muted">Opening the spectrum…</p>
        ) : spec.kind === 'missing' ? (
          <p className="muted">The raw file is not stored in this session (it was imported without spectra). Drop the file again to see it.</p>
        ) : (
          <p className="error-text">{spec.message}</p>
        )}
      </div>

      <div className="plot-tools">
        <label>
          Smoothing{' '}
          <select value={smoothingPx} onChange={(e) => setSmoothingPx(Number(e.target.value))} aria-label="Smoothing">
            {SMOOTHING_PX.map((s) => (
              <option key={s} value={s}>
                {s === 1 ? 'none' : `${s} px`}
              </option>
            ))}
          </select>
        </label>
        <form
          className="inline-form"
          onSubmit={(e) => {
            e.preventDefault();
            const a = Number(typedA);
            if (Number.isFinite(a) && a > 0) void nameFeatureAt(a);
          }}
        >
          <label>
            Name a line at{' '}
            <input ref={lambdaInput} inputMode="decimal" value={typedA} onChange={(e) => setTypedA(e.target.value)} aria-label="Observed wavelength of a feature (Å)" size={8} />{' '}
            Å
          </label>
          <button type="submit" disabled={!ready}>
            Find
          </button>
        </form>
        <form
          className="inline-form"
          onSubmit={(e) => {
            e.preventDefault();
            const z = Number(typedZ);
            if (typedZ.trim() === '' || !Number.isFinite(z) || z <= -1 || z > 12) {
              setMessage('Type a redshift between -1 and 12.');
              return;
            }
            setMessage(null);
            (e.currentTarget.querySelector('input') as HTMLInputElement | null)?.blur();
            void refitAt(z, 'typed', undefined, refine);
          }}
        >
          <label>
            z ={' '}
            <input ref={zInput} inputMode="decimal" value={typedZ} onChange={(e) => setTypedZ(e.target.value)} aria-label="Type a redshift" size={8} />
          </label>
          <label>
            <input type="checkbox" checked={refine} onChange={(e) => setRefine(e.target.checked)} /> refine near it
          </label>
          <button type="submit">Set z</button>
        </form>
      </div>

      {naming &&
        (naming.answer ? (
          <LineNamingList answer={naming.answer} onChoose={chooseLine} onClose={() => setNaming(null)} busy={busy !== null} curves={result?.curves ?? []} />
        ) : (
          <p className="muted" role="status">
            Looking for a feature near {fmtNum(naming.clickA, 1)} Å…
          </p>
        ))}

      <div className="review-columns">
        <div>
          <h3>Candidates</h3>
          {result && <CandidateList candidates={result.candidates} bestGrade={result.confidence} selected={solution?.candidateIndex ?? null} onPick={pickCandidate} />}
          {result && result.curves.length > 0 && (
            <FitQualityPlot
              curves={result.curves}
              candidates={result.candidates}
              currentZ={solution?.z ?? null}
              selectedCandidate={solution?.candidateIndex ?? null}
              onPickCandidate={pickCandidate}
              onPickZ={(z: number) => void refitAt(z, 'refit')}
              height={180}
            />
          )}
          {result && result.curves.length > 0 && (
            <p className="muted small">
              The curve comes from the fast, coarse scan over all redshifts; the table gives each candidate's Δχ² after refinement with the full model. Click the curve to refit near that z.
            </p>
          )}
        </div>
        <div className="decision-box" aria-label="Decision">
          <h3>Decision</h3>
          <label className="field">
            Your confidence{' '}
            <select value={grade ?? ''} onChange={(e) => setGrade((e.target.value || null) as Grade | null)} aria-label="Your confidence grade">
              {GRADES.map((g) => (
                <option key={g} value={g}>
                  {g === '' ? '(not set)' : g}
                </option>
              ))}
            </select>
          </label>
          <label className="field">
            Note
            <textarea ref={noteInput} value={note} onChange={(e) => setNote(e.target.value)} rows={2} maxLength={2000} aria-label="Note" />
          </label>
          <div className="decision-buttons">
            <button type="button" className="primary" onClick={accept} disabled={!solution} data-testid="accept">
              {shownIsAuto || !solution ? 'Accept' : 'Accept change'} <kbd>a</kbd>
            </button>
            <button type="button" onClick={reject} data-testid="reject">
              Reject as unusable <kbd>x</kbd>
            </button>
            {decided && (
              <button type="button" onClick={onReopen}>
                Undo decision <kbd>u</kbd>
              </button>
            )}
          </div>
        </div>
      </div>

      <h3>Lines at this redshift</h3>
      {solution ? <LineTable lines={solution.lines} /> : <p className="muted">No redshift.</p>}

      <DerivedPanel z={solution?.z ?? null} cls={solution?.cls ?? 'unknown'} cosmology={cosmology} reviewed={!!decided} />
    </section>
  );
}

function describeHow(s: Solution): string {
  switch (s.howSet) {
    case 'auto':
      return 'automatic fit';
    case 'candidate':
      return s.candidateIndex === null ? 'a runner-up candidate' : `candidate ${s.candidateIndex + 1}`;
    case 'line':
      return s.lineId ? `line ${lineById(s.lineId.id)?.label ?? s.lineId.id} at ${s.lineId.observedA.toFixed(1)} Å` : 'line identification';
    case 'typed':
      return 'typed redshift';
    case 'refit':
      return 'refit near a chosen z';
  }
}
