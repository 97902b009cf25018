/**
 * Symmetric matrices held in one of three storage forms: lower triangle only,
 * upper triangle only, or both triangles. Every stage works from the lower
 * triangle, so this module normalises any form to it (checking that a
 * both-triangles matrix really is symmetric), permutes it symmetrically
 * (P·A·Pᵀ, the classic two-pass scatter, common practice), multiplies and
 * takes norms with the symmetry implied by the storage.
 */
import { InputError, NotSymmetricError } from "../errors.js";
import { checkPermutation } from "./permutation.js";
import { SparseMatrix } from "./sparse.js";

/** How a square matrix stores its symmetric pattern. A diagonal matrix reports "lower". */
export type StorageForm = "lower" | "upper" | "full";

/**
 * Throw InputError unless A is a square SparseMatrix. The shape is checked
 * by its fields rather than instanceof, so a matrix from the CommonJS build
 * still passes the ES module build's check.
 */
export function requireSquare(A: SparseMatrix, what = "matrix"): void {
  const m = A as unknown as Record<string, unknown> | null;
  if (typeof m !== "object" || m === null || !(m.colPtr instanceof Int32Array) || !(m.rowIdx instanceof Int32Array)
    || !(m.values instanceof Float64Array) || typeof m.nrows !== "number" || typeof m.ncols !== "number") {
    const got = m === null || typeof m !== "object" ? String(m) : Array.isArray(m) ? "an array" : "another object";
    throw new InputError(`${what} must be a SparseMatrix (SparseMatrix.fromTriplets, fromCSC or fromDense), got ${got}`);
  }
  if (A.nrows !== A.ncols) throw new InputError(`${what} must be square, got ${A.nrows} × ${A.ncols}`);
}

/** Detect the storage form from where the off-diagonal entries lie. */
export function storageForm(A: SparseMatrix): StorageForm {
  requireSquare(A);
  let below = false, above = false;
  const { colPtr, rowIdx } = A;
  for (let j = 0; j < A.ncols && !(below && above); j++) {
    const p0 = colPtr[j], p1 = colPtr[j + 1];
    if (p1 > p0) {
      if (rowIdx[p0] < j) above = true;
      if (rowIdx[p1 - 1] > j) below = true;
    }
  }
  return below && above ? "full" : above ? "upper" : "lower";
}

/**
 * Tolerance for two mirrored entries of a full-storage matrix to count as
 * equal, relative to the geometric mean of their rows' largest entries:
 * |a_ij − a_ji| ≤ 64·ε·max(|a_ij|, |a_ji|, √(r_i·r_j)), r_i = max_k |a_ik|.
 * Assembly computes a_ij and a_ji as sums of element terms in different
 * orders; each term is bounded by √(k_ii·k_jj) of its (semidefinite) element
 * matrix, so by Cauchy–Schwarz the two sums differ by rounding of order
 * ε·√(a_ii·a_jj), not of the entry itself, which cancellation can leave far
 * smaller. A difference of that size is below the backward error of the
 * factorization itself (common practice; Higham 2002, §10.1).
 */
const SYMMETRY_TOLERANCE = 64 * Number.EPSILON;

/**
 * The lower triangle (diagonal included) of a symmetric matrix stored in any
 * of the three forms. A full-storage matrix whose triangles disagree in
 * pattern or value throws NotSymmetricError naming the entry. Returns A itself
 * when it is already lower.
 */
export function lowerTriangle(A: SparseMatrix): SparseMatrix {
  const form = storageForm(A);
  if (form === "lower") return A;
  if (form === "upper") return A.transpose();
  requireSymmetric(A);
  return keepLower(A);
}

/** Keep the entries with row >= column. */
function keepLower(A: SparseMatrix): SparseMatrix {
  const n = A.ncols, { colPtr, rowIdx, values } = A;
  const ptr = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    let c = 0;
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) if (rowIdx[p] >= j) c++;
    ptr[j + 1] = ptr[j] + c;
  }
  const idx = new Int32Array(ptr[n]), val = new Float64Array(ptr[n]);
  for (let j = 0, q = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      if (rowIdx[p] >= j) { idx[q] = rowIdx[p]; val[q] = values[p]; q++; }
    }
  }
  return SparseMatrix.trusted(n, n, ptr, idx, val);
}

/** Largest absolute entry of each row of A as stored. */
function rowMaxima(A: SparseMatrix): Float64Array {
  const r = new Float64Array(A.nrows), { rowIdx, values } = A;
  for (let p = 0; p < A.nnz; p++) {
    const a = Math.abs(values[p]);
    if (a > r[rowIdx[p]]) r[rowIdx[p]] = a;
  }
  return r;
}

/**
 * Throw NotSymmetricError naming the first entry where A and Aᵀ disagree
 * beyond SYMMETRY_TOLERANCE (a missing entry counts as zero). Meant for
 * full storage; a one-triangle matrix stands for a symmetric one by definition.
 */
export function requireSymmetric(A: SparseMatrix): void {
  const T = A.transpose();
  const n = A.ncols, rows = rowMaxima(A);
  for (let j = 0; j < n; j++) {
    let p = A.colPtr[j], q = T.colPtr[j];
    const pe = A.colPtr[j + 1], qe = T.colPtr[j + 1];
    while (p < pe || q < qe) {
      const ia = p < pe ? A.rowIdx[p] : n, it = q < qe ? T.rowIdx[q] : n;
      const i = Math.min(ia, it);
      const a = ia === i ? A.values[p++] : 0;
      const t = it === i ? T.values[q++] : 0;
      if (a === t) continue;
      const scale = Math.max(Math.abs(a), Math.abs(t), Math.sqrt(rows[i]) * Math.sqrt(rows[j])); // no overflow near 1e308
      if (Math.abs(a - t) > SYMMETRY_TOLERANCE * scale) {
        throw new NotSymmetricError(i, j,
          `matrix is not symmetric: entry (${i}, ${j}) is ${a} but entry (${j}, ${i}) is ${t} (0-based)`);
      }
    }
  }
}

/**
 * Lower triangle of P·A·Pᵀ from the lower triangle L of A, where
 * inverse[old] = new. Entry (i, j) moves to (max, min) of (inverse[i], inverse[j]).
 * L may hold the upper triangle instead, not both (each pair would land twice);
 * InputError for that, or for an `inverse` that is not a permutation of 0..n−1.
 */
export function permuteLower(L: SparseMatrix, inverse: Int32Array): SparseMatrix {
  if (storageForm(L) === "full") throw new InputError("permuteLower needs one triangle of A, got both; pass lowerTriangle(A)");
  checkPermutation(inverse, L.ncols, "inverse");
  const n = L.ncols, { colPtr, rowIdx, values } = L;
  const ptr = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    const pj = inverse[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) ptr[Math.min(pj, inverse[rowIdx[p]]) + 1]++;
  }
  for (let j = 0; j < n; j++) ptr[j + 1] += ptr[j];
  // Scatter into a transposed image first so the second pass leaves rows sorted.
  const nz = ptr[n];
  const tptr = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    const pj = inverse[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) tptr[Math.max(pj, inverse[rowIdx[p]]) + 1]++;
  }
  for (let i = 0; i < n; i++) tptr[i + 1] += tptr[i];
  const tcol = new Int32Array(nz), tval = new Float64Array(nz), tnext = tptr.slice(0, n);
  for (let j = 0; j < n; j++) {
    const pj = inverse[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = inverse[rowIdx[p]];
      const r = pi > pj ? pi : pj, c = pi > pj ? pj : pi;
      const q = tnext[r]++;
      tcol[q] = c;
      tval[q] = values[p];
    }
  }
  const idx = new Int32Array(nz), val = new Float64Array(nz), next = ptr.slice(0, n);
  for (let r = 0; r < n; r++) {
    for (let q = tptr[r]; q < tptr[r + 1]; q++) {
      const d = next[tcol[q]]++;
      idx[d] = r;
      val[d] = tval[q];
    }
  }
  return SparseMatrix.trusted(n, n, ptr, idx, val);
}

/**
 * y = A·x for a symmetric A in any storage form: a one-triangle matrix stands
 * for the full symmetric matrix it implies.
 */
export function symmetricMultiply(A: SparseMatrix, x: ArrayLike<number>, y: Float64Array = new Float64Array(A.nrows)): Float64Array {
  const form = storageForm(A);
  if (form === "full") return A.multiply(x, y);
  if (x.length !== A.ncols) throw new InputError(`vector has length ${x.length}, expected ${A.ncols}`);
  y.fill(0);
  const { colPtr, rowIdx, values } = A;
  for (let j = 0; j < A.ncols; j++) {
    const xj = x[j];
    let s = 0;
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p], v = values[p];
      y[i] += v * xj;
      if (i !== j) s += v * x[i];
    }
    y[j] += s;
  }
  return y;
}

/**
 * ‖A‖∞ (= ‖A‖₁) of the symmetric matrix implied by the storage: the largest
 * absolute row sum.
 */
export function symmetricNormInf(A: SparseMatrix): number {
  const form = storageForm(A);
  const sums = new Float64Array(A.nrows);
  const { colPtr, rowIdx, values } = A;
  for (let j = 0; j < A.ncols; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p], a = Math.abs(values[p]);
      sums[i] += a;
      if (form !== "full" && i !== j) sums[j] += a;
    }
  }
  let m = 0;
  for (let i = 0; i < sums.length; i++) if (sums[i] > m) m = sums[i];
  return m;
}
