/** Exit codes of the ambit command (documented in `ambit --help`). */
export const EXIT = {
  ok: 0,
  /** The input data is bad: unreadable CSV/GeoJSON/JSON, bad coordinates, an invalid clip polygon. */
  data: 1,
  /** Bad usage: unknown or conflicting options, a missing argument. */
  usage: 2,
  /** A file could not be read or written. */
  io: 3,
  /** Anything else: a bug in ambit. */
  internal: 4,
} as const;

/** An error the command reports in one line and exits with. */
export class CliError extends Error {
  constructor(readonly exitCode: number, message: string) {
    super(message);
    this.name = 'CliError';
  }
}

export const usageError = (message: string): CliError => new CliError(EXIT.usage, message);
