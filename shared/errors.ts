/**
 * Typed errors of the Forecatch core, in one place.
 *
 * Every error carries a stable `code` so it survives the trip across IPC or a Web Worker boundary,
 * where the class itself is lost (see {@link serializeError} / {@link deserializeError}).
 */

/** Base class: a Forecatch error with a stable machine-readable code. */
export class ForecatchError extends Error {
  readonly code: string;
  constructor(code: string, message: string) {
    super(message);
    this.name = 'ForecatchError';
    this.code = code;
  }
}

/** Where in a file a parse error happened: a byte offset (binary formats) or a 1-based line (text). */
export interface FileLocation {
  file: string;
  byteOffset?: number;
  line?: number;
  column?: string;
}

/**
 * A file could not be read as what it claims to be.
 * The message always names the file, the place (byte offset or line) and what was expected.
 */
export class ParseError extends ForecatchError {
  readonly file: string;
  readonly byteOffset?: number;
  readonly line?: number;
  readonly expected: string;
  constructor(where: FileLocation, expected: string, found?: string) {
    const place =
      where.byteOffset !== undefined
        ? `byte ${where.byteOffset}`
        : where.line !== undefined
          ? `line ${where.line}${where.column ? `, column ${where.column}` : ''}`
          : 'unknown place';
    super('PARSE_ERROR', `${where.file}: ${place}: expected ${expected}${found !== undefined ? `, found ${found}` : ''}`);
    this.name = 'ParseError';
    this.file = where.file;
    this.byteOffset = where.byteOffset;
    this.line = where.line;
    this.expected = expected;
  }
}

/** Matrix or vector shapes do not agree. */
export class DimensionMismatchError extends ForecatchError {
  constructor(message: string) {
    super('DIMENSION_MISMATCH', message);
    this.name = 'DimensionMismatchError';
  }
}

/** A covariance (or innovation covariance) that must be positive definite is not. */
export class NotPositiveDefiniteError extends ForecatchError {
  constructor(message: string) {
    super('NOT_POSITIVE_DEFINITE', message);
    this.name = 'NotPositiveDefiniteError';
  }
}

/** An analysis could not produce a value for a reason of the data, not of the code (no onset, no contact...). */
export class AnalysisError extends ForecatchError {
  constructor(code: string, message: string) {
    super(code, message);
    this.name = 'AnalysisError';
  }
}

/** Plain-data form of an error, safe to send over IPC or postMessage. */
export interface SerializedError {
  name: string;
  code: string;
  message: string;
}

/** Turns any thrown value into {@link SerializedError}. */
export function serializeError(err: unknown): SerializedError {
  if (err instanceof ForecatchError) return { name: err.name, code: err.code, message: err.message };
  if (err instanceof RangeError) return { name: 'RangeError', code: 'RANGE_ERROR', message: err.message };
  if (err instanceof TypeError) return { name: 'TypeError', code: 'TYPE_ERROR', message: err.message };
  if (err instanceof Error) return { name: err.name, code: 'UNKNOWN', message: err.message };
  return { name: 'Error', code: 'UNKNOWN', message: String(err) };
}

/** Rebuilds an error from {@link SerializedError}; the class is ForecatchError, name and code are kept. */
export function deserializeError(data: SerializedError): ForecatchError {
  const err = new ForecatchError(data.code, data.message);
  err.name = data.name;
  return err;
}
