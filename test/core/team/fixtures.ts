/** Small team sessions for the merge tests: invented spectra and reviewers. */
import type { FitResult, ReviewDecision, SpectrumClass } from '../../../src/core/types';
import { TEAM_TAG_VERSION, type TeamTag } from '../../../src/core/team/teamTag';
import type { SessionLike } from '../../../src/core/team/verdictSet';

export const hashOf = (c: string) => c.repeat(64).slice(0, 64);

export const SPECTRA = [
  { id: 'a.fits', file: 'a.fits', sha256: hashOf('a') },
  { id: 'b.fits', file: 'b.fits', sha256: hashOf('b') },
  { id: 'c.fits', file: 'c.fits', sha256: hashOf('c') },
];

export function tag(reviewer: string, ids: string[], over: Partial<TeamTag> = {}): TeamTag {
  return {
    version: TEAM_TAG_VERSION,
    batchId: '0123456789abcdef',
    batchSize: SPECTRA.length,
    seed: 1,
    perSpectrum: 2,
    reviewers: ['Ana', 'Bo'],
    reviewer,
    madeAt: '2026-01-01T00:00:00.000Z',
    spectra: SPECTRA.filter((s) => ids.includes(s.id)),
    ...over,
  };
}

export function decision(file: string, reviewer: string, cls: SpectrumClass, z: number | null, at = '2026-01-02T00:00:00.000Z'): ReviewDecision {
  return { file, state: z === null ? 'rejected' : 'accepted', z, zErr: null, class: cls, reviewerGrade: null, howSet: 'auto', reviewer, decidedAt: at, note: '' };
}

export function result(file: string, cls: SpectrumClass, z: number): FitResult {
  return { file, status: 'ok', z, zErr: 0.001, class: cls } as unknown as FitResult;
}

export function session(t: TeamTag | undefined, decisions: Record<string, ReviewDecision | null>, machine: Record<string, [SpectrumClass, number]> = {}): SessionLike {
  return {
    reviewer: t?.reviewer ?? '',
    team: t,
    entries: Object.entries(decisions).map(([key, d]) => ({ key, file: key, decision: d, result: machine[key] ? result(key, ...machine[key]) : null })),
  };
}
