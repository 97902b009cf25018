/**
 * Supernodal multifrontal Cholesky and its solves, checked against outside
 * references: ml-matrix (CholeskyDecomposition, solve, dense residuals),
 * closed forms for the 1-D and 2-D Laplacians (standard results), and the
 * normwise backward error bound c·n·ε of a backward-stable Cholesky solve
 * (Higham 2002, Accuracy and Stability of Numerical Algorithms, Thm 10.4;
 * theorem number from memory).
 */
import fc from "fast-check";
import { CholeskyDecomposition, Matrix, solve as denseSolve } from "ml-matrix";
import { describe, expect, it } from "vitest";
import { grid2d } from "../src/generate/grids.js";
import { jsKernels } from "../src/kernels/js/index.js";
import { SparseMatrix } from "../src/matrix/sparse.js";
import { factorize } from "../src/numeric/index.js";
import { stackSchedule, predictWorkspace } from "../src/numeric/workspace.js";
import {
  EPS, analyse, asFull, asUpper, dense, denseBackwardError, gramPlusShift, permuteDense, randomPermutation,
  panelStoredDoubles, randomSpd, randomVector, readFactor, sparseSpd,
} from "./helpers/numeric.js";
import { laplacian1d } from "./helpers/patterns.js";

describe("Cholesky solve on random sparse SPD matrices (property)", () => {
  it("backward error and relative residual stay below 10·n·ε (dense residual via ml-matrix)", () => {
    fc.assert(
      fc.property(sparseSpd, fc.integer(), fc.boolean(), (A, seed, amalgamate) => {
        const n = A.ncols;
        const input = analyse(A, randomPermutation(n, seed), amalgamate ? {} : false);
        const F = factorize(input, A);
        const b = randomVector(n, seed + 1);
        const x = F.solve(b);
        const M = dense(A);
        // Higham 2002 Thm 10.4 (from memory): Cholesky solves are normwise backward stable, η ≤ c·n·ε.
        expect(denseBackwardError(M, x, b)).toBeLessThanOrEqual(10 * n * EPS);
        const Ax = M.mmul(Matrix.columnVector(Array.from(x)));
        let rn = 0, xn = 0;
        for (let i = 0; i < n; i++) { rn = Math.max(rn, Math.abs(b[i] - Ax.get(i, 0))); xn = Math.max(xn, Math.abs(x[i])); }
        expect(rn / (M.norm("max") * n * xn)).toBeLessThanOrEqual(10 * n * EPS);
        const info = F.solveWithInfo(b);
        expect(info.backwardError).toBeLessThanOrEqual(10 * n * EPS);
      }),
      { numRuns: 60 },
    );
  });

  it("B·Bᵀ + δI (not diagonally dominant) with refinement reaches backward error ≈ ε", () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 40 }), fc.integer(), (n, seed) => {
        const A = gramPlusShift(n, 0.1, seed, 1e-3);
        const F = factorize(analyse(A, randomPermutation(n, seed)), A);
        const b = randomVector(n, seed);
        const info = F.solveWithInfo(b, { refine: true });
        expect(info.backwardError).toBeLessThanOrEqual(4 * n * EPS);
        expect(denseBackwardError(dense(A), info.x, b)).toBeLessThanOrEqual(10 * n * EPS);
      }),
      { numRuns: 30 },
    );
  });
});

describe("factor and solution against ml-matrix on small cases", () => {
  it("L of P·A·Pᵀ equals ml-matrix's CholeskyDecomposition; x equals ml-matrix's solve", () => {
    for (let seed = 1; seed <= 12; seed++) {
      const n = 5 + 3 * seed;
      const A = seed % 2 ? randomSpd(n, 0.25, seed) : gramPlusShift(n, 0.08, seed, 0.5);
      const input = analyse(A, randomPermutation(n, 100 + seed));
      const K = jsKernels();
      const F = factorize(input, A, { kernels: K });
      const L = readFactor(K, input);
      const ref = new CholeskyDecomposition(permuteDense(dense(A), input.permutation)).lowerTriangularMatrix; // ml-matrix
      const scale = ref.norm("max");
      for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) {
        expect(Math.abs(L.get(i, j) - ref.get(i, j))).toBeLessThanOrEqual(100 * n * EPS * scale);
      }
      const b = randomVector(n, seed);
      const x = F.solve(b);
      const xr = denseSolve(dense(A), Matrix.columnVector(Array.from(b))); // ml-matrix (LU) solve
      for (let i = 0; i < n; i++) expect(x[i]).toBeCloseTo(xr.get(i, 0), 10);
    }
  });
});

describe("closed forms", () => {
  it("1-D Laplacian: L(i,i) = sqrt((i+1)/i), L(i+1,i) = −sqrt(i/(i+1)) (1-based), log det = log(n+1)", () => {
    // Standard result: tridiag(−1, 2, −1) has det n+1 and this Cholesky factor.
    const n = 300;
    const A = laplacian1d(n);
    const input = analyse(A);
    expect(Array.from(input.permutation)).toEqual(Array.from({ length: n }, (_, i) => i)); // a path's postorder is natural
    const K = jsKernels();
    const F = factorize(input, A, { kernels: K });
    const L = readFactor(K, input);
    for (let i = 1; i <= n; i++) {
      expect(L.get(i - 1, i - 1)).toBeCloseTo(Math.sqrt((i + 1) / i), 13);
      if (i < n) expect(L.get(i, i - 1)).toBeCloseTo(-Math.sqrt(i / (i + 1)), 13);
    }
    expect(F.logDeterminant()).toBeCloseTo(Math.log(n + 1), 10);
    // Any symmetric permutation leaves the determinant unchanged.
    const G = factorize(analyse(A, randomPermutation(n, 5)), A);
    expect(Math.abs(G.logDeterminant() - Math.log(n + 1))).toBeLessThanOrEqual(1e-10);
  });

  it("2-D 5-point Laplacian: log det = Σ log(4 − 2cos(pπ/(k+1)) − 2cos(qπ/(k+1)))", () => {
    // Standard result (LeVeque 2007, Finite Difference Methods for ODEs and PDEs; section from memory).
    for (const k of [7, 24]) {
      let want = 0;
      for (let p = 1; p <= k; p++) for (let q = 1; q <= k; q++) {
        want += Math.log(4 - 2 * Math.cos((p * Math.PI) / (k + 1)) - 2 * Math.cos((q * Math.PI) / (k + 1)));
      }
      const A = grid2d(k).matrix;
      for (const order of [undefined, randomPermutation(k * k, k)]) {
        const F = factorize(analyse(A, order), A);
        expect(Math.abs(F.logDeterminant() - want)).toBeLessThanOrEqual(1e-11 * Math.abs(want) + 1e-11);
      }
    }
  });
});

describe("multiple right-hand sides, storage forms, refactor", () => {
  it("n×k column-major right-hand sides give the same columns (to rounding) as k single solves", () => {
    const A = grid2d(15).matrix, n = A.ncols, k = 5;
    const F = factorize(analyse(A, randomPermutation(n, 3)), A);
    const B = randomVector(n * k, 9);
    const X = F.solve(B);
    const M = dense(A);
    for (let c = 0; c < k; c++) {
      const xc = F.solve(B.subarray(c * n, (c + 1) * n));
      for (let i = 0; i < n; i++) expect(Math.abs(X[c * n + i] - xc[i])).toBeLessThanOrEqual(1e-13 * (1 + Math.abs(xc[i])));
      expect(denseBackwardError(M, X.subarray(c * n, (c + 1) * n), B.subarray(c * n, (c + 1) * n))).toBeLessThan(10 * n * EPS);
    }
    const inPlace = B.slice();
    expect(F.solveInPlace(inPlace)).toBe(inPlace);
    expect(Array.from(inPlace)).toEqual(Array.from(X));
    const plain = F.solve(Array.from(B.subarray(0, n)));
    for (let i = 0; i < n; i++) expect(Math.abs(plain[i] - X[i])).toBeLessThanOrEqual(1e-13 * (1 + Math.abs(X[i])));
  });

  it("sparse right-hand sides (unit vectors, mostly zeros) solve as accurately as dense ones, Cholesky and L·D·Lᵀ", () => {
    // The single-right-hand-side sweeps skip groups of zero entries; the dense reference is ml-matrix's LU solve.
    const A = grid2d(20).matrix, n = A.ncols, M = dense(A);
    const order = randomPermutation(n, 11);
    const input = analyse(A, order);
    expect(Math.max(...Array.from({ length: input.structure.supernodeCount }, (_, s) => input.structure.superStart[s + 1] - input.structure.superStart[s]))).toBeGreaterThanOrEqual(8);
    for (const method of ["cholesky", "ldlt"] as const) {
      const F = factorize(input, A, { method });
      const rhs: Float64Array[] = [0, 7, 199, n - 1].map((i) => { const b = new Float64Array(n); b[i] = 1; return b; });
      const mostlyZero = randomVector(n, 4).map((v, i) => (i % 10 === 3 ? v : 0));
      rhs.push(mostlyZero);
      for (const b of rhs) {
        const x = F.solve(b);
        expect(denseBackwardError(M, x, b)).toBeLessThanOrEqual(10 * n * EPS);
        const xr = denseSolve(M, Matrix.columnVector(Array.from(b))); // ml-matrix
        let err = 0, size = 0;
        for (let i = 0; i < n; i++) { err = Math.max(err, Math.abs(x[i] - xr.get(i, 0))); size = Math.max(size, Math.abs(xr.get(i, 0))); }
        expect(err).toBeLessThanOrEqual(1e3 * n * EPS * size); // κ(A) = (1 + cos(π/21)) / (1 − cos(π/21)) ≈ 178 (closed-form eigenvalues)
      }
    }
  });

  it("lower, upper and both-triangle storage give bit-identical factors", () => {
    fc.assert(
      fc.property(sparseSpd, fc.integer(), (A, seed) => {
        const order = randomPermutation(A.ncols, seed);
        const stores = [A, asUpper(A), asFull(A)].map((M) => {
          const input = analyse(M, order);
          const K = jsKernels();
          factorize(input, M, { kernels: K });
          return Array.from(K.view().subarray(0, input.structure.factorPtr[input.structure.supernodeCount]));
        });
        expect(stores[1]).toEqual(stores[0]);
        expect(stores[2]).toEqual(stores[0]);
      }),
      { numRuns: 30 },
    );
  });

  it("refactor with new values and the same pattern matches a fresh factorization", () => {
    const A = randomSpd(80, 0.08, 1);
    const A2 = SparseMatrix.fromCSC(80, 80, A.colPtr, A.rowIdx, A.values.map((v, p) => v * (1 + 0.3 * Math.sin(p))));
    // Keep A2 SPD: re-dominate its diagonal.
    const d = dense(A2);
    const vals = A2.values.slice();
    for (let j = 0; j < 80; j++) for (let p = A2.colPtr[j]; p < A2.colPtr[j + 1]; p++) {
      if (A2.rowIdx[p] === j) { let s = 0; for (let i = 0; i < 80; i++) if (i !== j) s += Math.abs(d.get(i, j)); vals[p] = s + 1; }
    }
    const B = SparseMatrix.fromCSC(80, 80, A2.colPtr, A2.rowIdx, vals);
    const input = analyse(A, randomPermutation(80, 2));
    const F = factorize(input, A);
    const b = randomVector(80, 4);
    F.refactor(B);
    const fresh = factorize(input, B);
    expect(Array.from(F.solve(b))).toEqual(Array.from(fresh.solve(b)));
    expect(denseBackwardError(dense(B), F.solve(b), b)).toBeLessThan(10 * 80 * EPS);
    expect(F.stats.flops).toBe(input.flops);
  });
});

describe("refinement uses the factored matrix", () => {
  it("changing A's values after factoring does not change solveWithInfo's residual", () => {
    const A = randomSpd(40, 0.2, 8);
    const values = A.values.slice();
    const F = factorize(analyse(A), A);
    const b = randomVector(40, 1);
    A.values.fill(1e6); // the caller reuses the array
    const info = F.solveWithInfo(b, { refine: 1 });
    const original = SparseMatrix.fromCSC(40, 40, A.colPtr, A.rowIdx, values);
    expect(info.backwardError).toBeLessThanOrEqual(10 * 40 * EPS);
    expect(denseBackwardError(dense(original), info.x, b)).toBeLessThanOrEqual(10 * 40 * EPS);
    A.values.set(values);
  });
});

describe("workspace prediction and progress", () => {
  it("store = factor + stack + scratch; Liu's child order never needs more stack than the plain postorder", () => {
    for (const seed of [1, 2, 3]) {
      const A = grid2d(20).matrix;
      const input = analyse(A, randomPermutation(400, seed));
      const st = input.structure;
      let factor = 0;
      for (let s = 0; s < st.supernodeCount; s++) {
        factor += (st.rowPtr[s + 1] - st.rowPtr[s]) * (st.superStart[s + 1] - st.superStart[s]);
      }
      const w = predictWorkspace(st, "cholesky");
      expect(w.factorDoubles).toBe(factor);
      // Brute-force stack simulation over the given postorder (children in index order).
      let top = 0, peak = 0;
      const cb = (s: number): number => panelStoredDoubles(st.rowPtr[s + 1] - st.rowPtr[s] - (st.superStart[s + 1] - st.superStart[s]));
      for (let s = 0; s < st.supernodeCount; s++) {
        peak = Math.max(peak, top + cb(s));
        for (let c = 0; c < s; c++) if (st.superParent[c] === s) top -= cb(c);
        top += cb(s);
      }
      expect(stackSchedule(st).peak).toBeLessThanOrEqual(peak);
      expect(w.peakBytes).toBe(8 * (w.factorDoubles + w.stackDoubles + w.scratchDoubles));
      const K = jsKernels();
      const F = factorize(input, A, { kernels: K });
      expect(K.view().length).toBe(w.factorDoubles + w.stackDoubles);
      expect(F.stats.peakBytes).toBe(w.peakBytes);
    }
  });

  it("onProgress reports increasing fractions ending at 1", () => {
    const A = grid2d(30).matrix;
    const seen: number[] = [];
    factorize(analyse(A, randomPermutation(900, 1)), A, { onProgress: (f) => seen.push(f) });
    expect(seen.length).toBeGreaterThan(3);
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThan(seen[i - 1]);
    expect(seen[seen.length - 1]).toBeCloseTo(1, 12);
  });
});
