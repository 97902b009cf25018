/**
 * septum — sparse direct solution of symmetric positive definite and
 * quasi-definite systems: fill-reducing orderings, supernodal symbolic
 * analysis, multifrontal Cholesky and L·D·Lᵀ on register-tiled dense kernels.
 *
 * ```ts
 * import { SparseMatrix, analyze } from "septum";
 * const A = SparseMatrix.fromTriplets(n, n, rows, cols, values);
 * const analysis = analyze(A);            // ordering + symbolic, reusable
 * const F = analysis.factor(A);           // numeric Cholesky
 * const x = F.solve(b);
 * ```
 * @packageDocumentation
 */
export { SparseMatrix, type IndexArray, type ValueArray } from "./matrix/sparse.js";
export {
  storageForm, lowerTriangle, permuteLower, symmetricMultiply, symmetricNormInf, type StorageForm,
} from "./matrix/symmetric.js";
export {
  SeptumError, InputError, MatrixMarketError, NotSymmetricError, NotPositiveDefiniteError,
  PatternMismatchError, FormatError, AbortedError, CapacityError,
} from "./errors.js";
export type { Graph } from "./graph/types.js";
export { adjacencyGraph } from "./graph/adjacency.js";
export type { SeparatorTree, OrderingResult } from "./ordering/types.js";
export type { SupernodalStructure } from "./symbolic/types.js";
export type { AmalgamationOptions } from "./symbolic/supernodes.js";
export { analyze, type AnalyzeOptions, type OrderingName, type Progress } from "./solver/analyze.js";
export { Analysis } from "./solver/analysis.js";
export type { FactorizeOptions } from "./solver/factor.js";
export type { AnalysisStats } from "./solver/stats.js";
export { getKernels, type KernelSelectOptions } from "./kernels/index.js";
export type { DenseKernels, KernelName } from "./kernels/types.js";
export { Factorization, predictWorkspace, DEFAULT_PIVOT_TOLERANCE } from "./numeric/index.js";
export type {
  FactorMethod, FactorStats, Inertia, SolveInfo, SolveOptions, RefactorOptions, WorkspacePrediction,
} from "./numeric/index.js";
export { jsKernels } from "./kernels/js/index.js";
export { readMatrixMarket, writeMatrixMarket, writeMatrixMarketArray } from "./matrix/market.js";
export type {
  MarketContents, MarketSparse, MarketDense, MarketField, MarketWriteOptions, MarketArrayWriteOptions,
} from "./matrix/market.js";
export { minimumDegree, type MinimumDegreeOptions } from "./ordering/minimum-degree.js";
export { reverseCuthillMcKee } from "./ordering/rcm.js";
export { computeOrdering, ORDERING_NAMES, type OrderingOptions, type OrderingChoice } from "./ordering/index.js";
export { grid2d, grid3d, type ModelProblem } from "./generate/grids.js";
export { elasticity3d } from "./generate/elasticity.js";
export { plateMesh2d } from "./generate/plate.js";
export { geometricLaplacian } from "./generate/graphs.js";
export { saddle2d } from "./generate/saddle.js";
export { renderReport } from "./report/page.js";
export type { ReportInput, ReportOrdering, OrderingFigures } from "./report/types.js";
