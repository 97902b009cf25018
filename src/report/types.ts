/**
 * What the report draws: plain data gathered by the caller (the CLI or the
 * demo), so the rendering stays a pure function from data to an HTML string.
 */
import type { SeparatorTree } from "../ordering/types.js";
import type { SupernodalStructure } from "../symbolic/types.js";

/** Statistics of one ordering, as the analysis reports them. */
export interface OrderingFigures {
  readonly nnzL: number;
  readonly flops: number;
  readonly supernodes: number;
  readonly factorBytes?: number;
  readonly orderingSeconds?: number;
  readonly analyzeSeconds?: number;
  /** seconds of a numeric factorization, when one was run */
  readonly factorSeconds?: number;
}

/** One ordering's result. */
export interface ReportOrdering {
  readonly name: string;
  readonly figures: OrderingFigures;
  /** new → old */
  readonly permutation?: Int32Array;
  readonly separatorTree?: SeparatorTree;
  readonly structure?: SupernodalStructure;
  /** new → old permutation the structure is numbered in, when it differs from `permutation` */
  readonly structurePermutation?: Int32Array;
}

/** Everything the page shows. */
export interface ReportInput {
  readonly title: string;
  /** where the matrix came from (file name or generator description) */
  readonly source: string;
  readonly n: number;
  /** lower triangle of A (diagonal included), CSC pattern */
  readonly lowerColPtr: Int32Array;
  readonly lowerRowIdx: Int32Array;
  /** nonzeros of the full symmetric A */
  readonly nnzA: number;
  readonly orderings: readonly ReportOrdering[];
  /** index into `orderings` of the one drawn in detail */
  readonly shown: number;
  /** extra figures (already-rendered SVG/HTML fragments, trusted) placed after the overview */
  readonly extraSections?: readonly { title: string; html: string }[];
  readonly footer?: string;
}
