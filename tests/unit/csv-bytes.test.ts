import { describe, expect, it } from 'vitest';
import { readCSVSiteBytes, readCSVSites, type CSVSiteOptions } from '../../src/io/csv.js';
import { parseDecimal } from '../../src/io/decimal-bytes.js';

const utf8 = (s: string): Uint8Array => new TextEncoder().encode(s);

// Outside reference: the engine's own Number(text), which ECMAScript requires to round correctly to the nearest
// double (as recalled from the specification, from memory).
// A fixed generator (Marsaglia's xorshift, 2003, from memory): the same values every run.
let state = 88172645;
const rand = (): number => {
  state ^= state << 13; state >>>= 0; state ^= state >>> 17; state ^= state << 5; state >>>= 0;
  return state / 2 ** 32;
};

const NUMBER = /^[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?$/;
const parse = (s: string): number => { const b = utf8(s); return parseDecimal(b, 0, b.length); };

/** The exact decimal digits of the midpoint between a positive double and the next one up, and where its point goes. */
function midpointDigits(x: number): { digits: string; point: number } {
  const f = new Float64Array([x]), u = new Uint32Array(f.buffer);
  const m = (BigInt(u[1] & 0xfffff) + (1n << 20n)) * (1n << 32n) + BigInt(u[0]);
  const sh = ((u[1] >>> 20) & 0x7ff) - 1076; // midpoint = (2m + 1) * 2^sh
  if (sh >= 0) { const digits = ((2n * m + 1n) << BigInt(sh)).toString(); return { digits, point: digits.length }; }
  const digits = ((2n * m + 1n) * 5n ** BigInt(-sh)).toString();
  return { digits, point: digits.length + sh };
}

describe('decimal numbers read from bytes', () => {
  it('give Number(text) for plain decimals, NaN for anything else', () => {
    const texts = ['0', '-0', '+0', '-0.000', '0e5', '5.', '.5', '1e400', '-1e-400', '9007199254740993', '9007199254740992',
      '12345678901234567', '123456789012345678', '1.7976931348623157e308', '4.9e-324', '2.2250738585072014e-308', '00012.50',
      '', '.', '-', '+', 'e5', '.e5', '1e', '1e+', '0x10', ' 1', '1 ', '1.2.3', 'Infinity', 'NaN', '1,5', '1e5.5', '١'];
    for (let i = 0; i < 20_000; i++) {
      texts.push(String(rand()), String(rand() * 10 ** Math.floor(rand() * 60 - 30)), (rand() * 1000).toFixed(Math.floor(rand() * 20)),
        rand().toPrecision(1 + Math.floor(rand() * 21)), (rand() * 1e6).toExponential(Math.floor(rand() * 20)));
      let d = '';
      const len = 15 + Math.floor(rand() * 4);
      for (let k = 0; k < len; k++) d += Math.floor(rand() * 10);
      const p = Math.floor(rand() * (len + 1));
      texts.push((rand() < 0.5 ? '-' : '') + d.slice(0, p) + '.' + d.slice(p));
    }
    for (const t of texts) expect(Object.is(parse(t), NUMBER.test(t) ? Number(t) : NaN), t).toBe(true);
  });

  it('round correctly next to the midpoint between two doubles', () => {
    for (let i = 0; i < 20_000; i++) {
      const { digits, point } = midpointDigits(rand() * 10 ** Math.floor(rand() * 30 - 12));
      const lead = digits.search(/[1-9]/);
      for (const sig of [16, 17]) {
        const cut = digits.slice(lead, lead + sig), exp = point - lead - sig;
        // Just below the midpoint (truncated) and just above it (one more in the last digit).
        for (const t of [`${cut}e${exp}`, `${BigInt(cut) + 1n}e${exp}`]) expect(Object.is(parse(t), Number(t)), t).toBe(true);
      }
    }
  });
});

/** Both readers on one text: the same table, or the same error. */
function same(text: string, options: CSVSiteOptions = {}): void {
  let expected: unknown, got: unknown;
  const run = (f: () => ReturnType<typeof readCSVSites>): unknown => {
    try {
      const t = f();
      return { xy: Array.from(t.xy), w: t.weights && Array.from(t.weights), ids: t.ids, where: Array.from({ length: t.xy.length / 2 }, (_, i) => t.where(i)) };
    } catch (err) {
      return { error: (err as Error).constructor.name, message: (err as Error).message };
    }
  };
  expected = run(() => readCSVSites(text, options));
  got = run(() => readCSVSiteBytes(utf8(text), options));
  expect(got, JSON.stringify(text)).toEqual(expected);
}

describe('readCSVSiteBytes', () => {
  it('reads what readCSVSites reads, plain files and the rest', () => {
    same('x,y\n1,2\n3.5,-4e2\n');
    same('x,y\r\n1,2\r\n\r\n3,4');
    same('\ufeffx,y\n1,2\n');
    same('id,east,north,w\nA,1.5,-2e3,4\n"B, annex",+3,.5,0\n', { x: 'east', y: 'north', weight: 'w', id: 'id' });
    same('name,x,y\nStraße,1,2\nb,3,4\n', { id: 'name' });
    same(' x , y \n 1,2\n1,2 \n');
    same('\nx,y\n1,2\n');
    same('x,y\n1,2\r3,4\n');
    same('x,y\n1,2\n   \n3,4\n');
    same('a\n1\n2\n', { x: 'a', y: 'a' });
    const rows = ['x,y,w,id'];
    for (let i = 0; i < 3000; i++) rows.push(`${rand()},${rand() * 1e6},${rand().toPrecision(5)},s${i}`);
    same(rows.join('\n'), { weight: 'w', id: 'id' });
  });

  it('gives the same errors, with line and column', () => {
    for (const text of ['', '\n\n', 'x,y\n', 'x,y\n1,2\n3,abc\n', 'x,y\n1,2\n0x10,2\n', 'x,y\n1\n', 'x,y\n1,2,3\n', 'x,y\n,2\n',
      'x,y\n"1,2\n', 'a,b\n1,2\n', 'x,y\n1,Infinity\n']) same(text);
    same('x,y\n1,2\n', { weight: 'w' });
    same('x,y,w\n1,2,\n', { weight: 'w' });
  });
});
