/** Base class of every error ambit throws on purpose; `code` is stable across versions. */
export class AmbitError extends Error {
  readonly code: string;
  constructor(code: string, message: string) {
    super(message);
    this.name = 'AmbitError';
    this.code = code;
  }
}

/**
 * Input that ambit refuses: points, weights or options. `index` is the
 * first offending input point (or -1 when the problem is not one point),
 * `field` names what is wrong with it ("x", "y", "points", an option name).
 */
export class InputError extends AmbitError {
  readonly index: number;
  readonly field: string;
  constructor(code: string, message: string, index = -1, field = '') {
    super(code, message);
    this.name = 'InputError';
    this.index = index;
    this.field = field;
  }
}

/**
 * A serialised mesh or triangulation that cannot be trusted. `path` names the
 * offending field, for example "halfEdges.twin[17]".
 */
export class FormatError extends AmbitError {
  readonly path: string;
  constructor(code: string, message: string, path = '') {
    super(code, message);
    this.name = 'FormatError';
    this.path = path;
  }
}
