/**
 * `npm run reconcile -- a.json b.json ... --out merged.csv`: merge the
 * session files reviewers saved from their packets (or the catalogues they
 * exported from them, CSV or JSON), print the agreement
 * statistics, and write the final catalogue, the long table of every verdict
 * (`merged-verdicts.csv`) and the report (`merged-report.txt`). The browser's
 * saved merge work (with the arbiter's settlements) is read too. A file that
 * cannot be read or belongs to another batch is named and left out; the rest
 * are merged, and the exit status is then 2.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { basename } from 'node:path';
import { parseCommandLine, UsageError } from './args';
import { parseCosmologyOption } from './cosmologyOption';
import { parseSession } from '../ui/persist/sessionFile';
import type { FitResult } from '../core/types';
import { SOFTWARE_NAME, SOFTWARE_VERSION } from '../core/version';
import { buildTeamExport, checkRule, DEFAULT_TOLERANCE, isTeamCatalogue, mergeWhatFits, TeamFileError, verdictSetFromCatalogue, verdictSetFromSession, type Settlement, type TeamFormat, type VerdictSet } from '../core/team';
import { parseMergeWork } from '../ui/team/mergeWork';

export const RECONCILE_USAGE = `usage: npm run reconcile -- <session files...> [--out merged.csv] [options]
  --out FILE          final catalogue; beside it FILE-verdicts.EXT (every verdict)
                      and FILE-report.txt; format from the extension: .csv, .json
                      or .fits (default: print the statistics only)
  --tolerance X       redshifts agree when |dz|/(1+z) < X (default ${DEFAULT_TOLERANCE})
  --cosmology SPEC    e.g. h0=70,om=0.3,ok=0,or=0 (default flat h0=70, om=0.3)
  --help              this text
Inputs are session files saved from review packets, catalogues exported (CSV
or JSON) from such sessions, or a merge saved from the browser (it brings the
arbiter's settlements).`;

const OPTIONS = { out: 'string', tolerance: 'string', cosmology: 'string', help: 'boolean' } as const;

export interface ReconcileOptions {
  inputs: string[];
  out: string | undefined;
  format: TeamFormat;
  tolerance: number;
  cosmology: ReturnType<typeof parseCosmologyOption>;
}

export function formatOfOut(out: string | undefined): TeamFormat {
  const n = (out ?? '').toLowerCase();
  if (n.endsWith('.json')) return 'json';
  if (/\.(fits|fit|fts)$/.test(n)) return 'fits';
  if (!out || n.endsWith('.csv')) return 'csv';
  throw new UsageError(`--out must end in .csv, .json or .fits (got '${out}')`);
}

export function parseReconcileOptions(argv: readonly string[]): ReconcileOptions | 'help' {
  const { values, positionals } = parseCommandLine(argv, OPTIONS);
  if (values.help) return 'help';
  if (positionals.length === 0) throw new UsageError('no session files given');
  if (values.out === '') throw new UsageError('--out needs a file name');
  const tolerance = values.tolerance === undefined ? DEFAULT_TOLERANCE : Number(values.tolerance);
  try {
    checkRule({ tolerance });
  } catch (e) {
    throw new UsageError(`--tolerance: ${(e as Error).message.replace(/ \(got .*\)$/, '')} (got '${values.tolerance}')`);
  }
  return { inputs: positionals, out: values.out, format: formatOfOut(values.out), tolerance, cosmology: parseCosmologyOption(values.cosmology) };
}

/** Names of the companion files of --out: a.csv -> a-verdicts.csv, a-report.txt. */
export function companionNames(out: string): { verdicts: string; report: string } {
  const m = /^(.*?)(\.[^./\\]*)?$/.exec(out)!;
  return { verdicts: `${m[1]}-verdicts${m[2] ?? ''}`, report: `${m[1]}-report.txt` };
}

function main(): number {
  const options = parseReconcileOptions(process.argv.slice(2));
  if (options === 'help') {
    process.stdout.write(RECONCILE_USAGE + '\n');
    return 0;
  }
  const sets: VerdictSet[] = [];
  const settlements: Settlement[] = [];
  const results = new Map<string, FitResult>();
  const problems: string[] = [];
  /** Reviewer files already inside a saved merge: only their fit results are taken. */
  const fromWork = new Set<string>();
  const sessions: { name: string; session: Parameters<typeof verdictSetFromSession>[0] & { entries: { key: string; result: FitResult | null }[] } }[] = [];
  for (const name of options.inputs) {
    let text: string;
    try {
      text = readFileSync(name, 'utf8');
    } catch (e) {
      problems.push(`${name}: cannot be read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
      continue;
    }
    const work = parseMergeWork(text);
    if (work.ok) {
      sets.push(...work.work.sets);
      for (const s of work.work.sets) fromWork.add(basename(s.source));
      settlements.push(...work.work.settlements);
      continue;
    }
    if (work.isMergeWork) {
      problems.push(`${name}: ${work.problems.join('; ')}`);
      continue;
    }
    if (isTeamCatalogue(text)) {
      try {
        const fromExport = verdictSetFromCatalogue(text, name);
        if (fromExport) {
          sets.push(fromExport);
          continue;
        }
      } catch (e) {
        if (!(e instanceof TeamFileError)) throw e;
        problems.push(e.message);
        continue;
      }
    }
    const parsed = parseSession(text);
    if (!parsed.ok) {
      problems.push(`${name}: ${parsed.problems.join('; ')}`);
      continue;
    }
    sessions.push({ name, session: parsed.session });
  }
  for (const { name, session } of sessions) {
    for (const en of session.entries) if (en.result && !results.has(en.key)) results.set(en.key, en.result);
    if (fromWork.has(basename(name))) continue;
    try {
      sets.push(verdictSetFromSession(session, name));
    } catch (e) {
      if (!(e instanceof TeamFileError)) throw e;
      problems.push(e.message);
    }
  }
  const { merged, refused } = mergeWhatFits(sets);
  problems.push(...refused.map((r) => `${r.message} (left out)`));
  for (const p of problems) process.stderr.write(`refused: ${p}\n`);
  if (!merged) {
    process.stderr.write('error: no file could be merged\n');
    return 2;
  }
  const built = buildTeamExport(
    {
      merged,
      settlements,
      rule: { tolerance: options.tolerance },
      resultOf: (id) => results.get(id),
      cosmology: options.cosmology,
      software: SOFTWARE_NAME,
      version: SOFTWARE_VERSION,
      createdAt: new Date().toISOString(),
    },
    options.format,
  );
  process.stdout.write(built.report);
  if (options.out) {
    const { verdicts, report } = companionNames(options.out);
    writeFileSync(options.out, built.final);
    writeFileSync(verdicts, built.verdicts);
    writeFileSync(report, built.report);
    process.stderr.write(`wrote ${options.out} (${built.finalRows} spectra), ${verdicts} (${built.verdictRows} verdicts), ${report}\n`);
  }
  return problems.length ? 2 : 0;
}

try {
  process.exitCode = main();
} catch (e) {
  const err = e as Error;
  process.stderr.write(`error: ${err.message}\n${e instanceof UsageError ? RECONCILE_USAGE + '\n' : ''}`);
  process.exitCode = e instanceof UsageError ? 2 : 1;
}
