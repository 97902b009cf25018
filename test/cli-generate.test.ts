import { describe, expect, it } from "vitest";
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix } from "ml-matrix";
import { grid2d, grid3d } from "../src/generate/grids.js";
import { elasticity3d, hexStiffness } from "../src/generate/elasticity.js";
import { geometricLaplacian } from "../src/generate/graphs.js";
import { plateMesh2d } from "../src/generate/plate.js";
import { saddle2d } from "../src/generate/saddle.js";
import { symmetricMultiply } from "../src/matrix/symmetric.js";
import { dense } from "./helpers/numeric.js";
import { InputError } from "../src/errors.js";

const ones = (n: number) => new Float64Array(n).fill(1);

describe("model problems", () => {
  it("grid2d 5-point: k×k Dirichlet Laplacian has the closed-form eigenvalues 4 − 2cos(pπ/(k+1)) − 2cos(qπ/(k+1)) (LeVeque 2007)", () => {
    const k = 6;
    const ev = new EigenvalueDecomposition(dense(grid2d(k).matrix)).realEigenvalues.sort((a, b) => a - b);
    const exact: number[] = [];
    for (let p = 1; p <= k; p++) for (let q = 1; q <= k; q++) exact.push(4 - 2 * Math.cos((p * Math.PI) / (k + 1)) - 2 * Math.cos((q * Math.PI) / (k + 1)));
    exact.sort((a, b) => a - b);
    ev.forEach((v, i) => expect(Math.abs(v - exact[i])).toBeLessThan(1e-12 * 8));
  });

  it("grid2d 9-point (bilinear elements): interior rows sum to zero, the matrix is SPD (ml-matrix Cholesky)", () => {
    const k = 7;
    const A = grid2d(k, 9).matrix;
    const r = symmetricMultiply(A, ones(k * k));
    for (let y = 1; y < k - 1; y++) for (let x = 1; x < k - 1; x++) expect(Math.abs(r[y * k + x])).toBeLessThan(1e-14);
    expect(new CholeskyDecomposition(dense(A)).isPositiveDefinite()).toBe(true);
  });

  it("grid3d 7-point: interior rows sum to zero, n = k³, 3k²(k−1) edges (closed form)", () => {
    const k = 5;
    const A = grid3d(k).matrix;
    expect(A.ncols).toBe(k ** 3);
    expect(A.nnz).toBe(k ** 3 + 3 * k * k * (k - 1));
    expect(symmetricMultiply(A, ones(k ** 3))[(2 * k + 2) * k + 2]).toBe(0);
  });

  it("Q1 hexahedron stiffness: symmetric, the six rigid-body motions produce no force, the rest of the spectrum is positive (common practice)", () => {
    const K = new Matrix(Array.from({ length: 24 }, (_, i) => Array.from(hexStiffness(0.5, 200, 0.3).subarray(24 * i, 24 * i + 24))));
    const corners = [[0, 0, 0], [1, 0, 0], [1, 1, 0], [0, 1, 0], [0, 0, 1], [1, 0, 1], [1, 1, 1], [0, 1, 1]].map((c) => c.map((v) => v * 0.5));
    const modes = [
      () => [1, 0, 0], () => [0, 1, 0], () => [0, 0, 1],
      (x: number[]) => [-x[1], x[0], 0], (x: number[]) => [0, -x[2], x[1]], (x: number[]) => [x[2], 0, -x[0]],
    ];
    const scale = K.max();
    for (const m of modes) {
      const u = Matrix.columnVector(corners.flatMap((c) => m(c)));
      expect(K.mmul(u).norm("frobenius")).toBeLessThan(1e-12 * scale);
    }
    expect(K.clone().sub(K.transpose()).norm("frobenius")).toBeLessThan(1e-12 * scale);
    const ev = new EigenvalueDecomposition(K).realEigenvalues.sort((a, b) => a - b);
    expect(ev.filter((v) => Math.abs(v) < 1e-9 * scale).length).toBe(6);
    expect(ev[6]).toBeGreaterThan(1e-6 * scale);
  });

  it("elasticity3d: n = 3·k·(k+1)², clamped cube is SPD (ml-matrix Cholesky)", () => {
    const k = 2;
    const A = elasticity3d(k).matrix;
    expect(A.ncols).toBe(3 * k * (k + 1) ** 2);
    expect(new CholeskyDecomposition(dense(A)).isPositiveDefinite()).toBe(true);
  });

  it("geometric Laplacian: (L + δI)·1 = δ·1 (a Laplacian annihilates constants, closed form)", () => {
    const m = geometricLaplacian(500, 6, 0.01, 3);
    const r = symmetricMultiply(m.matrix, ones(500));
    for (const v of r) expect(Math.abs(v - 0.01)).toBeLessThan(1e-12);
  });

  it("mesh2d: P1 stiffness rows of nodes away from the channels sum to zero (constants in the kernel, common practice)", () => {
    const m = plateMesh2d(60);
    const r = symmetricMultiply(m.matrix, ones(m.matrix.ncols));
    let zeroRows = 0;
    for (const v of r) if (Math.abs(v) < 1e-12) zeroRows++;
    expect(zeroRows).toBeGreaterThan(0.8 * m.matrix.ncols);
  });

  it("saddle2d: quasi-definite, so its inertia is (velocity unknowns, pressure unknowns) (Vanderbei 1995; eigenvalues by ml-matrix)", () => {
    const k = 4;
    const ev = new EigenvalueDecomposition(dense(saddle2d(k).matrix)).realEigenvalues;
    expect(ev.filter((v) => v > 0).length).toBe(2 * k * k);
    expect(ev.filter((v) => v < 0).length).toBe((k - 1) * (k - 1));
  });

  it("saddle2d refuses a stabilization γ that is not > 0 (the matrix would not be quasi-definite)", () => {
    expect(() => saddle2d(4, -1)).toThrow(InputError);
    expect(() => saddle2d(4, 0)).toThrow(/saddle2d gamma must be a finite number > 0, got 0/);
    expect(() => saddle2d(4, Number.NaN)).toThrow(/got NaN/);
  });
});
