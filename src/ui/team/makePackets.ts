/**
 * Review packets from the batch in this browser: every fitted spectrum is
 * hashed (SHA-256), dealt to the reviewers (core/team), and each reviewer
 * gets a session file with their spectra's fits, no decisions, the team
 * block, and the spectra themselves unless the reviewers already have them.
 */
import { contentHash, planPackets, type PacketSpectrum } from '../../core/team';
import { encodeSession, SESSION_FORMAT, SESSION_VERSION, type SessionFileEntry } from '../persist/sessionFile';
import type { Session } from '../state/session';
import { SOFTWARE_NAME_VERSION } from '../version';

export interface PacketRequest {
  reviewers: string[];
  perSpectrum: number;
  seed: number;
  /** Put each spectrum's bytes in the packet (else reviewers drop their own copies, checked by hash). */
  withSpectra: boolean;
}

export interface BuiltPackets {
  batchId: string;
  files: { reviewer: string; name: string; text: string; spectra: number }[];
  /** Files of the batch left out: not fitted, failed, or without their bytes here. */
  leftOut: number;
}

/** A file-name-safe form of a reviewer's name. */
export function safeName(name: string): string {
  return name.trim().replace(/[^A-Za-z0-9._-]+/g, '_').slice(0, 40) || 'reviewer';
}

export async function buildPackets(session: Session, request: PacketRequest, now = new Date().toISOString()): Promise<BuiltPackets> {
  const rows = session.getSnapshot().rows;
  const usable = rows.filter((r) => r.hasBytes && r.status === 'ok');
  const batch: PacketSpectrum[] = [];
  const bytesOf = new Map<string, Uint8Array>();
  for (const r of usable) {
    const bytes = await session.getBytes(r.key);
    if (!bytes) continue;
    bytesOf.set(r.key, bytes);
    batch.push({ id: r.key, file: r.file, sha256: await contentHash(bytes) });
  }
  const plan = await planPackets(batch, request.reviewers, request.perSpectrum, request.seed, now);
  const order = new Map(rows.map((r, i) => [r.key, i]));
  const cosmology = session.getSnapshot().cosmology;
  const files: BuiltPackets['files'] = [];
  for (const tag of plan.packets) {
    const entries: SessionFileEntry[] = [];
    // Spectra of one multi-object file share its bytes: written once per packet, filled in on reading (sessionFile.ts).
    const written = new Set<string>();
    for (const s of tag.spectra) {
      const e: SessionFileEntry = { key: s.id, file: s.file, order: order.get(s.id) ?? entries.length, result: (await session.getResult(s.id)) ?? null, decision: null };
      if (request.withSpectra && !written.has(s.sha256)) {
        e.bytes = bytesOf.get(s.id);
        written.add(s.sha256);
      }
      entries.push(e);
    }
    const text = encodeSession({ format: SESSION_FORMAT, version: SESSION_VERSION, exportedAt: now, software: SOFTWARE_NAME_VERSION, reviewer: tag.reviewer, cosmology, entries, team: tag });
    files.push({ reviewer: tag.reviewer, name: `shiftmark-packet-${plan.batchId}-${safeName(tag.reviewer)}.json`, text, spectra: entries.length });
  }
  return { batchId: plan.batchId, files, leftOut: rows.length - batch.length };
}
