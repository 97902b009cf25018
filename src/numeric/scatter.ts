/**
 * Where each stored entry of A lands in the factor. Built once, on the first
 * factorization: entry (i, j) of the caller's matrix goes to (max, min) of
 * (inverse[i], inverse[j]) in the new numbering, i.e. to a row of the
 * supernode owning that column. A `refactor` then costs one pass over A's
 * values. Only the lower triangle of a full-storage matrix is placed; its
 * symmetry is checked by the matrix stage (NotSymmetricError names the entry).
 */
import { InputError, PatternMismatchError } from "../errors.js";
import type { SparseMatrix } from "../matrix/sparse.js";
import { storageForm, type StorageForm } from "../matrix/symmetric.js";
import type { SupernodalStructure } from "../symbolic/types.js";

/** The precomputed map from A's stored entries to factor offsets. */
export interface ScatterMap {
  readonly form: StorageForm;
  /** Copies of A's pattern, to recognise the same pattern later. */
  readonly colPtr: Int32Array;
  readonly rowIdx: Int32Array;
  /** Factor offset of each stored entry, −1 for the mirrored upper entries of a full-storage matrix. */
  readonly target: Float64Array;
}

/**
 * Build the map for a square A of order st.n (the caller checks both), throwing
 * PatternMismatchError for an entry outside the analysed structure.
 */
export function buildScatterMap(st: SupernodalStructure, inverse: Int32Array, A: SparseMatrix): ScatterMap {
  const n = st.n;
  const form = storageForm(A);
  const { colPtr, rowIdx } = A, nnz = colPtr[n];
  // Bucket the placed entries by their new column (counting sort).
  const ptr = new Int32Array(n + 1);
  const newRow = new Int32Array(nnz).fill(-1), newCol = new Int32Array(nnz);
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      if (form === "full" && i < j) continue;
      const a = inverse[i], b = inverse[j];
      newRow[p] = a > b ? a : b;
      newCol[p] = a > b ? b : a;
      ptr[newCol[p] + 1]++;
    }
  }
  for (let c = 0; c < n; c++) ptr[c + 1] += ptr[c];
  const bucket = new Int32Array(ptr[n]), next = ptr.slice(0, n);
  for (let p = 0; p < nnz; p++) if (newRow[p] >= 0) bucket[next[newCol[p]]++] = p;
  const target = new Float64Array(nnz).fill(-1);
  const local = new Int32Array(n), stamp = new Int32Array(n).fill(-1);
  for (let s = 0; s < st.supernodeCount; s++) {
    const r0 = st.rowPtr[s], m = st.rowPtr[s + 1] - r0, f = st.superStart[s];
    for (let t = 0; t < m; t++) { local[st.rowIdx[r0 + t]] = t; stamp[st.rowIdx[r0 + t]] = s; }
    for (let c = f; c < st.superStart[s + 1]; c++) {
      for (let q = ptr[c]; q < ptr[c + 1]; q++) {
        const p = bucket[q], r = newRow[p];
        if (stamp[r] !== s) {
          const j = entryColumn(colPtr, p);
          throw new PatternMismatchError(`entry (${rowIdx[p]}, ${j}) (0-based) is outside the pattern the analysis was made for`);
        }
        target[p] = st.factorPtr[s] + (c - f) * m + local[r];
      }
    }
  }
  return { form, colPtr: colPtr.slice(), rowIdx: rowIdx.slice(), target };
}

/** Column of stored entry p (binary search in colPtr). */
function entryColumn(colPtr: Int32Array, p: number): number {
  let lo = 0, hi = colPtr.length - 2;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (colPtr[mid] <= p) lo = mid; else hi = mid - 1;
  }
  return lo;
}

/** True when A stores exactly the pattern the map was built for. */
export function samePattern(map: ScatterMap, A: SparseMatrix): boolean {
  if (A.nrows !== A.ncols || A.colPtr.length !== map.colPtr.length) return false;
  const n = A.ncols;
  if (A.colPtr[n] !== map.colPtr[n]) return false;
  for (let j = 0; j <= n; j++) if (A.colPtr[j] !== map.colPtr[j]) return false;
  const r = A.rowIdx, nnz = map.colPtr[n];
  for (let p = 0; p < nnz; p++) if (r[p] !== map.rowIdx[p]) return false;
  return true;
}

/** Add A's values into the (zeroed) factor region of the store. Non-finite values are an InputError naming the entry. */
export function scatterValues(map: ScatterMap, A: SparseMatrix, S: Float64Array): void {
  const { target } = map, v = A.values, nnz = target.length;
  for (let p = 0; p < nnz; p++) {
    const x = v[p];
    if (!Number.isFinite(x)) {
      throw new InputError(`entry (${A.rowIdx[p]}, ${entryColumn(map.colPtr, p)}) (0-based) has non-finite value ${x}`);
    }
    const t = target[p];
    if (t >= 0) S[t] += x;
  }
}
