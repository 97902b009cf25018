import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { analyze, Analysis, geometricLaplacian, grid3d } from "../src/index.js";
import { SparseMatrix } from "../src/matrix/sparse.js";
import { FormatError, InputError, AbortedError } from "../src/errors.js";
import { symmetricMultiply } from "../src/matrix/symmetric.js";
import { encodeAnalysis } from "../src/solver/serialize.js";
import { bruteForceCounts, grid2d, laplacian1d, patternMatrix } from "./helpers/patterns.js";

const identity = (n: number) => Int32Array.from({ length: n }, (_, i) => i);

describe("analyze", () => {
  it("natural ordering of a k×k grid: nnz(L) fills the envelope, flops match brute force", () => {
    // Common practice: nnz(L) = (n − k)(k + 1) + 2k − 1 for the natural order (n = k²).
    const k = 12, n = k * k;
    const a = analyze(grid2d(k), { ordering: "natural" });
    expect(a.stats.nnzL).toBe((n - k) * (k + 1) + 2 * k - 1);
    const edges: Array<[number, number]> = [];
    const A = grid2d(k);
    for (let j = 0; j < n; j++) for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) edges.push([A.rowIdx[p], j]);
    const counts = bruteForceCounts(n, edges, identity(n));
    expect(a.stats.flops).toBe(counts.reduce((s, c) => s + c * c, 0));
    expect(a.stats.n).toBe(n);
    expect(a.stats.nnzA).toBe(A.nnz);
    expect(a.stats.ordering).toBe("natural");
    expect(a.stats.factorBytes).toBeGreaterThanOrEqual(8 * a.stats.nnzL);
    expect(a.stats.peakBytes).toBeGreaterThanOrEqual(a.stats.factorBytes);
    expect(Object.isFrozen(a)).toBe(true);
  });

  it("accepts a user permutation and reports its fill exactly", () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 30 }).chain((n) => fc.record({
      n: fc.constant(n),
      edges: fc.array(fc.tuple(fc.integer({ min: 0, max: n - 1 }), fc.integer({ min: 0, max: n - 1 })), { maxLength: 2 * n }),
      perm: fc.shuffledSubarray([...Array(n).keys()], { minLength: n, maxLength: n }),
    })), ({ n, edges, perm }) => {
      const A = patternMatrix(n, edges);
      const a = analyze(A, { ordering: perm });
      const ref = bruteForceCounts(n, edges, perm); // dense boolean elimination (definition of fill)
      expect(a.stats.nnzL).toBe(ref.reduce((s, c) => s + c, 0));
      expect(Array.from(a.orderingPermutation)).toEqual(perm);
      expect(a.stats.ordering).toBe("user");
    }), { numRuns: 100 });
  });

  it("the three storage forms give identical analyses", () => {
    const L = grid2d(9);
    const U = L.transpose();
    const fullRows: number[] = [], fullCols: number[] = [], fullVals: number[] = [];
    for (let j = 0; j < 81; j++) for (let p = L.colPtr[j]; p < L.colPtr[j + 1]; p++) {
      const i = L.rowIdx[p];
      fullRows.push(i); fullCols.push(j); fullVals.push(L.values[p]);
      if (i !== j) { fullRows.push(j); fullCols.push(i); fullVals.push(L.values[p]); }
    }
    const full = SparseMatrix.fromTriplets(81, 81, fullRows, fullCols, fullVals);
    const [a, b, c] = [L, U, full].map((M) => analyze(M, { ordering: "minimum-degree" }));
    for (const other of [b, c]) {
      expect(Array.from(other.permutation)).toEqual(Array.from(a.permutation));
      expect(other.stats.nnzL).toBe(a.stats.nnzL);
      expect(other.stats.nnzA).toBe(a.stats.nnzA);
    }
  });

  it("the default keeps the better of nested dissection and minimum degree", () => {
    for (const A of [grid3d(12).matrix, geometricLaplacian(3000, 8, 1e-2, 5).matrix, grid2d(5)]) {
      const auto = analyze(A);
      const nd = analyze(A, { ordering: "nested-dissection" }).stats.flops;
      const md = analyze(A, { ordering: "minimum-degree" }).stats.flops;
      expect(auto.stats.flops).toBe(A.ncols <= 200 ? md : Math.min(nd, md));
      expect(["nested-dissection", "minimum-degree"]).toContain(auto.stats.ordering);
      expect(auto.separatorTree !== undefined).toBe(auto.stats.ordering === "nested-dissection");
    }
  });

  it("rejects bad orderings and options with clear errors", () => {
    const A = laplacian1d(4);
    expect(() => analyze(A, { ordering: [0, 1, 1, 3] })).toThrow(InputError);
    expect(() => analyze(A, { ordering: [0, 1, 2] })).toThrow(InputError);
    expect(() => analyze(A, { ordering: [0, 1, 2, 7] })).toThrow(InputError);
    expect(() => analyze(A, { ordering: [0, 1.5, 2, 3] })).toThrow(/ordering\[1\] = 1.5/);
    expect(() => analyze(A, { ordering: "fastest" as never })).toThrow(/unknown ordering "fastest"/);
    expect(() => analyze(SparseMatrix.fromDense([[1, 2]]))).toThrow(/square/);
    // Plain-array entries beyond 32 bits are refused before the Int32Array copy, which would wrap 2^32 to 0.
    expect(() => analyze(A, { ordering: [2 ** 32, 1, 2, 3] })).toThrow(/ordering\[0\] = 4294967296 is out of range 0..3/);
    expect(() => analyze(A, { ordering: Uint32Array.from([3, 2, 1, 2 ** 32 - 1]) })).toThrow(/ordering\[3\] = 4294967295 is out of range 0..3/);
    // Coordinates are checked whatever the ordering (here the default, minimum degree for n ≤ 200).
    expect(() => analyze(A, { coordinates: new Float64Array(5) })).toThrow(/coordinates has length 5; expected 2·n = 8/);
    expect(() => analyze(A, { coordinates: new Float64Array(8).fill(NaN), ordering: "natural" })).toThrow(/coordinates\[0\] \(vertex 0, axis 0\) is not finite/);
    expect(() => analyze(A, { coordinateMode: "exact" as never })).toThrow(InputError);
    // Amalgamation bounds: NaN used to switch merging off silently, a fraction above 1 to merge everything.
    expect(() => analyze(A, { amalgamation: { smallColumns: Number.NaN } })).toThrow(/amalgamation.smallColumns must be a number in 0..Infinity, got NaN/);
    expect(() => analyze(A, { amalgamation: { largeZeroFraction: 2 } })).toThrow(/amalgamation.largeZeroFraction must be a number in 0..1, got 2/);
    expect(() => analyze(A, { amalgamation: "none" as never })).toThrow(InputError);
    const ac = new AbortController();
    ac.abort();
    expect(() => analyze(A, { signal: ac.signal })).toThrow(AbortedError);
  });

  it("an amalgamation bound left undefined keeps its default", () => {
    const A = grid2d(20);
    const plain = analyze(A, { ordering: "nested-dissection" }).stats;
    const spread = analyze(A, { ordering: "nested-dissection", amalgamation: { smallColumns: undefined, smallZeroFraction: undefined } }).stats;
    expect([spread.supernodes, spread.nnzL]).toEqual([plain.supernodes, plain.nnzL]);
  });

  it("handles n = 0, n = 1, diagonal and disconnected matrices", () => {
    expect(analyze(SparseMatrix.fromTriplets(0, 0, [], [], [])).stats.nnzL).toBe(0);
    expect(analyze(SparseMatrix.fromDense([[3]])).stats.nnzL).toBe(1);
    const D = SparseMatrix.fromTriplets(5, 5, [0, 1, 2, 3, 4], [0, 1, 2, 3, 4], [1, 2, 3, 4, 5]);
    expect(analyze(D).stats.nnzL).toBe(5);
    // Two tridiagonal pieces: no fill in either (common practice).
    const r = [0, 1, 1, 2, 3, 4, 4, 5], c = [0, 0, 1, 2, 3, 3, 4, 5], v = [2, -1, 2, 2, 2, -1, 2, 2];
    const B = SparseMatrix.fromTriplets(6, 6, r, c, v);
    const a = analyze(B);
    const ref = bruteForceCounts(6, [[1, 0], [4, 3]], a.permutation);
    expect(a.stats.nnzL).toBe(ref.reduce((s, x) => s + x, 0));
    expect(a.stats.nnzL).toBe(8);
  });
});

describe("Analysis bytes", () => {
  it("round-trips every field", () => {
    for (const ordering of ["natural", "minimum-degree", "nested-dissection"] as const) {
      const a = analyze(grid2d(15), { ordering });
      const b = Analysis.fromBytes(a.toBytes());
      expect(Array.from(b.permutation)).toEqual(Array.from(a.permutation));
      expect(Array.from(b.inversePermutation)).toEqual(Array.from(a.inversePermutation));
      expect(Array.from(b.orderingPermutation)).toEqual(Array.from(a.orderingPermutation));
      expect(Array.from(b.columnCounts)).toEqual(Array.from(a.columnCounts));
      expect(Array.from(b.eliminationTree)).toEqual(Array.from(a.eliminationTree));
      expect(Array.from(b.structure.rowIdx)).toEqual(Array.from(a.structure.rowIdx));
      expect(Array.from(b.structure.factorPtr)).toEqual(Array.from(a.structure.factorPtr));
      expect(Array.from(b.structure.columnSupernode)).toEqual(Array.from(a.structure.columnSupernode));
      expect(b.stats).toEqual(a.stats);
      expect(b.separatorTree === undefined).toBe(a.separatorTree === undefined);
      if (a.separatorTree && b.separatorTree) expect(Array.from(b.separatorTree.end)).toEqual(Array.from(a.separatorTree.end));
    }
  });

  it("a corrupted or foreign byte string is a FormatError", () => {
    const bytes = analyze(grid2d(6)).toBytes();
    expect(() => Analysis.fromBytes(new Uint8Array(10))).toThrow(FormatError);
    expect(() => Analysis.fromBytes(new TextEncoder().encode("%%MatrixMarket matrix coordinate real general\n" + " ".repeat(40)))).toThrow(/not a serialized septum analysis/);
    const flipped = bytes.slice();
    flipped[bytes.length - 5] ^= 0x40;
    expect(() => Analysis.fromBytes(flipped)).toThrow(/checksum/);
    expect(() => Analysis.fromBytes(bytes.slice(0, bytes.length - 8))).toThrow(FormatError);
    const version = bytes.slice();
    version[8] = 99;
    expect(() => Analysis.fromBytes(version)).toThrow(/version 99/);
  });

  it("bytes with a valid checksum but a supernode whose rows are not its parent's are a FormatError", () => {
    // The multifrontal extend-add needs each child's rows below its columns among its parent's rows
    // (supernodal elimination tree, common practice); a re-checksummed edit must not slip through.
    const a = analyze(grid2d(8), { ordering: "natural" });
    const st = a.structure, ns = st.supernodeCount, root = ns - 1;
    let s = 0;
    while (!(st.superParent[s] >= 0 && st.superParent[s] !== root)) s++;
    const superParent = st.superParent.slice();
    superParent[s] = root; // still a later supernode, so every per-supernode check passes
    const bytes = encodeAnalysis({ ...a, structure: { ...st, superParent } });
    expect(() => Analysis.fromBytes(bytes)).toThrow(/does not meet its parent|rows outside its parent/);
    expect(() => Analysis.fromBytes(encodeAnalysis(a))).not.toThrow();
  });

  it("a loaded analysis factors and solves like the original", () => {
    const A = grid2d(10);
    const original = analyze(A);
    const loaded = Analysis.fromBytes(original.toBytes());
    const b = Float64Array.from({ length: 100 }, (_, i) => Math.sin(i));
    const x1 = original.factor(A, { kernels: "js" }).solve(b);
    const x2 = loaded.factor(A, { kernels: "js" }).solve(b);
    expect(Array.from(x2)).toEqual(Array.from(x1));
    // Residual against the matrix itself: ‖b − A·x‖∞ ≤ c·n·ε·‖A‖∞‖x‖∞ (normwise backward error, common practice).
    const r = symmetricMultiply(A, x2).map((v, i) => b[i] - v);
    const rn = Math.max(...r.map(Math.abs)), xn = Math.max(...Array.from(x2, Math.abs));
    expect(rn).toBeLessThanOrEqual(100 * 100 * Number.EPSILON * 8 * xn);
  });
});
