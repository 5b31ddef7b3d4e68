// ambit library walk-through: the invented town of Quillon Vale and its facilities, through the API.
// Run after a build with `node examples/demo.mjs` (writes out/example/). `npm run demo` runs the command-line demo
// (`ambit demo`, src/cli/demo.ts) on the same town, whose data there is kept equal to data/quillon-vale.json by
// tests/unit/demo-data.test.ts.
import { readFileSync, mkdirSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';
import { triangulate, voronoi, checkMesh, writeTriangulationJSON, writeMeshJSON } from 'ambit';

const here = dirname(fileURLToPath(import.meta.url));
const town = JSON.parse(readFileSync(join(here, 'data', 'quillon-vale.json'), 'utf8'));
const facilities = town.facilities;

const tri = triangulate(facilities.map((f) => ({ x: f.x, y: f.y })));
const check = checkMesh(tri.toMesh());

// Name every site by the first facility record that landed on it.
const nameOfSite = [];
facilities.forEach((f, i) => { nameOfSite[tri.siteOfInput[i]] ??= f.name; });

console.log('ambit library walk-through: Quillon Vale (an invented town)');
console.log(`  ${facilities.length} facility records -> ${tri.siteCount} sites (${tri.mergedCount} merged duplicate)`);
facilities.forEach((f, i) => {
  const s = tri.siteOfInput[i];
  if (nameOfSite[s] !== f.name) console.log(`    record ${f.id} "${f.name}" shares its location with "${nameOfSite[s]}"`);
});
console.log(`  Delaunay triangulation: ${tri.triangleCount} triangles, ${tri.edges().length / 2} edges, mesh valid: ${check.ok}`);
console.log(`  outermost facilities (hull, counter-clockwise): ${Array.from(tri.hull(), (s) => nameOfSite[s]).join(', ')}`);
console.log('  nearest-neighbour structure (Delaunay neighbours of each facility):');
for (let s = 0; s < tri.siteCount; s++) {
  console.log(`    ${nameOfSite[s].padEnd(24)} ${Array.from(tri.neighbors(s), (t) => nameOfSite[t]).join(', ')}`);
}

// Straight-line service areas: each facility's Voronoi cell inside the town limit.
const areas = voronoi(tri, { clip: town.boundary.ring });
const km2 = areas.cellAreas();
console.log('  straight-line service areas inside the town limit (Voronoi cells):');
for (let s = 0; s < tri.siteCount; s++) {
  const n = areas.cellNeighbors(s).sites.length;
  console.log(`    ${nameOfSite[s].padEnd(24)} ${(km2[s] / 1e6).toFixed(2).padStart(6)} km²  ${n} neighbouring areas`);
}
console.log(`    total ${(areas.totalArea() / 1e6).toFixed(2)} km² (the town limit), mesh valid: ${checkMesh(areas.mesh).ok}`);
const probe = { x: 532000, y: 6181000 };
console.log(`  nearest facility to the point (${probe.x}, ${probe.y}): ${nameOfSite[areas.nearest(probe.x, probe.y)]}`);

const out = join(here, '..', 'out', 'example');
mkdirSync(out, { recursive: true });
writeFileSync(join(out, 'triangulation.json'), writeTriangulationJSON(tri));
writeFileSync(join(out, 'mesh.json'), writeMeshJSON(tri.toMesh()));
writeFileSync(join(out, 'service-areas.json'), writeMeshJSON(areas.mesh));
console.log('  wrote out/example/triangulation.json, out/example/mesh.json and out/example/service-areas.json');
console.log('  Caution: these are straight-line geometric neighbourhoods, not travel-time service areas.');
console.log('  For emergency or regulated services, defer to local codes and licensed practice.');
