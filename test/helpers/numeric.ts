/**
 * Shared helpers of the numeric tests: an analysis built from the project's
 * graph and symbolic stages, random sparse SPD and quasi-definite matrices,
 * dense copies for ml-matrix, and read-back of L from the kernel store.
 */
import fc from "fast-check";
import { Matrix } from "ml-matrix";
import { adjacencyGraph } from "../../src/graph/adjacency.js";
import type { DenseKernels } from "../../src/kernels/types.js";
import { SparseMatrix } from "../../src/matrix/sparse.js";
import { CB_PANEL } from "../../src/numeric/contribution.js";
import type { NumericInput } from "../../src/numeric/types.js";
import { symbolicFactorization, type AmalgamationOptions } from "../../src/symbolic/index.js";

export const EPS = Number.EPSILON;

/** Analyse A (any storage form) for the ordering `order` (new → old, identity by default). */
export function analyse(A: SparseMatrix, order?: Int32Array, amalgamation: AmalgamationOptions | false = {}): NumericInput {
  const n = A.ncols;
  const perm = order ?? Int32Array.from({ length: n }, (_, i) => i);
  const sym = symbolicFactorization(adjacencyGraph(A), perm, amalgamation);
  return { structure: sym.structure, permutation: sym.permutation, inversePermutation: sym.inverse, flops: sym.flops };
}

/** Dense symmetric copy (ml-matrix) of a matrix stored in any form. */
export function dense(A: SparseMatrix): Matrix {
  const n = A.ncols, M = new Matrix(n, n);
  for (let j = 0; j < n; j++) for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) {
    const i = A.rowIdx[p];
    M.set(i, j, A.values[p]); M.set(j, i, A.values[p]);
  }
  return M;
}

/** L (dense n×n, new numbering) read back from the store after a factorization with kernels K. */
export function readFactor(K: DenseKernels, input: NumericInput): Matrix {
  const st = input.structure, S = K.view(), L = new Matrix(st.n, st.n);
  for (let s = 0; s < st.supernodeCount; s++) {
    const r0 = st.rowPtr[s], m = st.rowPtr[s + 1] - r0, f = st.superStart[s];
    for (let jj = 0; jj < st.superStart[s + 1] - f; jj++) {
      for (let ii = jj; ii < m; ii++) L.set(st.rowIdx[r0 + ii], f + jj, S[st.factorPtr[s] + jj * m + ii]);
    }
  }
  return L;
}

/** Symmetric permutation P·A·Pᵀ of a dense matrix, perm new → old. */
export function permuteDense(M: Matrix, perm: Int32Array): Matrix {
  const n = perm.length, out = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out.set(i, j, M.get(perm[i], perm[j]));
  return out;
}

/** A random sparse pattern with values; lower triangle only, diagonal strictly dominant (SPD by Gershgorin). */
export const sparseSpd = fc
  .record({
    n: fc.integer({ min: 1, max: 60 }),
    density: fc.double({ min: 0.02, max: 0.4, noNaN: true }),
    seed: fc.integer(),
    scale: fc.constantFrom(1, 1e-3, 1e4),
  })
  .map(({ n, density, seed, scale }) => randomSpd(n, density, seed, scale));

/** xorshift32 in [0, 1). */
export function rng(seed: number): () => number {
  let s = seed | 0 || 0x9e3779b9;
  return () => {
    s ^= s << 13; s ^= s >>> 17; s ^= s << 5;
    return (s >>> 0) / 2 ** 32;
  };
}

/** A vector of n values uniform in [−1, 1) from rng(seed). */
export function randomVector(n: number, seed: number): Float64Array {
  const r = rng(seed);
  return Float64Array.from({ length: n }, () => r() * 2 - 1);
}

export function randomSpd(n: number, density: number, seed: number, scale = 1): SparseMatrix {
  const r = rng(seed), rows: number[] = [], cols: number[] = [], vals: number[] = [];
  const rowSum = new Float64Array(n);
  for (let j = 0; j < n; j++) for (let i = j + 1; i < n; i++) {
    if (r() < density) {
      const v = (r() * 2 - 1) * scale;
      rows.push(i); cols.push(j); vals.push(v);
      rowSum[i] += Math.abs(v); rowSum[j] += Math.abs(v);
    }
  }
  for (let i = 0; i < n; i++) { rows.push(i); cols.push(i); vals.push(rowSum[i] + scale * (0.1 + r())); }
  return SparseMatrix.fromTriplets(n, n, rows, cols, vals);
}

/** B·Bᵀ + δI for a random sparse B (n×n): SPD, not diagonally dominant; lower triangle. */
export function gramPlusShift(n: number, density: number, seed: number, delta: number): SparseMatrix {
  const r = rng(seed);
  const B: Array<Array<[number, number]>> = Array.from({ length: n }, () => []); // rows of B: (col, value)
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) if (r() < density || i === k) B[i].push([k, r() * 2 - 1]);
  const rows: number[] = [], cols: number[] = [], vals: number[] = [];
  for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) {
    let s = i === j ? delta : 0;
    for (const [k, v] of B[i]) for (const [k2, w] of B[j]) if (k === k2) s += v * w;
    if (s !== 0 || i === j) { rows.push(i); cols.push(j); vals.push(s); }
  }
  return SparseMatrix.fromTriplets(n, n, rows, cols, vals);
}

/** Lower-stored matrix → the same matrix stored upper-only (transpose) or in both triangles. */
export function asUpper(A: SparseMatrix): SparseMatrix {
  return A.transpose();
}
export function asFull(A: SparseMatrix): SparseMatrix {
  const r: number[] = [], c: number[] = [], v: number[] = [];
  for (let j = 0; j < A.ncols; j++) for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) {
    const i = A.rowIdx[p];
    r.push(i); c.push(j); v.push(A.values[p]);
    if (i !== j) { r.push(j); c.push(i); v.push(A.values[p]); }
  }
  return SparseMatrix.fromTriplets(A.nrows, A.ncols, r, c, v);
}

/** A random permutation (Fisher–Yates). */
export function randomPermutation(n: number, seed: number): Int32Array {
  const r = rng(seed), p = Int32Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    const t = p[i]; p[i] = p[j]; p[j] = t;
  }
  return p;
}

/** ‖b − A·x‖∞ / (‖A‖∞‖x‖∞ + ‖b‖∞) computed densely with ml-matrix (independent of the library's own residual). */
export function denseBackwardError(M: Matrix, x: ArrayLike<number>, b: ArrayLike<number>): number {
  const n = M.rows;
  let rn = 0, xn = 0, bn = 0, an = 0;
  for (let i = 0; i < n; i++) {
    let s = 0, rowAbs = 0;
    for (let j = 0; j < n; j++) { s += M.get(i, j) * x[j]; rowAbs += Math.abs(M.get(i, j)); }
    rn = Math.max(rn, Math.abs(b[i] - s)); xn = Math.max(xn, Math.abs(x[i])); bn = Math.max(bn, Math.abs(b[i]));
    an = Math.max(an, rowAbs);
  }
  return rn / (an * xn + bn);
}

/** η = ‖b − A·x‖∞ / (‖A‖∞‖x‖∞ + ‖b‖∞) for a lower-stored symmetric A, computed entry by entry. */
export function backwardError(A: SparseMatrix, x: Float64Array, b: Float64Array): number {
  const n = A.ncols, ax = new Float64Array(n), rowAbs = new Float64Array(n);
  for (let j = 0; j < n; j++) for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) {
    const i = A.rowIdx[p], v = A.values[p];
    ax[i] += v * x[j]; rowAbs[i] += Math.abs(v);
    if (i !== j) { ax[j] += v * x[i]; rowAbs[j] += Math.abs(v); }
  }
  let r = 0, xn = 0, bn = 0, an = 0;
  for (let i = 0; i < n; i++) {
    r = Math.max(r, Math.abs(b[i] - ax[i])); xn = Math.max(xn, Math.abs(x[i]));
    bn = Math.max(bn, Math.abs(b[i])); an = Math.max(an, rowAbs[i]);
  }
  return r / (an * xn + bn);
}

/** Block diagonal of lower-stored matrices (disconnected pieces). */
export function blockDiagonal(parts: SparseMatrix[]): SparseMatrix {
  const r: number[] = [], c: number[] = [], v: number[] = [];
  let off = 0;
  for (const P of parts) {
    for (let j = 0; j < P.ncols; j++) for (let p = P.colPtr[j]; p < P.colPtr[j + 1]; p++) {
      r.push(off + P.rowIdx[p]); c.push(off + j); v.push(P.values[p]);
    }
    off += P.ncols;
  }
  return SparseMatrix.fromTriplets(off, off, r, c, v);
}

/**
 * Doubles the factorization stores for a contribution block of order b, counted
 * column by column: column j keeps rows j0..b−1, j0 the first column of its
 * CB_PANEL-column panel (the layout of src/numeric/contribution.ts).
 */
export function panelStoredDoubles(b: number): number {
  let total = 0;
  for (let j = 0; j < b; j++) total += b - CB_PANEL * Math.floor(j / CB_PANEL);
  return total;
}
