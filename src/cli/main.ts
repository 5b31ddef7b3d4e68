import { readFileSync } from 'node:fs';
import { AmbitError } from '../core/errors.js';
import { runCells } from './cells.js';
import { runDemo } from './demo.js';
import { CliError, EXIT } from './exit.js';
import { runMesh } from './mesh.js';

export const MAIN_HELP = `ambit: exact Delaunay triangulations and Voronoi diagrams from the command line

Usage: ambit <command> [options]     (ambit <command> --help for its options and an example)

Commands:
  cells   the cell of every site, clipped to a region: straight-line, city-block (L1), chessboard (Linf),
          power (weighted) or balanced; written as GeoJSON, SVG, an ambit mesh (.json) or a CSV table
  mesh    the Delaunay (or weighted) triangulation of the sites, as an ambit mesh or GeoJSON
  demo    an invented town's service areas and balanced territories, written to a folder

Options: --help, --version

Examples:
  ambit demo --out demo-output
  ambit cells sites.csv --clip 0,0,100,100 --out cells.geojson

Exit codes:
  0  success
  1  bad input data (an unreadable or invalid sites or clip file: the message names the file and the line or feature)
  2  bad usage (unknown, missing or conflicting options)
  3  a file could not be read or written
  4  an unexpected internal error (a bug in ambit)
Nothing is written when the command fails.`;

function version(): string {
  try {
    const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version?: string };
    return pkg.version ?? 'unknown';
  } catch {
    return 'unknown';
  }
}

/** Runs the command line and returns the exit code (messages go to stdout and stderr). */
export function main(argv: readonly string[]): number {
  const [command, ...rest] = argv;
  try {
    if (command === undefined || command === '--help' || command === '-h' || command === 'help') { console.log(MAIN_HELP); return EXIT.ok; }
    if (command === '--version' || command === '-v') { console.log(version()); return EXIT.ok; }
    if (command === 'cells') return runCells(rest);
    if (command === 'mesh') return runMesh(rest);
    if (command === 'demo') return runDemo(rest);
    throw new CliError(EXIT.usage, `unknown command '${command}'; the commands are cells, mesh and demo (see 'ambit --help')`);
  } catch (err) {
    if (err instanceof CliError) {
      console.error(`ambit: ${err.message}`);
      return err.exitCode;
    }
    if (err instanceof AmbitError) {
      console.error(`ambit: ${err.message}`);
      return EXIT.data;
    }
    console.error(`ambit: internal error (please report): ${err instanceof Error ? err.stack : String(err)}`);
    return EXIT.internal;
  }
}

process.exitCode = main(process.argv.slice(2));
