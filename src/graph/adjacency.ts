/**
 * The undirected graph of a symmetric sparsity pattern: vertices are the
 * columns, an edge joins i and j when A(i, j) or A(j, i) is stored (i ≠ j).
 * Built by merging each column of A with the same column of Aᵀ, which keeps
 * neighbour lists sorted and free of repeats in O(nnz + n) (common practice).
 */
import { SparseMatrix } from "../matrix/sparse.js";
import { requireSquare } from "../matrix/symmetric.js";
import type { Graph } from "./types.js";

/** Adjacency of the symmetric pattern of A (any of the three storage forms). */
export function adjacencyGraph(A: SparseMatrix): Graph {
  requireSquare(A);
  const n = A.ncols;
  const T = transposePattern(A);
  const offsets = new Int32Array(n + 1);
  for (let pass = 0; pass < 2; pass++) {
    const neighbours = pass === 1 ? new Int32Array(offsets[n]) : null;
    for (let j = 0; j < n; j++) {
      let p = A.colPtr[j], q = T.colPtr[j], count = 0;
      const pe = A.colPtr[j + 1], qe = T.colPtr[j + 1];
      const base = pass === 1 ? offsets[j] : 0;
      while (p < pe || q < qe) {
        const ia = p < pe ? A.rowIdx[p] : n, it = q < qe ? T.rowIdx[q] : n;
        const i = ia < it ? ia : it;
        if (ia === i) p++;
        if (it === i) q++;
        if (i === j) continue;
        if (neighbours) neighbours[base + count] = i;
        count++;
      }
      if (!neighbours) offsets[j + 1] = offsets[j] + count;
    }
    if (neighbours) return { n, offsets, neighbours };
  }
  throw new Error("unreachable");
}

/** Pattern of Aᵀ (no values). */
function transposePattern(A: SparseMatrix): { colPtr: Int32Array; rowIdx: Int32Array } {
  const n = A.ncols, nz = A.nnz, { colPtr, rowIdx } = A;
  const tPtr = new Int32Array(n + 1);
  for (let p = 0; p < nz; p++) tPtr[rowIdx[p] + 1]++;
  for (let i = 0; i < n; i++) tPtr[i + 1] += tPtr[i];
  const next = tPtr.slice(0, n), tIdx = new Int32Array(nz);
  for (let j = 0; j < n; j++) for (let p = colPtr[j]; p < colPtr[j + 1]; p++) tIdx[next[rowIdx[p]]++] = j;
  return { colPtr: tPtr, rowIdx: tIdx };
}

/** Number of undirected edges. */
export function edgeCount(g: Graph): number {
  return g.offsets[g.n] / 2;
}
