import { FormatError } from './errors.js';

/**
 * JSON text parsed, or an already parsed value passed through: readers
 * accept both. Text that is not JSON is a FormatError 'bad-json' at path ''.
 */
export function parseJSONInput(input: unknown, label: string): unknown {
  if (typeof input !== 'string') return input;
  try {
    return JSON.parse(input);
  } catch (err) {
    throw new FormatError('bad-json', `${label}: not valid JSON (${err instanceof Error ? err.message : String(err)})`, '');
  }
}
