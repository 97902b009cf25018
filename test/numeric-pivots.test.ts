/**
 * FactorStats.smallestPivot = min_j |p_j| / r_j (p_j = L_jj² or d_j, r_j =
 * |a_jj|), and smallestPivotColumn, the column (original
 * numbering) where it occurs. Outside references: pivots worked by hand on 2×2
 * and 3×3 matrices; the closed-form Cholesky pivots (k+1)/k of tridiag(−1, 2, −1)
 * (Golub & Van Loan, Matrix Computations, §4.3, common practice); a connected
 * graph Laplacian has the eigenvalue 0 with the constant vector, so its last
 * pivot is 0 in exact arithmetic (Fiedler 1973, Czech. Math. J. 23).
 */
import { describe, expect, it } from "vitest";
import { SparseMatrix } from "../src/matrix/sparse.js";
import { factorize } from "../src/numeric/index.js";
import { EPS, analyse } from "./helpers/numeric.js";
import { laplacian1d } from "./helpers/patterns.js";

/** Lower triangle of a dense symmetric matrix given by rows. */
function lower(rows: number[][]): SparseMatrix {
  const r: number[] = [], c: number[] = [], v: number[] = [];
  rows.forEach((row, i) => row.forEach((a, j) => { if (j <= i && a !== 0) { r.push(i); c.push(j); v.push(a); } }));
  return SparseMatrix.fromTriplets(rows.length, rows.length, r, c, v);
}

/** Edge weight of the path edge (e, e+1). */
const weight = (e: number) => 1 + e / 7;

/**
 * Laplacian of a path of n nodes with edge weights 1 + e/7, node 0 tied to
 * ground by `ground` (0: none, singular). The weights are not binary
 * fractions, so without ground the last pivot comes out of rounding size
 * rather than exactly 0 (which would stop the factorization); for the orders
 * used here it rounds positive.
 */
function path(n: number, ground = 0): SparseMatrix {
  const r: number[] = [], c: number[] = [], v: number[] = [], d = new Float64Array(n);
  d[0] = ground;
  for (let e = 0; e + 1 < n; e++) {
    const w = weight(e);
    r.push(e + 1); c.push(e); v.push(-w); d[e] += w; d[e + 1] += w;
  }
  for (let i = 0; i < n; i++) { r.push(i); c.push(i); v.push(d[i]); }
  return SparseMatrix.fromTriplets(n, n, r, c, v);
}

const reversed = (n: number) => Int32Array.from({ length: n }, (_, i) => n - 1 - i);

describe("smallest relative pivot", () => {
  it("[[2, −1], [−1, 2]]: pivots 2 and 3/2 over diagonal entries 2 and 2 give 3/4, for L·Lᵀ and L·D·Lᵀ (by hand)", () => {
    const A = lower([[2, -1], [-1, 2]]);
    expect(factorize(analyse(A), A).stats.smallestPivot).toBeCloseTo(3 / 4, 15);
    expect(factorize(analyse(A), A, { method: "ldlt" }).stats.smallestPivot).toBeCloseTo(3 / 4, 15);
  });

  it("L·D·Lᵀ of the quasi-definite [[4, 1, 1], [1, 2, 1], [1, 1, −1]]: d = 4, 7/4, −11/7 over |a_jj| = 4, 2, 1 give 7/8 (by hand)", () => {
    // d1 = 4; d2 = 2 − 1/4 = 7/4; l32 = (1 − 1/4)/(7/4) = 3/7; d3 = −1 − 4·(1/4)² − (7/4)·(3/7)² = −11/7.
    // Ratios 1, 7/8, 11/7: the smallest is the second pivot's.
    const A = lower([[4, 1, 1], [1, 2, 1], [1, 1, -1]]);
    const F = factorize(analyse(A), A, { method: "ldlt" });
    expect(F.inertia()).toEqual({ positive: 2, negative: 1, zero: 0 }); // Sylvester: two positive d, one negative (by hand above)
    expect(F.stats.smallestPivot).toBeCloseTo(7 / 8, 15);
    // Constraint row first (order 2, 0, 1): d1 = −1 over row max 1 (ratio 1); d2 = 4 + 1 = 5 over 4; l = (1 + 1)/5,
    // d3 = 2 + 1 − 5·(2/5)² = 11/5 over 2. Smallest ratio 1 (by hand).
    const G = factorize(analyse(A, Int32Array.from([2, 0, 1])), A, { method: "ldlt" });
    expect(G.stats.smallestPivot).toBeCloseTo(1, 15);
  });

  it("grounded path tridiag(−1, 2, −1): pivots (k+1)/k over diagonal entry 2, smallest (n+1)/(2n) (closed form)", () => {
    for (const n of [1, 2, 7, 50]) {
      const A = laplacian1d(n);
      expect(factorize(analyse(A), A).stats.smallestPivot).toBeCloseTo((n + 1) / (2 * n), 14);
      expect(factorize(analyse(A, reversed(n)), A).stats.smallestPivot).toBeGreaterThan(0.5); // the reversed path is the same matrix
    }
  });

  it("ungrounded path Laplacian (eigenvalue 0): Cholesky and L·D·Lᵀ factor it, and the smallest ratio is below 1e−12", () => {
    const n = 10, A = path(n);
    for (const order of [undefined, reversed(n)]) {
      const F = factorize(analyse(A, order), A);
      expect(F.stats.smallestPivot).toBeLessThan(1e-12);
      expect(F.stats.smallestPivot).toBeGreaterThanOrEqual(0);
      const D = factorize(analyse(A, order), A, { method: "ldlt", pivotTolerance: 0 });
      expect(D.stats.smallestPivot).toBeLessThan(1e-12);
    }
    // Grounded at node 0 by conductance 1 it is nonsingular. Eliminating nodes 0..k−1 leaves node k tied to ground by
    // the series conductance g_k = 1 / (1 + Σ_{e<k} 1/w_e) (Ohm's law), so the pivots are w_k + g_k and, last, g_{n−1}
    // over its diagonal entry w_{n−2}; the earlier ratios exceed 1/2 as the weights increase (closed form).
    let series = 1;
    for (let e = 0; e < n - 1; e++) series += 1 / weight(e);
    const G = path(n, 1);
    expect(factorize(analyse(G), G).stats.smallestPivot).toBeCloseTo(1 / series / weight(n - 2), 14);
  });

  it("the singular path with b outside its range: a small backward error and a huge x; the figure shows what the residual hides", () => {
    const n = 10, A = path(n), F = factorize(analyse(A), A);
    // b = e_0 has 1ᵀb ≠ 0 while 1 spans the null space (Fiedler 1973), so A·x = b has no solution; the computed x
    // solves a nearby nonsingular matrix exactly (backward stability, Higham 2002 §10.1) and is of order 1/pivot.
    const b = new Float64Array(n); b[0] = 1;
    const { x, backwardError } = F.solveWithInfo(b, { refine: false });
    expect(backwardError).toBeLessThan(100 * n * EPS);
    expect(Math.max(...x.map(Math.abs))).toBeGreaterThan(1e10);
    expect(F.stats.smallestPivot).toBeLessThan(1e-12);
  });
});

describe("where the smallest relative pivot is (smallestPivotColumn, 0-based, original numbering)", () => {
  it("ungrounded path Laplacian: the last node eliminated, column n−1 in natural order and column 0 reversed", () => {
    // The leading principal blocks of a connected Laplacian are nonsingular and only the full matrix is singular
    // (Fiedler 1973), so only the pivot eliminated last is of rounding size. Reversed, it is at position n−1 of the new
    // numbering but column 0 of the original one.
    const n = 10, A = path(n);
    for (const [order, column] of [[undefined, n - 1], [reversed(n), 0]] as const) {
      const F = factorize(analyse(A, order), A);
      expect([F.stats.smallestPivot < 1e-12, F.stats.smallestPivotColumn]).toEqual([true, column]);
      const D = factorize(analyse(A, order), A, { method: "ldlt", pivotTolerance: 0 });
      expect([D.stats.smallestPivot < 1e-12, D.stats.smallestPivotColumn]).toEqual([true, column]);
    }
  });

  it("a diagonal matrix with one nearly dependent 2×2 block: the column eliminated second of the pair, in the caller's numbering", () => {
    // diag(2, ·, 2, 2, ·, 2) with the block [[1, 1], [1, 1 + δ]] on columns 1 and 4, δ = 2⁻³⁰ (1 + δ exact). By hand:
    // the diagonal columns give ratio 1 and the first of the pair gives 1 over its diagonal 1 (or 1+δ over 1+δ); the
    // second gives δ (natural: (1+δ) − 1, column 4) or 1 − 1/(1+δ) = δ/(1+δ) (column 4 first, the pivot at column 1),
    // over its diagonal 1+δ or 1. Cancellation costs about ε/δ ≈ 2.4e-7 relative accuracy.
    const delta = 2 ** -30, r = [0, 1, 2, 3, 4, 5, 4], c = [0, 1, 2, 3, 4, 5, 1], v = [2, 1, 2, 2, 1 + delta, 2, 1];
    const A = SparseMatrix.fromTriplets(6, 6, r, c, v);
    for (const [order, column, ratio] of [[undefined, 4, delta / (1 + delta)], [reversed(6), 1, delta / (1 + delta)]] as const) {
      const input = analyse(A, order);
      if (order) expect(input.inversePermutation[column]).not.toBe(column); // the new numbering would give another answer
      for (const method of ["cholesky", "ldlt"] as const) {
        const s = factorize(input, A, { method }).stats;
        expect(s.smallestPivotColumn).toBe(column);
        expect(Math.abs(s.smallestPivot / ratio - 1)).toBeLessThan(1e-6);
      }
    }
    // A tiny diagonal entry alone is not a tiny relative pivot: on a diagonal matrix every ratio is a_jj / a_jj = 1.
    const T = lower([[1, 0, 0], [0, 1e-14, 0], [0, 0, 4]]);
    expect(Math.abs(factorize(analyse(T), T).stats.smallestPivot - 1)).toBeLessThan(4 * EPS);
  });

  it("the empty matrix: column −1 and ratio 1", () => {
    const A = SparseMatrix.fromTriplets(0, 0, [], [], []);
    const s = factorize(analyse(A), A).stats;
    expect([s.smallestPivot, s.smallestPivotColumn]).toEqual([1, -1]);
  });
});
