import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { Matrix } from "ml-matrix";
import { SparseMatrix } from "../src/matrix/sparse.js";
import {
  lowerTriangle, permuteLower, storageForm, symmetricMultiply, symmetricNormInf,
} from "../src/matrix/symmetric.js";
import { adjacencyGraph } from "../src/graph/adjacency.js";
import { CapacityError, InputError, NotSymmetricError } from "../src/errors.js";
import { planeStrainFull } from "./helpers/elements.js";

/** Random symmetric matrix as a dense array (n ≤ 12), entries small integers, density ~30%. */
const denseSymmetric = fc.integer({ min: 1, max: 12 }).chain((n) =>
  fc.array(fc.integer({ min: -5, max: 5 }), { minLength: n * n, maxLength: n * n }).map((v) => {
    const d: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) {
      const x = Math.abs(v[i * n + j]) > 3 || i === j ? v[i * n + j] : 0;
      d[i][j] = x; d[j][i] = x;
    }
    return d;
  }));

function triangle(d: number[][], lower: boolean): SparseMatrix {
  return SparseMatrix.fromDense(d.map((row, i) => row.map((x, j) => (lower ? i >= j : i <= j) ? x : 0)));
}

describe("SparseMatrix construction", () => {
  it("sums duplicate triplets, as finite-element assembly needs", () => {
    // Two 2×2 element matrices sharing node 1: [[1,-1],[-1,1]] on (0,1) and (1,2).
    const A = SparseMatrix.fromTriplets(3, 3,
      [0, 1, 0, 1, 1, 2, 1, 2], [0, 0, 1, 1, 1, 1, 2, 2], [1, -1, -1, 1, 1, -1, -1, 1]);
    expect(A.toDense()).toEqual([[1, -1, 0], [-1, 2, -1], [0, -1, 1]]);
    expect(A.nnz).toBe(7);
  });

  it("agrees with a dense reference for random triplets (ml-matrix as the reference container)", () => {
    fc.assert(fc.property(
      fc.integer({ min: 1, max: 9 }), fc.integer({ min: 1, max: 9 }),
      fc.array(fc.tuple(fc.nat(), fc.nat(), fc.integer({ min: -9, max: 9 })), { maxLength: 60 }),
      (m, n, ts) => {
        const ref = Matrix.zeros(m, n);
        const r: number[] = [], c: number[] = [], v: number[] = [];
        for (const [a, b, x] of ts) { r.push(a % m); c.push(b % n); v.push(x); ref.set(a % m, b % n, ref.get(a % m, b % n) + x); }
        const A = SparseMatrix.fromTriplets(m, n, r, c, v);
        expect(A.toDense()).toEqual(ref.to2DArray().map((row) => row.map((x) => x + 0)));
        for (let j = 0; j < n; j++) for (let p = A.colPtr[j] + 1; p < A.colPtr[j + 1]; p++) expect(A.rowIdx[p]).toBeGreaterThan(A.rowIdx[p - 1]);
        expect(A.transpose().toDense()).toEqual(ref.transpose().to2DArray().map((row) => row.map((x) => x + 0)));
        const x = Array.from({ length: n }, (_, i) => i - 2);
        expect(Array.from(A.multiply(x))).toEqual(ref.mmul(Matrix.columnVector(x)).to1DArray());
      }));
  });

  it("wraps valid CSC arrays without copying and canonicalises unsorted ones", () => {
    const colPtr = Int32Array.from([0, 2, 3]), rowIdx = Int32Array.from([0, 1, 1]), values = Float64Array.from([4, 1, 3]);
    const A = SparseMatrix.fromCSC(2, 2, colPtr, rowIdx, values);
    expect(A.rowIdx).toBe(rowIdx);
    expect(A.values).toBe(values);
    const B = SparseMatrix.fromCSC(2, 2, [0, 3, 3], [1, 0, 1], [1, 2, 3]);
    expect(B.toDense()).toEqual([[2, 0], [4, 0]]);
  });

  it("refuses a dimension beyond 2^28 with CapacityError before allocating anything", () => {
    // fromTriplets(2^31 − 1, 2^31 − 1, [0], [0], [1]) used to allocate 8 GiB of column pointers and end the process
    const big = 2 ** 31 - 1;
    expect(() => SparseMatrix.fromTriplets(big, big, [0], [0], [1])).toThrow(CapacityError);
    expect(() => SparseMatrix.fromTriplets(5, 2 ** 28 + 1, [0], [0], [1])).toThrow(/ncols = 268435457 exceeds the largest dimension septum handles, 268435456/);
    expect(() => SparseMatrix.fromCSC(2 ** 28 + 1, 1, Int32Array.of(0, 0), new Int32Array(0), new Float64Array(0))).toThrow(/nrows = 268435457/);
    expect(() => SparseMatrix.fromTriplets(-1, 2, [], [], [])).toThrow(InputError);
  });

  it("rejects bad input with errors naming the entry", () => {
    expect(() => SparseMatrix.fromTriplets(2, 2, [0, 2], [0, 0], [1, 1])).toThrow(/entry 1: row index 2 out of range 0..1/);
    expect(() => SparseMatrix.fromTriplets(2, 2, [0], [-1], [1])).toThrow(/column index -1/);
    expect(() => SparseMatrix.fromTriplets(2, 2, [0, 1], [0, 1], [1, NaN])).toThrow(/entry 1 \(row 1, column 1\): value NaN is not finite/);
    expect(() => SparseMatrix.fromTriplets(2, 2, [0, 1], [0], [1, 1])).toThrow(/differ in length/);
    expect(() => SparseMatrix.fromTriplets(2.5, 2, [], [], [])).toThrow(InputError);
    expect(() => SparseMatrix.fromCSC(2, 2, [0, 2, 1], [0, 1], [1, 1])).toThrow(/not monotone at column 1/);
    expect(() => SparseMatrix.fromCSC(2, 2, [1, 1, 1], [0], [1])).toThrow(/colPtr\[0\]/);
    expect(() => SparseMatrix.fromCSC(2, 2, [0, 1], [0], [1])).toThrow(/length 2, expected ncols \+ 1 = 3/);
    expect(() => SparseMatrix.fromCSC(2, 2, [0, 1, 2], [0, 5], [1, 1])).toThrow(/entry 1 \(column 1\): row index 5/);
    expect(() => SparseMatrix.fromCSC(2, 2, [0, 1, 3], [0, 1], [1, 1])).toThrow(/announces 3 entries/);
    expect(() => SparseMatrix.fromDense([[1, 2], [3]])).toThrow(/row 1 has 1 entries/);
    // Duplicates are summed: a sum that overflows (1e308 + 1e308 > DBL_MAX ≈ 1.8e308, IEEE 754) names the duplicate that overflowed.
    expect(() => SparseMatrix.fromTriplets(2, 2, [1, 0, 1], [1, 0, 1], [1e308, 1, 1e308])).toThrow(InputError);
    expect(() => SparseMatrix.fromTriplets(2, 2, [1, 0, 1], [1, 0, 1], [1e308, 1, 1e308]))
      .toThrow(/entry 2 \(row 1, column 1\): summed with the earlier entries at \(1, 1\) it gives Infinity, which is not finite/);
    expect(() => SparseMatrix.fromCSC(1, 1, [0, 2], [0, 0], [-1e308, -1e308])).toThrow(/entry 1 \(row 0, column 0\).* gives -Infinity/);
    expect(() => lowerTriangle(SparseMatrix.fromDense([[1, 2, 3]]))).toThrow(/must be square, got 1 × 3/);
  });
});

describe("symmetric storage forms", () => {
  it("lower, upper and full storage give the same lower triangle, product and norm", () => {
    fc.assert(fc.property(denseSymmetric, (d) => {
      const full = SparseMatrix.fromDense(d), lo = triangle(d, true), up = triangle(d, false);
      const ref = lowerTriangle(lo);
      for (const M of [full, up]) {
        const L = lowerTriangle(M);
        expect(Array.from(L.colPtr)).toEqual(Array.from(ref.colPtr));
        expect(Array.from(L.rowIdx)).toEqual(Array.from(ref.rowIdx));
        expect(Array.from(L.values)).toEqual(Array.from(ref.values));
      }
      const x = d.map((_, i) => (i % 3) - 1.5);
      // Reference product: ml-matrix dense multiply.
      const y = new Matrix(d).mmul(Matrix.columnVector(x)).to1DArray();
      for (const M of [full, lo, up]) {
        expect(Array.from(symmetricMultiply(M, x))).toEqual(y);
        expect(symmetricNormInf(M)).toBe(Math.max(0, ...d.map((row) => row.reduce((s, v) => s + Math.abs(v), 0))));
      }
      const g = [full, lo, up].map((M) => adjacencyGraph(M));
      expect(Array.from(g[1].neighbours)).toEqual(Array.from(g[0].neighbours));
      expect(Array.from(g[2].offsets)).toEqual(Array.from(g[0].offsets));
    }));
  });

  it("detects the storage form", () => {
    expect(storageForm(SparseMatrix.fromDense([[2, 0], [1, 2]]))).toBe("lower");
    expect(storageForm(SparseMatrix.fromDense([[2, 1], [0, 2]]))).toBe("upper");
    expect(storageForm(SparseMatrix.fromDense([[2, 1], [1, 2]]))).toBe("full");
    expect(storageForm(SparseMatrix.fromDense([[2, 0], [0, 2]]))).toBe("lower");
  });

  it("a full-storage matrix whose triangles disagree is an error naming the entry", () => {
    const byValue = SparseMatrix.fromDense([[4, 1, 0], [1, 4, 2], [0, 3, 4]]);
    expect(() => lowerTriangle(byValue)).toThrow(NotSymmetricError);
    expect(() => lowerTriangle(byValue)).toThrow(/entry \(2, 1\) is 3 but entry \(1, 2\) is 2/);
    const byPattern = SparseMatrix.fromDense([[4, 1, 5], [1, 4, 0], [0, 0, 4]]);
    expect(() => lowerTriangle(byPattern)).toThrow(/entry \(2, 0\) is 0 but entry \(0, 2\) is 5/);
    // Rounding-level disagreement from assembly order is accepted (common practice).
    const near = SparseMatrix.fromDense([[4, 0.1 + 0.2], [0.3, 4]]);
    expect(lowerTriangle(near).get(1, 0)).toBeCloseTo(0.3, 15);
  });

  it("accepts full storage assembled element by element (Bᵀ·D·B): triangles differ by rounding of their rows, not of the entry", () => {
    for (const seed of [1, 2, 3]) {
      const A = planeStrainFull(12, seed);
      const n = A.ncols, rowMax = new Float64Array(n);
      for (let j = 0; j < n; j++) for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) {
        rowMax[A.rowIdx[p]] = Math.max(rowMax[A.rowIdx[p]], Math.abs(A.values[p]));
      }
      // The fixture: (Bᵀ·D·B)ᵀ = Bᵀ·D·B for symmetric D (closed form), so the triangles differ by rounding only:
      // within a few ε of the rows' scale, yet far beyond ε of the entry itself where contributions cancel.
      let byRows = 0, byEntry = 0;
      for (let j = 0; j < n; j++) for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) {
        const i = A.rowIdx[p], a = A.values[p], t = A.get(j, i), d = Math.abs(a - t);
        byRows = Math.max(byRows, d / Math.sqrt(rowMax[i] * rowMax[j]));
        byEntry = Math.max(byEntry, d / Math.max(Math.abs(a), Math.abs(t)));
      }
      expect(byRows).toBeLessThan(4 * Number.EPSILON);
      expect(byEntry).toBeGreaterThan(64 * Number.EPSILON);
      const L = lowerTriangle(A);
      for (let j = 0; j < n; j++) for (let p = L.colPtr[j]; p < L.colPtr[j + 1]; p++) expect(L.values[p]).toBe(A.get(L.rowIdx[p], j));
      // A real disagreement, 1e-9 of the rows' scale, is still refused and named.
      const v = A.values.slice();
      let q = -1;
      for (let p = A.colPtr[5]; p < A.colPtr[6] && q < 0; p++) if (A.rowIdx[p] > 5) q = p;
      v[q] += 1e-9 * Math.sqrt(rowMax[A.rowIdx[q]] * rowMax[5]);
      const B = SparseMatrix.fromCSC(n, n, A.colPtr, A.rowIdx, v);
      expect(() => lowerTriangle(B)).toThrow(NotSymmetricError);
      expect(() => lowerTriangle(B)).toThrow(`entry (${A.rowIdx[q]}, 5)`);
    }
    // Near the top of the double range the rows' scale must not overflow into accepting anything.
    expect(() => lowerTriangle(SparseMatrix.fromDense([[1e300, 1e299], [2e299, 1e300]]))).toThrow(NotSymmetricError);
  });

  it("permuteLower gives the lower triangle of P·A·Pᵀ (dense reference)", () => {
    fc.assert(fc.property(denseSymmetric.chain((d) => fc.tuple(fc.constant(d),
      fc.shuffledSubarray([...Array(d.length).keys()], { minLength: d.length, maxLength: d.length }))), ([d, perm]) => {
      const n = d.length;
      const inv = new Int32Array(n);
      perm.forEach((old, k) => { inv[old] = k; });
      const B = permuteLower(triangle(d, true), inv);
      const expected = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i >= j ? d[perm[i]][perm[j]] : 0)));
      expect(B.toDense()).toEqual(expected);
      expect(permuteLower(triangle(d, false), inv).toDense()).toEqual(expected); // the upper triangle stands for A as well
    }));
  });

  it("permuteLower refuses both triangles and an inverse that is not a permutation (they gave a malformed matrix)", () => {
    const lower = SparseMatrix.fromDense([[4, 0, 0], [1, 4, 0], [0, 1, 4]]);
    expect(() => permuteLower(lower, Int32Array.from([5, 0, 1]))).toThrow(/inverse\[0\] = 5 is out of range 0..2/);
    expect(() => permuteLower(lower, Int32Array.from([1, 0, 1]))).toThrow(/inverse\[2\] = 1 repeats inverse\[0\]/);
    expect(() => permuteLower(lower, Int32Array.from([1, 0]))).toThrow(/inverse has length 2, expected n = 3/);
    const full = SparseMatrix.fromDense([[4, 1, 0], [1, 4, 1], [0, 1, 4]]);
    expect(() => permuteLower(full, Int32Array.from([2, 1, 0]))).toThrow(InputError);
    expect(() => permuteLower(full, Int32Array.from([2, 1, 0]))).toThrow(/got both; pass lowerTriangle\(A\)/);
  });
});
