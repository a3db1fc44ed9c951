/** A small, strict parser for `--name value`, `--name=value` and flags. */
export type ParsedArgs = { values: Map<string, string>; flags: Set<string>; positional: string[] };

export class UsageError extends Error {}

export function parseArgs(argv: readonly string[], valued: readonly string[], flags: readonly string[]): ParsedArgs {
  const out: ParsedArgs = { values: new Map(), flags: new Set(), positional: [] };
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (!arg.startsWith('--')) {
      if (arg === '-h') out.flags.add('help');
      else out.positional.push(arg);
      continue;
    }
    const eq = arg.indexOf('=');
    const name = arg.slice(2, eq >= 0 ? eq : undefined);
    if (flags.includes(name)) {
      if (eq >= 0) throw new UsageError(`--${name} takes no value`);
      out.flags.add(name);
    } else if (valued.includes(name)) {
      const value = eq >= 0 ? arg.slice(eq + 1) : argv[++i];
      if (value === undefined) throw new UsageError(`--${name} needs a value`);
      out.values.set(name, value);
    } else {
      throw new UsageError(`unknown option --${name}`);
    }
  }
  return out;
}

export function numberOption(args: ParsedArgs, name: string, fallback: number, check: { min: number; max: number; integer?: boolean }): number {
  const raw = args.values.get(name);
  if (raw === undefined) return fallback;
  const value = Number(raw);
  if (raw.trim() === '' || !Number.isFinite(value) || value < check.min || value > check.max || (check.integer && !Number.isInteger(value))) {
    throw new UsageError(`--${name} must be ${check.integer ? 'a whole number' : 'a number'} from ${check.min} to ${check.max} (got "${raw}")`);
  }
  return value;
}
