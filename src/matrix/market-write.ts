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
import { SparseMatrix } from "./sparse.js";
import type { MarketField } from "./market-read.js";

/** Options of `writeMatrixMarket`. */
export interface MarketWriteOptions {
  /**
   * Write a `symmetric` file: the lower triangle only. The matrix may store the
   * lower triangle, the upper one, or both (then they must agree exactly,
   * otherwise NotSymmetricError). Default false.
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

/**
 * The lower triangle (diagonal included) of a square matrix stored as its
 * lower triangle, its upper triangle, or both (which must then agree exactly).
 */
function lowerTriangleOf(a: SparseMatrix): SparseMatrix {
  if (a.nrows !== a.ncols) throw new InputError(`a symmetric file needs a square matrix, this one is ${a.nrows} × ${a.ncols}`);
  let below = 0;
  let above = 0;
  for (let j = 0; j < a.ncols; j++) {
    for (let p = a.colPtr[j]!; p < a.colPtr[j + 1]!; p++) {
      const i = a.rowIdx[p]!;
      if (i > j) below++;
      else if (i < j) above++;
    }
  }
  if (above === 0) return a;
  const t = a.transpose();
  if (below === 0) return t;
  checkTrianglesAgree(a, t);
  return keepLower(a);
}

/** Compare the strictly lower part of `a` with that of `t` = aᵀ, column by column. */
function checkTrianglesAgree(a: SparseMatrix, t: SparseMatrix): void {
  for (let j = 0; j < a.ncols; j++) {
    let p = firstBelow(a, j);
    let q = firstBelow(t, j);
    const pEnd = a.colPtr[j + 1]!;
    const qEnd = t.colPtr[j + 1]!;
    while (p < pEnd || q < qEnd) {
      const ia = p < pEnd ? a.rowIdx[p]! : a.nrows;
      const it = q < qEnd ? t.rowIdx[q]! : a.nrows;
      if (ia !== it) {
        const i = Math.min(ia, it);
        const missing = ia < it ? `(${j}, ${i})` : `(${i}, ${j})`;
        throw new NotSymmetricError(i, j, `matrix is not symmetric: entry (${i}, ${j}) has no mirror ${missing}`);
      }
      if (a.values[p] !== t.values[q]) {
        throw new NotSymmetricError(ia, j, `matrix is not symmetric: entry (${ia}, ${j}) = ${a.values[p]} but (${j}, ${ia}) = ${t.values[q]}`);
      }
      p++;
      q++;
    }
  }
}

/** Position of the first entry strictly below the diagonal in column j (rows are sorted). */
function firstBelow(a: SparseMatrix, j: number): number {
  let p = a.colPtr[j]!;
  const end = a.colPtr[j + 1]!;
  while (p < end && a.rowIdx[p]! <= j) p++;
  return p;
}

/** The entries of `a` on or below the diagonal, as a new matrix (rows stay sorted). */
function keepLower(a: SparseMatrix): SparseMatrix {
  const n = a.ncols;
  const ptr = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    let p = a.colPtr[j]!;
    while (p < a.colPtr[j + 1]! && a.rowIdx[p]! < j) p++;
    ptr[j + 1] = ptr[j]! + (a.colPtr[j + 1]! - p);
  }
  const idx = new Int32Array(ptr[n]!);
  const val = new Float64Array(ptr[n]!);
  let q = 0;
  for (let j = 0; j < n; j++) {
    for (let p = a.colPtr[j]!; p < a.colPtr[j + 1]!; p++) {
      if (a.rowIdx[p]! < j) continue;
      idx[q] = a.rowIdx[p]!;
      val[q++] = a.values[p]!;
    }
  }
  return SparseMatrix.trusted(n, n, ptr, idx, val);
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
