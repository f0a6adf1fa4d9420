/** `npm run merge -- --out all.csv shard-*.csv`: join shard tables (see mergeTables.ts). */
import { readFileSync, writeFileSync } from 'node:fs';
import { parseArgs, UsageError } from './args';
import { MergeError, mergeShardTables } from './mergeTables';

const USAGE = 'usage: npm run merge -- --out <merged.csv> <shard tables...>';

try {
  const args = parseArgs(process.argv.slice(2), ['out'], ['help']);
  if (args.flags.has('help')) {
    process.stdout.write(USAGE + '\n');
    process.exit(0);
  }
  if (args.positional.length === 0) throw new UsageError('no shard tables given');
  const merged = mergeShardTables(args.positional.map((name) => ({ name, text: readFileSync(name, 'utf8') })));
  const out = args.options.get('out');
  if (out) writeFileSync(out, merged);
  else process.stdout.write(merged);
  process.stderr.write(`merged ${args.positional.length} shard tables\n`);
} catch (e) {
  const err = e as Error;
  process.stderr.write(`error: ${err.message}\n${e instanceof UsageError ? USAGE + '\n' : ''}`);
  process.exit(e instanceof UsageError || e instanceof MergeError ? 2 : 1);
}
