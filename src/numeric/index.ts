/**
 * Numeric stage: supernodal multifrontal Cholesky and L·D·Lᵀ, solves,
 * refinement, determinant and inertia.
 */
export { Factorization, factorize, type RefactorOptions } from "./factorization.js";
export { predictWorkspace, type WorkspacePrediction } from "./workspace.js";
export {
  DEFAULT_PIVOT_TOLERANCE,
  type FactorMethod, type FactorOptions, type FactorStats, type Inertia, type NumericInput, type SolveInfo, type SolveOptions,
} from "./types.js";
