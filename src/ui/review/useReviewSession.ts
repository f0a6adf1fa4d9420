/**
 * The review of one spectrum as state and actions, without layout: it loads
 * the stored fit and the spectrum, keeps the solution on screen, asks the
 * worker for the model, line measurements, refits and line suggestions, and
 * turns the reviewer's choice into a decision draft. Every answer from the
 * worker is checked against the spectrum it was asked for, so a late answer
 * for a spectrum the reviewer has left is dropped.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import type { FitResult, Grade, Spectrum } from '../../core/types';
import type { LineSuggestion } from '../../core/engine/identify';
import type { FeatureAnswer } from '../../worker/fitWorkerApi';
import { useServices } from '../state/SessionContext';
import type { Row } from '../state/session';
import { fmtZ } from '../format';
import {
  acceptDraft,
  autoSolution,
  candidateSolution,
  modelFamily,
  refitSolution,
  rejectDraft,
  solutionFromDecision,
  type DecisionDraft,
  type Solution,
} from './solution';

export type SpectrumState = { kind: 'loading' } | { kind: 'ready'; spectrum: Spectrum } | { kind: 'missing' } | { kind: 'error'; message: string };

export interface NamingState {
  clickA: number;
  answer: FeatureAnswer | null;
}

export interface ReviewSession {
  result: FitResult | null;
  spec: SpectrumState;
  ready: boolean;
  solution: Solution | null;
  model: Float64Array | null;
  grade: Grade | null;
  setGrade: (g: Grade | null | ((g: Grade | null) => Grade | null)) => void;
  note: string;
  setNote: (n: string) => void;
  naming: NamingState | null;
  closeNaming: () => void;
  busy: string | null;
  message: string | null;
  setMessage: (m: string | null) => void;
  typedZ: string;
  setTypedZ: (s: string) => void;
  typedA: string;
  setTypedA: (s: string) => void;
  refine: boolean;
  setRefine: (b: boolean) => void;
  pickCandidate: (i: number) => void;
  refitAt: (z: number, howSet: 'typed' | 'refit' | 'line', lineId?: { id: string; observedA: number }, doRefine?: boolean) => Promise<void>;
  nameFeatureAt: (clickA: number) => Promise<void>;
  chooseLine: (s: LineSuggestion) => void;
  /** Submit the typed redshift; false (with a message) when it is not a redshift. */
  submitTypedZ: () => boolean;
  accept: () => void;
  reject: () => void;
}

export interface ReviewSessionOptions {
  row: Row;
  onDecision: (draft: DecisionDraft) => void;
}

export function useReviewSession({ row, onDecision }: ReviewSessionOptions): ReviewSession {
  const { session, review } = useServices();
  const key = row.key;
  const [result, setResult] = useState<FitResult | null>(null);
  const [spec, setSpec] = useState<SpectrumState>({ kind: 'loading' });
  const [solution, setSolution] = useState<Solution | null>(null);
  const [grade, setGrade] = useState<Grade | null>(row.decision?.reviewerGrade ?? null);
  const [note, setNote] = useState(row.decision?.note ?? '');
  const [naming, setNaming] = useState<NamingState | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const [typedZ, setTypedZ] = useState('');
  const [typedA, setTypedA] = useState('');
  const [refine, setRefine] = useState(true);
  const [message, setMessage] = useState<string | null>(null);
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

  const submitTypedZ = useCallback(() => {
    const z = Number(typedZ);
    if (typedZ.trim() === '' || !Number.isFinite(z) || z <= -1 || z > 12) {
      setMessage('Type a redshift between -1 and 12.');
      return false;
    }
    setMessage(null);
    void refitAt(z, 'typed', undefined, refine);
    return true;
  }, [typedZ, refine, refitAt]);

  const accept = useCallback(() => {
    if (!solution) {
      setMessage(result?.status === 'ok' ? 'No solution to accept.' : 'This file has no fit: reject it as unusable (x), or set a redshift.');
      return;
    }
    onDecision(acceptDraft(row.file, solution, grade, note));
  }, [solution, result, row.file, grade, note, onDecision]);

  const reject = useCallback(() => onDecision(rejectDraft(row.file, grade, note)), [row.file, grade, note, onDecision]);

  const closeNaming = useCallback(() => setNaming(null), []);

  return {
    result,
    spec,
    ready,
    solution,
    model,
    grade,
    setGrade,
    note,
    setNote,
    naming,
    closeNaming,
    busy,
    message,
    setMessage,
    typedZ,
    setTypedZ,
    typedA,
    setTypedA,
    refine,
    setRefine,
    pickCandidate,
    refitAt,
    nameFeatureAt,
    chooseLine,
    submitTypedZ,
    accept,
    reject,
  };
}
