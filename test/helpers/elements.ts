/**
 * Finite-element matrices assembled the way application codes assemble them:
 * every element matrix Bᵀ·D·B computed entry by entry and both triangles
 * stored. D is symmetric, so (Bᵀ·D·B)ᵀ = Bᵀ·D·B exactly (closed form), but
 * entry (p, q) and entry (q, p) sum their products in different orders and
 * round differently; where element contributions cancel, the two triangles
 * of the assembled matrix then differ by far more than a few ulps of the
 * entry itself, while staying within rounding of the entries' rows.
 */
import { SparseMatrix } from "../../src/matrix/sparse.js";
import { rng } from "./numeric.js";

/**
 * Plane-strain linear elasticity (P1 triangles, E = 2e5, ν = 0.3) on a k×k
 * node lattice jittered by `seed`, clamped along its first row: 2·k·(k−1)
 * unknowns, both triangles stored, duplicates summed.
 */
export function planeStrainFull(k: number, seed: number): SparseMatrix {
  const r = rng(seed), X: number[] = [], Y: number[] = [];
  for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
    const inner = x > 0 && y > 0 && x < k - 1 && y < k - 1;
    X.push(x + (inner ? 0.6 * (r() - 0.5) : 0));
    Y.push(y + (inner ? 0.6 * (r() - 0.5) : 0));
  }
  const E = 2e5, nu = 0.3, c = E / ((1 + nu) * (1 - 2 * nu));
  const D = [[c * (1 - nu), c * nu, 0], [c * nu, c * (1 - nu), 0], [0, 0, (c * (1 - 2 * nu)) / 2]];
  const rows: number[] = [], cols: number[] = [], vals: number[] = [];
  for (let y = 0; y < k - 1; y++) for (let x = 0; x < k - 1; x++) {
    const a = y * k + x, b = a + 1, cc = a + k, d = cc + 1;
    for (const t of [[a, b, d], [a, d, cc]]) addElement(t, X, Y, D, k, rows, cols, vals);
  }
  const n = 2 * k * (k - 1);
  return SparseMatrix.fromTriplets(n, n, rows, cols, vals);
}

/** Bᵀ·D·B of one triangle, every entry of both triangles summed in its own order; nodes of row 0 are clamped. */
function addElement(
  t: number[], X: number[], Y: number[], D: number[][], k: number, rows: number[], cols: number[], vals: number[],
): void {
  const [x1, x2, x3] = t.map((i) => X[i]), [y1, y2, y3] = t.map((i) => Y[i]);
  const det = (x2 - x1) * (y3 - y1) - (x3 - x1) * (y2 - y1), area = det / 2;
  const bx = [y2 - y3, y3 - y1, y1 - y2].map((v) => v / det), by = [x3 - x2, x1 - x3, x2 - x1].map((v) => v / det);
  const B = [[bx[0], 0, bx[1], 0, bx[2], 0], [0, by[0], 0, by[1], 0, by[2]], [by[0], bx[0], by[1], bx[1], by[2], bx[2]]];
  const DB = D.map((row) => [0, 1, 2, 3, 4, 5].map((q) => row[0] * B[0][q] + row[1] * B[1][q] + row[2] * B[2][q]));
  for (let p = 0; p < 6; p++) for (let q = 0; q < 6; q++) {
    const np = t[p >> 1], nq = t[q >> 1];
    if (np < k || nq < k) continue;
    rows.push(2 * (np - k) + (p & 1));
    cols.push(2 * (nq - k) + (q & 1));
    vals.push(area * (B[0][p] * DB[0][q] + B[1][p] * DB[1][q] + B[2][p] * DB[2][q]));
  }
}
