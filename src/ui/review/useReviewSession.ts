/**
 * The review of one spectrum as state and actions, without layout: it loads
 * the stored fit and the spectrum, keeps the solution on screen, asks the
 * worker for the model, line measurements, refits and line suggestions, and
 * turns the reviewer's choice into a decision draft. Every answer from the
 * worker is checked against the spectrum it was asked for, so a late answer
 * for a spectrum the reviewer has left is dropped.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { FitResult, Grade, Spectrum, SpectrumClass } from '../../core/types';
import type { LineSuggestion } from '../../core/engine/identify';
import type { FeatureAnswer } from '../../worker/fitWorkerApi';
import { useServices } from '../state/SessionContext';
import type { Row } from '../state/session';
import { fmtZ } from '../format';
import { flagsOf, isReviewFlag, toggleFlag, type ReviewFlag } from './flags';
import { describeHow } from './SolutionLine';
import {
  acceptDraft,
  autoSolution,
  bestOfClass,
  candidateSolution,
  classForLine,
  keyedCandidates,
  lineSolution,
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

/** The staged, unsaved choice on one spectrum as kept over a reload. */
interface PanelDraft {
  key: string;
  solution: Omit<Solution, 'lines'> | null;
  typedZ: string;
  grade: Grade | null;
  note: string;
  flags: ReviewFlag[];
}

function asPanelDraft(d: unknown, key: string): PanelDraft | null {
  const o = d as Partial<PanelDraft> | null;
  if (!o || o.key !== key) return null;
  const s = o.solution;
  const solution = s && typeof s === 'object' && typeof s.z === 'number' && typeof s.howSet === 'string' && typeof s.cls === 'string' ? s : null;
  return {
    key,
    solution,
    typedZ: typeof o.typedZ === 'string' ? o.typedZ : '',
    grade: o.grade ?? null,
    note: typeof o.note === 'string' ? o.note : '',
    flags: Array.isArray(o.flags) ? o.flags.filter(isReviewFlag) : [],
  };
}

/** Wait this long after the last change before writing the staged choice (typing a note). */
const DRAFT_WRITE_DELAY_MS = 250;

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
  flags: ReviewFlag[];
  toggle: (f: ReviewFlag) => void;
  /** Candidate indices the number keys reach, in key order (key 1 = first). */
  keyed: number[];
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
  /** Show candidate index i. */
  pickCandidate: (i: number) => void;
  /** Show the candidate on number key n (1-9). */
  pickKey: (n: number) => void;
  /** Show the best candidate of a class. */
  pickClass: (cls: SpectrumClass) => void;
  /** Candidate index shown beside the solution for comparison, with its model once the worker has it. */
  compare: { index: number; model: Float64Array | null } | null;
  /** Next keyed candidate to compare with (not the one shown); after the last, off. */
  cycleCompare: () => void;
  stopCompare: () => void;
  /** Refit near the shown z (an explicit step after naming a line or typing a z). */
  refineShown: () => Promise<void>;
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
  const [flags, setFlags] = useState<ReviewFlag[]>(() => flagsOf(row.decision));
  const [naming, setNaming] = useState<NamingState | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const [typedZ, setTypedZ] = useState('');
  const [typedA, setTypedA] = useState('');
  const [refine, setRefine] = useState(true);
  const [message, setMessage] = useState<string | null>(null);
  const alive = useRef(key);
  alive.current = key;
  /** True once the reviewer has changed anything on this spectrum since it was opened or decided. */
  const dirty = useRef(false);
  const [loaded, setLoaded] = useState(false);
  const draftTimer = useRef<ReturnType<typeof setTimeout> | null>(null);

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
      let r: FitResult | null;
      try {
        r = (await session.getResult(key)) ?? null;
      } catch (e) {
        // The browser's storage refused the read (closed or gone): say so instead of failing silently.
        if (!stale) setSpec({ kind: 'error', message: `The stored fit could not be read: ${(e as Error)?.message ?? e}` });
        return;
      }
      if (stale) return;
      setResult(r);
      const fromDecision = row.decision && r ? solutionFromDecision(row.decision, r) : null;
      const draft = asPanelDraft(session.stagedDraft(), key);
      if (draft) {
        // The choice staged here before a reload: shown again, still unsaved.
        setSolution(draft.solution ? { ...draft.solution, lines: null } : fromDecision ?? (r ? autoSolution(r) : null));
        setTypedZ(draft.typedZ);
        setGrade(draft.grade);
        setNote(draft.note);
        setFlags(draft.flags);
        dirty.current = true;
      } else {
        // A choice staged on another spectrum is dropped when this one opens.
        session.saveDraft(null);
        setSolution(fromDecision ?? (r ? autoSolution(r) : null));
      }
      setLoaded(true);
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

  const touch = () => {
    dirty.current = true;
  };

  const keyed = useMemo(() => (result ? keyedCandidates(result.candidates) : []), [result]);

  const pickCandidate = useCallback(
    (i: number) => {
      if (!result) return;
      const s = candidateSolution(result, i);
      if (s) {
        touch();
        setSolution(s);
        setMessage(null);
      }
    },
    [result],
  );

  const [compareIndex, setCompareIndex] = useState<number | null>(null);
  const [compareModel, setCompareModel] = useState<Float64Array | null>(null);
  const cycleCompare = useCallback(() => {
    if (!result) return;
    const others = keyedCandidates(result.candidates).filter((i) => i !== solution?.candidateIndex);
    if (!others.length) {
      setMessage('There is no other candidate to compare with.');
      return;
    }
    setCompareIndex((cur) => {
      const at = cur === null ? -1 : others.indexOf(cur);
      return at + 1 < others.length ? others[at + 1] : null;
    });
  }, [result, solution]);
  const stopCompare = useCallback(() => setCompareIndex(null), []);
  const compareCand = compareIndex !== null ? result?.candidates[compareIndex] : undefined;
  useEffect(() => {
    setCompareModel(null);
    if (!compareCand || spec.kind !== 'ready') return;
    const forKey = key;
    let stale = false;
    void review.solutionModel(key, compareCand.z, compareCand.family).then((m) => {
      if (!stale && alive.current === forKey) setCompareModel(m);
    });
    return () => {
      stale = true;
    };
  }, [compareCand, spec.kind, key, review]);
  // Comparing a candidate with itself says nothing: stop when it becomes the one shown.
  useEffect(() => {
    if (compareIndex !== null && solution?.candidateIndex === compareIndex) setCompareIndex(null);
  }, [compareIndex, solution]);

  const pickKey = useCallback(
    (n: number) => {
      if (!result) return;
      const i = keyedCandidates(result.candidates)[n - 1];
      if (i !== undefined) pickCandidate(i);
    },
    [result, pickCandidate],
  );

  const pickClass = useCallback(
    (cls: SpectrumClass) => {
      if (!result) return;
      const i = bestOfClass(result.candidates, cls);
      if (i >= 0) pickCandidate(i);
      else setMessage(`This fit has no ${cls === 'qso' ? 'quasar' : cls} solution among its candidates. Type a redshift (z) to try one.`);
    },
    [result, pickCandidate],
  );

  const refitAt = useCallback(
    async (z: number, howSet: 'typed' | 'refit' | 'line', lineId?: { id: string; observedA: number }, doRefine = true) => {
      const forKey = key;
      touch();
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
          const s = refitSolution(r, howSet, z, solution?.cls ?? result?.class ?? 'unknown', lineId);
          if (r.status === 'ok') s.refinedFrom = { z, how: howSet === 'typed' ? 'the typed value' : howSet === 'line' ? 'the named line' : 'the chosen z' };
          setSolution(s);
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
      const f = naming?.answer?.feature;
      const observedA = f?.centreA ?? naming?.clickA ?? NaN;
      setNaming(null);
      setMessage(null);
      touch();
      const cls = classForLine(s.lineId, solution?.cls ?? result?.class ?? 'unknown');
      setSolution(lineSolution(s, observedA, f?.centreErrA ?? NaN, cls));
    },
    [naming, solution, result],
  );

  const refineShown = useCallback(async () => {
    const from = solution;
    if (!from || !ready) return;
    const forKey = key;
    touch();
    setBusy('Refitting near the shown redshift…');
    try {
      const r = await review.refitNear(key, from.z);
      if (alive.current !== forKey) return;
      if (!r) setMessage('The spectrum is not open in the worker; try again.');
      else if (r.status !== 'ok') setMessage(`No fit near z = ${fmtZ(from.z)}: ${r.error ?? r.status}. The redshift is kept as it was.`);
      else {
        const s = refitSolution(r, 'refit', from.z, from.cls, from.lineId);
        s.refinedFrom = { z: from.z, how: from.howSet === 'typed' ? 'the typed value' : describeHow(from, keyedCandidates(result?.candidates ?? [])) };
        setSolution(s);
      }
    } finally {
      if (alive.current === forKey) setBusy(null);
    }
  }, [solution, ready, key, review, result]);

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
    onDecision(acceptDraft(row.file, solution, grade, note, flags));
  }, [solution, result, row.file, grade, note, flags, onDecision]);

  const reject = useCallback(() => onDecision(rejectDraft(row.file, grade, note, flags)), [row.file, grade, note, flags, onDecision]);

  const closeNaming = useCallback(() => setNaming(null), []);

  const toggle = useCallback((f: ReviewFlag) => {
    touch();
    setFlags((cur) => toggleFlag(cur, f));
  }, []);

  // A stored decision (accept, reject, undo) ends the staged choice.
  const decision = row.decision;
  const lastDecision = useRef(decision);
  useEffect(() => {
    const before = lastDecision.current;
    lastDecision.current = decision;
    if (before === decision) return;
    dirty.current = false;
    if (draftTimer.current) clearTimeout(draftTimer.current);
    session.saveDraft(null);
    if (before && !decision) {
      // Undo: back to what an unreviewed spectrum shows, with nothing staged.
      setSolution(result ? autoSolution(result) : null);
      setGrade(null);
      setNote('');
      setFlags([]);
      setTypedZ('');
      setNaming(null);
      setMessage(null);
    }
  }, [decision, result, session]);

  // Keep the staged choice over a reload (written shortly after the last change).
  useEffect(() => {
    if (!loaded || !dirty.current) return;
    const d: PanelDraft = { key, solution: solution ? stripLines(solution) : null, typedZ, grade, note, flags };
    const t = setTimeout(() => {
      if (dirty.current) session.saveDraft(d);
    }, DRAFT_WRITE_DELAY_MS);
    draftTimer.current = t;
    return () => clearTimeout(t);
  }, [loaded, key, solution, typedZ, grade, note, flags, session]);

  return {
    result,
    spec,
    ready,
    solution,
    model,
    grade,
    setGrade: (g) => {
      touch();
      setGrade(g);
    },
    note,
    setNote: (n: string) => {
      touch();
      setNote(n);
    },
    flags,
    toggle,
    keyed,
    naming,
    closeNaming,
    busy,
    message,
    setMessage,
    typedZ,
    setTypedZ: (z: string) => {
      touch();
      setTypedZ(z);
    },
    typedA,
    setTypedA,
    refine,
    setRefine,
    pickCandidate,
    pickKey,
    pickClass,
    compare: compareIndex !== null && compareCand ? { index: compareIndex, model: compareModel } : null,
    cycleCompare,
    stopCompare,
    refineShown,
    refitAt,
    nameFeatureAt,
    chooseLine,
    submitTypedZ,
    accept,
    reject,
  };
}

function stripLines(s: Solution): Omit<Solution, 'lines'> {
  const { lines: _lines, ...rest } = s;
  return rest;
}
