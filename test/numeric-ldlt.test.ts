/**
 * L·D·Lᵀ without pivoting on quasi-definite and SPD matrices. Outside
 * references: Vanderbei 1995 (SIAM J. Optim. 5(1); from memory): a quasi-definite
 * [[H, Bᵀ], [B, −C]] (H, C positive definite) factors as L·D·Lᵀ for every
 * symmetric permutation, and D then has n₁ positive and n₂ negative entries
 * (Sylvester's law of inertia); ml-matrix's determinant and solve on small
 * cases; Cholesky's factor on SPD matrices (D = diag(L)², common practice).
 */
import fc from "fast-check";
import { Matrix, determinant, solve as denseSolve } from "ml-matrix";
import { describe, expect, it } from "vitest";
import { grid2d } from "../src/generate/grids.js";
import { SparseMatrix } from "../src/matrix/sparse.js";
import { factorize } from "../src/numeric/index.js";
import { jsKernels } from "../src/kernels/js/index.js";
import { wasmKernels } from "../src/kernels/wasm/index.js";
import { EPS, analyse, asFull, dense, denseBackwardError, randomPermutation, randomSpd, rng } from "./helpers/numeric.js";

/** [[H, Bᵀ], [B, −C]] with H, C sparse diagonally dominant SPD and B sparse random; lower triangle. */
function quasiDefinite(n1: number, n2: number, seed: number, density = 0.15): SparseMatrix {
  const r = rng(seed), rows: number[] = [], cols: number[] = [], vals: number[] = [];
  const H = randomSpd(n1, density, seed), C = randomSpd(n2, density, seed + 7, 1e-2);
  for (let j = 0; j < n1; j++) for (let p = H.colPtr[j]; p < H.colPtr[j + 1]; p++) { rows.push(H.rowIdx[p]); cols.push(j); vals.push(H.values[p]); }
  for (let j = 0; j < n2; j++) for (let p = C.colPtr[j]; p < C.colPtr[j + 1]; p++) { rows.push(n1 + C.rowIdx[p]); cols.push(n1 + j); vals.push(-C.values[p]); }
  for (let i = 0; i < n2; i++) for (let j = 0; j < n1; j++) if (r() < density) { rows.push(n1 + i); cols.push(j); vals.push(r() * 4 - 2); }
  return SparseMatrix.fromTriplets(n1 + n2, n1 + n2, rows, cols, vals);
}

describe("quasi-definite saddle-point systems", () => {
  it("solve has backward error below 10·n·ε and inertia (n₁, n₂, 0) for any ordering (property)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 40 }), fc.integer({ min: 1, max: 30 }), fc.integer(), (n1, n2, seed) => {
        const A = quasiDefinite(n1, n2, seed), n = n1 + n2;
        const F = factorize(analyse(A, randomPermutation(n, seed)), A, { method: "ldlt" });
        expect(F.method).toBe("ldlt");
        expect(F.inertia()).toEqual({ positive: n1, negative: n2, zero: 0 });
        expect(F.determinantSign()).toBe(n2 % 2 === 0 ? 1 : -1);
        const r = rng(seed + 3), b = Float64Array.from({ length: n }, () => r() - 0.5);
        const info = F.solveWithInfo(b, { refine: 2 });
        expect(info.backwardError).toBeLessThanOrEqual(10 * n * EPS);
        expect(denseBackwardError(dense(A), info.x, b)).toBeLessThanOrEqual(10 * n * EPS);
      }),
      { numRuns: 50 },
    );
  });

  it("log|det| and its sign match ml-matrix's determinant; x matches ml-matrix's solve", () => {
    for (const [n1, n2, seed] of [[6, 3, 1], [10, 5, 2], [4, 8, 3], [12, 1, 4]]) {
      const A = quasiDefinite(n1, n2, seed, 0.3), n = n1 + n2;
      const F = factorize(analyse(asFull(A), randomPermutation(n, seed)), asFull(A), { method: "ldlt" });
      const det = determinant(dense(A)); // ml-matrix (LU)
      expect(F.logDeterminant()).toBeCloseTo(Math.log(Math.abs(det)), 9);
      expect(F.determinantSign()).toBe(Math.sign(det));
      const b = Float64Array.from({ length: n }, (_, i) => Math.cos(i));
      const x = F.solve(b);
      const xr = denseSolve(dense(A), Matrix.columnVector(Array.from(b)));
      for (let i = 0; i < n; i++) expect(x[i]).toBeCloseTo(xr.get(i, 0), 9);
    }
  });
});

describe("growth of L·D·Lᵀ without pivoting, and the refinement it calls for", () => {
  it("reports the growth max_j (|L|·|D|·|Lᵀ|)_jj / max|a_ij| of [[−γ, 1], [1, 1]] in closed form", () => {
    // Natural order: d₁ = −γ, l₂₁ = −1/γ, d₂ = 1 + 1/γ, so (|L||D||Lᵀ|)₁₁ = γ and
    // (|L||D||Lᵀ|)₂₂ = l₂₁²·γ + d₂ = 1 + 2/γ (worked by hand); max|a_ij| = 1.
    for (const gamma of [1e-1, 1e-4, 1e-8]) {
      const A = SparseMatrix.fromTriplets(2, 2, [0, 1, 1], [0, 0, 1], [-gamma, 1, 1]);
      const F = factorize(analyse(A), A, { method: "ldlt" });
      expect(F.stats.growth).toBeCloseTo(1 + 2 / gamma, 6 - Math.log10(1 + 2 / gamma));
      expect(F.inertia()).toEqual({ positive: 1, negative: 1, zero: 0 });
    }
    // Cholesky cannot grow: Σ_k l_jk² = a_jj (common practice).
    const S = grid2d(6).matrix;
    expect(factorize(analyse(S), S).stats.growth).toBe(1);
  });

  it("a quasi-definite system with a small −γ·I block: solve refines by itself when the growth is large", () => {
    // Eliminating a pressure before its velocities makes pivots of order 1/γ: the plain sweeps
    // lose about log10(growth) digits of backward error, refinement in working precision restores them.
    const A = quasiDefinite(40, 20, 5), n = A.ncols;
    const v = A.values.slice();
    for (let j = 40; j < n; j++) for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) v[p] *= 1e-8; // C → 1e-8·C (the whole block: C stays positive definite)
    const Q = SparseMatrix.fromCSC(n, n, A.colPtr, A.rowIdx, v);
    const pressuresFirst = Int32Array.from({ length: n }, (_, k) => (k < 20 ? 40 + k : k - 20));
    const F = factorize(analyse(Q, pressuresFirst), Q, { method: "ldlt" });
    expect(F.inertia()).toEqual({ positive: 40, negative: 20, zero: 0 });
    expect(F.stats.growth).toBeGreaterThan(1e6);
    const b = Float64Array.from({ length: n }, (_, i) => Math.cos(i));
    const plain = F.solveInPlace(b.slice()); // no refinement, by definition
    const x = F.solve(b);
    // Reference residuals: ml-matrix dense products.
    expect(denseBackwardError(dense(Q), plain, b)).toBeGreaterThan(1e4 * n * EPS);
    expect(denseBackwardError(dense(Q), x, b)).toBeLessThanOrEqual(10 * n * EPS);
    expect(F.solveWithInfo(b).backwardError).toBeLessThanOrEqual(10 * n * EPS);
    expect(F.solveWithInfo(b, { refine: 0 }).refinementSteps).toBe(0);
  });
});

describe("L·D·Lᵀ on SPD matrices agrees with Cholesky", () => {
  it("same log det, same solution to rounding, all-positive inertia", () => {
    const A = grid2d(18).matrix, n = A.ncols;
    const input = analyse(A, randomPermutation(n, 11));
    const C = factorize(input, A), L = factorize(input, A, { method: "ldlt" });
    expect(Math.abs(C.logDeterminant() - L.logDeterminant())).toBeLessThan(1e-10 * Math.abs(C.logDeterminant()));
    expect(L.inertia()).toEqual({ positive: n, negative: 0, zero: 0 });
    expect(C.inertia()).toEqual({ positive: n, negative: 0, zero: 0 });
    const b = Float64Array.from({ length: n }, (_, i) => Math.sin(i + 1));
    const x1 = C.solve(b), x2 = L.solve(b);
    for (let i = 0; i < n; i++) expect(Math.abs(x1[i] - x2[i])).toBeLessThan(1e-11 * (1 + Math.abs(x1[i])));
    // Multiple right-hand sides through the D sweep too.
    const B = new Float64Array(3 * n).map((_, i) => Math.cos(i));
    const X = L.solve(B);
    for (let c = 0; c < 3; c++) {
      expect(denseBackwardError(dense(A), X.subarray(c * n, (c + 1) * n), B.subarray(c * n, (c + 1) * n))).toBeLessThan(10 * n * EPS);
    }
    expect(L.stats.method).toBe("ldlt");
    expect(L.stats.peakBytes).toBeGreaterThan(C.stats.peakBytes); // ldlt adds a scratch block
  });
});

/** D·A·D for a lower-stored A and diagonal d (a change of units of each unknown). */
function congruence(A: SparseMatrix, d: Float64Array): SparseMatrix {
  const v = A.values.slice();
  for (let j = 0; j < A.ncols; j++) for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) v[p] *= d[A.rowIdx[p]] * d[j];
  return SparseMatrix.fromCSC(A.nrows, A.ncols, A.colPtr, A.rowIdx, v);
}

describe("pivots are judged in a way a change of units cannot fool", () => {
  it("2-D Laplacian in units from 1e-100 to 1e100 (D·A·D): both methods factor it, log det and smallestPivot as unscaled", () => {
    // A pivot of D·A·D is d_j² times the pivot of A, and so is a_jj (closed form), so a scale-invariant
    // test measures p_j against a_jj, not against the largest entry of its row: in row j of D·A·D that
    // entry is d_j·a_jk·d_k, with d_k up to 1e200 times d_j. Products of two entries of W = L·D reach
    // 1e-400 and must not be formed.
    const k = 12, A = grid2d(k).matrix, n = A.ncols;
    const d = Float64Array.from({ length: n }, (_, i) => 10 ** (100 * Math.sin(2.1 * i))); // 1e-100 .. 1e100
    const S = congruence(A, d);
    // log det(D·A·D) = log det A + 2 Σ log d_j; log det A from the eigenvalues 4 − 2cos(pπ/(k+1)) − 2cos(qπ/(k+1))
    // of the 5-point Laplacian (closed form, LeVeque 2007).
    let logdet = 0;
    for (let p = 1; p <= k; p++) for (let q = 1; q <= k; q++) logdet += Math.log(4 - 2 * Math.cos((p * Math.PI) / (k + 1)) - 2 * Math.cos((q * Math.PI) / (k + 1)));
    let shift = 0;
    for (let i = 0; i < n; i++) shift += 2 * Math.log(d[i]);
    const input = analyse(S, randomPermutation(n, 4));
    const plain = factorize(analyse(A, input.permutation), A).stats.smallestPivot;
    for (const method of ["cholesky", "ldlt"] as const) for (const kernels of [jsKernels, wasmKernels]) {
      const what = `${method}/${kernels.name}`;
      const F = factorize(input, S, { method, kernels: kernels() });
      expect(F.inertia(), what).toEqual({ positive: n, negative: 0, zero: 0 });
      expect(Math.abs(F.logDeterminant() - (logdet + shift)), what).toBeLessThan(1e3 * n * EPS * (Math.abs(logdet) + Math.abs(shift)));
      expect(Math.abs(F.stats.smallestPivot - plain), what).toBeLessThan(1e3 * n * EPS * plain);
      // y = D⁻¹·x solves D·A·D·y = D·b when A·x = b (closed form); x from the unscaled factorization.
      const b = Float64Array.from({ length: n }, (_, i) => Math.cos(i));
      const x = factorize(input, A, { method }).solve(b);
      const y = F.solve(b.map((v, i) => v * d[i]));
      let worst = 0, xmax = 0;
      for (let i = 0; i < n; i++) { worst = Math.max(worst, Math.abs(y[i] * d[i] - x[i])); xmax = Math.max(xmax, Math.abs(x[i])); }
      expect(worst / xmax, what).toBeLessThan(1e2 * n * EPS);
    }
  });

  it("a quasi-definite system with stabilization γ = 1e-14 factors under every ordering with inertia (n₁, n₂)", () => {
    // A −γ pivot eliminated before its neighbours equals its own diagonal entry: no cancellation, so it is
    // not tiny however small γ is (Vanderbei 1995: every symmetric permutation factors). Growth is about
    // 1/γ and solve refines against A.
    const A = quasiDefinite(40, 20, 3), n = A.ncols;
    const v = A.values.slice();
    for (let j = 40; j < n; j++) for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) v[p] *= 1e-12; // C → 1e-12·C (C ~ 1e-2)
    const Q = SparseMatrix.fromCSC(n, n, A.colPtr, A.rowIdx, v);
    const b = Float64Array.from({ length: n }, (_, i) => Math.cos(i));
    const pressuresFirst = Int32Array.from({ length: n }, (_, k) => (k < 20 ? 40 + k : k - 20));
    for (const order of [pressuresFirst, undefined, randomPermutation(n, 8)]) {
      const F = factorize(analyse(Q, order), Q, { method: "ldlt" });
      expect(F.inertia()).toEqual({ positive: 40, negative: 20, zero: 0 });
      // Reference residual: ml-matrix dense product.
      expect(denseBackwardError(dense(Q), F.solve(b), b)).toBeLessThanOrEqual(10 * n * EPS);
    }
  });
});
