/**
 * The factorization on matrices of the kinds users bring: 3-D elasticity
 * (three unknowns per node), an unstructured 2-D plate mesh with high-contrast
 * coefficients, a random geometric graph Laplacian, a disconnected matrix and
 * a regularized saddle point built from them. Every check is the normwise
 * backward error bound c·n·ε of a backward-stable factorization (Higham
 * 2002, Thm 10.4 for Cholesky; Gill, Saunders & Shinnerl 1996, SIAM J.
 * Matrix Anal. Appl. 17(1), for L·D·Lᵀ of quasi-definite matrices; both
 * citations from memory), measured
 * with an independent residual computed by the test.
 */
import { describe, expect, it } from "vitest";
import { elasticity3d } from "../src/generate/elasticity.js";
import { geometricLaplacian } from "../src/generate/graphs.js";
import { grid2d } from "../src/generate/grids.js";
import { plateMesh2d } from "../src/generate/plate.js";
import { SparseMatrix } from "../src/matrix/sparse.js";
import { factorize } from "../src/numeric/index.js";
import { EPS, analyse, backwardError, blockDiagonal, randomPermutation, randomVector, rng } from "./helpers/numeric.js";



describe("matrices users bring", () => {
  const cases: Array<[string, () => SparseMatrix]> = [
    ["3-D Q1 elasticity, 3 dof per node", () => elasticity3d(5).matrix],
    ["unstructured plate mesh, contrast 1e6", () => plateMesh2d(60, 1e6).matrix],
    ["geometric graph Laplacian + shift", () => geometricLaplacian(1500, 8, 1e-2, 3).matrix],
    ["disconnected: grid ⊕ elasticity ⊕ 1×1", () => blockDiagonal([grid2d(12).matrix, elasticity3d(3).matrix, SparseMatrix.fromTriplets(1, 1, [0], [0], [2])])],
  ];
  for (const [name, make] of cases) {
    it(`${name}: Cholesky and L·D·Lᵀ solves are backward stable`, () => {
      const A = make(), n = A.ncols;
      const input = analyse(A, randomPermutation(n, n));
      const b = randomVector(n, 1);
      for (const method of ["cholesky", "ldlt"] as const) {
        const F = factorize(input, A, { method });
        expect(F.inertia()).toEqual({ positive: n, negative: 0, zero: 0 });
        const x = F.solve(b);
        expect(backwardError(A, x, b)).toBeLessThanOrEqual(10 * n * EPS);
        const refined = F.solveWithInfo(b, { refine: true });
        expect(refined.backwardError).toBeLessThanOrEqual(backwardError(A, x, b) + EPS);
        expect(backwardError(A, refined.x, b)).toBeLessThanOrEqual(4 * EPS * 10);
      }
    });
  }

  it("saddle point [[K, Bᵀ], [B, −δI]] from elasticity: inertia (n₁, n₂) and a backward-stable solve", () => {
    const K = elasticity3d(4).matrix, n1 = K.ncols, n2 = 20, r = rng(5);
    const rows: number[] = [], cols: number[] = [], vals: number[] = [];
    for (let j = 0; j < n1; j++) for (let p = K.colPtr[j]; p < K.colPtr[j + 1]; p++) { rows.push(K.rowIdx[p]); cols.push(j); vals.push(K.values[p]); }
    for (let i = 0; i < n2; i++) {
      for (let t = 0; t < 6; t++) { rows.push(n1 + i); cols.push(Math.floor(r() * n1)); vals.push(r() * 2 - 1); } // constraint rows
      rows.push(n1 + i); cols.push(n1 + i); vals.push(-1e-6);
    }
    const A = SparseMatrix.fromTriplets(n1 + n2, n1 + n2, rows, cols, vals), n = n1 + n2;
    const F = factorize(analyse(A, randomPermutation(n, 2)), A, { method: "ldlt" });
    expect(F.inertia()).toEqual({ positive: n1, negative: n2, zero: 0 });
    const b = randomVector(n, 3);
    const info = F.solveWithInfo(b, { refine: true });
    expect(backwardError(A, info.x, b)).toBeLessThanOrEqual(10 * n * EPS);
  });
});
