/**
 * Shapes shared by the numeric stage: what it reads from the symbolic
 * analysis, the options of a numeric factorization, and what solves report.
 */
import type { DenseKernels } from "../kernels/types.js";
import type { SupernodalStructure } from "../symbolic/types.js";

/** Factorization method: L·Lᵀ (SPD) or L·D·Lᵀ without pivoting (SPD or quasi-definite). */
export type FactorMethod = "cholesky" | "ldlt";

/** What the numeric phase needs from an analysis. All of it is read-only. */
export interface NumericInput {
  readonly structure: SupernodalStructure;
  /** new → original */
  readonly permutation: Int32Array;
  /** original → new */
  readonly inversePermutation: Int32Array;
  /** Σ c_j² without amalgamation zeros, if the analysis knows it (used for GF/s); otherwise counted from the structure. */
  readonly flops?: number;
}

/** Default L·D·Lᵀ pivot tolerance, relative to the largest entry of the pivot's own row of A. */
export const DEFAULT_PIVOT_TOLERANCE = 1e-12;

/** Options of a numeric factorization. */
export interface FactorOptions {
  /** "cholesky" (default) or "ldlt". */
  method?: FactorMethod;
  /** Dense kernel set; by default a fresh plain-JS set. A kernel set must not be shared by two live factorizations. */
  kernels?: DenseKernels;
  /** Called with the fraction (0..1] of the factorization flops done, between supernodes. */
  onProgress?: (fraction: number) => void;
  /** Checked between supernodes; when aborted the factorization throws AbortedError and is left unusable. */
  signal?: AbortSignal;
  /**
   * L·D·Lᵀ only: a pivot d_j with |d_j| ≤ pivotTolerance · |a_jj| (its own
   * diagonal entry; where a_jj = 0, Σ_k l_jk²·|d_k|, the terms it was formed
   * from) stops the factorization with NotPositiveDefiniteError. Default
   * 1e-12. Both sides scale alike under a change of units (multifrontal.ts).
   */
  pivotTolerance?: number;
}

/** Options of a solve. */
export interface SolveOptions {
  /**
   * Iterative refinement against the original matrix: a number of steps
   * (stopping early once the backward error reaches ε), or `true` for up to
   * 10 steps while each step at least halves the backward error. Default:
   * `true` for an L·D·Lᵀ factorization whose growth exceeds 16 (see
   * FactorStats.growth), none otherwise. Anything else (a negative count,
   * NaN, a string) is an InputError.
   */
  refine?: number | boolean;
}

/** A solution with its quality. */
export interface SolveInfo {
  /** The solution (n, or n×k column-major). */
  readonly x: Float64Array;
  /**
   * Normwise backward error ‖b − A·x‖∞ / (‖A‖∞·‖x‖∞ + ‖b‖∞) (Rigal & Gaches
   * 1967), the largest over the right-hand sides.
   */
  readonly backwardError: number;
  /** Refinement steps taken. */
  readonly refinementSteps: number;
}

/** Inertia of the factored matrix: counts of positive, negative and zero eigenvalues (Sylvester's law applied to D). */
export interface Inertia {
  readonly positive: number;
  readonly negative: number;
  readonly zero: number;
}

/** Figures of the last successful factorization. */
export interface FactorStats {
  readonly method: FactorMethod;
  /** Kernel set that ran ("js" or "wasm"). */
  readonly kernels: string;
  /** Wall-clock seconds of the numeric factorization (assembly + dense kernels). */
  readonly seconds: number;
  /** Σ c_j² over the columns of L, as AnalysisStats.flops. */
  readonly flops: number;
  /** flops / seconds / 1e9. */
  readonly gflopsPerSecond: number;
  /** Bytes of the factor L (supernodal panels, explicit zeros of amalgamation included). */
  readonly factorBytes: number;
  /** Bytes of the whole kernel store: factor + peak contribution stack + scratch. */
  readonly peakBytes: number;
  readonly supernodes: number;
  /**
   * Growth ρ = max_j (|L|·|D|·|Lᵀ|)_jj / max|a_ij| (src/numeric/growth.ts):
   * 1 for Cholesky; an L·D·Lᵀ solve may lose about log10(ρ) digits of
   * backward error, which refinement restores (solves refine by default
   * when ρ > 16).
   */
  readonly growth: number;
  /**
   * Smallest relative pivot min_j |p_j| / r_j, with p_j = L_jj² (Cholesky) or
   * d_j (L·D·Lᵀ) and r_j = |a_jj| (for L·D·Lᵀ where a_jj = 0, Σ_k l_jk²·|d_k|;
   * the scale of the L·D·Lᵀ pivot tolerance); it does not change with the
   * units of the unknowns (D·A·D); 1 for an empty matrix. Each pivot is the
   * diagonal of a Schur complement, so a value near ε (2.2e-16) means a pivot
   * cancelled to rounding: A is singular or nearly so to working precision,
   * and solutions may be meaningless even when the backward error is small
   * (Cholesky still factors an ill-conditioned SPD matrix backward stably).
   * Typical causes: a graph Laplacian with no grounded node, or a model
   * missing constraints (a floating body, pure Neumann conditions). It is a
   * warning sign, not a condition number: a well-scaled SPD matrix gives a
   * value of order 1, but a small value is not required for ill-conditioning.
   */
  readonly smallestPivot: number;
  /**
   * Where `smallestPivot` occurs: the column j of A (0-based, original
   * numbering, as in NotPositiveDefiniteError.column) whose pivot gives the
   * smallest ratio; on ties the one eliminated first. −1 for an empty matrix.
   * For a singular matrix it is where the dependence surfaced in the
   * elimination order (an ungrounded Laplacian: the node eliminated last), a
   * place to start checking the model rather than proof that this equation
   * is the wrong one.
   */
  readonly smallestPivotColumn: number;
}
