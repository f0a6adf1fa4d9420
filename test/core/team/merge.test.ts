import { describe, expect, it } from 'vitest';
import { mergeVerdictSets } from '../../../src/core/team/merge';
import { TeamFileError, verdictSetFromSession } from '../../../src/core/team/verdictSet';
import { consensusOf } from '../../../src/core/team/consensus';
import { teamStatistics } from '../../../src/core/team/statistics';
import { teamReportText } from '../../../src/core/team/report';
import { DEFAULT_RULE } from '../../../src/core/team/agreement';
import { cohenKappa } from '../../../src/core/team/kappa';
import { finalCatalogueRows, verdictRows } from '../../../src/core/team/tables';
import { DEFAULT_COSMOLOGY } from '../../../src/core/cosmology';
import { decision, hashOf, session, tag } from './fixtures';

const ana = () =>
  verdictSetFromSession(
    session(tag('Ana', ['a.fits', 'b.fits', 'c.fits']), {
      'a.fits': decision('a.fits', 'Ana', 'qso', 1.5),
      'b.fits': decision('b.fits', 'Ana', 'galaxy', 0.3),
      'c.fits': decision('c.fits', 'Ana', 'star', 0),
    }, { 'a.fits': ['qso', 1.5005], 'b.fits': ['galaxy', 0.7] }),
    'ana.json',
  );
const bo = () =>
  verdictSetFromSession(
    session(tag('Bo', ['a.fits', 'b.fits']), {
      'a.fits': decision('a.fits', 'Bo', 'qso', 1.502),
      'b.fits': decision('b.fits', 'Bo', 'galaxy', 0.7),
    }),
    'bo.json',
  );

describe('verdictSetFromSession and mergeVerdictSets: refusing foreign files', () => {
  it('refuses a session without a team block, naming the file', () => {
    expect(() => verdictSetFromSession(session(undefined, {}), 'solo.json')).toThrow(/solo\.json: not from a review packet/);
  });

  it('refuses a file of another batch, naming both files and batches', () => {
    const other = verdictSetFromSession(session(tag('Bo', ['a.fits'], { batchId: 'fedcba9876543210' }), {}), 'other.json');
    expect(() => mergeVerdictSets([ana(), other])).toThrow(TeamFileError);
    expect(() => mergeVerdictSets([ana(), other])).toThrow(/other\.json belongs to batch fedcba9876543210, but ana\.json to batch 0123456789abcdef/);
  });

  it('refuses a file whose spectrum has other contents (content hash), naming the spectrum and both files', () => {
    const t = tag('Bo', ['a.fits']);
    t.spectra = [{ ...t.spectra[0], sha256: hashOf('e') }];
    const changed = verdictSetFromSession(session(t, {}), 'bo-changed.json');
    expect(() => mergeVerdictSets([ana(), changed])).toThrow(/spectrum a\.fits has different contents in bo-changed\.json and in ana\.json/);
  });

  it('refuses the same file given twice and a malformed team block', () => {
    expect(() => mergeVerdictSets([ana(), ana()])).toThrow(/ana\.json is given twice/);
    expect(() => verdictSetFromSession({ reviewer: '', team: { version: 1 }, entries: [] }, 'bad.json')).toThrow(/bad\.json: .*batchId/);
  });
});

describe('consensus and statistics of a merged batch', () => {
  it('classifies spectra, keeps every verdict, and counts the statistics', () => {
    const merged = mergeVerdictSets([ana(), bo()]);
    expect(merged.verdicts).toHaveLength(5);
    const cons = consensusOf(merged, [], DEFAULT_RULE);
    // a: 1.5 vs 1.502 -> 0.002/2.501 = 0.0008 agree; b: 0.3 vs 0.7 disagree; c: Ana only.
    expect(cons.map((c) => c.state)).toEqual(['agree', 'disagree', 'single']);
    expect(cons[1].final).toBeNull();
    const settled = consensusOf(merged, [{ id: 'b.fits', arbiter: 'Cy', settledAt: '2026-01-03T00:00:00Z', picked: 'Bo', decision: decision('b.fits', 'Bo', 'galaxy', 0.7) }], DEFAULT_RULE);
    expect(settled[1].settledBy).toBe('Cy');
    const stats = teamStatistics(merged, settled, DEFAULT_RULE);
    expect(stats.byState).toEqual({ agree: 1, disagree: 1, single: 1, none: 0 });
    expect(stats.overall).toEqual({ n: 2, agree: 1, rate: 0.5 });
    expect(stats.settled).toBe(1);
    expect(stats.open).toBe(0);
    expect(stats.byClass.find((c) => c.class === 'galaxy')).toMatchObject({ n: 1, agree: 0 });
    // Pair Ana/Bo on class: qso/qso, galaxy/galaxy -> the kappa of that table by the same formula (checked in kappa.test.ts).
    expect(stats.pairs).toHaveLength(1);
    expect(stats.pairs[0].table[0][0]).toBe(1);
    expect(stats.pairs[0].table[1][1]).toBe(1);
    expect(stats.pairs[0].kappa).toBe(cohenKappa(stats.pairs[0].table).kappa);
    const anaStats = stats.reviewers.find((r) => r.reviewer === 'Ana')!;
    // Ana vs final: a (agree with her own), b (0.3 vs 0.7: no), c (hers): 2 of 3. Vs machine: a yes (1.5005), b no (0.7): 1 of 2.
    expect(anaStats.withFinal).toMatchObject({ n: 3, agree: 2 });
    expect(anaStats.withMachine).toMatchObject({ n: 2, agree: 1 });
    const text = teamReportText(stats, { batchId: merged.batchId, sources: merged.sources, createdAt: 'T', software: 'Shiftmark test' });
    expect(text).toContain('Agreement rate (spectra with two or more verdicts): 50.0 % (1 of 2)');
    expect(text).toContain('Ana / Bo: kappa');
  });

  it('keeps a reviewer\'s earlier verdict from another file but counts only the later one', () => {
    const later = verdictSetFromSession(session(tag('Bo', ['b.fits']), { 'b.fits': decision('b.fits', 'Bo', 'galaxy', 0.3005, '2026-01-05T00:00:00.000Z') }), 'bo-again.json');
    const merged = mergeVerdictSets([ana(), bo(), later]);
    expect(merged.verdicts).toHaveLength(6);
    expect(merged.verdicts.filter((v) => !v.counted).map((v) => v.source)).toEqual(['bo.json']);
    expect(consensusOf(merged, [], DEFAULT_RULE)[1].state).toBe('agree');
  });
});

describe('verdictRows and finalCatalogueRows', () => {
  it('lists every verdict and settlement, marks the one the catalogue carries, and fills the consensus columns', () => {
    const merged = mergeVerdictSets([ana(), bo()]);
    const st = [
      { id: 'b.fits', arbiter: 'Cy', settledAt: '2026-01-03T00:00:00Z', picked: 'Ana', decision: decision('b.fits', 'Ana', 'galaxy', 0.3) },
      { id: 'b.fits', arbiter: 'Cy', settledAt: '2026-01-04T00:00:00Z', picked: null, decision: decision('b.fits', 'Cy', 'galaxy', 0.5) },
    ];
    const cons = consensusOf(merged, st, DEFAULT_RULE);
    const rows = verdictRows(merged, cons, st);
    // 5 reviewer verdicts and 2 settlements; the later settlement counts.
    expect(rows).toHaveLength(7);
    expect(rows.filter((r) => r.spectrum_id === 'b.fits').map((r) => [r.role, r.reviewer, r.counted, r.in_final])).toEqual([
      ['reviewer', 'Ana', 'true', 'false'],
      ['reviewer', 'Bo', 'true', 'false'],
      ['arbiter', 'Cy', 'false', 'false'],
      ['arbiter', 'Cy', 'true', 'true'],
    ]);
    // Each spectrum with a final verdict has exactly one row in the final catalogue's place.
    for (const id of ['a.fits', 'b.fits', 'c.fits']) expect(rows.filter((r) => r.spectrum_id === id && r.in_final === 'true')).toHaveLength(1);
    const final = finalCatalogueRows(merged, cons, () => undefined, DEFAULT_COSMOLOGY);
    expect(final.map((r) => [r.file, r.n_reviewers, r.agreement, r.settled_by, r.final_z])).toEqual([
      ['a.fits', '2', 'agree', '', '1.500000'],
      ['b.fits', '2', 'disagree', 'Cy', '0.500000'],
      ['c.fits', '1', 'single', '', '0.000000'],
    ]);
    // Without a fit or an exported row, the automatic columns say why.
    expect(final[0].error).toBe('no fit result in the merged files');
  });
});
