/**
 * Merge reviewers' verdict sets of one batch. Files of another batch, or
 * whose spectra have other contents than the same spectra in another file,
 * are refused with both file names. Every verdict is kept; where one reviewer
 * judged a spectrum twice (two files), the later decision counts and the
 * earlier stays in the record, marked as not counted.
 */
import { TeamFileError, type TeamSpectrum, type Verdict, type VerdictSet } from './verdictSet';

export interface MergedVerdict extends Verdict {
  /** False for a reviewer's earlier verdict on a spectrum they judged again in another file. */
  counted: boolean;
}

export interface MergedBatch {
  batchId: string;
  batchSize: number;
  /** The files merged, in the order given. */
  sources: { name: string; reviewer: string; verdicts: number; outside: number }[];
  /** Every spectrum any file names, in order of first appearance. */
  spectra: TeamSpectrum[];
  verdicts: MergedVerdict[];
  /** Exported catalogue rows by spectrum id, from merged catalogue exports (see fromCatalogue.ts). */
  autoRows: Record<string, Readonly<Record<string, string>>>;
}

export function mergeVerdictSets(sets: readonly VerdictSet[]): MergedBatch {
  if (!sets.length) throw new TeamFileError('no reviewer files to merge');
  const first = sets[0];
  const names = new Set<string>();
  const spectra = new Map<string, { s: TeamSpectrum; from: string }>();
  for (const set of sets) {
    if (names.has(set.source)) throw new TeamFileError(`${set.source} is given twice`);
    names.add(set.source);
    if (set.tag.batchId !== first.tag.batchId)
      throw new TeamFileError(`${set.source} belongs to batch ${set.tag.batchId}, but ${first.source} to batch ${first.tag.batchId}: not the same batch`);
    for (const s of set.spectra) {
      const seen = spectra.get(s.id);
      if (!seen) {
        spectra.set(s.id, { s: { ...s }, from: set.source });
        continue;
      }
      if (seen.s.sha256 !== s.sha256)
        throw new TeamFileError(`spectrum ${s.file} has different contents in ${set.source} and in ${seen.from} (content hashes differ): not the same file`);
      if (!seen.s.machine && s.machine) seen.s.machine = s.machine;
    }
  }
  // One counted verdict per spectrum and reviewer: the latest.
  const all = sets.flatMap((s) => s.verdicts);
  const latest = new Map<string, Verdict>();
  for (const v of all) {
    const key = `${v.id}\u0000${v.reviewer}`;
    const prev = latest.get(key);
    if (!prev || Date.parse(v.decision.decidedAt) > Date.parse(prev.decision.decidedAt)) latest.set(key, v);
  }
  const counted = new Set(latest.values());
  return {
    batchId: first.tag.batchId,
    batchSize: first.tag.batchSize,
    sources: sets.map((s) => ({ name: s.source, reviewer: s.reviewer, verdicts: s.verdicts.length, outside: s.outside })),
    spectra: [...spectra.values()].map((x) => x.s),
    verdicts: all.map((v) => ({ ...v, counted: counted.has(v) })),
    autoRows: Object.assign({}, ...sets.map((s) => s.autoRows ?? {}).reverse()),
  };
}

/** Counted verdicts of each spectrum id, reviewers in name order. */
export function countedBySpectrum(merged: MergedBatch): Map<string, MergedVerdict[]> {
  const out = new Map<string, MergedVerdict[]>(merged.spectra.map((s) => [s.id, []]));
  for (const v of merged.verdicts) if (v.counted) out.get(v.id)?.push(v);
  for (const list of out.values()) list.sort((a, b) => (a.reviewer < b.reviewer ? -1 : a.reviewer > b.reviewer ? 1 : 0));
  return out;
}

/**
 * Merge the sets one by one, refusing each that does not fit the ones taken
 * before (another batch, changed contents, given twice) with its message,
 * so one wrong file does not stop the rest.
 */
export function mergeWhatFits(sets: readonly VerdictSet[]): { merged: MergedBatch | null; refused: { source: string; message: string }[] } {
  const taken: VerdictSet[] = [];
  const refused: { source: string; message: string }[] = [];
  let merged: MergedBatch | null = null;
  for (const set of sets) {
    try {
      merged = mergeVerdictSets([...taken, set]);
      taken.push(set);
    } catch (e) {
      if (!(e instanceof TeamFileError)) throw e;
      refused.push({ source: set.source, message: e.message });
    }
  }
  return { merged, refused };
}
