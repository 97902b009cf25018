/**
 * The narrow interface between the numeric factorization and its dense
 * kernels. Every kernel works on one contiguous store of doubles owned by the
 * kernel set (plain memory for the JS set, WebAssembly linear memory for the
 * wasm set); operands are given as offsets into that store, blocks are
 * column-major with explicit leading dimensions. The numeric code never
 * copies a supernode out of the store to call a kernel.
 */
export type KernelName = "js" | "wasm";

export interface DenseKernels {
  readonly name: KernelName;
  /**
   * Make the store hold at least `length` doubles and return a view of it.
   * Earlier views may be invalidated; contents need not be preserved.
   * Throws CapacityError when the platform cannot provide the memory.
   */
  reserve(length: number): Float64Array;
  /** The current view of the store (valid until the next reserve). */
  view(): Float64Array;

  /**
   * In-place Cholesky of the n×n lower triangle at a (leading dim lda):
   * A = L·Lᵀ, L overwrites the lower triangle. Returns -1 on success, or the
   * 0-based local column whose pivot was not positive (the pivot value is
   * left on that diagonal entry, not rooted).
   */
  potrf(n: number, a: number, lda: number): number;

  /**
   * In-place L·D·Lᵀ of the n×n lower triangle at a without pivoting: unit
   * lower L in the strict lower triangle, D on the diagonal. Returns -1 on
   * success, or the local column whose pivot had |d| <= tiny (d left on the
   * diagonal).
   */
  ldlt(n: number, a: number, lda: number, tiny: number): number;

  /**
   * B := B · L⁻ᵀ where L is the n×n lower triangle at a, B is m×n at b.
   * With unit = true the diagonal of L is taken as 1 (L·D·Lᵀ panels).
   */
  trsm(m: number, n: number, a: number, lda: number, b: number, ldb: number, unit: boolean): void;

  /**
   * C := C − A · Bᵀ with A m×k at a, B n×k at b, C m×n at c.
   * With lower = true (requires m = n) only the lower triangle of C is
   * referenced and updated (the symmetric rank-k update when a = b).
   */
  gemm(
    m: number, n: number, k: number,
    a: number, lda: number,
    b: number, ldb: number,
    c: number, ldc: number,
    lower: boolean,
  ): void;
}
