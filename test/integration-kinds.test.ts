/**
 * End-to-end analyze → factor → solve on the kinds of matrices users bring:
 * unstructured 2-D meshes, 3-dof elasticity, high-contrast coefficients,
 * shifted graph Laplacians, saddle points (L·D·Lᵀ), disconnected pieces —
 * with every ordering and both kernel sets. The check is the normwise
 * backward error ‖b − A·x‖∞ / (‖A‖∞‖x‖∞ + ‖b‖∞) (Rigal & Gaches 1967), which a
 * backward-stable Cholesky keeps at a modest multiple of n·ε (common practice:
 * Higham 2002, Accuracy and Stability of Numerical Algorithms, ch. 10).
 */
import { describe, expect, it } from "vitest";
import {
  analyze, elasticity3d, geometricLaplacian, grid2d, grid3d, plateMesh2d, saddle2d, SparseMatrix, type OrderingName,
} from "../src/index.js";
import { Matrix } from "ml-matrix";
import { lowerTriangle } from "../src/matrix/symmetric.js";
import { backwardError, blockDiagonal, denseBackwardError } from "./helpers/numeric.js";
import { planeStrainFull } from "./helpers/elements.js";
import { powerLawLaplacian } from "./helpers/networks.js";

const ORDERINGS: OrderingName[] = ["nested-dissection", "minimum-degree", "reverse-cuthill-mckee", "natural"];


function rhs(n: number): Float64Array {
  return Float64Array.from({ length: n }, (_, i) => Math.cos(0.37 * i) + 0.5);
}


/** 2-D 5-point operator with coefficients jumping between 1e-6 and 1e6 in a checkerboard of blocks. */
function highContrast(k: number): SparseMatrix {
  const kappa = (x: number, y: number) => ((Math.floor(x / 4) + Math.floor(y / 4)) % 2 === 0 ? 1e6 : 1e-6);
  const r: number[] = [], c: number[] = [], v: number[] = [];
  const diag = new Float64Array(k * k);
  for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
    const i = y * k + x;
    for (const [dx, dy] of [[1, 0], [0, 1]]) {
      const X = x + dx, Y = y + dy;
      if (X >= k || Y >= k) { diag[i] += kappa(x, y); continue; }
      const w = 2 / (1 / kappa(x, y) + 1 / kappa(X, Y)); // harmonic mean across the face
      const j = Y * k + X;
      r.push(j); c.push(i); v.push(-w);
      diag[i] += w; diag[j] += w;
    }
    diag[i] += x === 0 || y === 0 ? kappa(x, y) : 0; // Dirichlet faces
  }
  for (let i = 0; i < k * k; i++) { r.push(i); c.push(i); v.push(diag[i]); }
  return SparseMatrix.fromTriplets(k * k, k * k, r, c, v);
}

const SPD_CASES: Array<[string, () => SparseMatrix]> = [
  ["unstructured plate mesh with holes (P1)", () => plateMesh2d(60).matrix],
  ["3-dof trilinear elasticity", () => elasticity3d(5).matrix],
  ["high-contrast coefficients 1e-6..1e6", () => highContrast(24)],
  ["shifted geometric graph Laplacian", () => geometricLaplacian(700, 8, 1e-2, 3).matrix],
  ["power-law network Laplacian (preferential attachment), grounding shift 1e-3", () => powerLawLaplacian(1000, 2, 3, 1e-3)],
  ["disconnected pieces", () => blockDiagonal([grid2d(9).matrix, grid3d(5).matrix, SparseMatrix.fromDense([[2]]), grid2d(3).matrix])],
];

describe("SPD matrices of many kinds, every ordering, both kernel sets", () => {
  for (const [label, make] of SPD_CASES) {
    it(label, () => {
      const A = make();
      const b = rhs(A.ncols);
      for (const ordering of ORDERINGS) {
        const analysis = analyze(A, { ordering });
        for (const kernels of ["js", "wasm"] as const) {
          const F = analysis.factor(A, { kernels });
          const x = F.solve(b);
          const eta = backwardError(A, x, b);
          expect(eta, `${ordering}/${kernels}`).toBeLessThan(20 * A.ncols * Number.EPSILON);
          expect(F.inertia()).toEqual({ positive: A.ncols, negative: 0, zero: 0 });
        }
      }
    });
  }
});

describe("full storage as application codes write it", () => {
  it("element-by-element Bᵀ·D·B elasticity in both triangles solves exactly as its lower triangle does", () => {
    // Both triangles round differently where element contributions cancel (see helpers/elements.ts).
    const A = planeStrainFull(20, 1);
    const lower = lowerTriangle(A);
    const b = rhs(A.ncols);
    for (const ordering of ORDERINGS) {
      const x = analyze(A, { ordering }).factor(A).solve(b);
      // Reference residual: ml-matrix dense product with the full matrix as stored.
      expect(denseBackwardError(new Matrix(A.toDense()), x, b), ordering).toBeLessThan(20 * A.ncols * Number.EPSILON);
      // The factor reads the lower triangle only, so both storage forms give the same solution bit for bit.
      expect(Array.from(analyze(lower, { ordering }).factor(lower).solve(b)), ordering).toEqual(Array.from(x));
    }
  });
});

describe("saddle-point (quasi-definite) systems with L·D·Lᵀ", () => {
  it("Stokes-like [[K, Bᵀ], [B, −γI]] solves with every ordering and reports its inertia", () => {
    const P = saddle2d(10);
    const A = P.matrix;
    const nu = 2 * 10 * 10, np = 9 * 9;
    const b = rhs(A.ncols);
    for (const ordering of ORDERINGS) {
      const F = analyze(A, { ordering }).factor(A, { method: "ldlt" });
      expect(backwardError(A, F.solve(b), b), ordering).toBeLessThan(20 * A.ncols * Number.EPSILON);
      // Sylvester's law of inertia: K is SPD (nu positive), the Schur complement −γI − B K⁻¹ Bᵀ is negative definite.
      expect(F.inertia()).toEqual({ positive: nu, negative: np, zero: 0 });
    }
  });

  it("with a small stabilization γ = 1e-8, solve keeps the backward error near n·ε under every ordering", () => {
    // Orderings that eliminate pressures before their velocities grow pivots of order 1/γ; the
    // factorization reports that growth and solve refines against A (Skeel 1980) until ε is reached.
    const A = saddle2d(12, 1e-8).matrix, n = A.ncols;
    const b = rhs(n);
    for (const ordering of [...ORDERINGS, undefined]) {
      const F = analyze(A, { ordering }).factor(A, { method: "ldlt" });
      expect(backwardError(A, F.solve(b), b), ordering).toBeLessThan(20 * n * Number.EPSILON);
    }
  });

  it("the same system with pressures in other units (D·K·D, D = diag(I, 1e-6·I)) solves and keeps its inertia", () => {
    // A change of units is a congruence: Sylvester's law keeps the inertia, and D·K·D·y = D·b has y = D⁻¹·x
    // for K·x = b (closed form). The pressure pivots scale by 1e-12 with their rows; they are not tiny.
    const k = 10, t = 1e-6, nu = 2 * k * k, np = (k - 1) * (k - 1);
    const K = saddle2d(k).matrix, n = K.ncols;
    const d = Float64Array.from({ length: n }, (_, i) => (i < nu ? 1 : t));
    const v = K.values.slice();
    for (let j = 0; j < n; j++) for (let p = K.colPtr[j]; p < K.colPtr[j + 1]; p++) v[p] *= d[K.rowIdx[p]] * d[j];
    const S = SparseMatrix.fromCSC(n, n, K.colPtr, K.rowIdx, v);
    const b = rhs(n), Db = b.map((x, i) => x * d[i]);
    for (const ordering of ORDERINGS) {
      const x = analyze(K, { ordering }).factor(K, { method: "ldlt" }).solve(b);
      const F = analyze(S, { ordering }).factor(S, { method: "ldlt" });
      expect(F.inertia(), ordering).toEqual({ positive: nu, negative: np, zero: 0 });
      const y = F.solve(Db);
      let worst = 0, xmax = 0;
      for (let i = 0; i < n; i++) { worst = Math.max(worst, Math.abs(y[i] * d[i] - x[i])); xmax = Math.max(xmax, Math.abs(x[i])); }
      expect(worst / xmax, ordering).toBeLessThan(1e-9);
    }
  });
});
