/**
 * The Analysis: the immutable result of ordering and symbolic factorization
 * for one sparsity pattern. It is reused for every numeric factorization of a
 * matrix with that pattern, and it serializes to bytes so another run can
 * skip the analysis entirely.
 */
import type { SparseMatrix } from "../matrix/sparse.js";
import type { SeparatorTree } from "../ordering/types.js";
import type { SupernodalStructure } from "../symbolic/types.js";
import type { AnalysisStats } from "./stats.js";
import { decodeAnalysis, encodeAnalysis } from "./serialize.js";
import { factorWithAnalysis, type Factorization, type FactorizeOptions } from "./factor.js";

/** The fields an Analysis is made of (what serialization stores). */
export interface AnalysisParts {
  readonly permutation: Int32Array;
  readonly inversePermutation: Int32Array;
  readonly orderingPermutation: Int32Array;
  readonly separatorTree: SeparatorTree | undefined;
  readonly eliminationTree: Int32Array;
  readonly columnCounts: Int32Array;
  readonly structure: SupernodalStructure;
  readonly stats: AnalysisStats;
}

/** Ordering and symbolic factorization of one sparsity pattern; immutable and reusable. */
export class Analysis {
  /** Order of the matrix. */
  readonly n: number;
  /**
   * The permutation the factorization uses: `permutation[k]` is the original
   * index placed at position k. It is an equivalent reordering (a postorder
   * of the same elimination tree, with each supernode contiguous) of
   * `orderingPermutation`, so the fill is exactly the ordering's.
   */
  readonly permutation: Int32Array;
  /** Inverse of `permutation`: original index → position. */
  readonly inversePermutation: Int32Array;
  /** The permutation exactly as the ordering produced it (new → original). */
  readonly orderingPermutation: Int32Array;
  /**
   * The separator tree of a nested-dissection ordering, in the numbering of
   * `orderingPermutation`; undefined for other orderings.
   */
  readonly separatorTree: SeparatorTree | undefined;
  /** Elimination tree in the numbering of `permutation` (-1 for roots). */
  readonly eliminationTree: Int32Array;
  /** Entries of each column of L (diagonal included), numbering of `permutation`. */
  readonly columnCounts: Int32Array;
  /** Supernodes of L and their row structures, numbering of `permutation`. */
  readonly structure: SupernodalStructure;
  /** Sizes, predicted work and memory, and timings. */
  readonly stats: AnalysisStats;

  /** @internal Use {@link analyze} or {@link Analysis.fromBytes}. */
  constructor(parts: AnalysisParts) {
    this.n = parts.structure.n;
    this.permutation = parts.permutation;
    this.inversePermutation = parts.inversePermutation;
    this.orderingPermutation = parts.orderingPermutation;
    this.separatorTree = parts.separatorTree;
    this.eliminationTree = parts.eliminationTree;
    this.columnCounts = parts.columnCounts;
    this.structure = parts.structure;
    this.stats = parts.stats;
    Object.freeze(this);
  }

  /**
   * Numeric factorization of A, which must have the analysed pattern (in the
   * same storage form: lower, upper or both triangles). Cholesky by default;
   * `{ method: "ldlt" }` for L·D·Lᵀ.
   */
  factor(A: SparseMatrix, options: FactorizeOptions = {}): Factorization {
    return factorWithAnalysis(this, A, options);
  }

  /** Serialize to bytes (versioned, checksummed). */
  toBytes(): Uint8Array {
    return encodeAnalysis(this);
  }

  /** Rebuild an Analysis saved with {@link Analysis.toBytes}; FormatError when the bytes are not one. */
  static fromBytes(bytes: Uint8Array): Analysis {
    return new Analysis(decodeAnalysis(bytes));
  }
}
