/**
 * Which reviewers see which spectrum: a seeded, reproducible assignment of
 * every spectrum to k of N reviewers. The spectra are put in a seeded random
 * order (Fisher-Yates shuffle; Durstenfeld 1964, CACM 7, 420) and so are the
 * reviewers; then the n k places are dealt round the reviewers in turn, k
 * consecutive ones per spectrum. So every spectrum gets k different reviewers
 * (k <= N), and every reviewer gets floor(n k / N) or one more.
 */
import { createRng, mixSeed } from '../sim/prng';

export interface Assignment {
  /** Reviewers of each spectrum id, in dealing order. */
  bySpectrum: Map<string, string[]>;
  /** Spectrum ids of each reviewer, in the batch's order. */
  byReviewer: Map<string, string[]>;
}

/** Reviewer names as given, trimmed; refuses empty, repeated or too few names. */
export function checkReviewers(reviewers: readonly string[], k: number): string[] {
  const names = reviewers.map((r) => r.trim());
  if (names.some((n) => !n)) throw new RangeError('a reviewer name is empty');
  const seen = new Set<string>();
  for (const n of names) {
    if (seen.has(n)) throw new RangeError(`reviewer ${n} is named twice`);
    seen.add(n);
  }
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`reviewers per spectrum must be a whole number >= 1 (got ${k})`);
  if (names.length < k) throw new RangeError(`${k} reviewers per spectrum need at least ${k} reviewers (got ${names.length})`);
  return names;
}

function shuffled<T>(items: readonly T[], seed: number): T[] {
  const rng = createRng(seed);
  const out = [...items];
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(rng.next() * (i + 1));
    [out[i], out[j]] = [out[j], out[i]];
  }
  return out;
}

/** Deal `spectrumIds` to `reviewers`, k per spectrum; the same inputs and seed give the same assignment. */
export function assignReviewers(spectrumIds: readonly string[], reviewers: readonly string[], k: number, seed: number): Assignment {
  const names = checkReviewers(reviewers, k);
  if (new Set(spectrumIds).size !== spectrumIds.length) throw new RangeError('a spectrum id appears twice in the batch');
  if (!Number.isInteger(seed)) throw new RangeError(`the seed must be a whole number (got ${seed})`);
  const order = shuffled(spectrumIds, mixSeed(seed, 1));
  const people = shuffled(names, mixSeed(seed, 2));
  const bySpectrum = new Map<string, string[]>();
  order.forEach((id, i) => {
    const who: string[] = [];
    for (let j = 0; j < k; j++) who.push(people[(i * k + j) % people.length]);
    bySpectrum.set(id, who);
  });
  const byReviewer = new Map<string, string[]>(names.map((n) => [n, []]));
  for (const id of spectrumIds) for (const who of bySpectrum.get(id)!) byReviewer.get(who)!.push(id);
  return { bySpectrum, byReviewer };
}
