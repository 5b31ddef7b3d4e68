import { InputError } from '../core/errors.js';
import type { SiteTable } from '../io/csv.js';
import { parseArgs, stringOption, type OptionSpec, type ParsedArgs } from './args.js';
import { CliError, EXIT, usageError } from './exit.js';

/**
 * Runs a library build on sites read from `file`; an InputError about one
 * point is reported at its place in the file (line or feature), one about
 * the clip region at the region's source.
 */
export function buildFrom<T>(file: string, table: SiteTable, clipSource: string, build: () => T): T {
  try {
    return build();
  } catch (err) {
    if (!(err instanceof InputError)) throw err;
    if (err.field === 'clip') throw new CliError(EXIT.data, `${clipSource}: ${err.message}`);
    const perPoint = ['x', 'y', 'w', 'points', 'sites', 'weights', 'shares'].includes(err.field) && err.index >= 0 && err.index < table.xy.length / 2;
    if (perPoint) throw new CliError(EXIT.data, `${file}, ${table.where(err.index)}: ${err.message}`);
    throw new CliError(EXIT.data, `${file}: ${err.message}`);
  }
}

/** Each site's id: that of the first input point merged onto it. */
export function siteIds(ids: string[] | null, siteOfInput: Int32Array, siteCount: number): string[] | undefined {
  if (ids === null) return undefined;
  const out: string[] = new Array<string>(siteCount);
  for (let i = 0; i < siteOfInput.length; i++) out[siteOfInput[i]] ??= ids[i];
  return out;
}

export type OutputFormat = 'geojson' | 'svg' | 'json' | 'csv';

/** The output format: --format, else the extension of --out. */
export function outputFormat(out: string, format: string | undefined, allowed: readonly OutputFormat[]): OutputFormat {
  const f = (format ?? (/\.([A-Za-z]+)$/.exec(out)?.[1] ?? '')).toLowerCase();
  if (!(allowed as readonly string[]).includes(f)) {
    throw new CliError(EXIT.usage, format !== undefined
      ? `--format ${format} is not one of ${allowed.join(', ')}`
      : `cannot tell the output format from '${out}': use a .${allowed.join(', .')} extension or --format`);
  }
  return f as OutputFormat;
}

/** What a file-to-file subcommand starts from: its parsed options, the sites file, the output path and format. */
export interface FileCommand { args: ParsedArgs; file: string; out: string; format: OutputFormat }

/**
 * Parses a `<command> <sites file> --out <file>` command line; null when
 * --help was asked for (the help has then been printed).
 */
export function startFileCommand(argv: readonly string[], specs: readonly OptionSpec[], command: string, help: string,
  formats: readonly OutputFormat[]): FileCommand | null {
  const args = parseArgs(argv, specs, command);
  if (args.values.has('help')) { console.log(help); return null; }
  if (args.positional.length !== 1) throw usageError(`${command} takes one sites file, got ${args.positional.length}; see 'ambit ${command} --help'`);
  const out = stringOption(args, 'out');
  if (out === undefined) throw usageError(`${command} needs --out <file>; see 'ambit ${command} --help'`);
  return { args, file: args.positional[0], out, format: outputFormat(out, stringOption(args, 'format'), formats) };
}
