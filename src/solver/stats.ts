/**
 * Figures of an analysis, computed from the symbolic result and the numeric
 * stage's memory prediction before any numeric storage is allocated.
 */
import type { SupernodalStructure } from "../symbolic/types.js";

/** Figures of an analysis. */
export interface AnalysisStats {
  /** Order of the matrix. */
  readonly n: number;
  /** Entries of the lower triangle of A, diagonal included (comparable with nnzL). */
  readonly nnzA: number;
  /** Entries of L, diagonal included, without amalgamation zeros. */
  readonly nnzL: number;
  /** Σ c_j² over the columns of L (c_j = entries of column j): the leading term of Cholesky's flop count, the figure septum reports everywhere. */
  readonly flops: number;
  /** Number of supernodes. */
  readonly supernodes: number;
  /** Columns of the widest supernode. */
  readonly largestSupernode: number;
  /** Rows of the tallest supernode (the order of the largest frontal matrix). */
  readonly largestFront: number;
  /** Bytes of the stored factor (supernodal panels, amalgamation zeros included). */
  readonly factorBytes: number;
  /**
   * Predicted peak bytes of a Cholesky factorization: factor + contribution
   * stack. The analysis does not know the method; L·D·Lᵀ also needs a scratch
   * block, so its figure is `predictWorkspace(analysis.structure, "ldlt").peakBytes`
   * (what FactorStats.peakBytes then reports).
   */
  readonly peakBytes: number;
  /** Name of the ordering used ("user" for a given permutation). */
  readonly ordering: string;
  /** Seconds spent ordering. */
  readonly orderingSeconds: number;
  /** Seconds spent in the symbolic phase (elimination tree to supernode structure). */
  readonly symbolicSeconds: number;
}

/** Widest and tallest supernode. */
export function supernodeExtremes(st: SupernodalStructure): { columns: number; rows: number } {
  let columns = 0, rows = 0;
  for (let s = 0; s < st.supernodeCount; s++) {
    columns = Math.max(columns, st.superStart[s + 1] - st.superStart[s]);
    rows = Math.max(rows, st.rowPtr[s + 1] - st.rowPtr[s]);
  }
  return { columns, rows };
}
