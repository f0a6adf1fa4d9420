/**
 * The team block a review packet carries inside its session file, and every
 * session saved from it: which batch, who the packet is for, how the batch
 * was dealt, and each of its spectra by id, file name and SHA-256 of the
 * file's bytes. The merge checks these to refuse files of another batch.
 */
import { isContentHash } from './contentHash';

export const TEAM_TAG_VERSION = 1;

export interface PacketSpectrum {
  /** The spectrum's id in the batch (the session key; opaque text). */
  id: string;
  /** File name as the batch names it. */
  file: string;
  /** SHA-256 of the file's bytes, hex. */
  sha256: string;
}

export interface TeamTag {
  version: number;
  /** Id of the whole batch: a hash of every spectrum's id and content hash. */
  batchId: string;
  /** Spectra in the whole batch. */
  batchSize: number;
  /** Seed of the assignment. */
  seed: number;
  /** Reviewers per spectrum. */
  perSpectrum: number;
  /** Every reviewer of the batch. */
  reviewers: string[];
  /** The reviewer this packet is for. */
  reviewer: string;
  /** Time the packets were made, ISO 8601. */
  madeAt: string;
  /** The spectra of this packet. */
  spectra: PacketSpectrum[];
}

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Problems with a team block read from a file; empty when it is sound. */
export function teamTagProblems(v: unknown): string[] {
  if (!isObj(v)) return ['team: not an object'];
  const p: string[] = [];
  if (v.version !== TEAM_TAG_VERSION) p.push(`team: version ${String(v.version)} is not supported (this version reads ${TEAM_TAG_VERSION})`);
  if (typeof v.batchId !== 'string' || !/^[0-9a-f]{16,64}$/.test(v.batchId)) p.push('team: batchId is not a batch id');
  if (!Number.isInteger(v.batchSize) || (v.batchSize as number) < 0) p.push('team: batchSize is not a count');
  if (!Number.isInteger(v.seed)) p.push('team: seed is not a whole number');
  if (!Number.isInteger(v.perSpectrum) || (v.perSpectrum as number) < 1) p.push('team: perSpectrum is not a count');
  if (!Array.isArray(v.reviewers) || !v.reviewers.every((r) => typeof r === 'string' && r.trim())) p.push('team: reviewers is not a list of names');
  if (typeof v.reviewer !== 'string' || !v.reviewer.trim()) p.push('team: reviewer is missing');
  if (typeof v.madeAt !== 'string') p.push('team: madeAt is missing');
  if (!Array.isArray(v.spectra)) p.push('team: spectra is not a list');
  else
    v.spectra.forEach((s: unknown, i) => {
      if (!isObj(s) || typeof s.id !== 'string' || !s.id || typeof s.file !== 'string' || !isContentHash(s.sha256))
        p.push(`team: spectrum ${i + 1} needs an id, a file name and a SHA-256 content hash`);
    });
  return p;
}
