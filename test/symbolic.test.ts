import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { adjacencyGraph } from "../src/graph/adjacency.js";
import { symbolicFactorization, countFill } from "../src/symbolic/index.js";
import { bruteForceCounts, grid2d, laplacian1d, patternMatrix } from "./helpers/patterns.js";

const randomPattern = fc.integer({ min: 1, max: 40 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    edges: fc.array(fc.tuple(fc.integer({ min: 0, max: n - 1 }), fc.integer({ min: 0, max: n - 1 })), { maxLength: 3 * n }),
    perm: fc.shuffledSubarray([...Array(n).keys()], { minLength: n, maxLength: n }),
  }),
);

describe("symbolic analysis", () => {
  it("column counts equal a brute-force elimination on random patterns and orderings", () => {
    // Reference: dense boolean elimination written in the test (the definition of fill, common practice).
    fc.assert(fc.property(randomPattern, ({ n, edges, perm }) => {
      const g = adjacencyGraph(patternMatrix(n, edges));
      const p = Int32Array.from(perm);
      const ref = bruteForceCounts(n, edges, p);
      const fill = countFill(g, p);
      expect(Array.from(fill.columnCounts)).toEqual(ref);
      const sym = symbolicFactorization(g, p);
      // The final permutation is an equivalent reordering: same total fill and work.
      expect(sym.nnzL).toBe(ref.reduce((a, b) => a + b, 0));
      expect(sym.flops).toBe(ref.reduce((a, b) => a + b * b, 0));
      const refFinal = bruteForceCounts(n, edges, sym.permutation);
      expect(Array.from(sym.columnCounts)).toEqual(refFinal);
    }), { numRuns: 300 });
  });

  it("every supernode's row structure contains the exact structure of its columns", () => {
    fc.assert(fc.property(randomPattern, ({ n, edges, perm }) => {
      const g = adjacencyGraph(patternMatrix(n, edges));
      for (const amalg of [false, {}] as const) {
        const sym = symbolicFactorization(g, Int32Array.from(perm), amalg);
        const s = sym.structure;
        // Exact structure of L in the final numbering by brute force.
        const inv = new Array<number>(n);
        for (let k = 0; k < n; k++) inv[sym.permutation[k]] = k;
        const m: boolean[][] = Array.from({ length: n }, () => new Array<boolean>(n).fill(false));
        for (const [a, b] of edges) if (a !== b) { m[inv[a]][inv[b]] = true; m[inv[b]][inv[a]] = true; }
        for (let j = 0; j < n; j++) {
          const below: number[] = [];
          for (let i = j + 1; i < n; i++) if (m[i][j]) below.push(i);
          for (const a of below) for (const b of below) if (a !== b) m[a][b] = true;
          const sn = s.columnSupernode[j];
          const rows = new Set(Array.from(s.rowIdx.subarray(s.rowPtr[sn], s.rowPtr[sn + 1])));
          for (const i of below) expect(rows.has(i)).toBe(true);
        }
        let total = 0;
        for (let t = 0; t < s.supernodeCount; t++) {
          const rows = s.rowIdx.subarray(s.rowPtr[t], s.rowPtr[t + 1]);
          for (let q = 1; q < rows.length; q++) expect(rows[q]).toBeGreaterThan(rows[q - 1]);
          expect(rows[0]).toBe(s.superStart[t]);
          if (s.superParent[t] !== -1) expect(s.superParent[t]).toBeGreaterThan(t);
          total += rows.length * (s.superStart[t + 1] - s.superStart[t]);
        }
        expect(s.factorPtr[s.supernodeCount]).toBe(total);
        // Supernodal storage holds every entry of L (plus the unused upper part of diagonal blocks).
        expect(total).toBeGreaterThanOrEqual(sym.nnzL);
      }
    }), { numRuns: 200 });
  });

  it("natural order of a k×k 5-point grid fills its band", () => {
    // Common practice (no source): Cholesky fill stays inside the envelope and,
    // for the natural order of a k×k 5-point grid, fills all of it:
    // nnz(L) = (n − k)(k + 1) + 2k − 1 with n = k².
    for (const k of [3, 7, 20, 45]) {
      const n = k * k;
      const A = grid2d(k);
      const fill = countFill(adjacencyGraph(A), Int32Array.from({ length: n }, (_, i) => i));
      expect(fill.nnzL).toBe((n - k) * (k + 1) + 2 * k - 1);
    }
  });

  it("tridiagonal matrices have no fill", () => {
    for (const n of [1, 2, 10, 1000]) {
      const fill = countFill(adjacencyGraph(laplacian1d(n)), Int32Array.from({ length: n }, (_, i) => i));
      expect(fill.nnzL).toBe(2 * n - 1);
    }
  });
});
