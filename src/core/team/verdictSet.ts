/**
 * One reviewer's verdicts, read from a session saved from a review packet:
 * the packet's spectra (id, file, content hash, the machine's solution) and
 * the reviewer's decisions on them. Shape checks of the file itself are the
 * session reader's job; this takes what it returns.
 */
import type { FitResult, ReviewDecision, SpectrumClass } from '../types';
import { teamTagProblems, type TeamTag } from './teamTag';

/** What a session file holds, as far as the team step needs it. */
export interface SessionLike {
  reviewer: string;
  team?: unknown;
  entries: readonly { key: string; file: string; result: FitResult | null; decision: ReviewDecision | null }[];
}

export interface MachineSolution {
  z: number;
  zErr: number;
  class: SpectrumClass;
}

export interface TeamSpectrum {
  id: string;
  file: string;
  sha256: string;
  /** The automatic solution, when the file carried a successful fit. */
  machine: MachineSolution | null;
}

export interface Verdict {
  /** Spectrum id. */
  id: string;
  reviewer: string;
  /** Name of the file the verdict was read from. */
  source: string;
  decision: ReviewDecision;
}

export interface VerdictSet {
  /** File name it was read from. */
  source: string;
  /** Whom the packet was for. */
  reviewer: string;
  tag: TeamTag;
  spectra: TeamSpectrum[];
  verdicts: Verdict[];
  /** Decisions in the file on spectra outside its packet (not counted). */
  outside: number;
  /** From a catalogue export: each spectrum's row as exported (its automatic cells stand in for a missing fit). */
  autoRows?: Record<string, Readonly<Record<string, string>>>;
}

/** A file the team step cannot use, or that belongs to another batch; the message names the file(s). */
export class TeamFileError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'TeamFileError';
  }
}

function machineOf(r: FitResult | null): MachineSolution | null {
  return r && r.status === 'ok' && Number.isFinite(r.z) ? { z: r.z, zErr: r.zErr, class: r.class } : null;
}

/** The verdict set of a session read from `source`; throws TeamFileError when it is not from a packet. */
export function verdictSetFromSession(session: SessionLike, source: string): VerdictSet {
  if (session.team === undefined) throw new TeamFileError(`${source}: not from a review packet (the session has no team block)`);
  const problems = teamTagProblems(session.team);
  if (problems.length) throw new TeamFileError(`${source}: ${problems.join('; ')}`);
  const tag = session.team as TeamTag;
  const entries = new Map(session.entries.map((e) => [e.key, e]));
  const inPacket = new Set(tag.spectra.map((s) => s.id));
  const spectra = tag.spectra.map((s) => ({ id: s.id, file: s.file, sha256: s.sha256, machine: machineOf(entries.get(s.id)?.result ?? null) }));
  const verdicts: Verdict[] = [];
  let outside = 0;
  for (const e of session.entries) {
    const d = e.decision;
    if (!d || d.state === 'unreviewed') continue;
    if (!inPacket.has(e.key)) {
      outside++;
      continue;
    }
    verdicts.push({ id: e.key, reviewer: d.reviewer.trim() || tag.reviewer, source, decision: d });
  }
  return { source, reviewer: tag.reviewer, tag, spectra, verdicts, outside };
}
