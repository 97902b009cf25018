/**
 * Triangular solve B := B·L⁻ᵀ with L lower (the right-side TRSM of
 * LAPACK-style factorizations; Golub & Van Loan, Matrix Computations, 4th
 * ed., §3.1), blocked by 32 columns: inside a block, each group of four
 * columns receives the update from the block's solved columns through the
 * register-tiled `gemm`, then its 4×4 triangle is solved row by row in
 * registers; after the block, one `gemm` updates all remaining columns.
 */
import { gemm } from "./gemm.js";

/** Solve the columns [j, j+w) (w ≤ 4) of B against the w×w triangle of L at (j, j), all m rows. */
function solveGroup(
  S: Float64Array, m: number, j: number, w: number, a: number, lda: number, b: number, ldb: number, unit: boolean,
): void {
  const d = a + j + j * lda;
  const l10 = w > 1 ? S[d + 1] : 0, l20 = w > 2 ? S[d + 2] : 0, l30 = w > 3 ? S[d + 3] : 0;
  const l21 = w > 2 ? S[d + lda + 2] : 0, l31 = w > 3 ? S[d + lda + 3] : 0, l32 = w > 3 ? S[d + 2 * lda + 3] : 0;
  const i0 = unit ? 1 : 1 / S[d], i1 = unit || w < 2 ? 1 : 1 / S[d + lda + 1];
  const i2 = unit || w < 3 ? 1 : 1 / S[d + 2 * lda + 2], i3 = unit || w < 4 ? 1 : 1 / S[d + 3 * lda + 3];
  const c0 = b + j * ldb, c1 = c0 + ldb, c2 = c1 + ldb, c3 = c2 + ldb;
  for (let i = 0; i < m; i++) {
    const x0 = S[c0 + i] * i0;
    S[c0 + i] = x0;
    if (w < 2) continue;
    const x1 = (S[c1 + i] - x0 * l10) * i1;
    S[c1 + i] = x1;
    if (w < 3) continue;
    const x2 = (S[c2 + i] - x0 * l20 - x1 * l21) * i2;
    S[c2 + i] = x2;
    if (w < 4) continue;
    S[c3 + i] = (S[c3 + i] - x0 * l30 - x1 * l31 - x2 * l32) * i3;
  }
}

/** Column block width: inside a block, left-looking groups of four; after it, one right-looking gemm update. */
const TRSM_BLOCK = 32;

/**
 * B := B·L⁻ᵀ, L the n×n lower triangle at a, B m×n at b. With `unit` the
 * diagonal of L is taken as 1.
 */
export function trsm(
  S: Float64Array, m: number, n: number, a: number, lda: number, b: number, ldb: number, unit: boolean,
): void {
  if (m <= 0 || n <= 0) return;
  for (let j0 = 0; j0 < n; j0 += TRSM_BLOCK) {
    const j1 = Math.min(n, j0 + TRSM_BLOCK);
    for (let j = j0; j < j1; j += 4) {
      const w = Math.min(4, j1 - j);
      // B[:, j..j+w) −= X[:, j0..j) · L[j..j+w, j0..j)ᵀ
      if (j > j0) gemm(S, m, w, j - j0, b + j0 * ldb, ldb, a + j + j0 * lda, lda, b + j * ldb, ldb, false);
      solveGroup(S, m, j, w, a, lda, b, ldb, unit);
    }
    // B[:, j1..n) −= X[:, j0..j1) · L[j1..n, j0..j1)ᵀ
    if (j1 < n) gemm(S, m, n - j1, j1 - j0, b + j0 * ldb, ldb, a + j1 + j0 * lda, lda, b + j1 * ldb, ldb, false);
  }
}
