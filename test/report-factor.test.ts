import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { CholeskyDecomposition, Matrix } from "ml-matrix";
import { SparseMatrix } from "../src/matrix/sparse.js";
import { analyze } from "../src/solver/analyze.js";
import { binFactor } from "../src/report/density.js";
import { exactFactorPattern } from "../src/report/pattern.js";
import { adjacencyGraph } from "../src/graph/adjacency.js";
import { grid2d } from "../src/generate/grids.js";
import { treeChildren } from "../src/report/svg.js";

/** Random sparse SPD matrix (strictly diagonally dominant, lower triangle) with random values. */
const spd = fc.integer({ min: 2, max: 30 }).chain((n) =>
  fc.array(fc.tuple(fc.integer({ min: 0, max: n - 1 }), fc.integer({ min: 0, max: n - 1 }), fc.double({ min: 0.1, max: 1, noNaN: true })), { maxLength: 3 * n })
    .map((entries) => {
      const rows: number[] = [], cols: number[] = [], vals: number[] = [];
      const diag = new Array(n).fill(1);
      for (const [a, b, v] of entries) {
        if (a === b) continue;
        rows.push(Math.max(a, b)); cols.push(Math.min(a, b)); vals.push(-v);
        diag[a] += v; diag[b] += v;
      }
      for (let i = 0; i < n; i++) { rows.push(i); cols.push(i); vals.push(diag[i]); }
      return SparseMatrix.fromTriplets(n, n, rows, cols, vals);
    }));

describe("the report's picture of L", () => {
  it("drawn in the ordering's numbering, it holds exactly the nonzeros of the dense Cholesky factor of P·A·Pᵀ (ml-matrix): nnz(L) entries", () => {
    fc.assert(fc.property(spd, fc.constantFrom("nested-dissection", "minimum-degree", "reverse-cuthill-mckee", "natural" as const), (A, ordering) => {
      const n = A.ncols;
      const an = analyze(A, { ordering });
      const p = an.orderingPermutation, inv = new Int32Array(n);
      p.forEach((old, k) => (inv[old] = k));
      const exact = exactFactorPattern(adjacencyGraph(A), p);
      const relabel = Int32Array.from(exact.permutation, (old) => inv[old]);
      const b = binFactor(exact.structure, n, relabel);
      // dense P·A·Pᵀ in the ordering's numbering, factored by ml-matrix
      const D = A.toDense();
      const M = Matrix.zeros(n, n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) M.set(i, j, D[Math.max(p[i], p[j])][Math.min(p[i], p[j])]);
      const L = new CholeskyDecomposition(M).lowerTriangularMatrix;
      const scale = L.max();
      for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) {
        if (Math.abs(L.get(i, j)) > 1e-12 * scale) expect(b.counts[i * n + j]).toBeGreaterThan(0);
        if (j < i) expect(b.counts[j * n + i]).toBe(0); // nothing above the diagonal
      }
      // no explicit zeros: the picture has exactly nnz(L) entries, one per cell
      let drawn = 0;
      for (const c of b.counts) { if (c > 0) drawn++; expect(c).toBeLessThanOrEqual(1); }
      expect(drawn).toBe(an.stats.nnzL);
    }), { numRuns: 60 });
  });

  it("the blocks the report outlines as zero hold no entry of L (nested dissection of a 24×24 grid)", () => {
    const A = grid2d(24).matrix, n = A.ncols;
    const an = analyze(A, { ordering: "nested-dissection" });
    const t = an.separatorTree!;
    expect(t.count).toBeGreaterThan(3);
    const inv = new Int32Array(n);
    an.orderingPermutation.forEach((old, k) => (inv[old] = k));
    const exact = exactFactorPattern(adjacencyGraph(A), an.orderingPermutation);
    const b = binFactor(exact.structure, n, Int32Array.from(exact.permutation, (old) => inv[old]));
    const ch = treeChildren(t);
    let checked = 0;
    for (let i = 0; i < t.count; i++) for (let x = 0; x < ch[i].length; x++) for (let y = x + 1; y < ch[i].length; y++) {
      const a = ch[i][x], c = ch[i][y]; // c after a: rows of c × columns of a, below the diagonal
      let inside = 0;
      for (let r = t.first[c]; r < t.end[c]; r++) for (let q = t.first[a]; q < t.end[a]; q++) inside += b.counts[r * n + q];
      expect(inside).toBe(0);
      checked++;
    }
    expect(checked).toBeGreaterThan(2);
  });
});
