/**
 * Every error path of the numeric stage: typed errors from src/errors.ts that
 * name the offending column or entry in the caller's original numbering, and
 * a factorization that refuses to solve after any failure until a refactor
 * succeeds. Expected columns and pivots are worked by hand beside each case.
 */
import { describe, expect, it } from "vitest";
import { Matrix, solve } from "ml-matrix";
import {
  AbortedError, CapacityError, InputError, NotPositiveDefiniteError, NotSymmetricError, PatternMismatchError, SeptumError,
} from "../src/errors.js";
import { grid2d } from "../src/generate/grids.js";
import { SparseMatrix } from "../src/matrix/sparse.js";
import { factorize } from "../src/numeric/index.js";
import { analyze } from "../src/solver/analyze.js";
import { EPS, analyse, asFull, randomPermutation, randomSpd } from "./helpers/numeric.js";

/** SPD matrix of order n with A(q,q) replaced by `d` and q decoupled from everything. */
function withIsolated(n: number, q: number, d: number): SparseMatrix {
  const A = randomSpd(n, 0.2, 5);
  const r: number[] = [], c: number[] = [], v: number[] = [];
  for (let j = 0; j < n; j++) for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) {
    const i = A.rowIdx[p];
    if (i === q || j === q) continue;
    r.push(i); c.push(j); v.push(A.values[p]);
  }
  r.push(q); c.push(q); v.push(d);
  return SparseMatrix.fromTriplets(n, n, r, c, v);
}

function caught(f: () => unknown): unknown {
  try { f(); } catch (e) { return e; }
  throw new Error("expected an error");
}

describe("pivot breakdown names the original column", () => {
  it("Cholesky: a decoupled diagonal −1 at original column q fails exactly there, for any ordering", () => {
    // Decoupled, the pivot of column q is its own diagonal −1; every other pivot is positive (SPD rest).
    for (const seed of [1, 2, 3, 4]) {
      const q = 7 * seed;
      const A = withIsolated(40, q, -1);
      const e = caught(() => factorize(analyse(A, randomPermutation(40, seed)), A));
      expect(e).toBeInstanceOf(NotPositiveDefiniteError);
      expect((e as NotPositiveDefiniteError).column).toBe(q);
      expect((e as NotPositiveDefiniteError).pivot).toBe(-1);
      expect((e as Error).message).toContain("-1");
      expect((e as Error).message).toContain(`column ${q}`);
    }
  });

  it("Cholesky: the 2×2 block [[1, 2], [2, 1]] fails at whichever of its columns is eliminated second (pivot 1 − 4 = −3)", () => {
    const r = [0, 1, 1, 2, 3, 3, 4], c = [0, 1, 0, 2, 3, 1, 4], v = [5, 1, 0, 5, 1, 2, 5];
    // entries: (1,1)=1, (3,3)=1, (3,1)=2 → block on original indices 1 and 3.
    const A = SparseMatrix.fromTriplets(5, 5, r, c, v);
    for (const seed of [1, 2, 3, 4, 5, 6]) {
      const input = analyse(A, randomPermutation(5, seed));
      const later = input.inversePermutation[1] > input.inversePermutation[3] ? 1 : 3;
      const e = caught(() => factorize(input, A)) as NotPositiveDefiniteError;
      expect(e).toBeInstanceOf(NotPositiveDefiniteError);
      expect(e.column).toBe(later);
      expect(e.pivot).toBeCloseTo(-3, 14);
    }
  });

  it("L·D·Lᵀ: a zero pivot and a tiny pivot (relative to its diagonal entry) stop it with the original column", () => {
    const Z = withIsolated(30, 12, 0);
    const e = caught(() => factorize(analyse(Z, randomPermutation(30, 9)), Z, { method: "ldlt" })) as NotPositiveDefiniteError;
    expect(e).toBeInstanceOf(NotPositiveDefiniteError);
    expect(e.column).toBe(12);
    // [[1, 1], [1, 1 + 1e-14]]: second pivot 1e-14 (to rounding) ≤ 1e-12 · (a₁₁ = 1 + 1e-14).
    const T = SparseMatrix.fromTriplets(2, 2, [0, 1, 1], [0, 0, 1], [1, 1, 1 + 1e-14]);
    const t = caught(() => factorize(analyse(T), T, { method: "ldlt" })) as NotPositiveDefiniteError;
    expect(t).toBeInstanceOf(NotPositiveDefiniteError);
    expect(t.column).toBe(1);
    // With a smaller tolerance the same matrix factors and is positive definite.
    const ok = factorize(analyse(T), T, { method: "ldlt", pivotTolerance: 1e-16 });
    expect(ok.inertia()).toEqual({ positive: 2, negative: 0, zero: 0 });
  });

  it("L·D·Lᵀ: a small pivot in a row of small entries is not tiny, however large the rest of the matrix", () => {
    // [[1e8, 0, 1], [0, 1e-5, 1], [1, 1, −1e-6]] in natural order: pivots 1e8, 1e-5 (its own diagonal, no
    // cancellation) and −1e-6 − 1e-8 − 1e5 (worked by hand), so the inertia is (2, 1); 1e-5 < 1e-12 · 1e8.
    const T = SparseMatrix.fromTriplets(3, 3, [0, 1, 2, 2, 2], [0, 1, 0, 1, 2], [1e8, 1e-5, 1, 1, -1e-6]);
    const F = factorize(analyse(T), T, { method: "ldlt" });
    expect(F.inertia()).toEqual({ positive: 2, negative: 1, zero: 0 });
    const b = [1, 2, 3], x = F.solve(b);
    // Reference: ml-matrix's dense LU solve of the same matrix.
    const ref = solve(new Matrix([[1e8, 0, 1], [0, 1e-5, 1], [1, 1, -1e-6]]), Matrix.columnVector(b)).to1DArray();
    for (let i = 0; i < 3; i++) expect(Math.abs(x[i] - ref[i])).toBeLessThan(1e-12 * Math.abs(ref[i]));
  });
});

describe("a failed or aborted factorization refuses to solve until a refactor succeeds", () => {
  it("after a pivot failure in refactor", () => {
    const good = withIsolated(20, 4, 3), bad = withIsolated(20, 4, -3);
    const F = factorize(analyse(good), good);
    const b = new Float64Array(20).fill(1);
    F.solve(b);
    expect(() => F.refactor(bad)).toThrow(NotPositiveDefiniteError);
    expect(() => F.solve(b)).toThrow(SeptumError);
    expect(() => F.logDeterminant()).toThrow(/not usable/);
    expect(() => F.inertia()).toThrow(SeptumError);
    expect(() => F.stats).toThrow(SeptumError);
    F.refactor(good);
    expect(F.solve(b)[4]).toBeCloseTo(1 / 3, 14);
  });

  it("abort before start and between supernodes", () => {
    const A = grid2d(25).matrix;
    const input = analyse(A, randomPermutation(625, 1));
    const pre = new AbortController();
    pre.abort();
    expect(() => factorize(input, A, { signal: pre.signal })).toThrow(AbortedError);
    const F = factorize(input, A);
    const mid = new AbortController();
    expect(() => F.refactor(A, { signal: mid.signal, onProgress: (f) => { if (f > 0.3) mid.abort(); } })).toThrow(AbortedError);
    expect(() => F.solve(new Float64Array(625))).toThrow(/not usable/);
    F.refactor(A);
    expect(F.solve(new Float64Array(625).fill(1)).every(Number.isFinite)).toBe(true);
  });
});

describe("bad input", () => {
  it("a pattern different from the analysed one is a PatternMismatchError (refactor and first factor)", () => {
    const A = randomSpd(15, 0.2, 1);
    const input = analyse(A);
    const F = factorize(input, A);
    const other = randomSpd(15, 0.2, 2);
    expect(() => F.refactor(other)).toThrow(PatternMismatchError);
    expect(() => F.solve(new Float64Array(15))).toThrow(SeptumError);
    // An entry outside the analysed structure at the first factorization; the message names it.
    const tri = SparseMatrix.fromTriplets(3, 3, [0, 1, 2], [0, 1, 2], [1, 1, 1]);
    const extra = SparseMatrix.fromTriplets(3, 3, [0, 1, 2, 2], [0, 1, 2, 0], [1, 1, 1, 0.1]);
    expect(() => factorize(analyse(tri), extra)).toThrow(/entry \(2, 0\)/);
    expect(() => factorize(analyse(tri), randomSpd(4, 0.5, 1))).toThrow(PatternMismatchError);
  });

  it("full storage whose triangles disagree is a NotSymmetricError naming the entry", () => {
    const A = asFull(SparseMatrix.fromTriplets(6, 6, [0, 1, 2, 3, 4, 5, 4, 2, 5], [0, 1, 2, 3, 4, 5, 1, 0, 3], [4, 4, 4, 4, 4, 4, -1, -1, -1]));
    const vals = A.values.slice();
    // Find stored (4, 1) and perturb it only.
    let target = -1;
    for (let p = A.colPtr[1]; p < A.colPtr[2]; p++) if (A.rowIdx[p] === 4) target = p;
    if (target < 0) throw new Error("fixture lacks entry (4,1)");
    vals[target] += 1;
    const B = SparseMatrix.fromCSC(6, 6, A.colPtr, A.rowIdx, vals);
    const e = caught(() => factorize(analyse(A), B)) as NotSymmetricError;
    expect(e).toBeInstanceOf(NotSymmetricError);
    expect([e.row, e.column].sort()).toEqual([1, 4]);
  });

  it("wrong right-hand side length, non-finite right-hand side, bad options", () => {
    const A = randomSpd(10, 0.3, 1);
    const F = factorize(analyse(A), A);
    expect(() => F.solve(new Float64Array(7))).toThrow(InputError);
    expect(() => F.solve(new Float64Array(15))).toThrow(/length 15/);
    expect(() => F.solve([])).toThrow(InputError);
    const b = new Float64Array(10); b[3] = NaN;
    expect(() => F.solve(b)).toThrow(/entry 3/);
    expect(() => factorize(analyse(A), A, { method: "lu" as never })).toThrow(InputError);
    expect(() => factorize(analyse(A), A, { method: "ldlt", pivotTolerance: -1 })).toThrow(InputError);
    // A refinement request that is not true, false or a count >= 0 used to mean silently no refinement.
    const ones = new Float64Array(10).fill(1);
    expect(() => F.solveWithInfo(ones, { refine: -1 })).toThrow(/refine must be true, false or a number of steps >= 0, got -1/);
    expect(() => F.solveWithInfo(ones, { refine: Number.NaN })).toThrow(InputError);
    expect(() => F.solve(ones, { refine: "yes" as never })).toThrow(/got "yes"/);
    expect(F.solveWithInfo(ones, { refine: 0 }).refinementSteps).toBe(0);
  });

  it("a solution beyond the double range is a CapacityError naming its entry, not Infinity returned as x", () => {
    // diag(1, 1e-300, 2) with b = (1, 1e10, 1) in a random order: x₁ = 1e310 > 1.8e308 (closed form), so no
    // double holds it; the other entries are fine. Every solve path must say so rather than return Infinity.
    const A = SparseMatrix.fromTriplets(3, 3, [0, 1, 2], [0, 1, 2], [1, 1e-300, 2]);
    const b = [1, 1e10, 1];
    for (const method of ["cholesky", "ldlt"] as const) {
      const F = factorize(analyse(A, Int32Array.from([2, 1, 0])), A, { method });
      for (const attempt of [() => F.solve(b), () => F.solveWithInfo(b), () => F.solveInPlace(Float64Array.from(b)), () => F.solve([...b, ...b])]) {
        const e = caught(attempt);
        expect(e, method).toBeInstanceOf(CapacityError);
        expect((e as Error).message, method).toMatch(/entry 1 of column 0/);
      }
      // Still usable: a right-hand side with a representable solution solves (x = (1, 1e10, 0.5)).
      const x = F.solve([1, 1e-290, 1]);
      [1, 1e10, 0.5].forEach((want, i) => expect(Math.abs(x[i] - want)).toBeLessThan(4 * EPS * want));
    }
  });

  it("wrongly typed arguments: a matrix or right-hand side that is not one is an InputError, not a TypeError", () => {
    const A = randomSpd(6, 0.4, 1);
    const F = factorize(analyse(A), A);
    expect(() => F.solve(undefined as never)).toThrow(/right-hand side must be a Float64Array or an array of numbers, got undefined/);
    expect(() => F.solveWithInfo(null as never)).toThrow(/got null/);
    expect(() => F.solveInPlace(undefined as never)).toThrow(InputError);
    expect(() => F.refactor(A.toDense() as never)).toThrow(/matrix must be a SparseMatrix \(SparseMatrix.fromTriplets, fromCSC or fromDense\), got an array/);
    expect(() => F.refactor(undefined as never)).toThrow(/got undefined/);
    expect(() => analyze({ nrows: 2, ncols: 2 } as never)).toThrow(/must be a SparseMatrix.*got another object/);
  });

  it("options: null means none; an ordering name or a number where an options object belongs is an InputError naming the call", () => {
    const A = grid2d(6).matrix, b = new Float64Array(A.ncols).fill(1);
    const an = analyze(A, null as never);
    expect(Array.from(an.permutation)).toEqual(Array.from(analyze(A).permutation));
    const F = an.factor(A, null as never);
    const x = F.solve(b, null as never);
    expect(Array.from(F.solveWithInfo(b, null as never).x)).toEqual(Array.from(x));
    expect(F.refactor(A, null as never)).toBe(F);
    expect(() => analyze(A, "minimum-degree" as never)).toThrow(/analyze: options must be an object, got "minimum-degree"/);
    expect(() => an.factor(A, "ldlt" as never)).toThrow(/factor: options must be an object, got "ldlt"/);
    expect(() => F.solve(b, 3 as never)).toThrow(/solve: options must be an object, got 3/);
    expect(() => F.solveWithInfo(b, [true] as never)).toThrow(/solveWithInfo: options must be an object, got an array/);
    expect(() => F.refactor(A, "again" as never)).toThrow(InputError);
  });
});
