import { UsageError } from './command';

/** Parsed `--name value` options, `--flag` switches and positional words. */
export interface ParsedArgs {
  positional: string[];
  options: Map<string, string>;
  flags: Set<string>;
}

/**
 * Splits arguments by a declared set of valued options and switches, so that
 * an unknown option or a missing value is a usage error naming it.
 */
export function parseArgs(args: readonly string[], spec: { values?: readonly string[]; flags?: readonly string[] }): ParsedArgs {
  const values = new Set(spec.values ?? []);
  const switches = new Set([...(spec.flags ?? []), 'debug']);
  const out: ParsedArgs = { positional: [], options: new Map(), flags: new Set() };
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (!a.startsWith('--')) {
      out.positional.push(a);
      continue;
    }
    const eq = a.indexOf('=');
    const name = a.slice(2, eq < 0 ? undefined : eq);
    if (values.has(name)) {
      const v = eq >= 0 ? a.slice(eq + 1) : args[++i];
      if (v === undefined || (eq < 0 && v.startsWith('--'))) throw new UsageError(`The option --${name} needs a value.`);
      out.options.set(name, v);
    } else if (switches.has(name)) {
      out.flags.add(name);
    } else {
      const known = [...values].map((v) => `--${v}`).concat([...switches].map((s) => `--${s}`));
      throw new UsageError(`Unknown option --${name}. This command takes: ${known.join(', ')}.`);
    }
  }
  return out;
}

export function requireOption(args: ParsedArgs, name: string, what: string): string {
  const v = args.options.get(name);
  if (!v) throw new UsageError(`Give ${what} with --${name}.`);
  return v;
}

/** A whole-number option of at least `min`, or undefined when not given. */
export function wholeNumber(args: ParsedArgs, name: string, min: number): number | undefined {
  const text = args.options.get(name);
  if (text === undefined) return undefined;
  if (!/^\d+$/.test(text.trim()) || Number(text) < min) throw new UsageError(`--${name} takes a whole number of at least ${min}, not "${text}".`);
  return Number(text);
}
