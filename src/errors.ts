/**
 * Typed errors. Every error the library raises on bad input or numerical
 * breakdown is a `SeptumError`; subclasses carry the location that a caller
 * can act on (entry, line, column), always in the caller's original numbering.
 */

/** Base class of every error raised by septum. */
export class SeptumError extends Error {
  constructor(message: string) {
    super(message);
    this.name = new.target.name;
  }
}

/** Invalid arguments: wrong lengths, indices out of range, non-finite values, bad options. */
export class InputError extends SeptumError {}

/** A Matrix Market text that cannot be read. `line` is 1-based; 0 when the problem is not tied to a line. */
export class MatrixMarketError extends SeptumError {
  readonly line: number;
  constructor(line: number, message: string) {
    super(line > 0 ? `line ${line}: ${message}` : message);
    this.line = line;
  }
}

/** A matrix whose two triangles disagree although symmetry is required. Indices are 0-based, original numbering. */
export class NotSymmetricError extends SeptumError {
  readonly row: number;
  readonly column: number;
  constructor(row: number, column: number, message: string) {
    super(message);
    this.row = row;
    this.column = column;
  }
}

/**
 * Factorization breakdown: Cholesky met a pivot that is not positive, or
 * L·D·Lᵀ met a zero or tiny pivot. `column` is 0-based in the original numbering.
 */
export class NotPositiveDefiniteError extends SeptumError {
  readonly column: number;
  readonly pivot: number;
  constructor(column: number, pivot: number, message: string) {
    super(message);
    this.column = column;
    this.pivot = pivot;
  }
}

/** A matrix whose sparsity pattern differs from the one an Analysis was built for. */
export class PatternMismatchError extends SeptumError {}

/** Bytes that are not a serialized Analysis of this version, or are corrupted. */
export class FormatError extends SeptumError {}

/** Work stopped by an AbortSignal. Nothing half-built is left usable. */
export class AbortedError extends SeptumError {}

/** A request beyond what the platform can hold (for example WebAssembly memory limits, or a solution entry beyond the range of doubles). */
export class CapacityError extends SeptumError {}

/**
 * The options argument of a public call: undefined and null mean none; a
 * string, number or array (say an ordering name where `{ ordering }` was
 * meant) is an InputError naming the call.
 */
export function optionsObject<T extends object>(options: T | null | undefined, who: string): T {
  if (options === undefined || options === null) return {} as T;
  if (typeof options !== "object" || Array.isArray(options) || ArrayBuffer.isView(options)) {
    const got = typeof options === "string" ? `"${options}"` : Array.isArray(options) || ArrayBuffer.isView(options) ? "an array" : String(options);
    throw new InputError(`${who}: options must be an object, got ${got}`);
  }
  return options;
}
