/**
 * Compressed sparse column (CSC) storage, the format every later stage reads.
 * Column j holds rows rowIdx[colPtr[j] .. colPtr[j+1]) in strictly increasing
 * order with values alongside. Assembly from triplets sums duplicates, as
 * finite-element assembly needs; it runs in O(nnz + n) with two counting
 * passes (the classic transpose-twice construction, common practice).
 */
import { CapacityError, InputError } from "../errors.js";

/** Index or value arrays accepted from callers. */
export type IndexArray = Int32Array | Uint32Array | ArrayLike<number>;
export type ValueArray = Float64Array | Float32Array | ArrayLike<number>;

/** A sparse matrix in compressed sparse column form with sorted, unique row indices. */
export class SparseMatrix {
  /** Number of rows. */
  readonly nrows: number;
  /** Number of columns. */
  readonly ncols: number;
  /** Column pointers, length ncols + 1. */
  readonly colPtr: Int32Array;
  /** Row index of each stored entry, sorted within each column. */
  readonly rowIdx: Int32Array;
  /** Value of each stored entry. */
  readonly values: Float64Array;

  private constructor(nrows: number, ncols: number, colPtr: Int32Array, rowIdx: Int32Array, values: Float64Array) {
    this.nrows = nrows;
    this.ncols = ncols;
    this.colPtr = colPtr;
    this.rowIdx = rowIdx;
    this.values = values;
  }

  /**
   * Wrap arrays already known to be canonical (sorted unique rows, in range,
   * finite). No checks: for the library's own stages only.
   * @internal
   */
  static trusted(nrows: number, ncols: number, colPtr: Int32Array, rowIdx: Int32Array, values: Float64Array): SparseMatrix {
    return new SparseMatrix(nrows, ncols, colPtr, rowIdx, values);
  }

  /** Number of stored entries. */
  get nnz(): number {
    return this.colPtr[this.ncols];
  }

  /**
   * Assemble from coordinate triplets (0-based). Duplicate (row, col) pairs are
   * summed. Throws InputError naming the first bad entry, or the duplicate
   * whose sum overflows.
   */
  static fromTriplets(nrows: number, ncols: number, rows: IndexArray, cols: IndexArray, values: ValueArray): SparseMatrix {
    checkDimension("nrows", nrows);
    checkDimension("ncols", ncols);
    const nz = rows.length;
    if (cols.length !== nz || values.length !== nz) {
      throw new InputError(`triplet arrays differ in length: rows ${nz}, cols ${cols.length}, values ${values.length}`);
    }
    for (let k = 0; k < nz; k++) {
      const i = rows[k], j = cols[k], v = values[k];
      if (!Number.isInteger(i) || i < 0 || i >= nrows) throw new InputError(`entry ${k}: row index ${i} out of range 0..${nrows - 1}`);
      if (!Number.isInteger(j) || j < 0 || j >= ncols) throw new InputError(`entry ${k}: column index ${j} out of range 0..${ncols - 1}`);
      if (!Number.isFinite(v)) throw new InputError(`entry ${k} (row ${i}, column ${j}): value ${v} is not finite`);
    }
    // Pass 1: bucket by row (gives row-major order), pass 2: bucket by column,
    // which leaves rows sorted within each column; then sum neighbours that repeat.
    const rowPtr = new Int32Array(nrows + 1);
    for (let k = 0; k < nz; k++) rowPtr[rows[k] + 1]++;
    for (let i = 0; i < nrows; i++) rowPtr[i + 1] += rowPtr[i];
    const byRow = new Int32Array(nz);
    const next = rowPtr.slice(0, nrows);
    for (let k = 0; k < nz; k++) byRow[next[rows[k]]++] = k;
    const colPtr = new Int32Array(ncols + 1);
    for (let k = 0; k < nz; k++) colPtr[cols[k] + 1]++;
    for (let j = 0; j < ncols; j++) colPtr[j + 1] += colPtr[j];
    const order = new Int32Array(nz);
    const cnext = colPtr.slice(0, ncols);
    for (let t = 0; t < nz; t++) {
      const k = byRow[t];
      order[cnext[cols[k]]++] = k;
    }
    return sumSortedDuplicates(nrows, ncols, colPtr, order, rows, values);
  }

  /**
   * Wrap existing CSC arrays. When they are already valid (monotone pointers,
   * in-range strictly increasing rows, finite values, Int32Array/Float64Array)
   * they are used without copying; unsorted or repeated rows are sorted and
   * summed into new arrays. Anything else is an InputError.
   */
  static fromCSC(nrows: number, ncols: number, colPtr: IndexArray, rowIdx: IndexArray, values: ValueArray): SparseMatrix {
    checkDimension("nrows", nrows);
    checkDimension("ncols", ncols);
    if (colPtr.length !== ncols + 1) throw new InputError(`colPtr has length ${colPtr.length}, expected ncols + 1 = ${ncols + 1}`);
    if (colPtr[0] !== 0) throw new InputError(`colPtr[0] is ${colPtr[0]}, expected 0`);
    for (let j = 0; j < ncols; j++) {
      if (!(colPtr[j + 1] >= colPtr[j]) || !Number.isInteger(colPtr[j + 1])) {
        throw new InputError(`colPtr is not monotone at column ${j}: colPtr[${j}] = ${colPtr[j]}, colPtr[${j + 1}] = ${colPtr[j + 1]}`);
      }
    }
    const nz = colPtr[ncols];
    if (rowIdx.length < nz || values.length < nz) {
      throw new InputError(`colPtr announces ${nz} entries but rowIdx has ${rowIdx.length} and values ${values.length}`);
    }
    let canonical = true;
    for (let j = 0; j < ncols; j++) {
      let last = -1;
      for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
        const i = rowIdx[p], v = values[p];
        if (!Number.isInteger(i) || i < 0 || i >= nrows) throw new InputError(`entry ${p} (column ${j}): row index ${i} out of range 0..${nrows - 1}`);
        if (!Number.isFinite(v)) throw new InputError(`entry ${p} (row ${i}, column ${j}): value ${v} is not finite`);
        if (i <= last) canonical = false;
        last = i;
      }
    }
    if (canonical && colPtr instanceof Int32Array && rowIdx instanceof Int32Array && values instanceof Float64Array) {
      const exact = rowIdx.length === nz && values.length === nz;
      return new SparseMatrix(nrows, ncols, colPtr, exact ? rowIdx : rowIdx.subarray(0, nz), exact ? values : values.subarray(0, nz));
    }
    const cols = new Int32Array(nz);
    for (let j = 0; j < ncols; j++) for (let p = colPtr[j]; p < colPtr[j + 1]; p++) cols[p] = j;
    return SparseMatrix.fromTriplets(nrows, ncols, Array.prototype.slice.call(rowIdx, 0, nz), cols, Array.prototype.slice.call(values, 0, nz));
  }

  /** Build from a small dense matrix given as rows (row-major nested arrays); zeros are not stored. For tests and examples. */
  static fromDense(rows: ArrayLike<ArrayLike<number>>): SparseMatrix {
    const nrows = rows.length;
    const ncols = nrows > 0 ? rows[0].length : 0;
    const ri: number[] = [], ci: number[] = [], vi: number[] = [];
    for (let i = 0; i < nrows; i++) {
      if (rows[i].length !== ncols) throw new InputError(`row ${i} has ${rows[i].length} entries, expected ${ncols}`);
      for (let j = 0; j < ncols; j++) {
        const v = rows[i][j];
        if (v !== 0) { ri.push(i); ci.push(j); vi.push(v); }
      }
    }
    return SparseMatrix.fromTriplets(nrows, ncols, ri, ci, vi);
  }

  /** The entry at (i, j), 0 when not stored (binary search in column j). */
  get(i: number, j: number): number {
    let lo = this.colPtr[j], hi = this.colPtr[j + 1] - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1, r = this.rowIdx[mid];
      if (r === i) return this.values[mid];
      if (r < i) lo = mid + 1; else hi = mid - 1;
    }
    return 0;
  }

  /** Aᵀ as a new matrix. */
  transpose(): SparseMatrix {
    const t = transposeArrays(this, true);
    return SparseMatrix.trusted(this.ncols, this.nrows, t.colPtr, t.rowIdx, t.values!);
  }

  /** y = A·x (as stored, no symmetry implied). */
  multiply(x: ArrayLike<number>, y: Float64Array = new Float64Array(this.nrows)): Float64Array {
    if (x.length !== this.ncols) throw new InputError(`vector has length ${x.length}, expected ${this.ncols}`);
    y.fill(0);
    const { colPtr, rowIdx, values } = this;
    for (let j = 0; j < this.ncols; j++) {
      const xj = x[j];
      if (xj === 0) continue;
      for (let p = colPtr[j]; p < colPtr[j + 1]; p++) y[rowIdx[p]] += values[p] * xj;
    }
    return y;
  }

  /** Dense copy as rows (row-major nested arrays). For tests and small examples. */
  toDense(): number[][] {
    const out: number[][] = [];
    for (let i = 0; i < this.nrows; i++) out.push(new Array<number>(this.ncols).fill(0));
    for (let j = 0; j < this.ncols; j++) {
      for (let p = this.colPtr[j]; p < this.colPtr[j + 1]; p++) out[this.rowIdx[p]][j] = this.values[p];
    }
    return out;
  }
}

/**
 * Column pointers and row indices of Aᵀ (rows stay sorted: a counting sort by
 * row over the columns in order), with the values when `withValues`.
 * @internal
 */
export function transposeArrays(
  A: SparseMatrix, withValues: boolean,
): { colPtr: Int32Array; rowIdx: Int32Array; values?: Float64Array } {
  const { nrows, ncols, colPtr, rowIdx, values } = A;
  const nz = A.nnz;
  const tPtr = new Int32Array(nrows + 1);
  for (let p = 0; p < nz; p++) tPtr[rowIdx[p] + 1]++;
  for (let i = 0; i < nrows; i++) tPtr[i + 1] += tPtr[i];
  const next = tPtr.slice(0, nrows);
  const tIdx = new Int32Array(nz), tVal = withValues ? new Float64Array(nz) : undefined;
  for (let j = 0; j < ncols; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const q = next[rowIdx[p]]++;
      tIdx[q] = j;
      if (tVal) tVal[q] = values[p];
    }
  }
  return { colPtr: tPtr, rowIdx: tIdx, values: tVal };
}

/**
 * Duplicates whose sum overflows to ±Infinity: `entry` is the (0-based)
 * triplet that made the running sum non-finite, duplicates being summed in
 * the order given. An InputError, with the position for callers (such as
 * the Matrix Market reader) that name it in their own numbering.
 * @internal
 */
export class DuplicateSumError extends InputError {
  constructor(readonly entry: number, readonly row: number, readonly column: number, readonly sum: number) {
    super(`entry ${entry} (row ${row}, column ${column}): summed with the earlier entries at (${row}, ${column}) it gives ${sum}, which is not finite`);
  }
}

/**
 * Largest number of rows or columns (2²⁸): the column pointers alone of a
 * larger matrix take over a GiB, and an analysis keeps a few dozen arrays of
 * that length, beyond what a JavaScript process holds. Checked before any
 * allocation, so a short file or call that declares a huge empty matrix is a
 * CapacityError rather than an out-of-memory crash.
 */
export const MAX_DIMENSION = 2 ** 28;

function checkDimension(name: string, v: number): void {
  if (!Number.isInteger(v) || v < 0) throw new InputError(`${name} = ${v} is not a valid dimension`);
  if (v > MAX_DIMENSION) {
    throw new CapacityError(`${name} = ${v} exceeds the largest dimension septum handles, ${MAX_DIMENSION} (its index arrays would need ${(4 * v / 2 ** 30).toFixed(1)} GiB each)`);
  }
}

/** Compact entries `order` (sorted by column, then row) into CSC, summing repeats. */
function sumSortedDuplicates(
  nrows: number, ncols: number, colPtr: Int32Array, order: Int32Array, rows: IndexArray, values: ValueArray,
): SparseMatrix {
  const nz = order.length;
  const outPtr = new Int32Array(ncols + 1);
  const outIdx = new Int32Array(nz), outVal = new Float64Array(nz);
  let q = 0;
  for (let j = 0; j < ncols; j++) {
    const start = q;
    for (let t = colPtr[j]; t < colPtr[j + 1]; t++) {
      const k = order[t], i = rows[k];
      if (q > start && outIdx[q - 1] === i) {
        outVal[q - 1] += values[k];
        if (!Number.isFinite(outVal[q - 1])) throw new DuplicateSumError(k, i, j, outVal[q - 1]);
      } else { outIdx[q] = i; outVal[q] = values[k]; q++; }
    }
    outPtr[j + 1] = q;
  }
  const exact = q === nz;
  return SparseMatrix.trusted(nrows, ncols, outPtr, exact ? outIdx : outIdx.slice(0, q), exact ? outVal : outVal.slice(0, q));
}
