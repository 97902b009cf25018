/**
 * The contribution stack of the multifrontal factorization: its predicted
 * peak against a count made by hand for a three-supernode tree and against a
 * brute-force replay of the schedule whose block sizes are counted column by
 * column (independent of contribution.ts's closed form); the store the
 * factorization reserves against that prediction; solutions checked with the
 * dense residual of ml-matrix or the test's own sparse backward error.
 */
import { describe, expect, it } from "vitest";
import { grid3d } from "../src/generate/grids.js";
import { jsKernels } from "../src/kernels/js/index.js";
import { wasmKernels } from "../src/kernels/wasm/index.js";
import { SparseMatrix } from "../src/matrix/sparse.js";
import { CB_PANEL } from "../src/numeric/contribution.js";
import { factorize } from "../src/numeric/index.js";
import { predictWorkspace, stackSchedule } from "../src/numeric/workspace.js";
import { analyze } from "../src/solver/analyze.js";
import type { SupernodalStructure } from "../src/symbolic/types.js";
import { EPS, analyse, backwardError, dense, denseBackwardError, panelStoredDoubles, randomVector, rng } from "./helpers/numeric.js";

/** Stack peak replayed along the schedule: push each block, after popping its children's. */
function replayPeak(st: SupernodalStructure, size: (b: number) => number): number {
  const { order, childPtr, children } = stackSchedule(st);
  const order_b = (s: number) => st.rowPtr[s + 1] - st.rowPtr[s] - (st.superStart[s + 1] - st.superStart[s]);
  let top = 0, peak = 0;
  for (const s of order) {
    peak = Math.max(peak, top + size(order_b(s))); // s's block is formed above its children's
    for (let k = childPtr[s]; k < childPtr[s + 1]; k++) top -= size(order_b(children[k]));
    top += size(order_b(s));
  }
  return peak;
}

/**
 * Columns 0..4: a clique joined to all of the separator; 5..7: a clique
 * joined to its first 40 columns; 8..137: the separator, a clique. Values
 * from rng(seed), diagonal dominant (SPD by Gershgorin).
 */
function twoLeavesAndSeparator(seed: number): SparseMatrix {
  const r = rng(seed), rows: number[] = [], cols: number[] = [], vals: number[] = [];
  const n = 138, rowSum = new Float64Array(n);
  const link = (i: number, j: number) => {
    const v = r() * 2 - 1;
    rows.push(Math.max(i, j)); cols.push(Math.min(i, j)); vals.push(v);
    rowSum[i] += Math.abs(v); rowSum[j] += Math.abs(v);
  };
  const clique = (a: number, b: number) => { for (let j = a; j < b; j++) for (let i = j + 1; i < b; i++) link(i, j); };
  clique(0, 5); clique(5, 8); clique(8, 138);
  for (let j = 0; j < 5; j++) for (let i = 8; i < 138; i++) link(i, j);
  for (let j = 5; j < 8; j++) for (let i = 8; i < 48; i++) link(i, j);
  for (let i = 0; i < n; i++) { rows.push(i); cols.push(i); vals.push(rowSum[i] + 1); }
  return SparseMatrix.fromTriplets(n, n, rows, cols, vals);
}

describe("contribution stack", () => {
  it("a three-supernode tree: predicted stack, factor and store equal the hand count", () => {
    const A = twoLeavesAndSeparator(5);
    const input = analyse(A, undefined, false); // identity order, no amalgamation: supernodes {0..4}, {5..7}, {8..137}
    const st = input.structure;
    expect(Array.from(st.superStart)).toEqual([0, 5, 8, 138]);
    // By hand, 64-column panels, each from its first diagonal entry down: leaf 1 sends a block of order 130,
    // panels 130 × 64, 66 × 64 and 2 × 2: 8320 + 4224 + 4 = 12548. Leaf 2 sends order 40, one panel 40 × 40:
    // 1600. Both wait on the stack when the root starts, which sends nothing: peak 12548 + 1600 = 14148
    // (full squares: 130² + 40² = 18500; triangles with diagonal: 8515 + 820 = 9335).
    // Factor: 135·5 + 43·3 + 130·130 = 17704.
    // L·D·Lᵀ scratch, the largest (m − c)·c: 130·5 = 650.
    const w = predictWorkspace(st, "cholesky");
    expect(CB_PANEL).toBe(64); // the count below is for 64-column panels
    expect(w.stackDoubles).toBe(14148);
    expect(w.factorDoubles).toBe(17704);
    expect(predictWorkspace(st, "ldlt").scratchDoubles).toBe(650);
    const M = dense(A), b = randomVector(138, 3);
    for (const method of ["cholesky", "ldlt"] as const) {
      const K = jsKernels();
      const F = factorize(input, A, { kernels: K, method });
      expect(K.view().length).toBe(17704 + 14148 + (method === "ldlt" ? 650 : 0));
      expect(F.stats.peakBytes).toBe(8 * K.view().length);
      // Backward stability (Higham 2002, Thm 10.4, from memory), residual computed densely with ml-matrix.
      expect(denseBackwardError(M, F.solve(b), b)).toBeLessThanOrEqual(10 * 138 * EPS);
    }
  });

  it("3-D grid 16³: the stack equals the column-by-column replay, about half of full squares, and the factorization fits it", () => {
    const A = grid3d(16).matrix, n = A.ncols;
    const analysis = analyze(A, { ordering: "nested-dissection" });
    const st = analysis.structure;
    let largest = 0;
    for (let s = 0; s < st.supernodeCount; s++) largest = Math.max(largest, st.rowPtr[s + 1] - st.rowPtr[s] - (st.superStart[s + 1] - st.superStart[s]));
    expect(largest).toBeGreaterThan(4 * CB_PANEL); // several panels per large block, else the check below says little
    const w = predictWorkspace(st, "cholesky");
    expect(w.stackDoubles).toBe(replayPeak(st, panelStoredDoubles));
    // Full b×b squares on the same schedule give 1, b(b+1)/2 triangles about 0.5, the panels about 0.6 here.
    expect(w.stackDoubles).toBeLessThan(0.7 * replayPeak(st, (b) => b * b));
    const b = randomVector(n, 7);
    for (const make of [jsKernels, wasmKernels]) {
      for (const method of ["cholesky", "ldlt"] as const) {
        const kernels = make();
        const F = analysis.factor(A, { kernels, method });
        const pred = predictWorkspace(st, method);
        // The pass throws if its stack passes the prediction; the JS store is exactly the reserved length
        // (the wasm one is rounded up to whole 64 KiB pages).
        if (kernels.name === "js") expect(kernels.view().length).toBe(pred.factorDoubles + pred.stackDoubles + pred.scratchDoubles);
        expect(F.stats.peakBytes).toBe(pred.peakBytes);
        // Sparse residual computed by the test (helpers/numeric backwardError), bound as above.
        expect(backwardError(A, F.solve(b), b), `${kernels.name}/${method}`).toBeLessThanOrEqual(10 * n * EPS);
      }
    }
  });
});
