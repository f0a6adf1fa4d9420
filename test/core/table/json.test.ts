import { describe, expect, it } from 'vitest';
import { catalogueJson, catalogueJsonText } from '../../../src/core/table/json';
import { AUTOMATIC_COLUMNS, CATALOGUE_COLUMNS } from '../../../src/core/table/columns';
import { automaticRow, catalogueRow } from '../../../src/core/table/rows';
import { DEFAULT_COSMOLOGY } from '../../../src/core/cosmology';
import { decision, failedResult, META, okResult } from './fixtures';

describe('catalogueJson(rows, columns, meta)', () => {
  const rows = [catalogueRow(okResult(), decision(), DEFAULT_COSMOLOGY), catalogueRow(failedResult(), undefined, DEFAULT_COSMOLOGY)];
  const doc = catalogueJson(rows, CATALOGUE_COLUMNS, META);
  it('carries meta with the cosmology, the caution and the creation time', () => {
    expect(doc.meta.software).toBe('Shiftmark');
    expect(doc.meta.version).toBe('0.1.0');
    expect(doc.meta.templateSet).toBe('lantern-templates-1');
    expect(doc.meta.createdAt).toBe('2026-03-05T10:00:00Z');
    expect(doc.meta.cosmology).toMatchObject({ h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 });
    expect(doc.meta.cosmology.omegaLambda).toBeCloseTo(0.7, 15);
    expect(doc.meta.caution).toMatch(/unreviewed.*hypotheses/);
  });
  it('lists the columns with unit, type and description', () => {
    expect(doc.columns.map((c) => c.name)).toEqual(CATALOGUE_COLUMNS.map((c) => c.name));
    expect(doc.columns.find((c) => c.name === 'z')).toMatchObject({ unit: '', type: 'float', ucd: 'src.redshift' });
  });
  it('types the row values: numbers, booleans, null for empty numbers, strings for text', () => {
    const [ok, failed] = doc.rows;
    expect(ok.z).toBe(2.345679);
    expect(ok.n_pix).toBe(3900);
    expect(ok.noise_estimated).toBe(false);
    expect(ok.final_z).toBe(0.987654);
    expect(ok.class).toBe('qso');
    expect(failed.z).toBeNull();
    expect(failed.noise_estimated).toBeNull();
    expect(failed.error).toMatch(/NAXIS1 claims/);
  });
  it('text form parses back to the same object and is deterministic', () => {
    const a = catalogueJsonText(rows, CATALOGUE_COLUMNS, META);
    expect(JSON.parse(a)).toEqual(doc);
    expect(catalogueJsonText(rows, CATALOGUE_COLUMNS, META)).toBe(a);
    expect(a.endsWith('}\n')).toBe(true);
  });
  it('has the automatic caution for a table without review columns', () => {
    const d = catalogueJson([automaticRow(okResult(), DEFAULT_COSMOLOGY)], AUTOMATIC_COLUMNS, META);
    expect(d.meta.caution).toMatch(/every redshift in this table is automatic and unreviewed/);
    expect(Object.keys(d.rows[0])).not.toContain('final_z');
  });
});
