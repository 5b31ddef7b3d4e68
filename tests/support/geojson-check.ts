// An RFC 7946 validity checker of our own, for the polygon output ambit writes. The rules checked, from RFC 7946
// (IETF, 2016): a FeatureCollection has "features", an array of Features (section 3.3); a Feature has "geometry"
// and "properties", an object or null (3.2); a Polygon's coordinates are an array of linear rings, a MultiPolygon's
// an array of such arrays (3.1.6, 3.1.7); a position is an array of two or three numbers (3.1.1); a linear ring is
// closed, with four or more positions, its first and last equivalent (3.1.6); exterior rings are counter-clockwise
// and holes clockwise (3.1.6, the right-hand rule; "counter-clockwise" with y pointing up). Members we never write
// (bbox, foreign members) are not checked.

type Json = unknown;

const isObject = (v: Json): v is Record<string, Json> => v !== null && typeof v === 'object' && !Array.isArray(v);

/** Twice the signed area of a closed ring (last position = first), relative to its first position. */
export function signedArea2(ring: readonly (readonly number[])[]): number {
  const [ox, oy] = ring[0];
  let a = 0;
  for (let i = 1; i + 1 < ring.length; i++) {
    a += (ring[i][0] - ox) * (ring[i + 1][1] - oy) - (ring[i + 1][0] - ox) * (ring[i][1] - oy);
  }
  return a;
}

function checkRing(ring: Json, path: string, exterior: boolean, problems: string[]): void {
  if (!Array.isArray(ring)) { problems.push(`${path}: not an array`); return; }
  if (ring.length < 4) problems.push(`${path}: ${ring.length} positions, a linear ring needs at least 4`);
  let ok = true;
  ring.forEach((p, k) => {
    if (!Array.isArray(p) || p.length < 2 || p.length > 3 || !p.every((v) => typeof v === 'number' && Number.isFinite(v))) {
      problems.push(`${path}[${k}]: not a position of 2 or 3 finite numbers`);
      ok = false;
    }
  });
  if (!ok || ring.length < 4) return;
  const first = ring[0] as number[], last = ring[ring.length - 1] as number[];
  if (first[0] !== last[0] || first[1] !== last[1]) problems.push(`${path}: not closed (last position differs from the first)`);
  const a = signedArea2(ring as number[][]);
  if (exterior && !(a > 0)) problems.push(`${path}: exterior ring is not counter-clockwise (signed area ${a / 2})`);
  if (!exterior && !(a < 0)) problems.push(`${path}: hole is not clockwise (signed area ${a / 2})`);
}

function checkPolygon(rings: Json, path: string, problems: string[]): void {
  if (!Array.isArray(rings) || rings.length === 0) { problems.push(`${path}: a polygon is a non-empty array of rings`); return; }
  rings.forEach((r, k) => checkRing(r, `${path}[${k}]`, k === 0, problems));
}

/** Every RFC 7946 rule above that the value breaks, as readable lines (empty: valid). */
export function geoJSONProblems(root: Json): string[] {
  const problems: string[] = [];
  if (!isObject(root) || root.type !== 'FeatureCollection') return ['root: not a FeatureCollection'];
  if (!Array.isArray(root.features)) return ['features: not an array'];
  root.features.forEach((f, i) => {
    const at = `features[${i}]`;
    if (!isObject(f) || f.type !== 'Feature') { problems.push(`${at}: not a Feature`); return; }
    if (!('properties' in f) || !(f.properties === null || isObject(f.properties))) problems.push(`${at}.properties: not an object or null`);
    const g = f.geometry;
    if (!isObject(g)) { problems.push(`${at}.geometry: not an object`); return; }
    if (g.type === 'Polygon') checkPolygon(g.coordinates, `${at}.geometry.coordinates`, problems);
    else if (g.type === 'MultiPolygon') {
      if (!Array.isArray(g.coordinates) || g.coordinates.length === 0) problems.push(`${at}.geometry.coordinates: a MultiPolygon needs polygons`);
      else g.coordinates.forEach((p, k) => checkPolygon(p, `${at}.geometry.coordinates[${k}]`, problems));
    } else problems.push(`${at}.geometry.type: ${String(g.type)}, expected Polygon or MultiPolygon`);
  });
  return problems;
}
