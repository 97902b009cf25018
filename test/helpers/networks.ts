/**
 * Graph Laplacians of networks with a power-law degree distribution, grown
 * by preferential attachment (Barabási & Albert 1999, Science 286): each new
 * vertex joins m distinct earlier vertices, picked with probability
 * proportional to their degree (1 in 20 picks uniform, so that a lone start
 * can grow). Hubs of degree ~√n appear, and minimum degree typically fills
 * less than nested dissection on them.
 */
import { SparseMatrix } from "../../src/matrix/sparse.js";
import { rng } from "./numeric.js";

/** L + shift·I for the preferential-attachment graph on n vertices (lower triangle, unit edge weights). */
export function powerLawLaplacian(n: number, m: number, seed: number, shift: number): SparseMatrix {
  const r = rng(seed), ends: number[] = [], degree = new Float64Array(n);
  const rows: number[] = [], cols: number[] = [], vals: number[] = [];
  for (let v = 1; v < n; v++) {
    const chosen = new Set<number>();
    while (chosen.size < Math.min(m, v)) {
      chosen.add(ends.length === 0 || r() < 0.05 ? Math.floor(r() * v) : ends[Math.floor(r() * ends.length)]);
    }
    for (const u of chosen) {
      rows.push(v); cols.push(u); vals.push(-1);
      degree[u]++; degree[v]++;
      ends.push(u, v);
    }
  }
  for (let i = 0; i < n; i++) { rows.push(i); cols.push(i); vals.push(degree[i] + shift); }
  return SparseMatrix.fromTriplets(n, n, rows, cols, vals);
}
