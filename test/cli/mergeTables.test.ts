/**
 * mergeShardTables on hand-made shard tables (fixtures of test/core/table, an
 * invented field): no fitting, so every case is quick. The expected merged
 * table is the unsharded one, by construction of the sharding rule.
 */
import { describe, expect, it } from 'vitest';
import { mergeShardTables } from '../../src/cli/mergeTables';
import { listFingerprint } from '../../src/cli/shard';
import { automaticRow, catalogueTableWriter, parseCatalogueCsv } from '../../src/core/table';
import { DEFAULT_COSMOLOGY } from '../../src/core/cosmology';
import { failedResult, META, okResult } from '../core/table/fixtures';

const files = ['night2/a.fits', 'night2/b "odd", name.fits', 'night2/c.fits'];
const rows = files.map((file, i) =>
  i === 2
    ? automaticRow(failedResult(file, `${file}: =HYPERLINK("x") is not a spectrum`), DEFAULT_COSMOLOGY)
    : automaticRow(okResult({ file, input: { ...okResult().input, meta: { objectId: i === 0 ? '@LD-1' : 'LD-2' } } }), DEFAULT_COSMOLOGY),
);

function shard(index: number, count: number): string {
  const w = catalogueTableWriter('csv', {
    ...META,
    extra: { shard: `${index}/${count}`, inputs_total: String(files.length), input_list: listFingerprint(files) },
  });
  return w.begin() + rows.filter((_, k) => k % count === index - 1).map((r) => w.row(r)).join('') + w.end();
}

describe('mergeShardTables(tables)', () => {
  it('gives the rows of the unsharded run, in input order, with the formula guard kept on the way out', () => {
    const merged = mergeShardTables([{ name: 's2.csv', text: shard(2, 2) }, { name: 's1.csv', text: shard(1, 2) }]);
    const parsed = parseCatalogueCsv(merged);
    expect(parsed.rows).toEqual(rows);
    expect(parsed.meta.merged_shards).toBe('2');
    expect(parsed.meta.shard).toBeUndefined();
    expect(merged).toContain(",'@LD-1,");
    expect(merged).toContain(`"night2/b ""odd"", name.fits"`);
    expect(merged.endsWith('\r\n')).toBe(true);
    expect(merged.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
  });
  it('equals the table one unsharded run writes, apart from the header line naming the shards', () => {
    const merged = mergeShardTables([{ name: 's1.csv', text: shard(1, 1) }]);
    expect(merged).toBe(shard(1, 1).replace('# shard: 1/1\r\n', '# merged_shards: 1\r\n'));
  });
  it('refuses a missing, repeated or foreign shard, and a damaged table', () => {
    expect(() => mergeShardTables([{ name: 's1.csv', text: shard(1, 2) }])).toThrow(/missing shard 2\/2/);
    expect(() => mergeShardTables([{ name: 's1.csv', text: shard(1, 2) }, { name: 'again.csv', text: shard(1, 2) }])).toThrow(/given twice/);
    expect(() => mergeShardTables([{ name: 's1.csv', text: shard(1, 2) }, { name: 't.csv', text: shard(2, 3) }])).toThrow(/one of 2/);
    const cut = shard(2, 2).replace(/\r\n$/, '').slice(0, -40) + ',"cut off';
    expect(() => mergeShardTables([{ name: 's1.csv', text: shard(1, 2) }, { name: 's2.csv', text: cut }])).toThrow(/^s2\.csv: line \d+: quoted cell is never closed/);
  });
});

describe('mergeShardTables with multi-object files (rows file#n)', () => {
  // Inputs: a plate of 12 spectra between two files of one; the fitter writes a plate's rows in row order.
  const inputs = ['night3/a.fits', 'night3/plate.fits', 'night3/z.fits'];
  const ids = ['night3/a.fits', ...Array.from({ length: 12 }, (_, i) => `night3/plate.fits#${i + 1}`), 'night3/z.fits'];
  const byId = new Map(ids.map((file) => [file, automaticRow(okResult({ file }), DEFAULT_COSMOLOGY)]));
  /** A shard's table: the rows of its inputs (a plate's rows stay in its input's shard). */
  const table = (index: number, count: number, mine = (id: string) => inputs.findIndex((f) => id === f || id.startsWith(`${f}#`)) % count === index - 1) => {
    const w = catalogueTableWriter('csv', { ...META, extra: { shard: `${index}/${count}`, inputs_total: String(inputs.length), input_list: listFingerprint(inputs) } });
    return w.begin() + ids.filter(mine).map((id) => w.row(byId.get(id)!)).join('') + w.end();
  };

  it('counts inputs, not rows, and orders a plate by its row number (#10 after #9), as the unsharded run does', () => {
    const merged = parseCatalogueCsv(mergeShardTables([{ name: 's2.csv', text: table(2, 2) }, { name: 's1.csv', text: table(1, 2) }]));
    expect(merged.rows.map((r) => r.file)).toEqual(ids);
    expect(merged.rows).toEqual(parseCatalogueCsv(table(1, 1)).rows);
  });

  it("refuses a plate whose rows are in two shards (tables of different runs), and a plate's row given twice", () => {
    const odd = (id: string) => /#\d*[13579]$/.test(id);
    const a = table(1, 2, (id) => id.endsWith('a.fits') || odd(id));
    const b = table(2, 2, (id) => !id.endsWith('a.fits') && !odd(id));
    expect(() => mergeShardTables([{ name: 's1.csv', text: a }, { name: 's2.csv', text: b }])).toThrow(/input night3\/plate\.fits has rows in s1\.csv and in s2\.csv/);
    const twice = table(2, 2, () => true);
    expect(() => mergeShardTables([{ name: 's1.csv', text: table(1, 2) }, { name: 's2.csv', text: twice }])).toThrow(/appears twice/);
  });
});
