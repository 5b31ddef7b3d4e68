import { closeSync, openSync, readFileSync, renameSync, unlinkSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import type { TextSink } from '../io/text-sink.js';
import { CliError, EXIT } from './exit.js';

function ioMessage(err: unknown): string {
  const e = err as NodeJS.ErrnoException;
  if (e.code === 'ENOENT') return 'no such file or folder';
  if (e.code === 'EACCES' || e.code === 'EPERM') return 'permission denied';
  if (e.code === 'EISDIR') return 'is a folder, not a file';
  return e.message ?? String(err);
}

/** A whole file as text; a missing or unreadable file is an I/O error (exit 3). */
export function readText(path: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (err) {
    throw new CliError(EXIT.io, `cannot read ${path}: ${ioMessage(err)}`);
  }
}

/** A whole file as bytes; a missing or unreadable file is an I/O error (exit 3). */
export function readBytes(path: string): Uint8Array {
  try {
    return readFileSync(path);
  } catch (err) {
    throw new CliError(EXIT.io, `cannot read ${path}: ${ioMessage(err)}`);
  }
}

/**
 * Writes a file through a temporary file in the same folder, renamed into
 * place only when the writer finishes: on any error nothing is left behind,
 * and an existing file keeps its old content.
 */
export function writeAtomically(path: string, write: (sink: TextSink) => void, onBytes?: (bytes: number) => void): number {
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
  let fd: number;
  try {
    fd = openSync(tmp, 'wx');
  } catch (err) {
    throw new CliError(EXIT.io, `cannot write ${path}: ${ioMessage(err)}`);
  }
  let bytes = 0;
  try {
    const put = (buf: Uint8Array): void => {
      let off = 0;
      while (off < buf.length) off += writeSync(fd, buf, off);
      bytes += buf.length;
      onBytes?.(bytes);
    };
    // Writers that build bytes hand them over directly (no text to make and encode again).
    write(Object.assign((chunk: string) => put(Buffer.from(chunk, 'utf8')), { bytes: put }));
    closeSync(fd);
    renameSync(tmp, path);
  } catch (err) {
    try { closeSync(fd); } catch { /* already closed */ }
    try { unlinkSync(tmp); } catch { /* never created or already gone */ }
    if (err instanceof Error && 'code' in err && typeof (err as NodeJS.ErrnoException).syscall === 'string') {
      throw new CliError(EXIT.io, `cannot write ${path}: ${ioMessage(err)}`);
    }
    throw err;
  }
  return bytes;
}
