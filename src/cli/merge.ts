/** `npm run merge -- --out all.csv shard-*.csv`: join shard tables (see mergeTables.ts). */
import { readFileSync, writeFileSync } from 'node:fs';
import { UsageError } from './args';
import { MERGE_USAGE, parseMergeOptions } from './options';
import { MergeError, mergeShardTables } from './mergeTables';

try {
  const options = parseMergeOptions(process.argv.slice(2));
  if (options === 'help') {
    process.stdout.write(MERGE_USAGE + '\n');
    process.exit(0);
  }
  const merged = mergeShardTables(options.tables.map((name) => ({ name, text: readFileSync(name, 'utf8') })));
  if (options.out) writeFileSync(options.out, merged);
  else process.stdout.write(merged);
  process.stderr.write(`merged ${options.tables.length} shard tables\n`);
} catch (e) {
  const err = e as Error;
  process.stderr.write(`error: ${err.message}\n${e instanceof UsageError ? MERGE_USAGE + '\n' : ''}`);
  process.exit(e instanceof UsageError || e instanceof MergeError ? 2 : 1);
}
