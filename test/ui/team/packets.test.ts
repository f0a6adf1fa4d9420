/**
 * Packets from a session (jsdom + fake IndexedDB, scripted fits): the deal
 * covers every fitted spectrum k times, packets are session files with the
 * team block, dropped files are checked against the packet by SHA-256
 * (node:crypto as the reference), and the block survives save and reload.
 */
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { makeSession, waitUntil } from '../harness';
import { textBytes } from '../fixtures';
import { buildPackets } from '../../../src/ui/team/makePackets';
import { screenAgainstPacket } from '../../../src/ui/team/screenFiles';
import { parseSession } from '../../../src/ui/persist/sessionFile';
import { Session } from '../../../src/ui/state/session';
import { ScriptedFitter } from '../harness';

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
const FILES = ['n1/a.txt', 'n1/b.txt', 'n1/c.txt', 'n1/d.txt'].map((path, i) => ({ path, bytes: textBytes(`spectrum ${i}`) }));

async function fittedSession() {
  const made = await makeSession();
  await made.session.addFiles(FILES);
  await waitUntil(() => made.session.getSnapshot().rows.every((r) => r.status === 'ok'), 'fits');
  return made;
}

describe('buildPackets(session, request)', () => {
  it('deals every fitted spectrum to k reviewers, in session files with the team block and content hashes', async () => {
    const { session } = await fittedSession();
    const built = await buildPackets(session, { reviewers: ['Ana', 'Bo', 'Cy'], perSpectrum: 2, seed: 9, withSpectra: true }, '2026-03-01T00:00:00.000Z');
    expect(built.files.map((f) => f.name)).toEqual(['Ana', 'Bo', 'Cy'].map((n) => `shiftmark-packet-${built.batchId}-${n}.json`));
    const seen = new Map<string, number>();
    for (const f of built.files) {
      const parsed = parseSession(f.text);
      if (!parsed.ok) throw new Error(parsed.problems.join('; '));
      const s = parsed.session;
      expect(s.team!.reviewer).toBe(f.reviewer);
      expect(s.reviewer).toBe(f.reviewer);
      expect(s.entries.every((e) => e.decision === null && e.result !== null && e.bytes)).toBe(true);
      for (const sp of s.team!.spectra) {
        const input = FILES.find((x) => x.path === sp.file)!;
        expect(sp.sha256).toBe(sha(input.bytes));
        seen.set(sp.id, (seen.get(sp.id) ?? 0) + 1);
      }
    }
    expect([...seen.values()]).toEqual([2, 2, 2, 2]);
    const again = await buildPackets(session, { reviewers: ['Ana', 'Bo', 'Cy'], perSpectrum: 2, seed: 9, withSpectra: false }, '2026-03-01T00:00:00.000Z');
    expect(again.batchId).toBe(built.batchId);
    const noBytes = parseSession(again.files[0].text);
    expect(noBytes.ok && noBytes.session.entries.every((e) => e.bytes === undefined)).toBe(true);
    // Same seed, same deal.
    expect(again.files.map((f) => f.spectra)).toEqual(built.files.map((f) => f.spectra));
  });

  it('writes the bytes of a file shared by several spectra once, and reading gives them to each', async () => {
    const { session } = await fittedSession();
    const twin = { path: 'n1/e.txt', bytes: FILES[0].bytes }; // same contents as a.txt: same SHA-256
    await session.addFiles([twin]);
    await waitUntil(() => session.getSnapshot().rows.every((r) => r.status === 'ok'), 'fits');
    const built = await buildPackets(session, { reviewers: ['Ana'], perSpectrum: 1, seed: 1, withSpectra: true });
    const raw = JSON.parse(built.files[0].text) as { entries: { file: string; bytes?: unknown }[] };
    expect(raw.entries.filter((e) => e.bytes !== undefined)).toHaveLength(4);
    const parsed = parseSession(built.files[0].text);
    expect(parsed.ok && parsed.session.entries.every((e) => e.bytes && e.bytes.length === FILES[0].bytes.length)).toBe(true);
  });

  it('refuses too few reviewers with a plain message', async () => {
    const { session } = await fittedSession();
    await expect(buildPackets(session, { reviewers: ['Ana'], perSpectrum: 2, seed: 1, withSpectra: true })).rejects.toThrow(/need at least 2 reviewers/);
  });
});

describe('screenAgainstPacket(tag, files)', () => {
  it('refuses by name a file named like a packet spectrum with other contents, and renames a matching one', async () => {
    const { session } = await fittedSession();
    const built = await buildPackets(session, { reviewers: ['Ana'], perSpectrum: 1, seed: 1, withSpectra: false });
    const parsed = parseSession(built.files[0].text);
    if (!parsed.ok) throw new Error('packet did not parse');
    const tag = parsed.session.team!;
    const out = await screenAgainstPacket(tag, [
      { path: 'copy/a.txt', bytes: FILES[0].bytes },
      { path: 'b.txt', bytes: textBytes('something else') },
      { path: 'unrelated.txt', bytes: textBytes('x') },
    ]);
    expect(out.files.map((f) => f.path)).toEqual(['n1/a.txt', 'unrelated.txt']);
    expect(out.refused).toHaveLength(1);
    expect(out.refused[0]).toMatch(/^b\.txt: not the packet's n1\/b\.txt \(the contents differ/);
  });
});

describe('screenAgainstPacket with spectra of a multi-object file', () => {
  it('matches the file itself (name without #n, the same hash for all its spectra)', async () => {
    const plate = textBytes('a plate of many fibres');
    const hash = createHash('sha256').update(plate).digest('hex');
    const tag = {
      version: 1,
      batchId: '0123456789abcdef',
      batchSize: 2,
      seed: 1,
      perSpectrum: 1,
      reviewers: ['Ana'],
      reviewer: 'Ana',
      madeAt: '2026-03-01T00:00:00.000Z',
      spectra: [1, 2].map((n) => ({ id: `k#${n}`, file: `obs/plate.fits#${n}`, sha256: hash })),
    };
    const ok = await screenAgainstPacket(tag, [{ path: 'plate.fits', bytes: plate }]);
    expect(ok.files.map((f) => f.path)).toEqual(['obs/plate.fits']);
    const bad = await screenAgainstPacket(tag, [{ path: 'plate.fits', bytes: textBytes('another plate') }]);
    expect(bad.refused[0]).toMatch(/^plate\.fits: not the packet's obs\/plate\.fits/);
  });
});

describe('Session team block', () => {
  it('is written into saved sessions and read back after a reload', async () => {
    const { session, db, name } = await fittedSession();
    const built = await buildPackets(session, { reviewers: ['Ana'], perSpectrum: 1, seed: 1, withSpectra: false });
    const parsed = parseSession(built.files[0].text);
    if (!parsed.ok) throw new Error('packet did not parse');
    await session.setTeamTag(parsed.session.team!);
    const saved = parseSession(await session.exportSession(false));
    expect(saved.ok && saved.session.team?.batchId).toBe(built.batchId);
    db.close();
    const { SessionDb } = await import('../../../src/ui/persist/sessionDb');
    const again = new Session(await SessionDb.open(name), new ScriptedFitter());
    await again.restore();
    expect(again.teamTag()?.reviewer).toBe('Ana');
    await again.clearBatch();
    expect(again.teamTag()).toBeNull();
  });
});
