/**
 * Where each stored entry of A lands in the factor. Built once, on the first
 * factorization: entry (i, j) of the caller's matrix goes to (max, min) of
 * (inverse[i], inverse[j]) in the new numbering, i.e. to a row of the
 * supernode owning that column. The entries are grouped by supernode, so the
 * multifrontal pass zeroes and assembles each panel right before it factors
 * it, while the panel is in cache (the assembly step of Duff & Reid 1983),
 * instead of zeroing and scattering into the whole factor first. A
 * `refactor` then costs one pass over A's values for the row statistics
 * below and one, supernode by supernode, for the assembly. Only the lower
 * triangle of a full-storage matrix is placed; its symmetry is checked by the
 * matrix stage (NotSymmetricError names the entry).
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
  /** Stored entries placed in supernode s: entry[entryPtr[s] .. entryPtr[s+1]) (indices into A's values). */
  readonly entryPtr: Int32Array;
  readonly entry: Int32Array;
  /** Offset of each of those entries within its supernode's panel (column-major, ld m). */
  readonly offset: Int32Array;
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
  const entryPtr = new Int32Array(st.supernodeCount + 1);
  for (let s = 0; s < st.supernodeCount; s++) entryPtr[s + 1] = ptr[st.superStart[s + 1]];
  const offset = new Int32Array(ptr[n]);
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
        offset[q] = (c - f) * m + local[r];
      }
    }
  }
  return { form, colPtr: colPtr.slice(), rowIdx: rowIdx.slice(), entryPtr, entry: bucket, offset };
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

/** Zero supernode s's panel (m·c doubles at `panel` in S) and add A's entries into it. */
export function assemblePanel(map: ScatterMap, s: number, values: Float64Array, S: Float64Array, panel: number, size: number): void {
  S.fill(0, panel, panel + size);
  const { entry, offset } = map;
  for (let q = map.entryPtr[s], e = map.entryPtr[s + 1]; q < e; q++) S[panel + offset[q]] += values[entry[q]];
}

/**
 * One pass over A's stored values (in the map's pattern): throws InputError
 * naming the first non-finite entry; fills sums[i] with Σ_k |a_ik| of row i
 * of the symmetric matrix (a mirrored entry of a triangular form counts
 * twice, as in symmetricNormInf; A's numbering) and diag[inverse[i]] with
 * |a_ii| (the new numbering); returns ‖A‖∞ = max_i sums[i] and the largest
 * |a_ij|. Both arrays are overwritten.
 */
export function rowStatistics(
  map: ScatterMap, values: Float64Array, inverse: Int32Array, sums: Float64Array, diag: Float64Array,
): { normInf: number; largest: number } {
  const { colPtr, rowIdx } = map, n = colPtr.length - 1, mirrored = map.form !== "full";
  sums.fill(0);
  diag.fill(0);
  let largest = 0;
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const x = values[p];
      if (!Number.isFinite(x)) throw new InputError(`entry (${rowIdx[p]}, ${j}) (0-based) has non-finite value ${x}`);
      const i = rowIdx[p], a = Math.abs(x);
      if (i === j) diag[inverse[j]] = a;
      if (a > largest) largest = a;
      sums[i] += a;
      if (mirrored && i !== j) sums[j] += a;
    }
  }
  let normInf = 0;
  for (let i = 0; i < n; i++) if (sums[i] > normInf) normInf = sums[i];
  return { normInf, largest };
}
