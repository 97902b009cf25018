/**
 * Ordering dispatch: picks the fill-reducing ordering by name, validates a
 * caller's permutation, compresses indistinguishable vertices before nested
 * dissection when that shrinks the graph enough (Ashcraft 1995, SIAM J. Sci.
 * Comput. 16(6)), and returns the permutation (new → original) with the
 * separator tree when nested dissection built one.
 */
import { AbortedError, InputError, optionsObject } from "../errors.js";
import { compressIfSmaller, expandPermutation, type CompressedGraph } from "../graph/compress.js";
import { checkGraph, checkGraphShape } from "../graph/check.js";
import { checkPermutation } from "../matrix/permutation.js";
import type { Graph } from "../graph/types.js";
import { validateCoordinates, type Coordinates } from "./coordinates.js";
import { minimumDegree } from "./minimum-degree.js";
import { nestedDissection } from "./nested-dissection/index.js";
import { availableCores } from "./nested-dissection/threads.js";
import { reverseCuthillMcKee } from "./rcm.js";
import type { OrderingResult, SeparatorTree } from "./types.js";

/** Every named fill-reducing ordering. */
export const ORDERING_NAMES = ["nested-dissection", "minimum-degree", "reverse-cuthill-mckee", "natural"] as const;

/** Named fill-reducing orderings. */
export type OrderingName = (typeof ORDERING_NAMES)[number];

/** A named ordering or a caller's permutation (new → original). */
export type OrderingChoice = OrderingName | Int32Array;

/** Options of {@link computeOrdering}. */
export interface OrderingOptions {
  /** Default: nested dissection above 200 vertices, minimum degree up to 200 (analyze's default runs both instead). */
  ordering?: OrderingChoice;
  /** Seed of the randomized steps of nested dissection; same seed, same ordering. Default 1. */
  seed?: number;
  /** Node coordinates (2 or 3 values per vertex) for coordinate bisection inside nested dissection. */
  coordinates?: Float64Array;
  /**
   * With coordinates: "refine" (default) refines each coordinate cut and keeps
   * the lighter of it and the multilevel separator; "plain" uses the coordinate
   * cut's boundary as is (fastest); "ignore" disregards the coordinates.
   * Both are checked for every ordering.
   */
  coordinateMode?: "refine" | "plain" | "ignore";
  /** Checked between pieces of the dissection; an aborted signal stops the work with AbortedError. */
  signal?: AbortSignal;
  /** Called with the fraction (0..1) of vertices placed so far. */
  onProgress?: (fraction: number) => void;
  /**
   * Threads nested dissection may use, this one included. Default: up to 4 (no
   * more than the cores, a Linux cgroup CPU quota counted) for graphs of
   * 100,000 vertices or more (after compression), else 1. Helper threads run in Node only (worker_threads,
   * with the caller blocked until they finish); elsewhere, or when they cannot
   * start, all runs on the calling thread. The ordering is the same for any
   * number of threads. An integer in 1..256 (checked for every ordering).
   */
  threads?: number;
}

/** Below this order the default is minimum degree, above it nested dissection. */
export const DISSECTION_THRESHOLD = 200;

/** Compress only when the quotient graph has at most this fraction of the vertices. */
const COMPRESSION_RATIO = 0.75;

/**
 * Computes the ordering requested in `options` for graph g.
 * @returns the permutation (new position → original vertex), the ordering's
 * name, and for nested dissection the separator tree in the new numbering.
 * @throws InputError for an unknown ordering, a bad seed, bad coordinates or an
 * invalid user permutation (naming the first bad entry); AbortedError when the signal fires.
 */
export function computeOrdering(g: Graph, given: OrderingOptions = {}): OrderingResult {
  const options = optionsObject(given, "computeOrdering");
  checkGraphShape(g, "computeOrdering");
  const n = g.n;
  if (options.signal?.aborted) throw new AbortedError("ordering aborted before it started");
  const choice = options.ordering ?? (n > DISSECTION_THRESHOLD ? "nested-dissection" : "minimum-degree");
  if (options.seed !== undefined && !Number.isFinite(options.seed)) {
    throw new InputError(`seed must be a finite number, got ${String(options.seed)}`);
  }
  const t = options.threads;
  if (t !== undefined && !(Number.isInteger(t) && t >= 1 && t <= MAX_THREADS)) {
    throw new InputError(`threads must be an integer in 1..${MAX_THREADS}, got ${String(t)}`);
  }
  // Coordinates and their mode are checked whatever the ordering, as threads are: a caller's mistake
  // should not pass unnoticed just because this ordering (or this size's default) ignores them.
  const coordinates = options.coordinates === undefined ? undefined : validateCoordinates(options.coordinates, n);
  const mode = options.coordinateMode;
  if (mode !== undefined && mode !== "refine" && mode !== "plain" && mode !== "ignore") {
    throw new InputError(`coordinateMode must be "refine", "plain" or "ignore", got ${String(mode)}`);
  }
  let result: OrderingResult;
  if (choice instanceof Int32Array) result = { permutation: validatePermutation(choice, n), name: "user" };
  else if (choice === "natural") result = { permutation: identity(n), name: choice };
  else if (choice === "minimum-degree") result = { permutation: minimumDegree(g), name: choice };
  else if (choice === "nested-dissection") result = { ...dissect(g, options, coordinates), name: choice };
  else if (choice === "reverse-cuthill-mckee") result = { permutation: reverseCuthillMcKee(g), name: choice };
  else throw new InputError(`unknown ordering "${String(choice)}"`);
  options.onProgress?.(1);
  return result;
}

function identity(n: number): Int32Array {
  const p = new Int32Array(n);
  for (let i = 0; i < n; i++) p[i] = i;
  return p;
}

/** Nested dissection, on the compressed graph when compression pays; `coordinates` already validated. */
function dissect(g: Graph, options: OrderingOptions, coordinates: Coordinates | undefined): OrderingResult {
  checkGraph(g, "nestedDissection");
  const c = g.n > DISSECTION_THRESHOLD ? compressIfSmaller(g, COMPRESSION_RATIO) : null;
  // leaves: halo minimum degree (the default leaf ordering of nestedDissection)
  const common = {
    seed: options.seed, signal: options.signal, onProgress: options.onProgress, coordinateMode: options.coordinateMode,
    threads: threadsFor(c === null ? g.n : c.graph.n, options.threads),
  };
  if (c === null) return nestedDissection(g, { ...common, coordinates });
  const r = nestedDissection(c.graph, {
    ...common, vertexWeights: c.weights, coordinates: coordinates && compressCoordinates(c, coordinates),
  });
  return { permutation: expandPermutation(c, r.permutation), separatorTree: expandTree(c, r.permutation, r.separatorTree), threads: r.threads };
}

/** Graphs (after compression) with at least this many vertices are dissected on several threads by default. */
export const PARALLEL_THRESHOLD = 100_000;

/** Most threads used by default. */
const DEFAULT_THREADS = 4;

/** Most threads a caller may ask for. */
const MAX_THREADS = 256;

/** Threads for dissecting an n-vertex graph: the caller's number (checked in computeOrdering), or the default. */
function threadsFor(n: number, requested: number | undefined): number {
  if (requested !== undefined) return requested;
  return n >= PARALLEL_THRESHOLD ? Math.min(DEFAULT_THREADS, availableCores()) : 1;
}

/** Each supervariable takes the coordinates of its first member. */
function compressCoordinates(c: CompressedGraph, x: Coordinates): Coordinates {
  const d = x.dimension;
  const m = c.graph.n;
  const values = new Float64Array(m * d);
  for (let s = 0; s < m; s++) {
    const v = c.members[c.memberOffsets[s]];
    for (let a = 0; a < d; a++) values[s * d + a] = x.values[v * d + a];
  }
  return { dimension: d, values };
}

/** Maps tree ranges from compressed positions to original positions. */
function expandTree(c: CompressedGraph, perm: Int32Array, t: SeparatorTree): SeparatorTree {
  const start = new Int32Array(perm.length + 1);
  for (let k = 0; k < perm.length; k++) start[k + 1] = start[k] + c.weights[perm[k]];
  const map = (a: Int32Array): Int32Array => a.map((k) => start[k]);
  return { count: t.count, first: map(t.first), separatorFirst: map(t.separatorFirst), end: map(t.end), parent: t.parent.slice() };
}

/** Checks that p is a permutation of 0..n−1; the error names the first bad entry. */
function validatePermutation(p: Int32Array, n: number): Int32Array {
  checkPermutation(p, n, "ordering");
  return p;
}
