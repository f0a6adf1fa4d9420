/**
 * The README's Slurm job array, run for real: a private one-node Slurm
 * (miniSlurm.ts), the job-array script read from README.md (not retyped)
 * submitted as 4 array tasks on the demo set, a bounded wait, `npm run merge`
 * of the shard tables, and the merged table compared row by row with one
 * single-process `npm run fit` of the same folder. Every daemon started is
 * stopped by PID in afterAll, also after a failure.
 *
 * Without Slurm and munge (Debian: apt-get install slurm-wlm munge) the test
 * is skipped with a message, unless SHIFTMARK_REQUIRE_SLURM=1 (set by
 * .ci/run), where that is a failure.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { missingPrograms, startMiniSlurm, type MiniSlurm } from './miniSlurm';
import { parseCatalogueCsv } from '../../src/core/table';
// @ts-expect-error plain JavaScript module without type declarations
import { sourceHash } from '../../scripts/cli-bundle.mjs';

const ROOT = resolve(__dirname, '../..');
const ARRAY_TASKS = 4;
/** Longest wait for the whole array, ms: the demo set takes well under a minute on 2 cores. */
const WAIT_LIMIT_MS = 8 * 60_000;

const missing = missingPrograms();
const required = process.env.SHIFTMARK_REQUIRE_SLURM === '1';
if (missing.length) {
  const msg = `Slurm test: missing ${missing.join(', ')}`;
  if (required) throw new Error(`${msg}, and SHIFTMARK_REQUIRE_SLURM=1 makes that a failure`);
  console.warn(`${msg}; the Slurm end-to-end test is SKIPPED. Install them (Debian: apt-get install slurm-wlm munge) to run it.`);
}

/** The job-array script of the README: the sh block holding `#SBATCH --job-name=shiftmark-fit`. */
function readmeJobScript(readme: string): string {
  const blocks = [...readme.matchAll(/```sh\n([\s\S]*?)```/g)].map((m) => m[1]);
  const script = blocks.find((b) => b.includes('#SBATCH --job-name=shiftmark-fit'));
  if (!script) throw new Error('README.md has no sh block with #SBATCH --job-name=shiftmark-fit');
  return script;
}

const npm = (args: string[]) => spawnSync('npm', ['run', '--silent', ...args], { cwd: ROOT, encoding: 'utf8' });

describe.skipIf(missing.length > 0)('the README job array under a real one-node Slurm', () => {
  let cluster: MiniSlurm | undefined;
  let jobId = '';

  beforeAll(async () => {
    // Built before the tasks start, so they do not all build at once (they could: see scripts/cli-bundle.mjs).
    expect(spawnSync('node', ['scripts/cli-bundle.mjs'], { cwd: ROOT }).status).toBe(0);
    cluster = await startMiniSlurm();
  }, 120_000);

  afterAll(async () => {
    if (!cluster) return;
    if (jobId) spawnSync('scancel', [jobId], { env: cluster.env }); // nothing left running under slurmd
    await cluster.stop();
  }, 60_000);

  /**
   * One submission of the README script and one single-process run to compare
   * with. Returns both tables, and whether the sources stayed the same from
   * the submission to the end (npm run fit rebuilds its bundle whenever they
   * change, so an edit in between, e.g. by someone else working in the same
   * tree, would compare two programs).
   */
  async function submitAndCompare(attempt: number) {
    const c = cluster!;
    const hashBefore = sourceHash(ROOT);
    const script = readmeJobScript(readFileSync(join(ROOT, 'README.md'), 'utf8'));
    expect(script).toMatch(/^#!\/bin\/bash\n/);
    const work = join(c.dir, `attempt-${attempt}`);
    mkdirSync(work);
    const scriptPath = join(work, 'fit-array.sh');
    writeFileSync(scriptPath, script, { mode: 0o755 });
    const tables = join(work, 'tables');
    const spectra = join(ROOT, 'sample-spectra');
    // As the README says: submitted from the Shiftmark folder; the array size, the folders and the
    // task logs given on the command line (sbatch options override the script's #SBATCH lines).
    jobId = c
      .run('sbatch', ['--parsable', `--array=1-${ARRAY_TASKS}`, `--output=${join(work, 'task-%A_%a.out')}`, `--export=ALL,SPECTRA=${spectra},TABLES=${tables}`, scriptPath], { cwd: ROOT })
      .trim()
      .split(';')[0];
    expect(jobId).toMatch(/^\d+$/);

    const t0 = Date.now();
    while (c.run('squeue', ['-h', '-j', jobId]).trim() !== '') {
      if (Date.now() - t0 > WAIT_LIMIT_MS) throw new Error(`the array job ${jobId} did not finish within ${WAIT_LIMIT_MS / 1000} s\n${c.logs()}`);
      await new Promise((r) => setTimeout(r, 1000));
    }
    const taskLogs = readdirSync(work).filter((f) => f.startsWith('task-')).map((f) => `--- ${f}\n${readFileSync(join(work, f), 'utf8')}`).join('\n');
    // Every task ran and ended with status 0 (scontrol keeps finished jobs for MinJobAge).
    const records = c.run('scontrol', ['-o', 'show', 'job', jobId]).trim().split('\n');
    const tasks = records.map((r) => ({ id: /ArrayTaskId=(\d+)/.exec(r)?.[1], state: /JobState=(\w+)/.exec(r)?.[1], exit: /ExitCode=([\d:]+)/.exec(r)?.[1] }));
    expect(tasks.map((t) => Number(t.id)).sort(), taskLogs).toEqual([1, 2, 3, 4]);
    for (const t of tasks) expect([t.state, t.exit], `task ${t.id}\n${taskLogs}`).toEqual(['COMPLETED', '0:0']);
    expect(readdirSync(tables).sort()).toEqual(['shard-1.csv', 'shard-2.csv', 'shard-3.csv', 'shard-4.csv']);

    const merged = join(work, 'catalogue.csv');
    const m = npm(['merge', '--', '--out', merged, ...[1, 2, 3, 4].map((i) => join(tables, `shard-${i}.csv`))]);
    expect(m.status, m.stderr).toBe(0);
    const single = join(work, 'single.csv');
    const f = npm(['fit', '--', spectra, '--out', single, '--quiet']);
    expect(f.status, f.stderr).toBe(0);
    return {
      merged: parseCatalogueCsv(readFileSync(merged, 'utf8')),
      single: parseCatalogueCsv(readFileSync(single, 'utf8')),
      sameSources: sourceHash(ROOT) === hashBefore,
    };
  }

  it('fits the demo set in 4 array tasks whose merged table equals one single-process run, row by row', async () => {
    let run = await submitAndCompare(1);
    // Sources edited during the run (never in CI, which works on a clean clone): once more, up to twice.
    for (let attempt = 2; !run.sameSources && attempt <= 3; attempt++) run = await submitAndCompare(attempt);
    expect(run.sameSources, 'the sources kept changing during every attempt; the two runs would compare two programs').toBe(true);
    const { merged: a, single: b } = run;
    expect(a.columns).toEqual(b.columns);
    expect(a.rows.length).toBeGreaterThan(90); // 44 demo files, 12 broken ones and the plate's 54 rows
    expect(a.rows.map((r) => r.file)).toEqual(b.rows.map((r) => r.file));
    a.rows.forEach((row, k) => expect(row, row.file).toEqual(b.rows[k]));
    expect(a.meta.merged_shards).toBe(String(ARRAY_TASKS));
    expect(a.meta.input_list).toBe(b.meta.input_list);
  }, 3 * WAIT_LIMIT_MS + 300_000);
});

// Runs without Slurm too: the README keeps a script this test can find.
describe('readmeJobScript(readme)', () => {
  it('finds the job-array block of README.md, which ends by writing shard tables', () => {
    const script = readmeJobScript(readFileSync(join(ROOT, 'README.md'), 'utf8'));
    expect(script).toContain('#SBATCH --array=');
    expect(script).toMatch(/npm run fit -- "\$SPECTRA"[\s\S]*--shard "\$\{SLURM_ARRAY_TASK_ID\}\/\$\{SLURM_ARRAY_TASK_COUNT\}"/);
    expect(() => readmeJobScript('# no script here')).toThrow(/no sh block/);
  });
});
