/**
 * The arbiter's merge in this browser: reviewers' files added one at a time
 * (each checked against the ones already in), settlements recorded, the
 * tolerance and arbiter's name; stored in the session database after every
 * change, so a reload loses nothing. Verdicts and settlements are only added.
 */
import { useCallback, useEffect, useMemo, useState } from 'react';
import {
  consensusOf,
  DEFAULT_TOLERANCE,
  mergeWhatFits,
  teamStatistics,
  TeamFileError,
  verdictSetFromSession,
  verdictSetFromCatalogue,
  isTeamCatalogue,
  type Consensus,
  type MergedBatch,
  type Settlement,
  type TeamStatistics,
  type VerdictSet,
} from '../../core/team';
import type { FitResult } from '../../core/types';
import { parseSession } from '../persist/sessionFile';
import { planImport } from '../persist/planImport';
import type { Session } from '../state/session';
import { MERGE_WORK_FORMAT, MERGE_WORK_VERSION, parseMergeWork, type MergeWork } from './mergeWork';

const SETTING = 'teamMerge';

export function emptyWork(arbiter = ''): MergeWork {
  return { format: MERGE_WORK_FORMAT, version: MERGE_WORK_VERSION, savedAt: '', arbiter, tolerance: DEFAULT_TOLERANCE, sets: [], settlements: [] };
}

export interface MergeState {
  work: MergeWork;
  merged: MergedBatch | null;
  consensus: Consensus[];
  stats: TeamStatistics | null;
  /** Fit results read from reviewers' files, for spectra this browser's batch lacks. */
  results: ReadonlyMap<string, FitResult>;
  loaded: boolean;
  addFiles: (files: readonly { name: string; text: string }[]) => Promise<{ added: string[]; refused: string[] }>;
  settle: (s: Settlement) => Promise<void>;
  setTolerance: (t: number) => Promise<void>;
  setArbiter: (name: string) => Promise<void>;
  clear: () => Promise<void>;
}

export function useMergeWork(session: Session): MergeState {
  const [work, setWork] = useState<MergeWork>(() => emptyWork());
  const [loaded, setLoaded] = useState(false);
  const [results, setResults] = useState<Map<string, FitResult>>(new Map());

  useEffect(() => {
    let live = true;
    void session.db.getSetting<MergeWork>(SETTING).then((w) => {
      if (!live) return;
      const ok = w && parseMergeWork(JSON.stringify(w));
      if (ok && ok.ok) setWork(ok.work);
      else setWork(emptyWork(session.getSnapshot().reviewer ?? ''));
      setLoaded(true);
    });
    return () => {
      live = false;
    };
  }, [session]);

  const store = useCallback(
    async (next: MergeWork) => {
      const w = { ...next, savedAt: new Date().toISOString() };
      setWork(w);
      await session.db.putSetting(SETTING, w);
    },
    [session],
  );

  const merged = useMemo(() => (work.sets.length ? mergeWhatFits(work.sets).merged : null), [work.sets]);
  const consensus = useMemo(() => (merged ? consensusOf(merged, work.settlements, { tolerance: work.tolerance }) : []), [merged, work.settlements, work.tolerance]);
  const stats = useMemo(() => (merged ? teamStatistics(merged, consensus, { tolerance: work.tolerance }) : null), [merged, consensus, work.tolerance]);

  const addFiles = useCallback(
    async (files: readonly { name: string; text: string }[]) => {
      const added: string[] = [];
      const refused: string[] = [];
      let sets: VerdictSet[] = [...work.sets];
      let settlements = [...work.settlements];
      const more = new Map(results);
      for (const f of files) {
        const asWork = parseMergeWork(f.text);
        let incoming: VerdictSet[] = [];
        if (asWork.ok) {
          incoming = asWork.work.sets;
          // A settlement already here (the same merge loaded again) is not listed twice.
          const have = new Set(settlements.map((x) => `${x.id}\u0000${x.arbiter}\u0000${x.settledAt}`));
          settlements = [...settlements, ...asWork.work.settlements.filter((x) => !have.has(`${x.id}\u0000${x.arbiter}\u0000${x.settledAt}`))];
        } else if (asWork.isMergeWork) {
          refused.push(`${f.name}: ${asWork.problems.join('; ')}`);
          continue;
        } else {
          // A catalogue exported from a packet session carries its team block; anything else is tried as a session file.
          let fromExport: VerdictSet | null = null;
          try {
            fromExport = isTeamCatalogue(f.text) ? verdictSetFromCatalogue(f.text, f.name) : null;
          } catch (e) {
            if (!(e instanceof TeamFileError)) throw e;
            refused.push(e.message);
            continue;
          }
          if (fromExport) incoming = [fromExport];
        }
        if (!asWork.ok && !incoming.length) {
          const parsed = parseSession(f.text);
          if (!parsed.ok) {
            refused.push(`${f.name}: ${parsed.problems.join('; ')}`);
            continue;
          }
          try {
            incoming = [verdictSetFromSession(parsed.session, f.name)];
          } catch (e) {
            if (!(e instanceof TeamFileError)) throw e;
            refused.push(e.message);
            continue;
          }
          for (const en of parsed.session.entries) if (en.result) more.set(en.key, en.result);
          // In a browser that is no reviewer's packet, spectra it lacks come in (without decisions) so the arbiter can look at them.
          if (!session.teamTag()) {
            const existing = new Map(session.getSnapshot().rows.map((r) => [r.key, { hasBytes: r.hasBytes }]));
            const plan = planImport(existing, { ...parsed.session, entries: parsed.session.entries.map((e) => ({ ...e, decision: null })) });
            if (plan.newEntries.length || plan.bytesToAttach.length) await session.applyImport(plan);
          }
        }
        for (const set of incoming) {
          const { refused: no } = mergeWhatFits([...sets, set]);
          const mine = no.find((r) => r.source === set.source);
          if (mine) refused.push(mine.message);
          else {
            sets = [...sets, set];
            added.push(set.source);
          }
        }
      }
      setResults(more);
      await store({ ...work, sets, settlements });
      return { added, refused };
    },
    [work, results, session, store],
  );

  const settle = useCallback((s: Settlement) => store({ ...work, settlements: [...work.settlements, s] }), [work, store]);
  const setTolerance = useCallback((t: number) => store({ ...work, tolerance: t }), [work, store]);
  const setArbiter = useCallback((name: string) => store({ ...work, arbiter: name }), [work, store]);
  const clear = useCallback(() => store(emptyWork(work.arbiter)), [work.arbiter, store]);

  return { work, merged, consensus, stats, results, loaded, addFiles, settle, setTolerance, setArbiter, clear };
}
