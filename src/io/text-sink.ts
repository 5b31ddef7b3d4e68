import { InputError } from '../core/errors.js';

/** Receives output text in pieces of about a megabyte, so huge outputs never become one string. */
export type TextSink = (chunk: string) => void;

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
