import { InputError } from './errors.js';

/**
 * Refuses an options argument that is not a plain object, or that names an
 * option the function does not know: a misspelt option would otherwise be
 * ignored without a word, and the result quietly be something else.
 */
export function checkOptionNames(options: unknown, known: readonly string[], where: string): void {
  if (options === undefined) return;
  if (options === null || typeof options !== 'object' || Array.isArray(options)) {
    throw new InputError('bad-option', `${where}: options must be an object, got ${options === null ? 'null' : Array.isArray(options) ? 'an array' : typeof options}`, -1, 'options');
  }
  for (const key of Object.keys(options)) {
    if (!known.includes(key)) {
      throw new InputError('bad-option', `${where}: unknown option '${key}' (known: ${known.join(', ')})`, -1, key);
    }
  }
}
