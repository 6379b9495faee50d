/** Flags of the form `--name value` or `--flag`, and positional arguments, as the command line gives them. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

export interface ParsedArguments {
  positional: string[];
  flags: Map<string, string | true>;
}

export function parseArguments(argv: readonly string[], booleanFlags: readonly string[]): ParsedArguments {
  const positional: string[] = [];
  const flags = new Map<string, string | true>();
  for (let i = 0; i < argv.length; i += 1) {
    const arg = argv[i] as string;
    if (!arg.startsWith('--')) {
      positional.push(arg);
      continue;
    }
    const [name, inline] = arg.slice(2).split(/=(.*)/s, 2) as [string, string | undefined];
    if (booleanFlags.includes(name)) {
      flags.set(name, true);
    } else if (inline !== undefined) {
      flags.set(name, inline);
    } else {
      const next = argv[i + 1];
      if (next === undefined || (next.startsWith('--') && !/^--?\d/.test(next)))
        throw new UsageError(`--${name} needs a value`);
      flags.set(name, next);
      i += 1;
    }
  }
  return { positional, flags };
}

/** Refuses flags the command does not know, so a typo is not silently ignored. */
export function rejectUnknown(parsed: ParsedArguments, known: readonly string[], command: string): void {
  for (const name of parsed.flags.keys()) {
    if (!known.includes(name)) throw new UsageError(`'${command}' has no option --${name}`);
  }
}

export function stringFlag(parsed: ParsedArguments, name: string): string | undefined {
  const v = parsed.flags.get(name);
  if (v === true) throw new UsageError(`--${name} needs a value`);
  return v;
}

/** A number flag in plain notation (decimal point); the message names the flag and the text. */
export function numberFlag(parsed: ParsedArguments, name: string): number | undefined {
  const v = stringFlag(parsed, name);
  if (v === undefined) return undefined;
  const n = Number(v.replace(',', '.'));
  if (v.trim() === '' || !Number.isFinite(n)) throw new UsageError(`--${name} must be a number, got '${v}'`);
  return n;
}

export function integerFlag(parsed: ParsedArguments, name: string): number | undefined {
  const n = numberFlag(parsed, name);
  if (n !== undefined && !Number.isInteger(n))
    throw new UsageError(`--${name} must be a whole number, got ${n}`);
  return n;
}
