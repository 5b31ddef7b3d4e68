import { triangulate } from '../triangulate/triangulation.js';
import { writeMeshJSON } from '../mesh/json.js';
import { writeTrianglesGeoJSON } from '../io/geojson-triangles.js';
import { optionHelp, stringOption, type OptionSpec } from './args.js';
import { buildFrom, startFileCommand } from './build.js';
import { SITE_OPTIONS } from './cells.js';
import { writeAtomically } from './files.js';
import { loadSites } from './inputs.js';
import { Progress } from './progress.js';

const OPTIONS: OptionSpec[] = [
  ...SITE_OPTIONS.filter((o) => o.name !== 'id'),
  { name: 'out', value: 'file', help: 'output file (required): .json (ambit mesh) or .geojson (one polygon per triangle)' },
  { name: 'format', value: 'json|geojson', help: 'output format, when the extension does not say' },
  { name: 'help', help: 'show this help' },
];

export const MESH_HELP = `ambit mesh: the Delaunay triangulation of the sites (regular triangulation with --weight)

Usage: ambit mesh <sites.csv|.geojson|.json> --out <file> [options]

Repeated points are merged onto one site. The .json output is an ambit.mesh (kind "delaunay": vertex v is site v);
the .geojson output has one Polygon per triangle with its three sites.

Options:
${optionHelp(OPTIONS)}

Example:
  ambit mesh stops.csv --x east --y north --out stops-mesh.json`;

export function runMesh(argv: readonly string[]): number {
  const start = startFileCommand(argv, OPTIONS, 'mesh', MESH_HELP, ['json', 'geojson']);
  if (start === null) return 0;
  const { args, file, out, format } = start;
  const progress = new Progress('ambit mesh', 3);
  try {
    progress.stage(`reading ${file}`);
    const table = loadSites(file, { x: stringOption(args, 'x'), y: stringOption(args, 'y'), weight: stringOption(args, 'weight') });
    progress.stage('triangulating');
    const tri = buildFrom(file, table, '', () => triangulate(table.xy, { weights: table.weights ?? undefined }));
    progress.stage(`writing ${out}`);
    writeAtomically(out, (sink) => {
      if (format === 'geojson') writeTrianglesGeoJSON(tri, sink);
      else sink(writeMeshJSON(tri.toMesh()));
    }, (bytes) => progress.note(`${(bytes / 1e6).toFixed(0)} MB`));
    progress.done();
    console.log(`wrote ${out}: ${tri.triangleCount} triangles on ${tri.siteCount} sites` +
      (tri.mergedCount > 0 ? ` (${tri.mergedCount} repeated points merged)` : '') +
      (tri.hiddenSites.length > 0 ? `; ${tri.hiddenSites.length} hidden by their weights` : ''));
    return 0;
  } finally {
    progress.done();
  }
}
