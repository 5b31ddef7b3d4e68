import { balanceTerritories } from '../analyze/balance.js';
import { clipToStudyArea, studyAreaBounds } from '../analyze/study-area/study-area-cells.js';
import type { CellPieceList } from '../io/cells-source.js';
import type { ClippedCells } from '../diagram/cells.js';
import { paddedBounds, type ClipRegion } from '../diagram/region.js';
import { voronoi } from '../diagram/voronoi.js';
import { triangulate, type Triangulation } from '../triangulate/triangulation.js';
import { writeMeshJSON } from '../mesh/json.js';
import { writeCellTable } from '../io/cell-table.js';
import { writeGeoJSON } from '../io/geojson.js';
import { writeSVG } from '../io/svg.js';
import { optionHelp, refuseTogether, stringOption, type OptionSpec } from './args.js';
import { buildFrom, siteIds, startFileCommand } from './build.js';
import { usageError } from './exit.js';
import { writeAtomically } from './files.js';
import { asDataError, loadClipFile, loadSites, parseClipBox } from './inputs.js';
import { Progress } from './progress.js';

export const CAUTION = 'Caution: these areas are geometric (straight-line or grid distance), not travel-time service areas.\n' +
  'For emergency or regulated services, defer to local codes and licensed practice.';

export const SITE_OPTIONS: OptionSpec[] = [
  { name: 'x', value: 'column', help: 'CSV column of x (default x)' },
  { name: 'y', value: 'column', help: 'CSV column of y (default y)' },
  { name: 'weight', value: 'column', help: 'CSV column or GeoJSON property of weights' },
  { name: 'id', value: 'column', help: 'CSV column or GeoJSON property of site ids (copied to the output)' },
];

const OPTIONS: OptionSpec[] = [
  ...SITE_OPTIONS,
  { name: 'metric', value: 'L2|L1|Linf|p', help: 'distance: straight line (default), city block, chessboard, or Minkowski p >= 1 (e.g. 3)' },
  { name: 'balance', help: 'balanced territories: cells sized by the --weight column (equal without it; repeated places add up)' },
  { name: 'clip', value: 'minX,minY,maxX,maxY', help: 'clip the cells to this rectangle' },
  { name: 'clip-file', value: 'area.geojson', help: 'clip the cells to the polygon(s) of a GeoJSON file (holes and non-convex outlines: GeoJSON output, cells in pieces)' },
  { name: 'out', value: 'file', help: 'output file (required): .geojson, .svg, .json (ambit mesh) or .csv (cell table)' },
  { name: 'format', value: 'geojson|svg|json|csv', help: 'output format, when the extension does not say' },
  { name: 'triangulation', help: 'SVG: also draw the Delaunay triangulation' },
  { name: 'decimals', value: 'n', help: 'GeoJSON: round coordinates to n decimals (default: exact); SVG: picture decimals (default 2)' },
  { name: 'help', help: 'show this help' },
];

export const CELLS_HELP = `ambit cells: the cell of every site (Voronoi, power or metric diagram), clipped to a region

Usage: ambit cells <sites.csv|.geojson|.json> --out <file> [options]

Sites come from a CSV file with a header row (columns x and y, or those named by --x and --y), GeoJSON Point or
MultiPoint features, an ambit.triangulation or ambit.mesh JSON file, or a JSON array of [x, y] points.
With --weight (and no --balance) the cells are power cells: |p - s|^2 - w decides. Without a clip region the
cells are clipped to the sites' bounding box padded by 10%.

Options:
${optionHelp(OPTIONS)}

Example:
  ambit cells depots.csv --id name --clip 0,0,1000,800 --out depots.geojson
  ambit cells depots.csv --metric L1 --out depots.svg --triangulation

${CAUTION}`;

const METRICS: Record<string, 'L2' | 'L1' | 'Linf'> = { l2: 'L2', l1: 'L1', linf: 'Linf', 'l∞': 'Linf' };

function readDecimals(text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const v = Number(text);
  if (!/^\d+$/.test(text) || v > 15) throw usageError(`--decimals takes a whole number 0..15, got '${text}'`);
  return v;
}

/** Each site's pieces inside a study area (holes, several polygons, non-convex outlines). */
function studyAreaPieces(diagram: ClippedCells, polygons: Float64Array[][]): CellPieceList {
  const cut = clipToStudyArea(diagram, polygons);
  return Array.from({ length: cut.siteCount }, (_, s) => cut.pieces(s));
}

export function runCells(argv: readonly string[]): number {
  const start = startFileCommand(argv, OPTIONS, 'cells', CELLS_HELP, ['geojson', 'svg', 'json', 'csv']);
  if (start === null) return 0;
  const { args, file, out, format } = start;
  refuseTogether(args, 'clip', 'clip-file', 'give one clip region');
  refuseTogether(args, 'balance', 'metric', 'balanced territories are power diagrams, Euclidean only');
  const metricText = stringOption(args, 'metric') ?? 'L2';
  // A name, or the exponent p >= 1 of a Minkowski distance written as a plain number (3, 1.5).
  const exponent = /^\d+(\.\d+)?$/.test(metricText) ? Number(metricText) : NaN;
  const metric: 'L2' | 'L1' | 'Linf' | number | undefined = METRICS[metricText.toLowerCase()] ?? (exponent >= 1 ? exponent : undefined);
  if (metric === undefined) throw usageError(`--metric takes L2, L1, Linf or a number p >= 1 (Minkowski), got '${metricText}'`);
  if (metric !== 'L2' && args.values.has('weight')) throw usageError('--weight and --metric cannot be used together: weighted (power) cells need the Euclidean metric (L2)');
  if (args.values.has('triangulation') && format !== 'svg') throw usageError('--triangulation applies to SVG output only');
  if (args.values.has('decimals') && format !== 'svg' && format !== 'geojson') throw usageError('--decimals applies to GeoJSON and SVG output only');
  const decimals = readDecimals(stringOption(args, 'decimals'));
  const cols = { x: stringOption(args, 'x'), y: stringOption(args, 'y'), weight: stringOption(args, 'weight'), id: stringOption(args, 'id') };
  const clipText = stringOption(args, 'clip'), clipFile = stringOption(args, 'clip-file');
  let clip: ClipRegion | undefined = clipText === undefined ? undefined : parseClipBox(clipText);

  const progress = new Progress('ambit cells', 3);
  try {
    progress.stage(`reading ${file}`);
    const table = loadSites(file, cols);
    const area = clipFile === undefined ? undefined : loadClipFile(clipFile);
    if (area?.kind === 'convex') clip = area.ring;
    if (area?.kind === 'study-area') {
      if (format !== 'geojson') throw usageError(`${clipFile} has holes, several polygons or a non-convex outline: cells cut to it come in pieces, written as GeoJSON only (--out *.geojson)`);
      if (args.values.has('balance')) throw usageError(`--balance needs a convex clip region; ${clipFile} has holes, several polygons or a non-convex outline`);
      clip = studyAreaBounds(area.polygons);
    }
    progress.stage('building cells');
    const clipSource = clipFile ?? '--clip';
    // Balancing needs distinct sites: records at one place merge first (as every diagram merges them), and their
    // weights add up, so two facilities sharing a building share one territory sized for both.
    let merged: Triangulation | null = null;
    const diagram: ClippedCells = buildFrom(file, table, clipSource, () => {
      if (args.values.has('balance')) {
        const region = clip ?? paddedBounds(table.xy, table.xy.length >> 1);
        merged = triangulate(table.xy);
        let shares: Float64Array | undefined;
        if (table.weights) {
          shares = new Float64Array(merged.siteCount);
          table.weights.forEach((w, i) => { shares![merged!.siteOfInput[i]] += w; });
        }
        return balanceTerritories(merged.siteXY, { clip: region, shares }).diagram;
      }
      return voronoi(table.xy, { clip, metric, weights: table.weights ?? undefined });
    });
    const tri: Triangulation = merged ?? diagram.triangulation;
    const ids = siteIds(table.ids, tri.siteOfInput, tri.siteCount);
    const pieces = area?.kind === 'study-area' ? asDataError(clipSource, () => studyAreaPieces(diagram, area.polygons)) : null;
    progress.stage(`writing ${out}`);
    writeAtomically(out, (sink) => {
      if (pieces !== null) writeGeoJSON(pieces, sink, { ids, decimals });
      else if (format === 'geojson') writeGeoJSON(diagram, sink, { ids, decimals });
      else if (format === 'svg') writeSVG(diagram, sink, { triangulation: args.values.has('triangulation'), decimals, title: file });
      else if (format === 'csv') writeCellTable(diagram, sink, ids);
      else sink(writeMeshJSON(diagram.mesh));
    }, (bytes) => progress.note(`${(bytes / 1e6).toFixed(0)} MB`));
    progress.done();
    const missing = pieces === null ? diagram.sitesWithoutCell.length : pieces.filter((p) => p.length === 0).length;
    console.log(`wrote ${out}: ${tri.siteCount - missing} cells from ${tri.inputCount} points` +
      (tri.mergedCount > 0 ? ` (${tri.mergedCount} repeated points merged)` : '') +
      (missing > 0 ? `; ${missing} sites have no cell in the region` : ''));
    return 0;
  } finally {
    progress.done();
  }
}
