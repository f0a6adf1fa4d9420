/**
 * Command-line parsing for the CLI tools: Node's own `util.parseArgs`, run in
 * its lenient mode so that every problem is reported in our words (the option
 * as typed, what is wrong with it) rather than in Node's.
 */
import { parseArgs } from 'node:util';

export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

/** Option names (without the leading --) and whether each takes a value ('string') or is a flag ('boolean'). */
export type OptionTypes = Readonly<Record<string, 'string' | 'boolean'>>;

export type OptionValues<S extends OptionTypes> = { [K in keyof S]?: S[K] extends 'string' ? string : boolean };

export interface CommandLine<S extends OptionTypes> {
  values: OptionValues<S>;
  /** Everything that is not an option, in order; after a lone `--` everything is positional. */
  positionals: string[];
}

/**
 * Parse `argv` (without the node and script words). Accepts `--name value`,
 * `--name=value` and `--flag`; a repeated option keeps its last value. Throws
 * UsageError for an unknown option (short ones included), a value missing or
 * given to a flag, and a value that looks like another option (`--out --jobs 2`
 * forgot the file name; `--out=--odd` passes such a value on purpose).
 */
export function parseCommandLine<S extends OptionTypes>(argv: readonly string[], spec: S): CommandLine<S> {
  const options = Object.fromEntries(Object.entries(spec).map(([name, type]) => [name, { type }]));
  const { tokens, positionals } = parseArgs({ args: [...argv], options, strict: false, allowPositionals: true, tokens: true });
  const values: Record<string, string | boolean> = {};
  for (const t of tokens) {
    if (t.kind !== 'option') continue;
    const type = Object.hasOwn(spec, t.name) ? spec[t.name] : undefined;
    if (type === undefined) throw new UsageError(`unknown option ${t.rawName}`);
    if (type === 'boolean') {
      if (t.value !== undefined) throw new UsageError(`${t.rawName} takes no value (got '${t.value}')`);
      values[t.name] = true;
      continue;
    }
    if (t.value === undefined) throw new UsageError(`${t.rawName} needs a value`);
    if (!t.inlineValue && t.value.length > 1 && t.value.startsWith('-')) {
      throw new UsageError(`${t.rawName} needs a value, but '${t.value}' looks like an option (write ${t.rawName}=${t.value} if it is the value)`);
    }
    values[t.name] = t.value;
  }
  return { values: values as OptionValues<S>, positionals };
}
