/**
 * The undirected graph of a symmetric sparsity pattern: vertices are the
 * columns, an edge joins i and j when A(i, j) or A(j, i) is stored (i ≠ j).
 * Built by merging each column of A with the same column of Aᵀ, which keeps
 * neighbour lists sorted and free of repeats in O(nnz + n) (common practice).
 */
import { transposeArrays, type SparseMatrix } from "../matrix/sparse.js";
import { requireSquare } from "../matrix/symmetric.js";
import type { Graph } from "./types.js";

/** Adjacency of the symmetric pattern of A (any of the three storage forms). */
export function adjacencyGraph(A: SparseMatrix): Graph {
  requireSquare(A);
  const n = A.ncols;
  const T = transposeArrays(A, false);
  const offsets = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) offsets[j + 1] = offsets[j] + mergeColumn(A, T, j, null, 0);
  const neighbours = new Int32Array(offsets[n]);
  for (let j = 0; j < n; j++) mergeColumn(A, T, j, neighbours, offsets[j]);
  return { n, offsets, neighbours };
}

/**
 * Merge column j of A with column j of Aᵀ (both sorted), dropping the
 * diagonal and repeats; writes into `out` from `base` when given. Returns the count.
 */
function mergeColumn(
  A: SparseMatrix, T: { colPtr: Int32Array; rowIdx: Int32Array }, j: number, out: Int32Array | null, base: number,
): number {
  const n = A.ncols;
  let p = A.colPtr[j], q = T.colPtr[j], count = 0;
  const pe = A.colPtr[j + 1], qe = T.colPtr[j + 1];
  while (p < pe || q < qe) {
    const ia = p < pe ? A.rowIdx[p] : n, it = q < qe ? T.rowIdx[q] : n;
    const i = ia < it ? ia : it;
    if (ia === i) p++;
    if (it === i) q++;
    if (i === j) continue;
    if (out) out[base + count] = i;
    count++;
  }
  return count;
}
