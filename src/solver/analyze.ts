/**
 * analyze(): the front door of the pipeline. Reads the pattern of a symmetric
 * matrix (any storage form), orders it, runs the symbolic phase and predicts
 * the numeric phase's memory, all before any numeric storage exists.
 */
import { AbortedError, InputError, optionsObject, SeptumError } from "../errors.js";
import { adjacencyGraph } from "../graph/adjacency.js";
import type { SparseMatrix } from "../matrix/sparse.js";
import { requireSquare, storageForm } from "../matrix/symmetric.js";
import { predictWorkspace } from "../numeric/workspace.js";
import {
  computeOrdering, DISSECTION_THRESHOLD, ORDERING_NAMES, type OrderingChoice, type OrderingName, type OrderingOptions,
} from "../ordering/index.js";
import type { Graph } from "../graph/types.js";
import type { OrderingResult } from "../ordering/types.js";
import { countFill, symbolicFactorization, type AmalgamationOptions } from "../symbolic/index.js";
import { Analysis } from "./analysis.js";
import { supernodeExtremes } from "./stats.js";

export type { OrderingName } from "../ordering/index.js";

/** Stage and fraction done, reported by long-running calls. */
export interface Progress {
  readonly phase: "ordering" | "symbolic" | "factor";
  /** 0..1 within the phase. */
  readonly fraction: number;
}

/** Options of {@link analyze}. */
export interface AnalyzeOptions {
  /**
   * A named ordering, or a permutation (new → original) of 0..n−1.
   * Default: both nested dissection and minimum degree are computed and the
   * one with fewer predicted flops is kept (minimum degree alone for n ≤ 200).
   */
  ordering?: OrderingName | Int32Array | ArrayLike<number>;
  /** Seed of the randomized parts of nested dissection (deterministic for a given seed). Default 1. */
  seed?: number;
  /** Node coordinates for nested dissection: 2 or 3 values per row/column of A (checked for every ordering). */
  coordinates?: Float64Array;
  /**
   * How nested dissection uses `coordinates`: "refine" (default) refines each
   * coordinate cut and keeps the lighter of it and the multilevel separator;
   * "plain" takes coordinate cuts as they are (good for multi-dof elasticity);
   * "ignore" disregards them.
   */
  coordinateMode?: "refine" | "plain" | "ignore";
  /**
   * Threads nested dissection may use, this one included. Default: up to 4 (no
   * more than the cores) for graphs of 100,000 or more vertices, else 1; see
   * {@link OrderingOptions.threads}. The ordering does not depend on it.
   */
  threads?: number;
  /** Bounds on relaxed supernode amalgamation (numbers >= 0, zero fractions at most 1), or false to keep fundamental supernodes. */
  amalgamation?: AmalgamationOptions | false;
  /** Called as work proceeds. */
  onProgress?: (progress: Progress) => void;
  /** Stops the analysis with AbortedError. */
  signal?: AbortSignal;
}

const NAMES: readonly string[] = ORDERING_NAMES;

/** Order and analyse the pattern of the symmetric matrix A. */
export function analyze(A: SparseMatrix, given: AnalyzeOptions = {}): Analysis {
  const options = optionsObject(given, "analyze");
  requireSquare(A);
  const { signal, onProgress } = options;
  const choice = orderingChoice(options.ordering, A.ncols);
  checkAbort(signal);
  const graph = adjacencyGraph(A);
  const t0 = now();
  const common: OrderingOptions = {
    seed: options.seed, coordinates: options.coordinates, coordinateMode: options.coordinateMode, threads: options.threads, signal,
  };
  const ordering = choice === undefined
    ? defaultOrdering(graph, common, onProgress)
    : computeOrdering(graph, {
      ...common,
      ordering: choice,
      onProgress: onProgress ? (fraction) => onProgress({ phase: "ordering", fraction }) : undefined,
    });
  const t1 = now();
  checkAbort(signal);
  checkOrderingOutput(ordering.permutation, A.ncols, ordering.name ?? "ordering");
  const sym = symbolicFactorization(graph, ordering.permutation, options.amalgamation ?? {});
  const work = predictWorkspace(sym.structure, "cholesky");
  const t2 = now();
  onProgress?.({ phase: "symbolic", fraction: 1 });
  const ext = supernodeExtremes(sym.structure);
  return new Analysis({
    permutation: sym.permutation,
    inversePermutation: sym.inverse,
    orderingPermutation: ordering.permutation,
    separatorTree: ordering.separatorTree,
    eliminationTree: sym.parent,
    columnCounts: sym.columnCounts,
    structure: sym.structure,
    stats: {
      n: A.ncols,
      nnzA: lowerCount(A),
      nnzL: sym.nnzL,
      flops: sym.flops,
      supernodes: sym.structure.supernodeCount,
      largestSupernode: ext.columns,
      largestFront: ext.rows,
      factorBytes: 8 * work.factorDoubles,
      peakBytes: work.peakBytes,
      ordering: ordering.name ?? (typeof choice === "string" ? choice : choice ? "user" : "default"),
      orderingSeconds: t1 - t0,
      symbolicSeconds: t2 - t1,
    },
  });
}

/**
 * The default: nested dissection and minimum degree, keeping the one with
 * fewer predicted flops (column counts cost O(nnz·α(n)), far less than either
 * ordering). Neither wins everywhere: dissection is far better on 2-D and
 * 3-D meshes, minimum degree can be better on irregular graphs.
 */
function defaultOrdering(graph: Graph, common: OrderingOptions, onProgress: AnalyzeOptions["onProgress"]): OrderingResult {
  if (graph.n <= DISSECTION_THRESHOLD) return computeOrdering(graph, { ...common, ordering: "minimum-degree" });
  const nd = computeOrdering(graph, {
    ...common,
    ordering: "nested-dissection",
    onProgress: onProgress ? (fraction) => onProgress({ phase: "ordering", fraction: 0.85 * fraction }) : undefined,
  });
  const md = computeOrdering(graph, { ...common, ordering: "minimum-degree" });
  onProgress?.({ phase: "ordering", fraction: 1 });
  return countFill(graph, md.permutation).flops < countFill(graph, nd.permutation).flops ? md : nd;
}

function orderingChoice(o: AnalyzeOptions["ordering"], n: number): OrderingChoice | undefined {
  if (o === undefined) return undefined;
  if (typeof o === "string") {
    if (!NAMES.includes(o)) throw new InputError(`unknown ordering "${o}"; expected one of ${NAMES.join(", ")} or a permutation`);
    return o as OrderingName;
  }
  if (o instanceof Int32Array) return o;
  if (typeof o === "object" && o !== null && typeof (o as ArrayLike<number>).length === "number") {
    const a = o as ArrayLike<number>;
    const p = new Int32Array(a.length);
    for (let k = 0; k < a.length; k++) {
      if (!Number.isInteger(a[k])) throw new InputError(`ordering[${k}] = ${a[k]} is not an integer index`);
      // Checked before the Int32Array copy, which would wrap 2^32 + 1 to 1.
      if (a[k] < 0 || a[k] >= n) throw new InputError(`ordering[${k}] = ${a[k]} is out of range 0..${n - 1}`);
      p[k] = a[k];
    }
    return p;
  }
  throw new InputError("ordering must be a name or a permutation array");
}

/** Entries of the lower triangle (diagonal included) of the symmetric matrix A stands for. */
function lowerCount(A: SparseMatrix): number {
  const form = storageForm(A);
  if (form !== "full") return A.nnz;
  let c = 0;
  for (let j = 0; j < A.ncols; j++) {
    for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) if (A.rowIdx[p] >= j) c++;
  }
  return c;
}

/** Guard against a faulty ordering: a bad permutation must never reach the symbolic phase. */
function checkOrderingOutput(p: Int32Array, n: number, name: string): void {
  const seen = new Uint8Array(n);
  let ok = p.length === n;
  for (let k = 0; ok && k < n; k++) {
    const v = p[k];
    ok = v >= 0 && v < n && seen[v] === 0;
    if (ok) seen[v] = 1;
  }
  if (!ok) throw new SeptumError(`internal error: the ${name} ordering returned an invalid permutation; please report this matrix`);
}

function checkAbort(signal: AbortSignal | undefined): void {
  if (signal?.aborted) throw new AbortedError("analysis aborted");
}

function now(): number {
  return performance.now() / 1000;
}
