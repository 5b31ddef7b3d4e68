import { describe, expect, it } from 'vitest';
import { writeShortest } from '../../src/io/shortest-number.js';
import { ByteText, collectText } from '../../src/io/text-sink.js';

const buf = new Uint8Array(64);
const text = (x: number): string => {
  const end = writeShortest(x, buf, 0);
  return String.fromCharCode(...buf.subarray(0, end));
};

// Outside reference: the engine's own String(x), which follows ECMAScript's Number::toString (the fewest digits that
// read back to x, the nearest such when several; the rule as recalled from the specification, from memory).
// A fixed generator (Marsaglia's xorshift, 2003, from memory): the same values every run.
let state = 2463534242;
const rand = (): number => {
  state ^= state << 13; state >>>= 0; state ^= state >>> 17; state ^= state << 5; state >>>= 0;
  return state / 2 ** 32;
};
const f64 = new Float64Array(1), u32 = new Uint32Array(f64.buffer);
/** The doubles just below and above v (by one unit in the last place). */
const neighbours = (v: number): number[] => {
  f64[0] = v; u32[0] -= 1; const below = f64[0];
  f64[0] = v; u32[0] += 1; const above = f64[0];
  return [below, above];
};

/** Values that stress each decision: random doubles at every magnitude, short decimals and their neighbours, ties. */
function values(count: number): number[] {
  const out: number[] = [0, -0, 1, -1, 0.1, 0.2, 0.3, 1 / 3, 2 / 3, 5e-324, 2.2250738585072014e-308, Number.MAX_VALUE, 2 ** 53, 2 ** 53 + 2,
    1e-7, 1e-6, 9.999999999999999e-7, 1e21, 1e15, 999999999999999.9, 1e14, 123456789012345680, 0.000001, 1e-31, 9.99e-32, 4.35, 0.5, 0.25, 0.125];
  for (let i = 0; i < count; i++) {
    out.push(rand(), rand() * 10 ** Math.floor(rand() * 90 - 45), -rand() * 1000);
    u32[0] = (rand() * 2 ** 32) >>> 0; u32[1] = (rand() * 2 ** 32) >>> 0;
    if (Number.isFinite(f64[0])) out.push(f64[0]);
    // Decimals with few digits (the shortest text is short) and the doubles next to them (it is long).
    const short = Number(rand().toPrecision(1 + Math.floor(rand() * 17))) * 10 ** Math.floor(rand() * 40 - 25);
    out.push(short, ...neighbours(short));
    // Midpoints of two short decimals: near-ties between two candidates of one length.
    const k = Math.floor(rand() * 1e6), scale = 10 ** Math.floor(rand() * 30 - 20);
    out.push((k + 0.5) * scale, ...neighbours((k + 0.5) * scale));
    out.push(Math.floor(rand() * 2 ** 53), 2 ** Math.floor(rand() * 200 - 100));
  }
  return out;
}

describe('shortest round-trip number text', () => {
  it('is String(x), byte for byte, on a wide mix of doubles', () => {
    const mismatches: string[] = [];
    for (const v of values(100_000)) {
      const got = text(v);
      if (got !== String(v) && mismatches.length < 10) mismatches.push(`${String(v)} written as ${got}`);
    }
    expect(mismatches).toEqual([]);
  });

  it('reads back to the same double', () => {
    for (const v of values(2_000)) expect(Object.is(Number(text(v)), v === 0 ? 0 : v)).toBe(true);
  });
});

describe('ByteText', () => {
  it('builds the same text as string concatenation, across chunk boundaries and with non-ASCII text', () => {
    const vs = values(20_000);
    let expected = '';
    const got = collectText((sink) => {
      const out = new ByteText(sink);
      vs.forEach((v, i) => {
        out.num(v); out.char(44); out.int(i); out.text(i % 1000 === 0 ? 'é"ü€' : 'id'); out.ascii(';\n'); out.row();
        expected += String(v) + ',' + i + (i % 1000 === 0 ? 'é"ü€' : 'id') + ';\n';
      });
      out.num(NaN); out.numOrEmpty(Infinity); out.end();
    });
    expect(got.length).toBeGreaterThan(2 ** 20);
    expect(got).toBe(expected + 'null');
  });

  it('hands bytes to a sink that takes them', () => {
    const parts: Uint8Array[] = [];
    const sink = Object.assign((_: string) => { throw new Error('text asked for'); }, { bytes: (b: Uint8Array) => parts.push(b.slice()) });
    const out = new ByteText(sink);
    out.ascii('x='); out.num(0.1); out.end();
    expect(new TextDecoder().decode(parts[0])).toBe('x=0.1');
  });
});
