import { describe, expect, it } from 'vitest';
import { AmbitError, balanceTerritories, InputError, relax, triangulate, voronoi, type Triangulation } from '../../src/index.js';

interface Expected { code: string; index: number; field: string }

/** Runs fn, which must throw an InputError with exactly these code, index and field. */
function expectInputError(fn: () => unknown, want: Expected): InputError {
  let caught: unknown;
  let result: unknown;
  try {
    result = fn();
  } catch (e) {
    caught = e;
  }
  expect(result, 'no partial result may be returned').toBeUndefined();
  expect(caught).toBeInstanceOf(InputError);
  expect(caught).toBeInstanceOf(AmbitError);
  const err = caught as InputError;
  expect({ code: err.code, index: err.index, field: err.field }).toEqual(want);
  // Readable: a sentence that names the offending point (or, for an odd
  // length, the length itself).
  expect(err.message.length).toBeGreaterThan(10);
  if (want.code === 'odd-length') expect(err.message).toMatch(/odd length \d+/);
  else if (want.index >= 0) expect(err.message).toContain(String(want.index));
  return err;
}

// Cast helper for deliberately ill-typed input.
const bad = (v: unknown) => v as Parameters<typeof triangulate>[0];

describe('triangulate rejects bad input with a typed error naming the first bad point', () => {
  const cases: [string, unknown, Expected][] = [
    ['NaN x', [0, 0, 1, 0, NaN, 1], { code: 'not-finite', index: 2, field: 'x' }],
    ['NaN y in pairs', [[0, 0], [1, NaN], [0, 1]], { code: 'not-finite', index: 1, field: 'y' }],
    ['+Infinity', [0, 0, 1, Infinity, 0, 1], { code: 'not-finite', index: 1, field: 'y' }],
    ['-Infinity in objects', [{ x: 0, y: 0 }, { x: -Infinity, y: 0 }], { code: 'not-finite', index: 1, field: 'x' }],
    ['2^121', [0, 0, 2 ** 121, 0, 0, 1], { code: 'out-of-range', index: 1, field: 'x' }],
    ['-2^121', [0, 0, 1, 0, 0, -(2 ** 121)], { code: 'out-of-range', index: 2, field: 'y' }],
    ['2^-121 (nonzero, too small)', [0, 0, 1, 2 ** -121, 0, 1], { code: 'out-of-range', index: 1, field: 'y' }],
    ['-2^-121', [[-(2 ** -121), 0], [1, 0], [0, 1]], { code: 'out-of-range', index: 0, field: 'x' }],
    ['subnormal', [0, 0, 1, 0, Number.MIN_VALUE, 1], { code: 'out-of-range', index: 2, field: 'x' }],
    ['largest double', Float64Array.of(0, 0, Number.MAX_VALUE, 1), { code: 'out-of-range', index: 1, field: 'x' }],
    ['odd-length flat array', [0, 0, 1, 0, 2], { code: 'odd-length', index: 2, field: 'points' }],
    ['odd-length Float64Array', Float64Array.of(0, 0, 1), { code: 'odd-length', index: 1, field: 'points' }],
    ['string entry', [0, 0, 1, '2', 0, 1], { code: 'not-a-number', index: 1, field: 'y' }],
    ['null entry', [0, 0, null, 0], { code: 'not-a-number', index: 1, field: 'x' }],
    ['undefined entry', [0, 0, 1, undefined], { code: 'not-a-number', index: 1, field: 'y' }],
    ['boolean entry', [true, 0, 1, 1], { code: 'not-a-number', index: 0, field: 'x' }],
    ['string in a pair', [[0, 0], ['1', 1]], { code: 'not-a-number', index: 1, field: 'x' }],
    ['null in an object', [{ x: 0, y: 0 }, { x: 1, y: null }], { code: 'not-a-number', index: 1, field: 'y' }],
    ['object missing y', [{ x: 0, y: 0 }, { x: 1 }], { code: 'not-a-number', index: 1, field: 'y' }],
    ['empty array', [], { code: 'empty', index: -1, field: 'points' }],
    ['empty Float64Array', new Float64Array(0), { code: 'empty', index: -1, field: 'points' }],
    ['null', null, { code: 'bad-points', index: -1, field: 'points' }],
    ['a number', 42, { code: 'bad-points', index: -1, field: 'points' }],
    ['a plain object', { x: 1, y: 2 }, { code: 'bad-points', index: -1, field: 'points' }],
    ['mixed: pairs then a number', [[0, 0], 1, 2], { code: 'bad-point', index: 1, field: 'points' }],
    ['mixed: pairs then null', [[0, 0], [1, 1], null], { code: 'bad-point', index: 2, field: 'points' }],
    ['mixed: objects then a number', [{ x: 0, y: 0 }, 3], { code: 'bad-point', index: 1, field: 'points' }],
    ['mixed: flat then a pair', [0, 0, [1, 1], 2], { code: 'not-a-number', index: 1, field: 'x' }],
    ['weight on some points only', [[0, 0], [1, 1, 1]], { code: 'bad-point', index: 1, field: 'w' }],
    ['pair of length 4', [[0, 0], [1, 1], [2, 0, 1, 1]], { code: 'bad-point', index: 2, field: 'points' }],
    ['pair of length 1', [[0, 0], [1, 0], [1]], { code: 'bad-point', index: 2, field: 'points' }],
    ['empty pair', [[], [1, 0]], { code: 'bad-point', index: 0, field: 'points' }],
    ['first of several bad points', [0, 0, NaN, 0, 'a', 0, Infinity, 1], { code: 'not-finite', index: 1, field: 'x' }],
    ['x reported before y', [[0, 0], [1, 1], [Infinity, NaN], [null, 0]], { code: 'not-finite', index: 2, field: 'x' }],
  ];
  for (const [name, input, want] of cases) {
    it(`${name} -> ${want.code} at point ${want.index} (${want.field})`, () => {
      expectInputError(() => triangulate(bad(input)), want);
    });
  }

  it('rejects an unknown insertion order', () => {
    const e = expectInputError(
      () => triangulate([0, 0, 1, 0, 0, 1], { order: 'zigzag' as 'input' }),
      { code: 'bad-option', index: -1, field: 'order' },
    );
    expect(e.message).toContain('zigzag');
  });

  it('rejects a misspelt option of any builder, naming it, instead of ignoring it', () => {
    const pts = [0, 0, 1, 0, 0, 1];
    const cases: [string, () => unknown][] = [
      ['metirc', () => voronoi(pts, { metirc: 'L1' } as never)],
      ['construction', () => voronoi(pts, { construction: 'sweep' } as never)],
      ['wieghts', () => triangulate(pts, { wieghts: [1, 2, 3] } as never)],
      ['step', () => relax(pts, { clip: { minX: 0, minY: 0, maxX: 1, maxY: 1 }, step: 5 } as never)],
      ['share', () => balanceTerritories(pts, { clip: { minX: 0, minY: 0, maxX: 1, maxY: 1 }, share: [1, 1, 1] } as never)],
    ];
    for (const [key, call] of cases) {
      const e = expectInputError(call, { code: 'bad-option', index: -1, field: key });
      expect(e.message).toContain(`unknown option '${key}'`);
    }
    expectInputError(() => voronoi(pts, [] as never), { code: 'bad-option', index: -1, field: 'options' });
  });
});

describe('accepted edges of the range', () => {
  it('accepts 2^120 and 2^-120 exactly, and zero', () => {
    const big = triangulate([0, 0, 2 ** 120, 0, 0, 2 ** 120, -(2 ** 120), -(2 ** 120)]);
    expect(big.dimension).toBe(2);
    expect(big.triangleCount).toBe(3); // (0, 0) lies inside the other three
    expect(Array.from(big.hull())).toEqual([3, 1, 2]);
    const tiny = triangulate([0, 0, 2 ** -120, 0, 0, 2 ** -120]);
    expect(tiny.dimension).toBe(2);
    expect(tiny.triangleCount).toBe(1);
  });
});

function snapshot(t: Triangulation) {
  return {
    siteCount: t.siteCount,
    inputCount: t.inputCount,
    mergedCount: t.mergedCount,
    dimension: t.dimension,
    siteXY: Array.from(t.siteXY.subarray(0, 2 * t.siteCount)),
    siteOfInput: Array.from(t.siteOfInput),
    triangleSites: Array.from(t.triangleSites),
    hull: Array.from(t.hull()),
  };
}

describe('insert() with bad points changes nothing', () => {
  for (const [name, batch, want] of [
    ['NaN in the second point', [[5, 5], [NaN, 0]], { code: 'not-finite', index: 1, field: 'x' }],
    ['odd-length batch', [5, 5, 6], { code: 'odd-length', index: 1, field: 'points' }],
    ['out of range', [7, 7, 8, 8, 9, 2 ** 121], { code: 'out-of-range', index: 2, field: 'y' }],
  ] as [string, unknown, Expected][]) {
    it(name, () => {
      for (const start of [[[0, 0], [4, 0], [4, 4], [0, 4], [1, 2]], [[0, 0], [1, 1]], [[3, 3]]]) {
        const t = triangulate(start as [number, number][]);
        const before = snapshot(t);
        expectInputError(() => t.insert(bad(batch)), want);
        expect(snapshot(t)).toEqual(before);
      }
    });
  }
});

describe('layouts', () => {
  // Cocircular square corners, a duplicate and an interior point: the tie-break
  // between diagonals must not depend on the layout either.
  const pairs: [number, number][] = [[0, 0], [3, 0], [3, 3], [0, 3], [1, 2], [3, 0], [5, 1.5], [-0.25, 4]];
  const flat = pairs.flat();

  it('flat number[], Float64Array, [x, y] pairs and {x, y} objects give identical triangulations', () => {
    const want = snapshot(triangulate(flat));
    expect(want.triangleSites.length).toBeGreaterThan(0);
    expect(snapshot(triangulate(Float64Array.from(flat)))).toEqual(want);
    expect(snapshot(triangulate(pairs))).toEqual(want);
    expect(snapshot(triangulate(pairs.map(([x, y]) => ({ x, y }))))).toEqual(want);
  });

  it('treats -0 as 0', () => {
    const withNeg = triangulate([-0, 0, 1, -0, -0, 1, 0, 0]);
    expect(withNeg.siteCount).toBe(3);
    expect(withNeg.mergedCount).toBe(1);
    expect(Array.from(withNeg.siteOfInput)).toEqual([0, 1, 2, 0]);
    expect(Object.is(withNeg.siteXY[0], 0)).toBe(true);
    expect(Object.is(withNeg.siteXY[3], 0)).toBe(true);
    expect(snapshot(withNeg).triangleSites).toEqual(snapshot(triangulate([0, 0, 1, 0, 0, 1, 0, 0])).triangleSites);
  });
});
