/**
 * Blocked right-looking Cholesky of a dense lower triangle (the LAPACK-style
 * POTRF organisation: factor a diagonal block, solve the panel below it, apply
 * a symmetric rank-nb update to the trailing triangle; Golub & Van Loan,
 * Matrix Computations, 4th ed., §4.2.9). The rank-nb update goes through the
 * register-tiled `gemm`, so almost all flops run in the 4×4 tile.
 */
import { gemm } from "./gemm.js";
import { trsm } from "./trsm.js";

/** Block width of the panel; measured on a 256×256 block (bench/factor.mjs reports the kernel rate). */
const POTRF_BLOCK = 32;

/** Unblocked right-looking Cholesky of the n×n lower triangle at a. */
function potrfUnblocked(S: Float64Array, n: number, a: number, lda: number): number {
  for (let j = 0; j < n; j++) {
    const cj = a + j * lda;
    const d = S[cj + j];
    if (!(d > 0) || d === Infinity) return j;
    const r = Math.sqrt(d);
    S[cj + j] = r;
    const inv = 1 / r;
    for (let i = j + 1; i < n; i++) S[cj + i] *= inv;
    for (let jj = j + 1; jj < n; jj++) {
      const t = S[cj + jj];
      if (t === 0) continue;
      const cjj = a + jj * lda;
      for (let i = jj; i < n; i++) S[cjj + i] -= S[cj + i] * t;
    }
  }
  return -1;
}

/**
 * In-place Cholesky of the n×n lower triangle at a (leading dimension lda).
 * Returns −1 on success or the local column whose pivot was not positive
 * (that pivot is left unrooted on the diagonal).
 */
export function potrf(S: Float64Array, n: number, a: number, lda: number): number {
  for (let k = 0; k < n; k += POTRF_BLOCK) {
    const kb = Math.min(POTRF_BLOCK, n - k);
    const diag = a + k + k * lda;
    const fail = potrfUnblocked(S, kb, diag, lda);
    if (fail >= 0) return k + fail;
    const rest = n - k - kb;
    if (rest > 0) {
      const below = diag + kb;
      trsm(S, rest, kb, diag, lda, below, lda, false);
      gemm(S, rest, rest, kb, below, lda, below, lda, below + kb * lda, lda, true);
    }
  }
  return -1;
}
