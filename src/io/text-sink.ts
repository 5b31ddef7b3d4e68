import { InputError } from '../core/errors.js';
import { writeShortest } from './shortest-number.js';

/**
 * Receives output text in pieces of about a megabyte, so huge outputs never
 * become one string. A sink that also has a `bytes` method is given the
 * UTF-8 bytes of each piece there instead (valid only during the call): a
 * file writer then skips making text and encoding it again.
 */
export type TextSink = ((chunk: string) => void) & { bytes?: (chunk: Uint8Array) => void };

const CHUNK = 1 << 20;

/** Collects small strings and hands them to a sink in large chunks. */
export class ChunkedText {
  private buf = '';
  constructor(private readonly sink: TextSink) {}
  add(s: string): void {
    this.buf += s;
    if (this.buf.length >= CHUNK) { this.sink(this.buf); this.buf = ''; }
  }
  end(): void {
    if (this.buf.length > 0) this.sink(this.buf);
    this.buf = '';
  }
}

// Room kept free after each row's start: a number needs at most 25 bytes.
const SLACK = 64;
let utf8Decoder: InstanceType<typeof TextDecoder> | null = null;
let utf8Encoder: InstanceType<typeof TextEncoder> | null = null;

/**
 * Builds output as UTF-8 bytes in a reused buffer and hands it to a sink
 * about a megabyte at a time: numbers are written digit by digit, with no
 * string per number or per row.
 */
export class ByteText {
  private buf = new Uint8Array(CHUNK + SLACK);
  private pos = 0;
  constructor(private readonly sink: TextSink) {}

  /** The exact shortest round-trip text of a number (String(v)); null when not finite (JSON has no NaN). */
  num(v: number): void {
    if (this.pos + 32 > this.buf.length) this.flush();
    if (Number.isFinite(v)) this.pos = writeShortest(v, this.buf, this.pos);
    else this.ascii('null');
  }

  /** A number as num() does, but nothing when it is not finite (an empty CSV field). */
  numOrEmpty(v: number): void {
    if (Number.isFinite(v)) this.num(v);
  }

  /** A whole number 0 <= v < 2^31. */
  int(v: number): void {
    if (this.pos + 16 > this.buf.length) this.flush();
    const b = this.buf;
    let pos = this.pos;
    if (v < 10) { b[pos++] = 48 + v; this.pos = pos; return; }
    let digits = 0;
    for (let t = v; t > 0; t = (t / 10) | 0) digits++;
    pos += digits;
    for (let i = 1, t = v; i <= digits; i++) { const q = (t / 10) | 0; b[pos - i] = 48 + t - q * 10; t = q; }
    this.pos = pos;
  }

  /** One character given by its code (below 128). */
  char(c: number): void {
    if (this.pos + 1 > this.buf.length) this.flush();
    this.buf[this.pos++] = c;
  }

  /** Text of ASCII characters (markup and separators). */
  ascii(s: string): void {
    if (this.pos + s.length > this.buf.length) this.flushFor(s.length);
    const b = this.buf;
    let pos = this.pos;
    for (let i = 0; i < s.length; i++) b[pos++] = s.charCodeAt(i);
    this.pos = pos;
  }

  /** Any text, encoded as UTF-8 (ids and titles). */
  text(s: string): void {
    let ascii = true;
    for (let i = 0; i < s.length; i++) if (s.charCodeAt(i) >= 128) { ascii = false; break; }
    if (ascii) { this.ascii(s); return; }
    utf8Encoder ??= new TextEncoder();
    const bytes = utf8Encoder.encode(s);
    if (this.pos + bytes.length > this.buf.length) this.flushFor(bytes.length);
    this.buf.set(bytes, this.pos);
    this.pos += bytes.length;
  }

  /** Call between rows: passes a full buffer on. */
  row(): void {
    if (this.pos >= CHUNK) this.flush();
  }

  /** Passes on what is left. */
  end(): void {
    if (this.pos > 0) this.flush();
  }

  private flushFor(n: number): void {
    this.flush();
    if (n > this.buf.length) this.buf = new Uint8Array(n + SLACK);
  }

  private flush(): void {
    const chunk = this.buf.subarray(0, this.pos);
    this.pos = 0;
    if (chunk.length === 0) return;
    if (this.sink.bytes !== undefined) { this.sink.bytes(chunk); return; }
    utf8Decoder ??= new TextDecoder('utf-8');
    this.sink(utf8Decoder.decode(chunk));
  }
}

/** Runs a chunked writer into one string (for outputs that fit in memory). */
export function collectText(write: (sink: TextSink) => void): string {
  const parts: string[] = [];
  write((c) => parts.push(c));
  return parts.join('');
}

/**
 * A number formatter: with `decimals` undefined, the shortest text that
 * reads back to the same double (exact round trip); otherwise rounded to
 * that many decimals, trailing zeros dropped. Non-finite values become null
 * (JSON has no NaN).
 */
export function numberFormat(decimals: number | undefined, field = 'decimals'): (v: number) => string {
  if (decimals === undefined) return (v) => (Number.isFinite(v) ? String(v) : 'null');
  if (!Number.isInteger(decimals) || decimals < 0 || decimals > 15) {
    throw new InputError('bad-option', `${field} must be a whole number in 0..15, got ${String(decimals)}`, -1, field);
  }
  return (v) => (Number.isFinite(v) ? String(Number(v.toFixed(decimals)) + 0) : 'null');
}
