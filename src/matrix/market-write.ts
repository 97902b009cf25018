/**
 * Writing the Matrix Market exchange format (Boisvert, Pozo & Remington 1996,
 * "The Matrix Market Exchange Formats: Initial Design", NIST).
 *
 * Sparse matrices are written as `coordinate` files, dense ones as `array`
 * files. By default every real is written in the shortest form that reads
 * back to the same double (ECMAScript Number::toString), so a write followed
 * by a read is exact.
 */

import { InputError, NotSymmetricError } from "../errors.js";
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

/** Collects output lines into chunks so that a huge file is not one long concatenation chain. */
class TextSink {
  private readonly chunks: string[] = [];
  private current = "";
  line(s: string): void {
    this.current += s + "\n";
    if (this.current.length > 1 << 16) {
      this.chunks.push(this.current);
      this.current = "";
    }
  }
  text(): string {
    this.chunks.push(this.current);
    return this.chunks.join("");
  }
}

/** Turns one value into its text for the chosen field; throws InputError naming `where` on a bad value. */
type ValueFormat = (v: number, where: () => string) => string;

function valueFormat(field: MarketField | "real" | "integer", precision: number | undefined): ValueFormat {
  if (precision !== undefined && (!Number.isInteger(precision) || precision < 1 || precision > 17)) {
    throw new InputError(`precision ${precision} is not an integer in 1..17`);
  }
  if (field === "integer") {
    return (v, where) => {
      if (!Number.isInteger(v)) throw new InputError(`${where()}: value ${v} is not an integer (field 'integer')`);
      return Math.abs(v) < 1e21 ? String(v) : BigInt(v).toString();
    };
  }
  return (v, where) => {
    if (!Number.isFinite(v)) throw new InputError(`${where()}: value ${v} is not finite`);
    if (precision !== undefined) return v.toExponential(precision - 1);
    return v === 0 && 1 / v < 0 ? "-0" : String(v);
  };
}

function checkField(field: string): void {
  if (field !== "real" && field !== "integer" && field !== "pattern") {
    throw new InputError(`field '${field}' is not one of 'real', 'integer', 'pattern'`);
  }
}

/** Write the banner and the comment lines. */
function writeHeader(out: TextSink, format: string, field: string, symmetric: boolean, comment?: string | readonly string[]): void {
  out.line(`%%MatrixMarket matrix ${format} ${field} ${symmetric ? "symmetric" : "general"}`);
  if (comment === undefined) return;
  const lines = typeof comment === "string" ? comment.split(/\r?\n/) : comment;
  for (const l of lines) {
    if (/[\r\n]/.test(l)) throw new InputError("a comment line given in an array may not contain a line break");
    out.line(l === "" ? "%" : `% ${l}`);
  }
}

/**
 * Write a sparse matrix as a Matrix Market `coordinate` file (1-based indices,
 * entries column by column).
 *
 * @throws InputError for a non-square matrix with `symmetric`, non-integer values with field `integer`, or a bad option.
 * @throws NotSymmetricError when `symmetric` is asked of a matrix holding both triangles that disagree.
 */
export function writeMatrixMarket(matrix: SparseMatrix, options: MarketWriteOptions = {}): string {
  const field = options.field ?? "real";
  checkField(field);
  const symmetric = options.symmetric ?? false;
  const source = symmetric ? lowerTriangleOf(matrix) : matrix;
  const format = valueFormat(field, options.precision);
  const out = new TextSink();
  writeHeader(out, "coordinate", field, symmetric, options.comment);
  out.line(`${source.nrows} ${source.ncols} ${source.nnz}`);
  const { colPtr, rowIdx, values } = source;
  for (let j = 0; j < source.ncols; j++) {
    const col = ` ${j + 1}`;
    for (let p = colPtr[j]!; p < colPtr[j + 1]!; p++) {
      const i = rowIdx[p]!;
      if (field === "pattern") out.line(`${i + 1}${col}`);
      else out.line(`${i + 1}${col} ${format(values[p]!, () => `entry (row ${i}, column ${j})`)}`);
    }
  }
  return out.text();
}

/** The lower triangle of a square matrix in any symmetric storage form (checked by lowerTriangle). */
function lowerTriangleOf(a: SparseMatrix): SparseMatrix {
  if (a.nrows !== a.ncols) throw new InputError(`a symmetric file needs a square matrix, this one is ${a.nrows} × ${a.ncols}`);
  return lowerTriangle(a);
}

/**
 * Write a dense nrows × ncols matrix (values column-major) as a Matrix Market
 * `array` file: one value per line, column by column.
 *
 * @throws InputError when the length does not match, a value is not finite, or an option is bad.
 * @throws NotSymmetricError when `symmetric` is asked of values that are not symmetric.
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
  const out = new TextSink();
  writeHeader(out, "array", field, symmetric, options.comment);
  out.line(`${nrows} ${ncols}`);
  for (let j = 0; j < ncols; j++) {
    for (let i = symmetric ? j : 0; i < nrows; i++) out.line(format(values[j * nrows + i]!, () => `entry (row ${i}, column ${j})`));
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
