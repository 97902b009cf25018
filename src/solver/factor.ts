/**
 * analysis.factor(): resolves the kernel choice and hands the analysis to the
 * numeric stage. Progress from the numeric stage is reported as phase "factor".
 */
import type { DenseKernels } from "../kernels/types.js";
import { getKernels } from "../kernels/index.js";
import type { SparseMatrix } from "../matrix/sparse.js";
import { factorize, type Factorization } from "../numeric/index.js";
import type { FactorMethod } from "../numeric/types.js";
import type { Analysis } from "./analysis.js";
import type { Progress } from "./analyze.js";

export type { Factorization } from "../numeric/index.js";

/** Options of {@link Analysis.factor}. */
export interface FactorizeOptions {
  /** "cholesky" (default): A = L·Lᵀ for SPD matrices. "ldlt": A = L·D·Lᵀ without pivoting, also for quasi-definite matrices. */
  method?: FactorMethod;
  /**
   * Dense kernels: "auto" (default) uses WebAssembly SIMD where the runtime
   * supports it, else plain JS; "wasm" and "js" force one. A kernel set object
   * may be passed instead (it must not be shared by two live factorizations).
   */
  kernels?: "auto" | "wasm" | "js" | DenseKernels;
  /** L·D·Lᵀ: a pivot d_j with |d_j| ≤ pivotTolerance · |a_jj| (where a_jj = 0: Σ_k l_jk²·|d_k|) is an error. Default 1e-12. */
  pivotTolerance?: number;
  /** Called with `{ phase: "factor", fraction }`, the fraction of the factorization flops done. */
  onProgress?: (progress: Progress) => void;
  /** Stops the factorization with AbortedError; the Factorization is then unusable until a successful refactor. */
  signal?: AbortSignal;
}

/** The analysis fields the numeric stage reads. */
type AnalysedPattern = Pick<Analysis, "structure" | "permutation" | "inversePermutation" | "stats">;

/** Numeric factorization of A with the structure of `analysis`. */
export function factorWithAnalysis(analysis: AnalysedPattern, A: SparseMatrix, options: FactorizeOptions): Factorization {
  const k = options.kernels ?? "auto";
  const kernels = typeof k === "string" ? getKernels(k) : k;
  const { onProgress } = options;
  return factorize(
    {
      structure: analysis.structure,
      permutation: analysis.permutation,
      inversePermutation: analysis.inversePermutation,
      flops: analysis.stats.flops,
    },
    A,
    {
      method: options.method,
      kernels,
      pivotTolerance: options.pivotTolerance,
      signal: options.signal,
      onProgress: onProgress ? (fraction) => onProgress({ phase: "factor", fraction }) : undefined,
    },
  );
}
