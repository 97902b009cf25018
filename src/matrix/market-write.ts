/**
 * Writing the Matrix Market exchange format (Boisvert, Pozo & Remington 1996,
 * "The Matrix Market Exchange Formats: Initial Design", NIST).
 *
 * Sparse matrices are written as `coordinate` files, dense ones as `array`
 * files. By default every real is written in the shortest form that reads
 * back to the same double (ECMAScript Number::toString), so a write followed
 * by a read is exact.
 */

import { CapacityError, InputError, NotSymmetricError } from "../errors.js";
import type { SparseMatrix } from "./sparse.js";
import { lowerTriangle } from "./symmetric.js";
import type { MarketField } from "./market-read.js";

/** Options of `writeMatrixMarket`. */
export interface MarketWriteOptions {
  /**
   * Write a `symmetric` file: the lower triangle only. The matrix may store the
   * lower triangle, the upper one, or both (then they must agree, up to the
   * rounding tolerance of `lowerTriangle`, otherwise NotSymmetricError).
   * Default false.
   */
  symmetric?: boolean;
  /** Value field: `real` (default), `integer` (values must be integers) or `pattern` (no values). */
  field?: MarketField;
  /** Comment text placed after the banner; each line becomes one `%` line. */
  comment?: string | readonly string[];
  /**
   * Significant digits for reals, 1..17, written in exponent form.
   * Default: the shortest form that reads back exactly.
   */
  precision?: number;
}

/** Options of `writeMatrixMarketArray`. */
export interface MarketArrayWriteOptions {
  /** Write a `symmetric` array (lower triangle, column by column); the values must be symmetric. */
  symmetric?: boolean;
  /** Value field: `real` (default) or `integer`. */
  field?: "real" | "integer";
  /** Comment text placed after the banner; each line becomes one `%` line. */
  comment?: string | readonly string[];
  /** Significant digits for reals, 1..17. Default: shortest exact form. */
  precision?: number;
}

/** Longest string V8 can hold (2^29 − 24 characters). */
const MAX_STRING = (1 << 29) - 24;

/** Output bytes in one growing buffer: no string per line, one decode at the end. */
class ByteSink {
  private buf: Uint8Array;
  private len = 0;
  constructor(estimate: number) {
    this.buf = new Uint8Array(Math.max(256, Math.min(estimate, MAX_STRING)));
  }
  private room(n: number): void {
    if (this.len + n <= this.buf.length) return;
    if (this.len + n > MAX_STRING) {
      throw new CapacityError(`the Matrix Market text would exceed ${MAX_STRING} characters, the longest string JavaScript can hold`);
    }
    const next = new Uint8Array(Math.min(MAX_STRING, Math.max(2 * this.buf.length, this.len + n)));
    next.set(this.buf.subarray(0, this.len));
    this.buf = next;
  }
  /** Append raw bytes (already encoded text). */
  bytes(b: Uint8Array): void {
    this.room(b.length);
    this.buf.set(b, this.len);
    this.len += b.length;
  }
  /** Append an ASCII string (numbers). */
  ascii(s: string): void {
    this.room(s.length);
    const buf = this.buf;
    let q = this.len;
    for (let k = 0; k < s.length; k++) buf[q++] = s.charCodeAt(k);
    this.len = q;
  }
  /** Append the decimal digits of a non-negative integer below 2^31. */
  int(v: number): void {
    this.room(10);
    const buf = this.buf;
    const start = this.len;
    let q = start;
    do {
      buf[q++] = 48 + (v % 10);
      v = (v / 10) | 0;
    } while (v > 0);
    for (let a = start, z = q - 1; a < z; a++, z--) {
      const t = buf[a]!;
      buf[a] = buf[z]!;
      buf[z] = t;
    }
    this.len = q;
  }
  byte(ch: number): void {
    this.room(1);
    this.buf[this.len++] = ch;
  }
  text(): string {
    return new TextDecoder("utf-8").decode(this.buf.subarray(0, this.len));
  }
}

/** Turns one value, at 0-based (i, j), into its text for the chosen field; throws InputError naming the entry on a bad value. */
type ValueFormat = (v: number, i: number, j: number) => string;

function valueFormat(field: MarketField | "real" | "integer", precision: number | undefined): ValueFormat {
  if (precision !== undefined && (!Number.isInteger(precision) || precision < 1 || precision > 17)) {
    throw new InputError(`precision ${precision} is not an integer in 1..17`);
  }
  if (field === "integer") {
    return (v, i, j) => {
      if (!Number.isInteger(v)) throw new InputError(`entry (row ${i}, column ${j}): value ${v} is not an integer (field 'integer')`);
      return Math.abs(v) < 1e21 ? String(v) : BigInt(v).toString();
    };
  }
  return (v, i, j) => {
    if (!Number.isFinite(v)) throw new InputError(`entry (row ${i}, column ${j}): value ${v} is not finite`);
    if (precision !== undefined) return v.toExponential(precision - 1);
    return v === 0 && 1 / v < 0 ? "-0" : String(v);
  };
}

function checkField(field: string): void {
  if (field !== "real" && field !== "integer" && field !== "pattern") {
    throw new InputError(`field '${field}' is not one of 'real', 'integer', 'pattern'`);
  }
}

/** Write the banner, the comment lines and the size line. */
function writeHeader(out: ByteSink, kind: string, comment: string | readonly string[] | undefined, size: string): void {
  const lines = [`%%MatrixMarket matrix ${kind}`];
  if (comment !== undefined) {
    for (const l of typeof comment === "string" ? comment.split(/\r?\n/) : comment) {
      if (/[\r\n]/.test(l)) throw new InputError("a comment line given in an array may not contain a line break");
      lines.push(l === "" ? "%" : `% ${l}`);
    }
  }
  lines.push(size, "");
  out.bytes(new TextEncoder().encode(lines.join("\n")));
}

const SPACE = 32;
const NL = 10;

/**
 * Write a sparse matrix as a Matrix Market `coordinate` file (1-based indices,
 * entries column by column).
 *
 * @throws InputError for a non-square matrix with `symmetric`, non-integer values with field `integer`, or a bad option.
 * @throws NotSymmetricError when `symmetric` is asked of a matrix holding both triangles that disagree.
 * @throws CapacityError when the text would be longer than a JavaScript string can be.
 */
export function writeMatrixMarket(matrix: SparseMatrix, options: MarketWriteOptions = {}): string {
  const field = options.field ?? "real";
  checkField(field);
  const symmetric = options.symmetric ?? false;
  const a = symmetric ? lowerTriangle(matrix) : matrix; // lowerTriangle checks squareness and symmetry
  const format = valueFormat(field, options.precision);
  const out = new ByteSink(a.nnz * (field === "pattern" ? 16 : 40) + 256);
  writeHeader(out, `coordinate ${field} ${symmetric ? "symmetric" : "general"}`, options.comment, `${a.nrows} ${a.ncols} ${a.nnz}`);
  const { colPtr, rowIdx, values } = a;
  for (let j = 0; j < a.ncols; j++) {
    for (let p = colPtr[j]!; p < colPtr[j + 1]!; p++) {
      const i = rowIdx[p]!;
      out.int(i + 1);
      out.byte(SPACE);
      out.int(j + 1);
      if (field !== "pattern") {
        out.byte(SPACE);
        out.ascii(format(values[p]!, i, j));
      }
      out.byte(NL);
    }
  }
  return out.text();
}

/**
 * Write a dense nrows × ncols matrix (values column-major) as a Matrix Market
 * `array` file: one value per line, column by column.
 *
 * @throws InputError when the length does not match, a value is not finite, or an option is bad.
 * @throws NotSymmetricError when `symmetric` is asked of values that are not symmetric.
 * @throws CapacityError when the text would be longer than a JavaScript string can be.
 */
export function writeMatrixMarketArray(nrows: number, ncols: number, values: ArrayLike<number>, options: MarketArrayWriteOptions = {}): string {
  for (const [name, v] of [["nrows", nrows], ["ncols", ncols]] as const) {
    if (!Number.isInteger(v) || v < 0) throw new InputError(`${name} = ${v} is not a valid dimension`);
  }
  if (values.length !== nrows * ncols) throw new InputError(`values has length ${values.length}, expected nrows × ncols = ${nrows * ncols}`);
  const field = options.field ?? "real";
  if (field !== "real" && field !== "integer") throw new InputError(`field '${field}' is not one of 'real', 'integer' for an array`);
  const symmetric = options.symmetric ?? false;
  if (symmetric) checkDenseSymmetric(nrows, ncols, values);
  const format = valueFormat(field, options.precision);
  const out = new ByteSink(values.length * 24 + 256);
  writeHeader(out, `array ${field} ${symmetric ? "symmetric" : "general"}`, options.comment, `${nrows} ${ncols}`);
  for (let j = 0; j < ncols; j++) {
    for (let i = symmetric ? j : 0; i < nrows; i++) {
      out.ascii(format(values[j * nrows + i]!, i, j));
      out.byte(NL);
    }
  }
  return out.text();
}

function checkDenseSymmetric(nrows: number, ncols: number, values: ArrayLike<number>): void {
  if (nrows !== ncols) throw new InputError(`a symmetric array needs a square matrix, this one is ${nrows} × ${ncols}`);
  for (let j = 0; j < ncols; j++) {
    for (let i = j + 1; i < nrows; i++) {
      const lower = values[j * nrows + i]!;
      const upper = values[i * nrows + j]!;
      if (lower !== upper) throw new NotSymmetricError(i, j, `matrix is not symmetric: entry (${i}, ${j}) = ${lower} but (${j}, ${i}) = ${upper}`);
    }
  }
}
