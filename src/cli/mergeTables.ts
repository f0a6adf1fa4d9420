/**
 * Join the CSV tables of the shards of one run into one table, checking that
 * the shards belong together (same input list), that none is missing or
 * repeated, and that every input appears exactly once (a multi-object file
 * as its rows `file#n`, all in one shard).
 */
import { columnByName, csvRecord, guardCell, parseCatalogueCsv, type ParsedCatalogue } from '../core/table';
import { parseShard } from './shard';
import { rowOfId } from '../core/io/readSpectra';

/**
 * The input file a row comes from: its `file` cell, less the `#n` that names
 * one spectrum of a multi-object file (index 0 for a file of one spectrum).
 */
function inputOf(file: string): { file: string; index: number } {
  return rowOfId(file) ?? { file, index: 0 };
}

export class MergeError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'MergeError';
  }
}

export interface ShardTable {
  name: string;
  text: string;
}

export function mergeShardTables(tables: readonly ShardTable[]): string {
  if (tables.length === 0) throw new MergeError('no shard tables given');
  const parsed: { name: string; t: ParsedCatalogue; index: number; count: number }[] = tables.map(({ name, text }) => {
    let t: ParsedCatalogue;
    try {
      t = parseCatalogueCsv(text);
    } catch (e) {
      throw new MergeError(`${name}: ${(e as Error).message}`);
    }
    const shardText = t.meta['shard'];
    if (!shardText) throw new MergeError(`${name}: no '# shard:' line in the header block (was it written with --no-header?)`);
    const { index, count } = parseShard(shardText);
    return { name, t, index, count };
  });
  const first = parsed[0];
  const count = first.count;
  const byIndex = new Map<number, string>();
  for (const p of parsed) {
    if (p.count !== count) throw new MergeError(`${p.name} is shard ${p.index}/${p.count} but ${first.name} is one of ${count}`);
    for (const key of ['input_list', 'inputs_total', 'template_set', 'cosmology', 'software']) {
      if (p.t.meta[key] !== first.t.meta[key]) {
        throw new MergeError(`${p.name} and ${first.name} differ in ${key} ('${p.t.meta[key]}' vs '${first.t.meta[key]}'): not shards of one run`);
      }
    }
    if (p.t.columns.join(',') !== first.t.columns.join(',')) throw new MergeError(`${p.name} has other columns than ${first.name}`);
    const prev = byIndex.get(p.index);
    if (prev) throw new MergeError(`shard ${p.index}/${count} given twice: ${prev} and ${p.name}`);
    byIndex.set(p.index, p.name);
  }
  const missing = [];
  for (let i = 1; i <= count; i++) if (!byIndex.has(i)) missing.push(`${i}/${count}`);
  if (missing.length) throw new MergeError(`missing shard${missing.length > 1 ? 's' : ''} ${missing.join(', ')}`);

  const rows = parsed.flatMap((p) => p.t.rows.map((r) => ({ r, from: p.name, at: inputOf(r.file) })));
  const seen = new Map<string, string>();
  const inputShard = new Map<string, string>();
  for (const { r, from, at } of rows) {
    const prev = seen.get(r.file);
    if (prev !== undefined) throw new MergeError(`input ${r.file} appears twice (in ${prev} and ${from})`);
    seen.set(r.file, from);
    // The spectra of one multi-object file are fitted in one shard: a file split over two is two runs mixed.
    const shardOf = inputShard.get(at.file);
    if (shardOf !== undefined && shardOf !== from) throw new MergeError(`input ${at.file} has rows in ${shardOf} and in ${from}`);
    inputShard.set(at.file, from);
  }
  const total = Number(first.t.meta['inputs_total']);
  if (inputShard.size !== total) throw new MergeError(`the shards hold rows of ${inputShard.size} input files but the run had ${total} inputs`);
  // Same order as a single unsharded run: the sorted input list, the spectra of a file by their number.
  rows.sort((a, b) => (a.at.file < b.at.file ? -1 : a.at.file > b.at.file ? 1 : a.at.index - b.at.index));

  let text = '';
  for (const [k, v] of Object.entries(first.t.meta)) text += k === 'shard' ? `# merged_shards: ${count}\r\n` : `# ${k}: ${v}\r\n`;
  const cols = first.t.columns;
  const defs = cols.map(columnByName);
  text += csvRecord(cols);
  // Cells were unguarded on reading; guard them again on writing (csv.ts).
  for (const { r } of rows) text += csvRecord(cols.map((c, i) => guardCell(defs[i], r[c] ?? '')));
  return text;
}
