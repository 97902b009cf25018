/**
 * Nested dissection (George 1973, "Nested dissection of a regular finite
 * element mesh", SIAM J. Numer. Anal. 10(2)) driven by multilevel vertex
 * bisection: the entry point. How each piece is cut and ordered is in
 * pieces.ts; with `threads` above 1, pieces below the top separators are
 * shared with helper threads (team.ts). The result depends on the seed only,
 * not on the number of threads.
 */
import { AbortedError } from "../../errors.js";
import type { Graph } from "../../graph/types.js";
import type { Coordinates } from "../coordinates.js";
import { leafMinimumDegree, leafWork } from "../leaf-degree.js";
import type { OrderingResult } from "../types.js";
import { defaultBisectOptions, type BisectOptions } from "./multilevel.js";
import {
  buildTree, drain, newState, pushComponents, setAsideDense, setHairs, type CoordinateMode, type LeafOrdering, type Settings, type State,
} from "./pieces.js";
import { fmWork } from "./refine.js";
import { joinTeam, shareOut, startTeam, stopTeam, teamPlaced, type Member } from "./team.js";
import { weightedGraph } from "./wgraph.js";

export type { CoordinateMode, LeafOrdering } from "./pieces.js";

/** Options of {@link nestedDissection}. */
export interface DissectionOptions {
  /** Orders one leaf piece with its halo (default: halo minimum degree, {@link defaultLeafOrdering}). */
  orderLeaf?: LeafOrdering;
  seed?: number;
  /** Vertex weights (supervariable sizes); all ones by default. */
  vertexWeights?: Int32Array;
  /** Pieces with at most this many vertices are leaves (default: {@link defaultLeafSize}). */
  leafSize?: number;
  coordinates?: Coordinates;
  coordinateMode?: CoordinateMode;
  bisect?: Partial<BisectOptions>;
  signal?: AbortSignal;
  onProgress?: (fraction: number) => void;
  /**
   * Threads to use, this one included (default 1). Helper threads need Node's
   * worker_threads and the built helper script, and run only with the default
   * leaf ordering; otherwise everything runs on this thread, with the same result.
   */
  threads?: number;
  /** The helper script (default: dissection-worker.js beside the bundle); for tests. */
  helperScript?: URL;
  /** For tests: this thread keeps no group of pieces, so all it cuts below the top it takes back from a helper. */
  keepNone?: boolean;
}

/** Nested dissection's result: the ordering, its separator tree and the threads that did the work. */
export interface DissectionResult extends OrderingResult {
  readonly separatorTree: NonNullable<OrderingResult["separatorTree"]>;
  /** Threads that cut pieces: 1 plus the helpers that ran (a helper that failed is redone here). */
  readonly threads: number;
  /** Pieces this thread took back from helpers that were still busy. */
  readonly takenBack: number;
}

/**
 * Leaf size for an n-vertex graph: n/512 within [128, 2048]. Minimum degree
 * orders small pieces about as well as further dissection (the flops and
 * nnz(L) of the 2-D 300², 3-D 40³ and plate-mesh problems moved by under 2 %
 * between leaves of 128 and 1024, bench/ordering.mjs), but on 65,000-vertex
 * 9-point and elasticity problems leaves of 1024 cost 14–16 % more flops, so
 * leaves grow only on large graphs, where each level of dissection saved is a
 * sweep of the whole graph. n/512 against n/1024 (flops ÷ minimum degree's,
 * gmean of seeds 1–3): 5-point 600² 0.538 → 0.540, 7-point 70³ 0.238 → 0.238,
 * 9-point 600² 0.985 → 1.006, plate mesh (4.2·10⁵) 0.559 → 0.558, random
 * geometric (4·10⁵) 1.125 → 1.115; on the 10⁶-vertex grid 8 % less wall time
 * with two threads (.scratch A/B runs in one process, 2026-12-02).
 */
export function defaultLeafSize(n: number): number {
  return Math.max(128, Math.min(2048, Math.round(n / 512)));
}

/**
 * Halo minimum degree: exact minimum degree on bitsets for small leaves,
 * approximate minimum degree (dense rows set aside) for larger ones; both count
 * the leaf's halo in the degrees.
 */
export function defaultLeafOrdering(): LeafOrdering {
  const work = leafWork();
  return (leaf, halo) => leafMinimumDegree(leaf, work, halo);
}

/** The settings of a dissection of `graph` (total vertex weight `wholeWeight`) under options o. */
function settingsOf(o: DissectionOptions, n: number, wholeWeight: number): Settings {
  return {
    seed: o.seed ?? 1, leafSize: o.leafSize ?? defaultLeafSize(n), bisect: { ...defaultBisectOptions, ...o.bisect },
    coordinates: o.coordinates, coordinateMode: o.coordinateMode ?? "refine", wholeWeight,
  };
}

/** Orders `graph` by nested dissection; deterministic for a given seed, whatever the number of threads. */
export function nestedDissection(graph: Graph, o: DissectionOptions = {}): DissectionResult {
  const n = graph.n;
  // helpers start first, so that their start-up overlaps the preparation and the first cut
  const helpers = o.orderLeaf === undefined ? Math.floor(o.threads ?? 1) - 1 : 0;
  let team = startTeam(helpers, o.helperScript);
  try {
    const whole = weightedGraph(graph, o.vertexWeights);
    const set = settingsOf(o, n, whole.totalWeight);
    const s = newState(graph, set, o.orderLeaf ?? defaultLeafOrdering(), fmWork(n, graph.neighbours.length), whole.edgeWeight, null);
    const { g, ids, root } = setAsideDense(s, whole);
    setHairs(s, g, ids);
    pushComponents(s, g, ids, null, 0, 0, root);
    const tick = (): void => checkpoint(s, o, team);
    if (team.length > 0) team = shareOut(s, team, tick, o.keepNone);
    drain(s, tick);
    const { threads, takenBack } = joinTeam(s, team, tick);
    return { permutation: s.perm, separatorTree: buildTree(s), threads, takenBack };
  } finally {
    stopTeam(team);
  }
}

/** Between pieces: stops on an aborted signal, reports progress (helpers' vertices included). */
function checkpoint(s: State, o: DissectionOptions, team: Member[]): void {
  if (o.signal?.aborted) throw new AbortedError("nested dissection aborted");
  const n = s.perm.length;
  o.onProgress?.(n === 0 ? 1 : (s.placed + teamPlaced(team)) / n);
}
