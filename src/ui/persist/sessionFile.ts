/**
 * The whole session as one JSON file, for moving work to another machine
 * or keeping a copy. Typed arrays and non-finite numbers (NaN redshift of a
 * failed file, Infinity chi-square gap) survive through tagged objects.
 * Reading is strict: every entry is checked before anything is used.
 */
import type { CosmologyParams, FitResult, ReviewDecision } from '../../core/types';
import { bytesToBase64, base64ToBytes } from './base64';
import { decisionProblems, fitResultProblems, asDecision, asFitResult } from './validateRecords';
import { teamTagProblems, type TeamTag } from '../../core/team/teamTag';

export const SESSION_FORMAT = 'shiftmark-session';
/** Version written; versions read: 1 (curves as number lists) and 2 (curves thinned, as base64 float32). */
export const SESSION_VERSION = 2;
const READABLE_VERSIONS = [1, 2];
/** Points kept per fit-quality curve in a session file (the lowest point of each block, so every well stays). */
export const SESSION_CURVE_POINTS = 500;
/** Largest session file read, bytes (a guard against a wrong file, not a real limit). */
export const MAX_SESSION_BYTES = 1_500_000_000;

export interface SessionFileEntry {
  key: string;
  file: string;
  order: number;
  result: FitResult | null;
  decision: ReviewDecision | null;
  /** The raw file, present when the session was saved with its spectra. */
  bytes?: Uint8Array;
}

export interface SessionFile {
  format: typeof SESSION_FORMAT;
  version: number;
  /** ISO 8601 time of export. */
  exportedAt: string;
  software: string;
  reviewer: string;
  cosmology: CosmologyParams;
  entries: SessionFileEntry[];
  /** Present in a review packet and in every session saved from one (src/core/team/teamTag.ts). */
  team?: TeamTag;
}

type Tagged = { $f64: number[] } | { $f32: string } | { $num: 'NaN' | 'Infinity' | '-Infinity' } | { $b64: string };

/**
 * A fit-quality curve thinned to at most maxPoints: the grid cut into equal
 * blocks, the lowest delta chi-square of each kept with its z, so the minima
 * (candidates) survive. For session files: the curve is only drawn.
 */
export function thinCurve(z: Float64Array, d: Float64Array, maxPoints = SESSION_CURVE_POINTS): { z: Float64Array; deltaChi2: Float64Array } {
  const n = Math.min(z.length, d.length);
  if (n <= maxPoints) return { z, deltaChi2: d };
  const oz = new Float64Array(maxPoints);
  const od = new Float64Array(maxPoints);
  for (let q = 0; q < maxPoints; q++) {
    const i0 = Math.floor((q * n) / maxPoints);
    const i1 = Math.floor(((q + 1) * n) / maxPoints);
    let k = i0;
    for (let i = i0 + 1; i < i1; i++) if (d[i] < d[k] || !(d[k] === d[k])) k = i;
    oz[q] = z[k];
    od[q] = d[k];
  }
  return { z: oz, deltaChi2: od };
}

/** Every fit-quality curve of the session thinned (results are copied, never changed). */
function thinResults(session: SessionFile): SessionFile {
  return {
    ...session,
    entries: session.entries.map((e) =>
      e.result ? { ...e, result: { ...e.result, curves: e.result.curves.map((c) => ({ family: c.family, ...thinCurve(c.z, c.deltaChi2) })) } } : e,
    ),
  };
}

/** Typed-array kind by its tag, not instanceof, so arrays from another realm (a storage layer's structured clone) are recognised. */
function typedKind(value: unknown): string | null {
  return ArrayBuffer.isView(value) ? Object.prototype.toString.call(value).slice(8, -1) : null;
}

function encodeValue(_key: string, value: unknown): unknown {
  if (typeof value === 'number' && !Number.isFinite(value)) return { $num: String(value) } as Tagged;
  const kind = typedKind(value);
  if (kind === 'Float64Array') return { $f32: bytesToBase64(new Uint8Array(Float32Array.from(value as Float64Array).buffer)) } as Tagged;
  if (kind === 'Uint8Array') return { $b64: bytesToBase64(value as Uint8Array) } as Tagged;
  // Curves are drawn, not computed with: float32 (7 digits) as base64 is a quarter of the text of a number list.
  if (value instanceof Float64Array) return { $f32: bytesToBase64(new Uint8Array(Float32Array.from(value).buffer)) } as Tagged;
  if (value instanceof Uint8Array) return { $b64: bytesToBase64(value) } as Tagged;
  return value;
}

function decodeNumber(x: unknown): number {
  if (typeof x === 'number') return x;
  if (x === 'NaN') return NaN;
  if (x === 'Infinity') return Infinity;
  if (x === '-Infinity') return -Infinity;
  throw new Error(`not a number: ${JSON.stringify(x)}`);
}

function decodeValue(_key: string, value: unknown): unknown {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return value;
  const keys = Object.keys(value);
  if (keys.length !== 1) return value;
  const v = value as Record<string, unknown>;
  if ('$num' in v) return decodeNumber(v.$num);
  if ('$f64' in v) {
    if (!Array.isArray(v.$f64)) throw new Error('$f64 is not a list');
    return Float64Array.from(v.$f64, decodeNumber);
  }
  if ('$f32' in v) {
    if (typeof v.$f32 !== 'string' || !/^[A-Za-z0-9+/]*={0,2}$/.test(v.$f32)) throw new Error('$f32 is not base64');
    const bytes = base64ToBytes(v.$f32);
    if (bytes.length % 4) throw new Error('$f32 is not a whole number of float32 values');
    return Float64Array.from(new Float32Array(bytes.buffer, bytes.byteOffset, bytes.length / 4));
  }
  if ('$b64' in v) {
    if (typeof v.$b64 !== 'string' || !/^[A-Za-z0-9+/]*={0,2}$/.test(v.$b64)) throw new Error('$b64 is not base64');
    return base64ToBytes(v.$b64);
  }
  return value;
}

/**
 * A packet writes the bytes of a file once even when several of its spectra
 * come from it (a multi-object file); the others, named with the same
 * content hash in the team block, get the same bytes back here.
 */
function shareTeamBytes(entries: SessionFileEntry[], team: TeamTag): void {
  const hashOf = new Map(team.spectra.map((s) => [s.id, s.sha256]));
  const byHash = new Map<string, Uint8Array>();
  for (const e of entries) if (e.bytes && hashOf.has(e.key)) byHash.set(hashOf.get(e.key)!, e.bytes);
  for (const e of entries) if (!e.bytes && hashOf.has(e.key)) {
    const b = byHash.get(hashOf.get(e.key)!);
    if (b) e.bytes = b;
  }
}

export function encodeSession(session: SessionFile): string {
  return JSON.stringify(thinResults(session), encodeValue);
}

export type ParsedSession = { ok: true; session: SessionFile } | { ok: false; problems: string[] };

/** Parse and check a session file; at most the first 20 problems are listed. */
export function parseSession(text: string): ParsedSession {
  if (text.length > MAX_SESSION_BYTES) return { ok: false, problems: ['the file is too large to be a session file'] };
  let raw: unknown;
  try {
    raw = JSON.parse(text, decodeValue);
  } catch (e) {
    return { ok: false, problems: [`not a readable session file: ${(e as Error).message}`] };
  }
  const problems: string[] = [];
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) return { ok: false, problems: ['the file does not hold a session object'] };
  const r = raw as Record<string, unknown>;
  if (r.format !== SESSION_FORMAT) return { ok: false, problems: [`not a Shiftmark session file (format is ${JSON.stringify(r.format)})`] };
  if (!READABLE_VERSIONS.includes(r.version as number))
    problems.push(`session file version ${String(r.version)} is not supported (this version reads ${READABLE_VERSIONS.join(' and ')})`);
  if (typeof r.exportedAt !== 'string') problems.push('exportedAt is missing');
  if (typeof r.reviewer !== 'string') problems.push('reviewer is not text');
  if (typeof r.software !== 'string') problems.push('software is not text');
  const c = r.cosmology as Record<string, unknown> | undefined;
  if (!c || !['h0', 'omegaM', 'omegaK', 'omegaR'].every((k) => typeof c[k] === 'number' && Number.isFinite(c[k] as number)))
    problems.push('cosmology is malformed');
  if (r.team !== undefined) problems.push(...teamTagProblems(r.team));
  if (!Array.isArray(r.entries)) problems.push('entries is not a list');
  else {
    const seen = new Set<string>();
    r.entries.forEach((e: unknown, i: number) => {
      const where = `entry ${i + 1}`;
      if (typeof e !== 'object' || e === null) {
        problems.push(`${where}: not an object`);
        return;
      }
      const en = e as Record<string, unknown>;
      if (typeof en.key !== 'string' || !en.key) problems.push(`${where}: key is missing`);
      else if (seen.has(en.key)) problems.push(`${where}: key ${en.key} appears twice`);
      else seen.add(en.key);
      if (typeof en.file !== 'string') problems.push(`${where}: file is not text`);
      if (typeof en.order !== 'number' || !Number.isFinite(en.order)) problems.push(`${where}: order is not a number`);
      if (en.result !== null) problems.push(...fitResultProblems(en.result, where));
      if (en.decision !== null) problems.push(...decisionProblems(en.decision, where));
      if (en.bytes !== undefined && !(en.bytes instanceof Uint8Array)) problems.push(`${where}: bytes are malformed`);
    });
  }
  if (problems.length) return { ok: false, problems: problems.slice(0, 20).concat(problems.length > 20 ? [`... and ${problems.length - 20} more`] : []) };
  const entries = (r.entries as Record<string, unknown>[]).map((en) => {
    const out: SessionFileEntry = {
      key: en.key as string,
      file: en.file as string,
      order: en.order as number,
      result: en.result === null ? null : asFitResult(en.result),
      decision: en.decision === null ? null : asDecision(en.decision),
    };
    if (en.bytes instanceof Uint8Array) out.bytes = en.bytes;
    return out;
  });
  if (r.team) shareTeamBytes(entries, r.team as TeamTag);
  return { ok: true, session: { ...(r as unknown as SessionFile), entries } };
}
