/**
 * The supernodal structure of the Cholesky factor L of P·A·Pᵀ, all indices in
 * the new (permuted) numbering. This is what the numeric phase consumes.
 *
 * Supernode s owns columns [superStart[s], superStart[s+1]); supernodes are
 * numbered in a postorder of the supernodal elimination tree (children before
 * parents, each subtree contiguous). Its row structure is
 * rowIdx[rowPtr[s] .. rowPtr[s+1]), ascending, beginning with the supernode's
 * own columns. Its panel of L is stored column-major with leading dimension
 * nrows(s) = rowPtr[s+1] - rowPtr[s], at factor offset factorPtr[s]; the
 * strict upper triangle of the diagonal block is storage only.
 * Offsets are held in a Float64Array so factors beyond 2^31 entries are exact.
 */
export interface SupernodalStructure {
  readonly n: number;
  readonly supernodeCount: number;
  readonly superStart: Int32Array;
  readonly superParent: Int32Array;
  readonly rowPtr: Int32Array;
  readonly rowIdx: Int32Array;
  readonly factorPtr: Float64Array;
  /** Supernode that owns each column (length n). */
  readonly columnSupernode: Int32Array;
}
