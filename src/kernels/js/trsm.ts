/**
 * Blocked triangular solve B := B·L⁻ᵀ with L lower (the right-side TRSM of
 * LAPACK-style factorizations; Golub & Van Loan, Matrix Computations, 4th ed.,
 * §3.1). Column blocks of B are solved by a small kernel that keeps four rows
 * of B in registers; the remaining columns are updated by the tiled `gemm`.
 */
import { gemm } from "./gemm.js";

/** Column block width of the blocked solve. */
export const TRSM_BLOCK = 32;

/** Solve X·L[j0..j1, j0..j1]ᵀ = B for rows [i0, i1) of B, columns [j0, j1). */
function trsmStrip(
  S: Float64Array, i0: number, i1: number, j0: number, j1: number,
  a: number, lda: number, b: number, ldb: number, unit: boolean,
): void {
  let i = i0;
  for (; i + 4 <= i1; i += 4) {
    for (let j = j0; j < j1; j++) {
      const bj = b + i + j * ldb;
      let x0 = S[bj], x1 = S[bj + 1], x2 = S[bj + 2], x3 = S[bj + 3];
      for (let p = j0, bp = b + i + j0 * ldb, lp = a + j + j0 * lda; p < j; p++, bp += ldb, lp += lda) {
        const l = S[lp];
        x0 -= S[bp] * l; x1 -= S[bp + 1] * l; x2 -= S[bp + 2] * l; x3 -= S[bp + 3] * l;
      }
      if (!unit) {
        const inv = 1 / S[a + j + j * lda];
        x0 *= inv; x1 *= inv; x2 *= inv; x3 *= inv;
      }
      S[bj] = x0; S[bj + 1] = x1; S[bj + 2] = x2; S[bj + 3] = x3;
    }
  }
  for (; i < i1; i++) {
    for (let j = j0; j < j1; j++) {
      let x = S[b + i + j * ldb];
      for (let p = j0; p < j; p++) x -= S[b + i + p * ldb] * S[a + j + p * lda];
      S[b + i + j * ldb] = unit ? x : x / S[a + j + j * lda];
    }
  }
}

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
    trsmStrip(S, 0, m, j0, j1, a, lda, b, ldb, unit);
    if (j1 < n) {
      gemm(S, m, n - j1, j1 - j0, b + j0 * ldb, ldb, a + j1 + j0 * lda, lda, b + j1 * ldb, ldb, false);
    }
  }
}
