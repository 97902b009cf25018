/**
 * Register-tiled update C := C − A·Bᵀ on column-major blocks inside one store
 * (the GEMM / SYRK building block of blocked dense factorizations; Goto & van
 * de Geijn 2008, "Anatomy of high-performance matrix multiplication", ACM TOMS
 * 34(3), for the register-tile idea). Plain JS: a 4×4 tile of C lives in 16
 * local doubles while the k loop streams four rows of A and four rows of B;
 * edges use 1×4, 4×1 and 1×1 tiles. The lower variant (SYRK when A = B) visits
 * only tiles touching the lower triangle and writes only entries with i ≥ j.
 */

/** C[i..i+3, j..j+3] −= A[i..i+3, :]·B[j..j+3, :]ᵀ; `diag` keeps only i ≥ j (tile on the diagonal). */
function tile44(
  S: Float64Array, k: number, a: number, lda: number, b: number, ldb: number,
  c: number, ldc: number, diag: boolean,
): void {
  let c00 = 0, c10 = 0, c20 = 0, c30 = 0, c01 = 0, c11 = 0, c21 = 0, c31 = 0;
  let c02 = 0, c12 = 0, c22 = 0, c32 = 0, c03 = 0, c13 = 0, c23 = 0, c33 = 0;
  for (let p = 0, pa = a, pb = b; p < k; p++, pa += lda, pb += ldb) {
    const a0 = S[pa], a1 = S[pa + 1], a2 = S[pa + 2], a3 = S[pa + 3];
    const b0 = S[pb], b1 = S[pb + 1], b2 = S[pb + 2], b3 = S[pb + 3];
    c00 += a0 * b0; c10 += a1 * b0; c20 += a2 * b0; c30 += a3 * b0;
    c01 += a0 * b1; c11 += a1 * b1; c21 += a2 * b1; c31 += a3 * b1;
    c02 += a0 * b2; c12 += a1 * b2; c22 += a2 * b2; c32 += a3 * b2;
    c03 += a0 * b3; c13 += a1 * b3; c23 += a2 * b3; c33 += a3 * b3;
  }
  S[c] -= c00; S[c + 1] -= c10; S[c + 2] -= c20; S[c + 3] -= c30;
  const c1 = c + ldc, c2 = c1 + ldc, c3 = c2 + ldc;
  S[c1 + 1] -= c11; S[c1 + 2] -= c21; S[c1 + 3] -= c31;
  S[c2 + 2] -= c22; S[c2 + 3] -= c32; S[c3 + 3] -= c33;
  if (!diag) {
    S[c1] -= c01; S[c2] -= c02; S[c3] -= c03;
    S[c2 + 1] -= c12; S[c3 + 1] -= c13; S[c3 + 2] -= c23;
  }
}

/** C[i, j..j+3] −= A[i, :]·B[j..j+3, :]ᵀ (one row of C). */
function tile14(
  S: Float64Array, k: number, a: number, lda: number, b: number, ldb: number, c: number, ldc: number,
): void {
  let c0 = 0, c1 = 0, c2 = 0, c3 = 0;
  for (let p = 0, pa = a, pb = b; p < k; p++, pa += lda, pb += ldb) {
    const a0 = S[pa];
    c0 += a0 * S[pb]; c1 += a0 * S[pb + 1]; c2 += a0 * S[pb + 2]; c3 += a0 * S[pb + 3];
  }
  S[c] -= c0; S[c + ldc] -= c1; S[c + 2 * ldc] -= c2; S[c + 3 * ldc] -= c3;
}

/** C[i..i+3, j] −= A[i..i+3, :]·B[j, :]ᵀ (one column of C). */
function tile41(
  S: Float64Array, k: number, a: number, lda: number, b: number, ldb: number, c: number,
): void {
  let c0 = 0, c1 = 0, c2 = 0, c3 = 0;
  for (let p = 0, pa = a, pb = b; p < k; p++, pa += lda, pb += ldb) {
    const b0 = S[pb];
    c0 += S[pa] * b0; c1 += S[pa + 1] * b0; c2 += S[pa + 2] * b0; c3 += S[pa + 3] * b0;
  }
  S[c] -= c0; S[c + 1] -= c1; S[c + 2] -= c2; S[c + 3] -= c3;
}

/** C[i, j] −= A[i, :]·B[j, :]ᵀ. */
function tile11(S: Float64Array, k: number, a: number, lda: number, b: number, ldb: number, c: number): void {
  let s = 0;
  for (let p = 0, pa = a, pb = b; p < k; p++, pa += lda, pb += ldb) s += S[pa] * S[pb];
  S[c] -= s;
}

/** Rows i0..m−1 (fewer than 4) of C against columns [j0, j1). */
function rowEdge(
  S: Float64Array, i0: number, m: number, j0: number, j1: number, k: number,
  a: number, lda: number, b: number, ldb: number, c: number, ldc: number,
): void {
  for (let i = i0; i < m; i++) {
    let j = j0;
    for (; j + 4 <= j1; j += 4) tile14(S, k, a + i, lda, b + j, ldb, c + i + j * ldc, ldc);
    for (; j < j1; j++) tile11(S, k, a + i, lda, b + j, ldb, c + i + j * ldc);
  }
}

/** Rows per cache block of A (MC) and depth per block (KC): an MC×KC block of A stays in L2 while all columns of C pass (Goto & van de Geijn 2008). */
const GEMM_ROW_BLOCK = 128;
const GEMM_DEPTH_BLOCK = 256;

/**
 * C := C − A·Bᵀ, A m×k at a, B n×k at b, C m×n at c (column-major, offsets
 * into S). With `lower` (m = n) only entries i ≥ j of C are touched.
 */
export function gemm(
  S: Float64Array, m: number, n: number, k: number,
  a: number, lda: number, b: number, ldb: number, c: number, ldc: number, lower: boolean,
): void {
  if (m <= 0 || n <= 0 || k <= 0) return;
  for (let p0 = 0; p0 < k; p0 += GEMM_DEPTH_BLOCK) {
    const kc = Math.min(GEMM_DEPTH_BLOCK, k - p0);
    for (let i0 = 0; i0 < m; i0 += GEMM_ROW_BLOCK) {
      const i1 = Math.min(m, i0 + GEMM_ROW_BLOCK);
      gemmRows(S, i0, i1, lower ? Math.min(n, i1) : n, kc, a + p0 * lda, lda, b + p0 * ldb, ldb, c, ldc, lower);
    }
  }
}

/** Rows [i0, i1) of C against columns [0, n) (i0 a multiple of 4). */
function gemmRows(
  S: Float64Array, i0: number, i1: number, n: number, k: number,
  a: number, lda: number, b: number, ldb: number, c: number, ldc: number, lower: boolean,
): void {
  for (let j = 0; j < n; j += 4) {
    if (n - j >= 4) {
      let i = lower && j > i0 ? j : i0;
      if (lower && i === j && i + 4 <= i1) {
        tile44(S, k, a + i, lda, b + j, ldb, c + i + j * ldc, ldc, true);
        i += 4;
      }
      for (; i + 4 <= i1; i += 4) tile44(S, k, a + i, lda, b + j, ldb, c + i + j * ldc, ldc, false);
      rowEdge(S, i, i1, j, j + 4, k, a, lda, b, ldb, c, ldc);
    } else {
      for (let jj = j; jj < n; jj++) {
        let i = lower && jj > i0 ? jj : i0;
        for (; i + 4 <= i1; i += 4) tile41(S, k, a + i, lda, b + jj, ldb, c + i + jj * ldc);
        for (; i < i1; i++) tile11(S, k, a + i, lda, b + jj, ldb, c + i + jj * ldc);
      }
    }
  }
}
