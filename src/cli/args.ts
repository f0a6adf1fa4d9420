/** A small argument parser: positional inputs plus --name value / --name=value / --flag. */
export interface ParsedArgs {
  positional: string[];
  options: Map<string, string>;
  flags: Set<string>;
}

export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

/** `valued` lists the options that take a value; any other --word is a flag. */
export function parseArgs(argv: string[], valued: readonly string[], known: readonly string[]): ParsedArgs {
  const positional: string[] = [];
  const options = new Map<string, string>();
  const flags = new Set<string>();
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--') {
      positional.push(...argv.slice(i + 1));
      break;
    }
    if (!a.startsWith('--')) {
      positional.push(a);
      continue;
    }
    const eq = a.indexOf('=');
    const name = a.slice(2, eq < 0 ? undefined : eq);
    if (!valued.includes(name) && !known.includes(name)) throw new UsageError(`unknown option --${name}`);
    if (valued.includes(name)) {
      const value = eq >= 0 ? a.slice(eq + 1) : argv[++i];
      if (value === undefined) throw new UsageError(`--${name} needs a value`);
      options.set(name, value);
    } else {
      if (eq >= 0) throw new UsageError(`--${name} takes no value`);
      flags.add(name);
    }
  }
  return { positional, options, flags };
}
