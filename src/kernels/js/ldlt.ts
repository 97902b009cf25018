/**
 * Blocked L·D·Lᵀ without pivoting of a dense lower triangle (the
 * square-root-free Cholesky variant for symmetric quasi-definite matrices;
 * Vanderbei 1995, SIAM J. Optim. 5(1), shows such matrices admit it for every
 * symmetric permutation). Per block of nb columns: factor the diagonal block,
 * W = A21·L11⁻ᵀ (unit TRSM, so W = L21·D1), trailing −= W·D1⁻¹·Wᵀ in a 4×4
 * register tile that scales by D on the fly, then L21 = W·D1⁻¹.
 */
import { trsm } from "./trsm.js";

/** Block width of the blocked L·D·Lᵀ. */
const LDLT_BLOCK = 32;

/** Unblocked right-looking L·D·Lᵀ of the n×n lower triangle at a. */
function ldltUnblocked(S: Float64Array, n: number, a: number, lda: number, tiny: number): number {
  for (let j = 0; j < n; j++) {
    const cj = a + j * lda;
    const d = S[cj + j];
    if (!(Math.abs(d) > tiny) || !Number.isFinite(d)) return j;
    const inv = 1 / d;
    for (let jj = j + 1; jj < n; jj++) {
      const l = S[cj + jj] * inv;
      if (l === 0) continue;
      const cjj = a + jj * lda;
      for (let i = jj; i < n; i++) S[cjj + i] -= S[cj + i] * l;
    }
    for (let i = j + 1; i < n; i++) S[cj + i] *= inv;
  }
  return -1;
}

/** Reciprocals of the pivots of the current scaled update, grown on demand. */
let reciprocals = new Float64Array(64);

/**
 * Σ_p (W[i, p]·r_p)·W[j, p], r_p = 1/d_p, for one entry (edges of the scaled
 * update), in the tile's order: W[i, p]·r_p is l_ip, so in a matrix with
 * unknowns in very different units (D·A·D) no product leaves the range of the
 * result, where W[i, p]·W[j, p] / d_p underflowed (d_i·d_j·d_p² at 1e-100 each).
 */
function scaledEntry(S: Float64Array, k: number, w: number, ldw: number, R: Float64Array, i: number, j: number): number {
  let s = 0;
  for (let p = 0, pw = w; p < k; p++, pw += ldw) s += S[pw + i] * R[p] * S[pw + j];
  return s;
}

/**
 * Lower triangle of C (m×m at c) −= W·D⁻¹·Wᵀ, W m×k at w, D on the diagonal
 * of the k×k block at dg (stride ldw + 1: the block shares W's leading dimension).
 */
function scaledUpdate(
  S: Float64Array, m: number, k: number, w: number, ldw: number, dg: number, c: number, ldc: number,
): void {
  if (reciprocals.length < k) reciprocals = new Float64Array(k);
  const R = reciprocals;
  for (let p = 0; p < k; p++) R[p] = 1 / S[dg + p * (ldw + 1)]; // once per call, not once per 4×4 tile
  const m4 = m & ~3;
  for (let j = 0; j < m4; j += 4) {
    for (let i = j; i < m4; i += 4) {
      let c00 = 0, c10 = 0, c20 = 0, c30 = 0, c01 = 0, c11 = 0, c21 = 0, c31 = 0;
      let c02 = 0, c12 = 0, c22 = 0, c32 = 0, c03 = 0, c13 = 0, c23 = 0, c33 = 0;
      for (let p = 0, pa = w + i, pb = w + j; p < k; p++, pa += ldw, pb += ldw) {
        const r = R[p];
        const a0 = S[pa] * r, a1 = S[pa + 1] * r, a2 = S[pa + 2] * r, a3 = S[pa + 3] * r;
        const b0 = S[pb], b1 = S[pb + 1], b2 = S[pb + 2], b3 = S[pb + 3];
        c00 += a0 * b0; c10 += a1 * b0; c20 += a2 * b0; c30 += a3 * b0;
        c01 += a0 * b1; c11 += a1 * b1; c21 += a2 * b1; c31 += a3 * b1;
        c02 += a0 * b2; c12 += a1 * b2; c22 += a2 * b2; c32 += a3 * b2;
        c03 += a0 * b3; c13 += a1 * b3; c23 += a2 * b3; c33 += a3 * b3;
      }
      const t = c + i + j * ldc, t1 = t + ldc, t2 = t1 + ldc, t3 = t2 + ldc;
      S[t] -= c00; S[t + 1] -= c10; S[t + 2] -= c20; S[t + 3] -= c30;
      S[t1 + 1] -= c11; S[t1 + 2] -= c21; S[t1 + 3] -= c31;
      S[t2 + 2] -= c22; S[t2 + 3] -= c32; S[t3 + 3] -= c33;
      if (i !== j) {
        S[t1] -= c01; S[t2] -= c02; S[t3] -= c03; S[t2 + 1] -= c12; S[t3 + 1] -= c13; S[t3 + 2] -= c23;
      }
    }
  }
  for (let j = 0; j < m; j++) {
    for (let i = Math.max(j, m4); i < m; i++) S[c + i + j * ldc] -= scaledEntry(S, k, w, ldw, R, i, j);
  }
}

/**
 * In-place L·D·Lᵀ of the n×n lower triangle at a: unit L strictly below the
 * diagonal, D on it. Returns −1, or the local column whose pivot had
 * |d| ≤ tiny (or was not finite), d left on the diagonal.
 */
export function ldlt(S: Float64Array, n: number, a: number, lda: number, tiny: number): number {
  for (let k = 0; k < n; k += LDLT_BLOCK) {
    const kb = Math.min(LDLT_BLOCK, n - k);
    const diag = a + k + k * lda;
    const fail = ldltUnblocked(S, kb, diag, lda, tiny);
    if (fail >= 0) return k + fail;
    const rest = n - k - kb;
    if (rest <= 0) continue;
    const below = diag + kb;
    trsm(S, rest, kb, diag, lda, below, lda, true);
    scaledUpdate(S, rest, kb, below, lda, diag, below + kb * lda, lda);
    for (let p = 0; p < kb; p++) {
      const inv = 1 / S[diag + p * (lda + 1)];
      const col = below + p * lda;
      for (let i = 0; i < rest; i++) S[col + i] *= inv;
    }
  }
  return -1;
}
