/**
 * The options of `npm run fit` and `npm run merge`, parsed and checked before
 * any work starts. Every problem is a UsageError whose message names the
 * option and what it accepts; the tools print it with their usage text and
 * exit with status 2.
 */
import { parseCommandLine, UsageError } from './args';
import { parseCosmologyOption } from './cosmologyOption';
import { parseShard, type ShardSpec } from './shard';
import type { CosmologyParams } from '../core/types';

export const FIT_USAGE = `usage: npm run fit -- <files or folders...> --out <table.csv> [options]
  --out FILE          where to write the table (default: standard output)
  --format FORMAT     csv, json, fits (binary table) or votable (1.4); default csv, or
                      from the --out extension (.json, .fits/.fit/.fts, .vot/.xml).
                      json, fits and votable also carry the line measurements;
                      fits and votable are written when the batch ends
  --lines FILE        also write the line measurements as CSV, one row per
                      spectrum and line (file ties them to the table)
  --jobs N            worker threads (default: the number of cores)
  --cosmology SPEC    e.g. h0=70,om=0.3,ok=0,or=0 (default flat h0=70, om=0.3)
  --shard I/N         fit only shard I of N of the sorted input list
  --time-limit S      seconds allowed per file (default 60)
  --no-header         CSV without the # header block
  --quiet             no progress line on standard error
  --help              this text`;

export const MERGE_USAGE = `usage: npm run merge -- --out <merged.csv> <shard tables...>
  --out FILE          where to write the merged table (default: standard output)
  --help              this text`;

const FIT_OPTIONS = {
  out: 'string',
  format: 'string',
  lines: 'string',
  jobs: 'string',
  cosmology: 'string',
  shard: 'string',
  'time-limit': 'string',
  'no-header': 'boolean',
  quiet: 'boolean',
  help: 'boolean',
} as const;

const MERGE_OPTIONS = { out: 'string', help: 'boolean' } as const;

/** Seconds allowed per file when --time-limit is not given. */
export const DEFAULT_TIME_LIMIT_S = 60;
/** The longest time limit a timer can hold: 2^31 - 1 ms (setTimeout's range in browsers and Node). */
const MAX_TIME_LIMIT_S = Math.floor((2 ** 31 - 1) / 1000);

/** Formats of the fitter's table: csv and json stream row by row; fits and votable are written at the end. */
export type FitFormat = 'csv' | 'json' | 'fits' | 'votable';

const FIT_FORMATS: readonly FitFormat[] = ['csv', 'json', 'fits', 'votable'];

/** The format an output file name implies (csv when nothing matches). */
export function formatFromName(name: string | undefined): FitFormat {
  const n = (name ?? '').toLowerCase();
  if (n.endsWith('.json')) return 'json';
  if (/\.(fits|fit|fts)$/.test(n)) return 'fits';
  if (/\.(vot|votable|xml)$/.test(n)) return 'votable';
  return 'csv';
}

export interface FitOptions {
  inputs: string[];
  /** Output file; undefined for standard output. */
  out: string | undefined;
  format: FitFormat;
  /** Lines CSV file, when asked for. */
  lines: string | undefined;
  jobs: number;
  timeLimitS: number;
  cosmology: CosmologyParams;
  shard: ShardSpec;
  headerBlock: boolean;
  quiet: boolean;
}

export interface MergeOptions {
  tables: string[];
  out: string | undefined;
}

/** Options of `npm run fit`; 'help' when --help was given. `cores` is the default for --jobs. */
export function parseFitOptions(argv: readonly string[], cores: number): FitOptions | 'help' {
  const { values, positionals } = parseCommandLine(argv, FIT_OPTIONS);
  if (values.help) return 'help';
  if (positionals.length === 0) throw new UsageError('no input files or folders given');

  const out = values.out;
  if (out === '') throw new UsageError('--out needs a file name');
  const format = (values.format ?? formatFromName(out)) as FitFormat;
  if (!FIT_FORMATS.includes(format)) throw new UsageError(`--format must be csv, json, fits or votable (got '${format}')`);
  if (values.lines === '') throw new UsageError('--lines needs a file name');
  if (values.lines !== undefined && values.lines === out) throw new UsageError('--lines must name a different file from --out');

  const jobsText = values.jobs;
  const jobs = jobsText === undefined ? cores : /^\s*\d+\s*$/.test(jobsText) ? Number(jobsText) : NaN;
  if (!(Number.isSafeInteger(jobs) && jobs >= 1)) throw new UsageError(`--jobs must be a whole number >= 1 (got '${jobsText}')`);

  const limitText = values['time-limit'];
  const timeLimitS = limitText === undefined ? DEFAULT_TIME_LIMIT_S : limitText.trim() === '' ? NaN : Number(limitText);
  if (!(Number.isFinite(timeLimitS) && timeLimitS > 0 && timeLimitS <= MAX_TIME_LIMIT_S)) {
    throw new UsageError(`--time-limit must be a number of seconds above 0 and at most ${MAX_TIME_LIMIT_S} (got '${limitText}')`);
  }

  let shard: ShardSpec = { index: 1, count: 1 };
  if (values.shard !== undefined) {
    try {
      shard = parseShard(values.shard);
    } catch (e) {
      throw new UsageError(`--shard: ${(e as Error).message}`);
    }
  }

  return {
    inputs: positionals,
    out,
    format,
    lines: values.lines,
    jobs,
    timeLimitS,
    cosmology: parseCosmologyOption(values.cosmology),
    shard,
    headerBlock: !values['no-header'],
    quiet: values.quiet === true,
  };
}

/** Options of `npm run merge`; 'help' when --help was given. */
export function parseMergeOptions(argv: readonly string[]): MergeOptions | 'help' {
  const { values, positionals } = parseCommandLine(argv, MERGE_OPTIONS);
  if (values.help) return 'help';
  if (values.out === '') throw new UsageError('--out needs a file name');
  if (positionals.length === 0) throw new UsageError('no shard tables given');
  return { tables: positionals, out: values.out };
}
