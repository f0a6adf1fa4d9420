/**
 * Command-line options of `npm run fit` and `npm run merge`: what each accepts
 * (the README's "Headless fitter" list) and the message for each mistake.
 * Defaults and limits are the project's own (src/cli/options.ts); the
 * cosmology default is flat H0 = 70, Omega_m = 0.3 (common practice, README).
 */
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { join, resolve } from 'node:path';
import { parseCommandLine, UsageError } from '../../src/cli/args';
import { parseCosmologyOption } from '../../src/cli/cosmologyOption';
import { DEFAULT_TIME_LIMIT_S, FIT_USAGE, parseFitOptions, parseMergeOptions, type FitOptions } from '../../src/cli/options';
import { DEFAULT_COSMOLOGY } from '../../src/core/cosmology';

const fitOpts = (...argv: string[]) => parseFitOptions(argv, 4) as FitOptions;
/** The UsageError message parseFitOptions throws for argv. */
function fitError(...argv: string[]): string {
  try {
    parseFitOptions(argv, 4);
  } catch (e) {
    expect(e).toBeInstanceOf(UsageError);
    return (e as Error).message;
  }
  throw new Error(`no error for ${argv.join(' ')}`);
}

describe('parseCommandLine(argv, spec) over node:util parseArgs', () => {
  const spec = { out: 'string', jobs: 'string', quiet: 'boolean' } as const;
  it('separates inputs, --name value, --name=value and flags; a repeated option keeps its last value', () => {
    const a = parseCommandLine(['x.fits', '--out', 't.csv', '--jobs=3', 'dir', '--quiet', '--jobs', '5'], spec);
    expect(a.positionals).toEqual(['x.fits', 'dir']);
    expect(a.values).toEqual({ out: 't.csv', jobs: '5', quiet: true });
  });
  it('takes everything after a lone -- as inputs, even names that look like options', () => {
    expect(parseCommandLine(['a', '--', '--quiet', '-x'], spec)).toEqual({ values: {}, positionals: ['a', '--quiet', '-x'] });
  });
  it('accepts a value that starts with a dash only when attached with =', () => {
    expect(parseCommandLine(['--out=-odd.csv'], spec).values.out).toBe('-odd.csv');
    expect(parseCommandLine(['--out', '-'], spec).values.out).toBe('-');
  });
  it('names an unknown option, long or short, as typed', () => {
    expect(() => parseCommandLine(['--bogus'], spec)).toThrow(new UsageError('unknown option --bogus'));
    expect(() => parseCommandLine(['-j', '2'], spec)).toThrow(new UsageError('unknown option -j'));
    expect(() => parseCommandLine(['--Out', 'x'], spec)).toThrow(/unknown option --Out/);
  });
  it('says when a value is missing, given to a flag, or looks like the next option', () => {
    expect(() => parseCommandLine(['--out'], spec)).toThrow(new UsageError('--out needs a value'));
    expect(() => parseCommandLine(['--quiet=yes'], spec)).toThrow(new UsageError("--quiet takes no value (got 'yes')"));
    expect(() => parseCommandLine(['--out', '--jobs', '2'], spec)).toThrow(
      new UsageError("--out needs a value, but '--jobs' looks like an option (write --out=--jobs if it is the value)"),
    );
  });
});

describe('parseFitOptions(argv, cores): the README options', () => {
  it('gives the defaults: CSV to standard output, one job per core, 60 s, whole list, header block, progress', () => {
    expect(fitOpts('spectra')).toEqual({
      inputs: ['spectra'],
      out: undefined,
      format: 'csv',
      lines: undefined,
      jobs: 4,
      timeLimitS: DEFAULT_TIME_LIMIT_S,
      cosmology: DEFAULT_COSMOLOGY,
      shard: { index: 1, count: 1 },
      headerBlock: true,
      quiet: false,
    });
    expect(DEFAULT_TIME_LIMIT_S).toBe(60); // README: "--time-limit S (default 60)" in the usage text
  });
  it('reads every documented option', () => {
    const o = fitOpts('a.fits', 'dir', '--out', 't.csv', '--format', 'json', '--jobs', '3', '--cosmology', 'h0=67.7,om=0.31,ok=0,or=0',
      '--shard', '2/8', '--time-limit', '2.5', '--no-header', '--quiet', '--lines', 'l.csv');
    expect(o).toEqual({
      inputs: ['a.fits', 'dir'],
      out: 't.csv',
      format: 'json',
      lines: 'l.csv',
      jobs: 3,
      timeLimitS: 2.5,
      cosmology: { h0: 67.7, omegaM: 0.31, omegaK: 0, omegaR: 0 },
      shard: { index: 2, count: 8 },
      headerBlock: false,
      quiet: true,
    });
  });
  it('takes the format from a .json output name unless --format says otherwise', () => {
    expect(fitOpts('a', '--out', 'T.JSON').format).toBe('json');
    expect(fitOpts('a', '--out', 't.json', '--format', 'csv').format).toBe('csv');
  });
  it('takes fits and votable by name or from the output name (.fits/.fit/.fts: FITS 4.0 sec. 1.1 common extensions; .vot/.xml: common practice)', () => {
    expect(fitOpts('a', '--format', 'fits').format).toBe('fits');
    expect(fitOpts('a', '--format', 'votable').format).toBe('votable');
    expect(fitOpts('a', '--out', 'cat.FITS').format).toBe('fits');
    expect(fitOpts('a', '--out', 'cat.fts').format).toBe('fits');
    expect(fitOpts('a', '--out', 'cat.vot').format).toBe('votable');
    expect(fitOpts('a', '--out', 'cat.xml').format).toBe('votable');
    expect(fitOpts('a', '--out', 'cat.fits', '--format', 'csv').format).toBe('csv');
  });
  it('answers --help before checking anything else', () => {
    expect(parseFitOptions(['--help'], 4)).toBe('help');
    expect(parseFitOptions(['--jobs', 'x', '--help'], 4)).toBe('help');
    expect(FIT_USAGE).toMatch(/--time-limit S/);
  });
  it('explains each bad option', () => {
    expect(fitError()).toBe('no input files or folders given');
    expect(fitError('a', '--format', 'xml')).toBe("--format must be csv, json, fits or votable (got 'xml')");
    expect(fitError('a', '--lines=')).toBe('--lines needs a file name');
    expect(fitError('a', '--out', 't.csv', '--lines', 't.csv')).toBe('--lines must name a different file from --out');
    expect(fitError('a', '--jobs', '0')).toBe("--jobs must be a whole number >= 1 (got '0')");
    expect(fitError('a', '--jobs', '2.5')).toBe("--jobs must be a whole number >= 1 (got '2.5')");
    expect(fitError('a', '--jobs', 'many')).toBe("--jobs must be a whole number >= 1 (got 'many')");
    expect(fitError('a', '--jobs=')).toBe("--jobs must be a whole number >= 1 (got '')");
    expect(fitError('a', '--time-limit', '0')).toMatch(/^--time-limit must be a number of seconds above 0 and at most 2147483 \(got '0'\)$/);
    expect(fitError('a', '--time-limit', 'soon')).toMatch(/--time-limit must be .*got 'soon'/);
    expect(fitError('a', '--time-limit', 'Infinity')).toMatch(/--time-limit must be .*got 'Infinity'/);
    expect(fitError('a', '--time-limit', '3e6')).toMatch(/--time-limit must be .*at most 2147483/);
    expect(fitError('a', '--shard', '5/4')).toBe('--shard: invalid shard "5/4": need 1 <= i <= n');
    expect(fitError('a', '--shard', 'half')).toBe('--shard: invalid shard "half": expected i/n, e.g. 3/16');
    expect(fitError('a', '--out=')).toBe('--out needs a file name');
    expect(fitError('a', '--threads', '2')).toBe('unknown option --threads');
    expect(fitError('a', '--out')).toBe('--out needs a value');
  });
});

describe('parseCosmologyOption(text)', () => {
  it('fills what is not given from the default', () => {
    expect(parseCosmologyOption(undefined)).toEqual(DEFAULT_COSMOLOGY);
    expect(parseCosmologyOption('h0=67.7')).toEqual({ ...DEFAULT_COSMOLOGY, h0: 67.7 });
    expect(parseCosmologyOption(' OM = 0.25 , or=8.4e-5 ')).toEqual({ ...DEFAULT_COSMOLOGY, omegaM: 0.25, omegaR: 8.4e-5 });
  });
  it('explains an unknown parameter, a missing or bad number, and a model with no finite age', () => {
    expect(() => parseCosmologyOption('w0=-1')).toThrow(new UsageError("--cosmology: unknown parameter 'w0': use h0, om, ok, or (e.g. h0=70,om=0.3)"));
    expect(() => parseCosmologyOption('h0')).toThrow(new UsageError("--cosmology: h0 needs a number, as in h0=70 (got 'h0')"));
    expect(() => parseCosmologyOption('om=abc')).toThrow(new UsageError("--cosmology: om needs a number, as in om=0.3 (got 'om=abc')"));
    expect(() => parseCosmologyOption('h0=70=5')).toThrow(/h0 needs a number/);
    expect(() => parseCosmologyOption('')).toThrow(/--cosmology needs parameters/);
    expect(() => parseCosmologyOption('h0=-70')).toThrow(/^--cosmology: H0 must be a positive number/);
    expect(() => parseCosmologyOption('om=-0.1')).toThrow(/^--cosmology: Omega_m must be/);
    // Omega_m = Omega_r = 0 with Omega_k <= 0 has no big bang (the core's own check, src/core/cosmology/params.ts).
    expect(() => parseCosmologyOption('om=0,ok=-0.1')).toThrow(/^--cosmology: no big bang/);
  });
});

describe('parseMergeOptions(argv)', () => {
  it('reads --out and the shard tables', () => {
    expect(parseMergeOptions(['--out', 'all.csv', 's1.csv', 's2.csv'])).toEqual({ out: 'all.csv', tables: ['s1.csv', 's2.csv'] });
    expect(parseMergeOptions(['s1.csv'])).toEqual({ out: undefined, tables: ['s1.csv'] });
    expect(parseMergeOptions(['--help'])).toBe('help');
  });
  it('explains a missing table list or an unknown option', () => {
    expect(() => parseMergeOptions(['--out', 'all.csv'])).toThrow(new UsageError('no shard tables given'));
    expect(() => parseMergeOptions(['--jobs', '2', 's1.csv'])).toThrow(new UsageError('unknown option --jobs'));
  });
});

describe('the tools on a bad command line', () => {
  const ROOT = resolve(__dirname, '../..');
  const TSX = join(ROOT, 'node_modules', '.bin', 'tsx');
  function run(script: string, args: string[]): { status: number | null; stderr: string } {
    try {
      execFileSync(TSX, [script, ...args], { cwd: ROOT, stdio: ['ignore', 'pipe', 'pipe'] });
      return { status: 0, stderr: '' };
    } catch (e) {
      const err = e as { status: number | null; stderr: Buffer };
      return { status: err.status, stderr: err.stderr.toString() };
    }
  }
  it('fit prints the message and the usage, and exits with status 2', () => {
    const r = run('src/cli/fit.ts', ['sample-spectra', '--jobs', 'many']);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^error: --jobs must be a whole number >= 1 \(got 'many'\)\nusage: npm run fit/);
  });
  it('merge does the same', () => {
    const r = run('src/cli/merge.ts', ['--bogus']);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^error: unknown option --bogus\nusage: npm run merge/);
  });
});
