/**
 * A private one-node Slurm for tests: munged, slurmctld and slurmd started in
 * the foreground as children of the test process, every file in one
 * temporary folder (munge key and socket, slurm.conf, state, spool, logs), on
 * ports of its own, so nothing of the machine's own Slurm or munge is used or
 * touched. Daemons run as the user running the tests (root in CI), with
 * proctrack/linuxproc and task/none (no cgroups needed). stop() ends every
 * daemon it started, by PID. Slurm configuration keywords: slurm.conf(5) of
 * Slurm 22.05 (Debian 12's slurm-wlm); munged(8) of munge 0.5.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { cpus, hostname, totalmem } from 'node:os';
import { join } from 'node:path';

/** Programs the cluster needs, with the Debian package that has them. */
export const SLURM_PROGRAMS: readonly [string, string][] = [
  ['munged', 'munge'],
  ['mungekey', 'munge'],
  ['slurmctld', 'slurm-wlm'],
  ['slurmd', 'slurm-wlm'],
  ['sbatch', 'slurm-wlm'],
  ['squeue', 'slurm-wlm'],
  ['scontrol', 'slurm-wlm'],
  ['scancel', 'slurm-wlm'],
  ['sinfo', 'slurm-wlm'],
];

/** The programs not found on PATH (or in /usr/sbin), as "program (package)". */
export function missingPrograms(): string[] {
  const path = `${process.env.PATH ?? ''}:/usr/sbin:/sbin`;
  return SLURM_PROGRAMS.filter(([p]) => spawnSync('sh', ['-c', `command -v ${p}`], { env: { ...process.env, PATH: path } }).status !== 0).map(([p, pkg]) => `${p} (${pkg})`);
}

/** A TCP port free now on 127.0.0.1. */
function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number };
      srv.close(() => resolve(port));
    });
  });
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export interface MiniSlurm {
  dir: string;
  /** Environment for sbatch, squeue and friends: SLURM_CONF points at the private configuration. */
  env: NodeJS.ProcessEnv;
  /** Run a Slurm client command; throws with its output when it fails. */
  run(command: string, args: string[], options?: { cwd?: string }): string;
  /** Every daemon's log, for a failure message. */
  logs(): string;
  /** Stop every daemon this cluster started (TERM, then KILL after a grace time), by PID; remove the folder unless kept. */
  stop(keepDir?: boolean): Promise<void>;
}

export async function startMiniSlurm(): Promise<MiniSlurm> {
  const dir = mkdtempSync('/tmp/smk-'); // short: a Unix socket path has at most 107 bytes
  chmodSync(dir, 0o711);
  const daemons: { name: string; child: ChildProcess; output: string[] }[] = [];
  const path = `${process.env.PATH ?? ''}:/usr/sbin:/sbin`;
  const env: NodeJS.ProcessEnv = { ...process.env, PATH: path, SLURM_CONF: join(dir, 'slurm.conf') };
  const file = (name: string) => join(dir, name);

  const start = (name: string, command: string, args: string[]) => {
    const child = spawn(command, args, { env, stdio: ['ignore', 'pipe', 'pipe'] });
    const output: string[] = [];
    child.stdout!.on('data', (d: Buffer) => output.push(d.toString()));
    child.stderr!.on('data', (d: Buffer) => output.push(d.toString()));
    daemons.push({ name, child, output });
  };
  const logs = () =>
    [
      ...daemons.map((d) => `--- ${d.name} (pid ${d.child.pid}, exit ${d.child.exitCode ?? 'running'}) ---\n${d.output.join('').slice(-3000)}`),
      ...['slurmctld.log', 'slurmd.log'].filter((f) => existsSync(file(f))).map((f) => `--- ${f} ---\n${readFileSync(file(f), 'utf8').slice(-3000)}`),
    ].join('\n');
  const run = (command: string, args: string[], options: { cwd?: string } = {}) => {
    const r = spawnSync(command, args, { env, cwd: options.cwd, encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`${command} ${args.join(' ')} failed (status ${r.status}): ${r.stderr}${r.stdout}\n${logs()}`);
    return r.stdout;
  };
  const stop = async (keepDir = false) => {
    for (const d of [...daemons].reverse()) {
      if (d.child.exitCode !== null || d.child.signalCode !== null) continue;
      d.child.kill('SIGTERM');
      for (let i = 0; i < 50 && d.child.exitCode === null && d.child.signalCode === null; i++) await sleep(100);
      if (d.child.exitCode === null && d.child.signalCode === null) d.child.kill('SIGKILL');
    }
    if (!keepDir) rmSync(dir, { recursive: true, force: true });
  };

  try {
    // munge: a key of our own and a socket in the folder (--force: the daemon runs as root in CI).
    run('mungekey', ['--create', `--keyfile=${file('munge.key')}`]);
    start('munged', 'munged', ['--foreground', '--force', `--socket=${file('munge.sock')}`, `--key-file=${file('munge.key')}`, `--pid-file=${file('munged.pid')}`, `--seed-file=${file('munge.seed')}`]);
    for (let i = 0; i < 50 && !existsSync(file('munge.sock')); i++) await sleep(100);
    if (!existsSync(file('munge.sock'))) throw new Error(`munged did not start\n${logs()}`);

    const [ctldPort, dPort] = [await freePort(), await freePort()];
    const host = hostname().split('.')[0];
    // Real memory to offer, MB: most of the machine's (slurmd drains a node that claims more than it has).
    const memMb = Math.floor((totalmem() / 2 ** 20) * 0.8);
    for (const d of ['state', 'spool']) mkdirSync(file(d));
    writeFileSync(
      file('slurm.conf'),
      [
        'ClusterName=shiftmarktest',
        `SlurmctldHost=${host}(127.0.0.1)`,
        `SlurmctldPort=${ctldPort}`,
        `SlurmdPort=${dPort}`,
        'SlurmUser=root',
        'SlurmdUser=root',
        'AuthType=auth/munge',
        'CredType=cred/munge',
        `AuthInfo=socket=${file('munge.sock')}`,
        `StateSaveLocation=${file('state')}`,
        `SlurmdSpoolDir=${file('spool')}`,
        `SlurmctldPidFile=${file('slurmctld.pid')}`,
        `SlurmdPidFile=${file('slurmd.pid')}`,
        `SlurmctldLogFile=${file('slurmctld.log')}`,
        `SlurmdLogFile=${file('slurmd.log')}`,
        'ProctrackType=proctrack/linuxproc',
        'TaskPlugin=task/none',
        'JobAcctGatherType=jobacct_gather/none',
        'AccountingStorageType=accounting_storage/none',
        'JobCompType=jobcomp/none',
        'SchedulerType=sched/builtin',
        'SelectType=select/cons_tres',
        'SelectTypeParameters=CR_Core',
        'MpiDefault=none',
        'ReturnToService=2',
        'MinJobAge=3600',
        `NodeName=shiftmarktest1 NodeHostname=${host} NodeAddr=127.0.0.1 CPUs=${cpus().length} RealMemory=${memMb} State=UNKNOWN`,
        'PartitionName=test Nodes=shiftmarktest1 Default=YES MaxTime=INFINITE State=UP',
        '',
      ].join('\n'),
    );
    // -D: stay in the foreground (the child is the daemon, so its PID is ours to stop); -c: no state from an earlier run.
    start('slurmctld', 'slurmctld', ['-D', '-c', '-f', file('slurm.conf')]);
    start('slurmd', 'slurmd', ['-D', '-N', 'shiftmarktest1', '-f', file('slurm.conf')]);
    // Ready when the node is idle.
    let state = '';
    for (let i = 0; i < 150 && !/^idle/.test(state); i++) {
      await sleep(200);
      state = spawnSync('sinfo', ['-h', '-N', '-o', '%T'], { env, encoding: 'utf8' }).stdout?.trim() ?? '';
    }
    if (!/^idle/.test(state)) throw new Error(`the Slurm node did not come up (state '${state}')\n${logs()}`);
  } catch (e) {
    await stop(true);
    throw e;
  }
  return { dir, env, run, logs, stop };
}
