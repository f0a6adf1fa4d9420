/**
 * Review packets from a batch: the batch id, the assignment, and one team
 * block per reviewer. The caller (browser) puts each block in a session file
 * with that reviewer's spectra.
 */
import { assignReviewers } from './assign';
import { textHash } from './contentHash';
import { TEAM_TAG_VERSION, type PacketSpectrum, type TeamTag } from './teamTag';

export const DEFAULT_PER_SPECTRUM = 2;

/**
 * The batch id: the first 16 hex digits of the SHA-256 of every spectrum's
 * id and content hash, sorted, one per line. The same spectra give the same
 * id on any machine, whatever order they were added in.
 */
export async function batchIdOf(spectra: readonly PacketSpectrum[]): Promise<string> {
  const lines = spectra.map((s) => `${s.id}\t${s.sha256}`).sort();
  return (await textHash(lines.join('\n'))).slice(0, 16);
}

export interface PacketPlan {
  batchId: string;
  /** One team block per reviewer, in the order the reviewers were given. */
  packets: TeamTag[];
}

export async function planPackets(
  batch: readonly PacketSpectrum[],
  reviewers: readonly string[],
  perSpectrum: number,
  seed: number,
  madeAt: string,
): Promise<PacketPlan> {
  if (!batch.length) throw new RangeError('the batch holds no spectrum to deal out');
  const assignment = assignReviewers(
    batch.map((s) => s.id),
    reviewers,
    perSpectrum,
    seed,
  );
  const batchId = await batchIdOf(batch);
  const byId = new Map(batch.map((s) => [s.id, s]));
  const names = [...assignment.byReviewer.keys()];
  const packets = names.map(
    (reviewer): TeamTag => ({
      version: TEAM_TAG_VERSION,
      batchId,
      batchSize: batch.length,
      seed,
      perSpectrum,
      reviewers: names,
      reviewer,
      madeAt,
      spectra: assignment.byReviewer.get(reviewer)!.map((id) => ({ ...byId.get(id)! })),
    }),
  );
  return { batchId, packets };
}
