import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { BOUNDARY, FACILITIES } from '../../src/cli/demo-data.js';

// The command-line demo (src/cli/demo-data.ts) and the library walk-through (examples/demo.mjs reading
// examples/data/quillon-vale.json) describe the same invented town: same records, same places, same limit.
describe('demo data', () => {
  const town = JSON.parse(readFileSync(new URL('../../examples/data/quillon-vale.json', import.meta.url), 'utf8'));
  it('has the same facilities and boundary as the example data', () => {
    expect(FACILITIES.map(({ id, name, kind, x, y }) => ({ id, name, kind, x, y }))).toEqual(town.facilities);
    expect(BOUNDARY.map((p) => [...p])).toEqual(town.boundary.ring);
  });
  it('gives every facility a positive capacity', () => {
    for (const f of FACILITIES) expect(f.capacity).toBeGreaterThan(0);
  });
});
