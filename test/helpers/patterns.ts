/** Shared test helpers: model problems and brute-force references written for the tests. */
import { SparseMatrix } from "../../src/matrix/sparse.js";

/** 5-point Laplacian on a k×k grid (Dirichlet), lower triangle, natural row-by-row numbering. */
export function grid2d(k: number): SparseMatrix {
  const r: number[] = [], c: number[] = [], v: number[] = [];
  for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
    const i = y * k + x;
    r.push(i); c.push(i); v.push(4);
    if (x + 1 < k) { r.push(i + 1); c.push(i); v.push(-1); }
    if (y + 1 < k) { r.push(i + k); c.push(i); v.push(-1); }
  }
  return SparseMatrix.fromTriplets(k * k, k * k, r, c, v);
}

/** Tridiagonal (−1, 2, −1) of order n, lower triangle. */
export function laplacian1d(n: number): SparseMatrix {
  const r: number[] = [], c: number[] = [], v: number[] = [];
  for (let i = 0; i < n; i++) {
    r.push(i); c.push(i); v.push(2);
    if (i + 1 < n) { r.push(i + 1); c.push(i); v.push(-1); }
  }
  return SparseMatrix.fromTriplets(n, n, r, c, v);
}

/**
 * Brute-force symbolic Cholesky: eliminate vertices of the symmetric pattern in
 * the order given (new → old) on a dense boolean matrix; returns the column
 * counts of L (diagonal included) in the new numbering. O(n³), tests only.
 */
export function bruteForceCounts(n: number, edges: Array<[number, number]>, perm: ArrayLike<number>): number[] {
  const inv = new Array<number>(n);
  for (let k = 0; k < n; k++) inv[perm[k]] = k;
  const m: boolean[][] = Array.from({ length: n }, () => new Array<boolean>(n).fill(false));
  for (const [a, b] of edges) { if (a !== b) { m[inv[a]][inv[b]] = true; m[inv[b]][inv[a]] = true; } }
  const counts: number[] = [];
  for (let j = 0; j < n; j++) {
    const below: number[] = [];
    for (let i = j + 1; i < n; i++) if (m[i][j]) below.push(i);
    counts.push(below.length + 1);
    for (const a of below) for (const b of below) if (a !== b) m[a][b] = true;
  }
  return counts;
}

/** Lower-triangle SparseMatrix with the given off-diagonal edges and a dominant diagonal. */
export function patternMatrix(n: number, edges: Array<[number, number]>): SparseMatrix {
  const r: number[] = [], c: number[] = [], v: number[] = [];
  const deg = new Array<number>(n).fill(0);
  for (const [a, b] of edges) {
    if (a === b) continue;
    r.push(Math.max(a, b)); c.push(Math.min(a, b)); v.push(-1);
    deg[a]++; deg[b]++;
  }
  for (let i = 0; i < n; i++) { r.push(i); c.push(i); v.push(deg[i] + 1); }
  return SparseMatrix.fromTriplets(n, n, r, c, v);
}
