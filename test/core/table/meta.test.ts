import { describe, expect, it } from 'vitest';
import { cosmologySummary, exportCaution, metaEntries, oneLine } from '../../../src/core/table/meta';
import { AUTOMATIC_COLUMNS, CATALOGUE_COLUMNS } from '../../../src/core/table/columns';
import { META } from './fixtures';

describe('oneLine(s)', () => {
  it('turns line breaks and control characters into single spaces and trims', () => {
    expect(oneLine('  a\r\nb\tc\u0000d  ')).toBe('a b c d');
  });
});

describe('exportCaution(columns)', () => {
  it('warns that unreviewed automatic redshifts are hypotheses, worded for each table kind', () => {
    expect(exportCaution(CATALOGUE_COLUMNS)).toMatch(/review_state = unreviewed.*hypotheses/);
    expect(exportCaution(AUTOMATIC_COLUMNS)).toMatch(/automatic and unreviewed.*hypotheses/);
  });
});

describe('metaEntries(meta, columns)', () => {
  it('lists software+version, template set, cosmology, creation time, caution and the derived note in that order', () => {
    const e = metaEntries(META, CATALOGUE_COLUMNS);
    expect(e.map(([k]) => k)).toEqual(['software', 'template_set', 'cosmology', 'created', 'caution', 'derived']);
    expect(e[0][1]).toBe('Shiftmark 0.1.0');
    expect(e[2][1]).toMatch(/H0 = 70 km\/s\/Mpc/);
    for (const [, v] of e) expect(v).not.toMatch(/[\r\n]/);
  });
});

describe('cosmologySummary(params)', () => {
  it('adds Omega_Lambda = 1 - Om - Ok - Or and the description', () => {
    const s = cosmologySummary({ h0: 68, omegaM: 0.31, omegaK: 0.01, omegaR: 0 });
    expect(s.omegaLambda).toBeCloseTo(0.68, 14);
    expect(s.description).toMatch(/^open Lambda-CDM/);
  });
});
