import { describe, expect, it } from 'vitest';
import { FormatError } from '../../src/index.js';
import { cellTableCSV } from '../../src/io/cell-table.js';
import { forEachCSVRecord, readCSVSites } from '../../src/io/csv.js';
import { voronoi } from '../../src/index.js';

const records = (text: string): [string[], number][] => {
  const out: [string[], number][] = [];
  forEachCSVRecord(text, (f, line) => out.push([f, line]));
  return out;
};

describe('CSV records', () => {
  it('splits quoted fields with commas, doubled quotes and line breaks, CRLF, a BOM and blank lines', () => {
    expect(records('\ufeffa,b\r\n"x, y","say ""hi"""\r\n\r\n"two\nlines",3\n4,\n')).toEqual([
      [['a', 'b'], 1], [['x, y', 'say "hi"'], 2], [['two\nlines', '3'], 4], [['4', ''], 6],
    ]);
  });
  it('names the line of a broken quote', () => {
    expect(() => records('a,b\n"open,1\n')).toThrow(/^line 2: a quoted field is never closed/);
    expect(() => records('a,b\n"x"y,1\n')).toThrow(/^line 2: unexpected text after a closing quote/);
  });
});

describe('readCSVSites', () => {
  it('reads named columns, weights and ids', () => {
    const t = readCSVSites('id,east,north,w\nA,1.5,-2e3,4\n"B, annex",+3,.5,0\n', { x: 'east', y: 'north', weight: 'w', id: 'id' });
    expect(Array.from(t.xy)).toEqual([1.5, -2000, 3, 0.5]);
    expect(Array.from(t.weights!)).toEqual([4, 0]);
    expect(t.ids).toEqual(['A', 'B, annex']);
    expect(t.where(1)).toBe('line 3');
  });
  it('refuses what is not a decimal number, with the line and column', () => {
    for (const [bad, msg] of [['0x10', /"0x10" is not a number/], ['Infinity', /"Infinity" is not a number/], ['', /the field is empty/], ['1,5', /3 fields/]] as const) {
      const text = `x,y\n1,2\n${bad.includes(',') ? `"${bad}"` : bad},2\n`.replace('"1,5"', '1,5');
      expect(() => readCSVSites(text), bad).toThrow(msg);
    }
    try {
      readCSVSites('x,y\n1,2\n3,abc\n');
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(FormatError);
      expect((err as FormatError).path).toBe('line 3, column "y"');
    }
  });
  it('refuses empty input and missing columns', () => {
    expect(() => readCSVSites('')).toThrow(/^line 1: the file is empty/);
    expect(() => readCSVSites('x,y\n')).toThrow(/^line 2: no rows/);
    expect(() => readCSVSites('x,y\n1,2\n', { weight: 'w' })).toThrow(/^line 1: no column "w" for weights; the header has "x", "y"/);
  });
});

describe('cellTableCSV', () => {
  it('one row per site, ids quoted when needed, measures exact', () => {
    // Collinear sites: the bisectors x = 2 and x = 52 are exact, so are the measures; the third cell misses the region.
    const d = voronoi([[0, 0], [4, 0], [100, 0]], { clip: { minX: 0, minY: 0, maxX: 4, maxY: 2 } });
    expect(cellTableCSV(d, ['a,b', 'c', 'far']).split('\n')).toEqual([
      'site,id,x,y,area,perimeter,centroid_x,centroid_y,neighbors',
      '0,"a,b",0,0,4,8,1,1,1',
      '1,c,4,0,4,8,3,1,1',
      '2,far,100,0,0,0,,,0',
      '',
    ]);
  });
});
