/**
 * The arbiter's merge as one JSON file (and as stored in the browser): the
 * reviewers' verdict sets as read, the settlements, the tolerance and the
 * arbiter's name. Verdicts and settlements are only ever added to it, so
 * nothing a reviewer or the arbiter decided is lost. The command line reads
 * it to write the same tables.
 */
import { teamTagProblems, type Settlement, type VerdictSet } from '../../core/team';
import { decisionProblems } from '../persist/validateRecords';

export const MERGE_WORK_FORMAT = 'shiftmark-team-merge';
export const MERGE_WORK_VERSION = 1;

export interface MergeWork {
  format: typeof MERGE_WORK_FORMAT;
  version: number;
  savedAt: string;
  arbiter: string;
  tolerance: number;
  sets: VerdictSet[];
  settlements: Settlement[];
}

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Shape problems of a merge work object; empty when sound. */
export function mergeWorkProblems(v: unknown): string[] {
  if (!isObj(v)) return ['not an object'];
  const p: string[] = [];
  if (v.version !== MERGE_WORK_VERSION) p.push(`merge file version ${String(v.version)} is not supported`);
  if (typeof v.arbiter !== 'string') p.push('arbiter is not text');
  if (typeof v.tolerance !== 'number' || !(v.tolerance > 0 && v.tolerance < 1)) p.push('tolerance is not a number between 0 and 1');
  if (!Array.isArray(v.sets)) p.push('sets is not a list');
  else
    v.sets.forEach((s: unknown, i) => {
      const where = `set ${i + 1}`;
      if (!isObj(s) || typeof s.source !== 'string' || typeof s.reviewer !== 'string' || !Array.isArray(s.spectra) || !Array.isArray(s.verdicts)) {
        p.push(`${where}: malformed`);
        return;
      }
      p.push(...teamTagProblems(s.tag).map((m) => `${where} (${s.source}): ${m}`));
      (s.verdicts as unknown[]).forEach((x, j) => {
        if (!isObj(x) || typeof x.id !== 'string' || typeof x.reviewer !== 'string') p.push(`${where} (${s.source}), verdict ${j + 1}: malformed`);
        else p.push(...decisionProblems(x.decision, `${where} (${s.source}), verdict ${j + 1}`));
      });
    });
  if (!Array.isArray(v.settlements)) p.push('settlements is not a list');
  else
    v.settlements.forEach((s: unknown, i) => {
      const where = `settlement ${i + 1}`;
      if (!isObj(s) || typeof s.id !== 'string' || typeof s.arbiter !== 'string' || typeof s.settledAt !== 'string' || !(s.picked === null || typeof s.picked === 'string'))
        p.push(`${where}: malformed`);
      else p.push(...decisionProblems(s.decision, where));
    });
  return p.slice(0, 20);
}

export type ParsedMergeWork = { ok: true; work: MergeWork } | { ok: false; isMergeWork: boolean; problems: string[] };

export function parseMergeWork(text: string): ParsedMergeWork {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    return { ok: false, isMergeWork: false, problems: [`not JSON: ${(e as Error).message}`] };
  }
  if (!isObj(raw) || raw.format !== MERGE_WORK_FORMAT) return { ok: false, isMergeWork: false, problems: ['not a merge file'] };
  const problems = mergeWorkProblems(raw);
  if (problems.length) return { ok: false, isMergeWork: true, problems };
  return { ok: true, work: raw as unknown as MergeWork };
}

export function encodeMergeWork(work: MergeWork): string {
  return JSON.stringify(work);
}
