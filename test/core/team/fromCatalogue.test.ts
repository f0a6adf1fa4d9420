/**
 * Catalogue exports as merge inputs: a reviewer's CSV and JSON exports (made
 * by the browser's own export code) carry the packet's team block and give
 * the same verdicts as their session; they merge with session files, and
 * without fit results the final catalogue keeps the exported automatic cells.
 */
import { describe, expect, it } from 'vitest';
import { buildExport } from '../../../src/ui/export/buildExport';
import { DEFAULT_COSMOLOGY } from '../../../src/core/cosmology';
import { parseCatalogueCsv } from '../../../src/core/table';
import { consensusOf, DEFAULT_RULE, finalCatalogueRows, mergeVerdictSets, TeamFileError, verdictSetFromCatalogue, verdictSetFromSession } from '../../../src/core/team';
import { makeResult } from '../../ui/fixtures';
import { decision, session, tag } from './fixtures';

const results = new Map([
  ['a.fits', makeResult('a.fits')],
  ['b.fits', makeResult('b.fits', { z: 0.7 })],
  ['c.fits', makeResult('c.fits')],
]);
const anaDecisions = {
  'a.fits': { ...decision('a.fits', 'Ana', 'qso', 1.5), flags: ['low-snr' as const], note: 'faint, "maybe"' },
  'b.fits': decision('b.fits', 'Ana', 'unknown', null),
  'c.fits': null,
};

async function exportOf(format: 'csv' | 'json'): Promise<string> {
  const t = tag('Ana', ['a.fits', 'b.fits', 'c.fits']);
  const built = await buildExport(
    { rows: Object.entries(anaDecisions).map(([key, d]) => ({ key, decision: d ?? undefined })), getResult: async (k) => results.get(k), team: t },
    format,
    DEFAULT_COSMOLOGY,
    'all',
    '2026-05-01T00:00:00Z',
  );
  return built.data as string;
}

describe('verdictSetFromCatalogue(text, source)', () => {
  it.each(['csv', 'json'] as const)('reads the same verdicts from a %s export as from the session', async (format) => {
    const fromExport = verdictSetFromCatalogue(await exportOf(format), `ana.${format}`)!;
    const fromSession = verdictSetFromSession(session(tag('Ana', ['a.fits', 'b.fits', 'c.fits']), anaDecisions), 'ana.json');
    expect(fromExport.tag).toEqual(fromSession.tag);
    const pick = (v: (typeof fromSession.verdicts)[number]) => [v.id, v.reviewer, v.decision.state, v.decision.class, v.decision.z, v.decision.note, v.decision.flags ?? []];
    expect(fromExport.verdicts.map(pick)).toEqual(fromSession.verdicts.map(pick));
    // The machine solution comes from the exported automatic columns.
    expect(fromExport.spectra.find((s) => s.id === 'b.fits')!.machine).toMatchObject({ z: 0.7, class: 'qso' });
  });

  it('is null for a catalogue without a packet, and refuses a damaged team entry by name', async () => {
    const plain = await buildExport({ rows: [{ key: 'a.fits' }], getResult: async (k) => results.get(k) }, 'csv', DEFAULT_COSMOLOGY);
    expect(verdictSetFromCatalogue(plain.data as string, 'plain.csv')).toBeNull();
    const damaged = (await exportOf('csv')).replace('# team_packet: {', '# team_packet: {{');
    expect(() => verdictSetFromCatalogue(damaged, 'ana.csv')).toThrow(TeamFileError);
    expect(() => verdictSetFromCatalogue(damaged, 'ana.csv')).toThrow(/ana\.csv: the team_packet entry is not readable/);
  });

  it('merges with a session file; without fits the final catalogue keeps the exported automatic cells', async () => {
    const ana = verdictSetFromCatalogue(await exportOf('csv'), 'ana.csv')!;
    const bo = verdictSetFromSession(session(tag('Bo', ['a.fits', 'b.fits']), { 'a.fits': decision('a.fits', 'Bo', 'qso', 1.5001), 'b.fits': decision('b.fits', 'Bo', 'qso', 0.7) }), 'bo.json');
    const merged = mergeVerdictSets([ana, bo]);
    const cons = consensusOf(merged, [], DEFAULT_RULE);
    expect(cons.map((c) => c.state)).toEqual(['agree', 'disagree', 'none']);
    const rows = finalCatalogueRows(merged, cons, () => undefined, DEFAULT_COSMOLOGY);
    const exported = parseCatalogueCsv(await exportOf('csv')).rows;
    expect(rows.map((r) => [r.object_id, r.z, r.class, r.error])).toEqual(exported.map((r) => [r.object_id, r.z, r.class, r.error]));
    expect(rows[0].final_z).toBe('1.500000');
  });
});
