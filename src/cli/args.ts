import { usageError } from './exit.js';

/** One option a subcommand accepts: a flag, or an option that takes a value. */
export interface OptionSpec { name: string; value?: string; help: string }

export interface ParsedArgs { positional: string[]; values: Map<string, string | true> }

/**
 * Parses `--name value`, `--name=value` and flags against a subcommand's
 * options; `-h` is `--help`, `--` ends the options. Unknown or repeated
 * options, and a missing value, are usage errors.
 */
export function parseArgs(argv: readonly string[], specs: readonly OptionSpec[], command: string): ParsedArgs {
  const byName = new Map(specs.map((s) => [s.name, s]));
  const positional: string[] = [], values = new Map<string, string | true>();
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--') { positional.push(...argv.slice(i + 1)); break; }
    if (a === '-h') { values.set('help', true); continue; }
    if (!a.startsWith('-') || a === '-') { positional.push(a); continue; }
    const eq = a.indexOf('=');
    const name = a.startsWith('--') ? a.slice(2, eq < 0 ? undefined : eq) : '';
    const spec = byName.get(name);
    if (spec === undefined) throw usageError(`unknown option ${eq < 0 ? a : a.slice(0, eq)}; see 'ambit ${command} --help'`);
    if (values.has(name)) throw usageError(`--${name} is given twice`);
    if (spec.value === undefined) {
      if (eq >= 0) throw usageError(`--${name} takes no value`);
      values.set(name, true);
    } else if (eq >= 0) {
      values.set(name, a.slice(eq + 1));
    } else {
      if (i + 1 >= argv.length || (argv[i + 1].startsWith('--') && argv[i + 1].length > 2)) throw usageError(`--${name} needs a value (${spec.value})`);
      values.set(name, argv[++i]);
    }
  }
  return { positional, values };
}

/** The option table of a help text. */
export function optionHelp(specs: readonly OptionSpec[]): string {
  const rows = specs.map((s) => [`--${s.name}${s.value ? ` ${s.value}` : ''}`, s.help]);
  const w = Math.max(...rows.map((r) => r[0].length));
  return rows.map(([a, b]) => `  ${a.padEnd(w)}  ${b}`).join('\n');
}

export function stringOption(args: ParsedArgs, name: string): string | undefined {
  const v = args.values.get(name);
  return v === true ? undefined : v;
}

/** A conflict between two given options is a usage error. */
export function refuseTogether(args: ParsedArgs, a: string, b: string, why: string): void {
  if (args.values.has(a) && args.values.has(b)) throw usageError(`--${a} and --${b} cannot be used together: ${why}`);
}
