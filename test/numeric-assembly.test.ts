/**
 * The per-supernode assembly of A (scatter.ts: buildScatterMap, assemblePanel)
 * and the one-pass row statistics (rowStatistics). Outside references: the
 * dense symmetric matrix built entry by entry with ml-matrix, permuted by
 * brute force (P·A·Pᵀ); ‖A‖∞ and the row maxima computed from its rows by
 * brute force (the definition of the ∞-norm, Golub & Van Loan §2.3).
 */
import { describe, expect, it } from "vitest";
import { buildScatterMap, assemblePanel, rowStatistics } from "../src/numeric/scatter.js";
import { InputError } from "../src/errors.js";
import { SparseMatrix } from "../src/matrix/sparse.js";
import { analyse, asFull, asUpper, dense, permuteDense, randomPermutation, randomSpd } from "./helpers/numeric.js";

describe("assembly supernode by supernode", () => {
  for (const [form, make] of [["lower", (A: SparseMatrix) => A], ["upper", asUpper], ["full", asFull]] as const) {
    it(`every panel holds P·A·Pᵀ's lower entries on its rows and zeros elsewhere (${form} storage, ml-matrix reference)`, () => {
      const L = randomSpd(40, 0.15, 7), A = make(L);
      const input = analyse(A, randomPermutation(40, 3));
      const st = input.structure, map = buildScatterMap(st, input.inversePermutation, A);
      const S = new Float64Array(st.factorPtr[st.supernodeCount]).fill(NaN); // stale values must be overwritten
      const B = permuteDense(dense(A), input.permutation);
      let checked = 0;
      for (let s = 0; s < st.supernodeCount; s++) {
        const r0 = st.rowPtr[s], m = st.rowPtr[s + 1] - r0, f = st.superStart[s], c = st.superStart[s + 1] - f;
        assemblePanel(map, s, A.values, S, st.factorPtr[s], m * c);
        for (let jj = 0; jj < c; jj++) for (let ii = jj; ii < m; ii++) {
          expect(S[st.factorPtr[s] + jj * m + ii]).toBe(B.get(st.rowIdx[r0 + ii], f + jj));
          checked++;
        }
      }
      expect(checked).toBeGreaterThan(40);
    });
  }

  it("largest entry, |diagonal| (new numbering) and ‖A‖∞ in one pass equal the dense rows (ml-matrix), every storage form", () => {
    const L = randomSpd(30, 0.2, 11);
    const M = dense(L);
    const want = M.to2DArray().map((row) => row.reduce((a, x) => a + Math.abs(x), 0));
    const maxima = M.to2DArray().map((row) => row.reduce((a, x) => Math.max(a, Math.abs(x)), 0));
    const absDiag = M.diag().map(Math.abs);
    for (const A of [L, asUpper(L), asFull(L)]) {
      const input = analyse(A, randomPermutation(30, 4));
      const map = buildScatterMap(input.structure, input.inversePermutation, A);
      const sums = new Float64Array(30).fill(-1), diag = new Float64Array(30).fill(-1);
      const r = rowStatistics(map, A.values, input.inversePermutation, sums, diag);
      expect(r.normInf).toBeCloseTo(Math.max(...want), 12);
      expect(r.largest).toBe(Math.max(...maxima));
      expect(Array.from(diag)).toEqual(Array.from(input.permutation, (old) => absDiag[old]));
      for (let i = 0; i < 30; i++) expect(sums[i]).toBeCloseTo(want[i], 12);
    }
  });

  it("a non-finite entry is named by rowStatistics", () => {
    const A = randomSpd(10, 0.3, 5);
    const input = analyse(A), map = buildScatterMap(input.structure, input.inversePermutation, A);
    const v = A.values.slice();
    const p = A.colPtr[3];
    v[p] = Infinity;
    expect(() => rowStatistics(map, v, input.inversePermutation, new Float64Array(10), new Float64Array(10)))
      .toThrow(new InputError(`entry (${A.rowIdx[p]}, 3) (0-based) has non-finite value Infinity`));
  });
});
