/**
 * The Analysis: the immutable result of ordering and symbolic factorization
 * for one sparsity pattern. It is reused for every numeric factorization of a
 * matrix with that pattern, and it serializes to bytes so another run can
 * skip the analysis entirely.
 */
import { optionsObject } from "../errors.js";
import type { SparseMatrix } from "../matrix/sparse.js";
import type { SeparatorTree } from "../ordering/types.js";
import type { SupernodalStructure } from "../symbolic/types.js";
import type { AnalysisStats } from "./stats.js";
import { decodeAnalysis, encodeAnalysis } from "./serialize.js";
import { factorWithAnalysis, type Factorization, type FactorizeOptions } from "./factor.js";

/** The fields an Analysis is made of (what serialization stores); `n` follows from the structure. */
export type AnalysisParts = Omit<Analysis, "n" | "factor" | "toBytes">;

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
  declare readonly permutation: Int32Array;
  /** Inverse of `permutation`: original index → position. */
  declare readonly inversePermutation: Int32Array;
  /** The permutation exactly as the ordering produced it (new → original). */
  declare readonly orderingPermutation: Int32Array;
  /**
   * The separator tree of a nested-dissection ordering, in the numbering of
   * `orderingPermutation`; undefined for other orderings.
   */
  declare readonly separatorTree: SeparatorTree | undefined;
  /** Elimination tree in the numbering of `permutation` (-1 for roots). */
  declare readonly eliminationTree: Int32Array;
  /** Entries of each column of L (diagonal included), numbering of `permutation`. */
  declare readonly columnCounts: Int32Array;
  /** Supernodes of L and their row structures, numbering of `permutation`. */
  declare readonly structure: SupernodalStructure;
  /** Sizes, predicted work and memory, and timings. */
  declare readonly stats: AnalysisStats;

  /** @internal Use {@link analyze} or {@link Analysis.fromBytes}. */
  constructor(parts: AnalysisParts) {
    Object.assign(this, parts);
    this.n = parts.structure.n;
    Object.freeze(this);
  }

  /**
   * Numeric factorization of A, which must have the analysed pattern (in the
   * same storage form: lower, upper or both triangles). Cholesky by default;
   * `{ method: "ldlt" }` for L·D·Lᵀ.
   */
  factor(A: SparseMatrix, options: FactorizeOptions = {}): Factorization {
    return factorWithAnalysis(this, A, optionsObject(options, "factor"));
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
