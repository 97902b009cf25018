/**
 * Approximate minimum degree ordering on the quotient graph (Amestoy, Davis &
 * Duff 1996, "An approximate minimum degree ordering algorithm", SIAM J.
 * Matrix Anal. Appl. 17(4)). Element absorption, mass elimination,
 * supervariables found by hashing, approximate external degrees, optional
 * aggressive absorption; rows of very high degree are set aside and ordered last.
 * The steps live in ./minimum-degree/; this file drives them. Internally the
 * last vertices may be a halo (Pellegrini, Roman & Amestoy 2000, "Hybridizing
 * nested dissection and halo approximate minimum degree for efficient sparse
 * matrix ordering", Concurrency: Practice and Experience 12; from memory):
 * counted in degrees, never ordered.
 */
import { InputError } from "../errors.js";
import type { Graph } from "../graph/types.js";
import { checkGraph } from "../graph/check.js";
import { buildElement, externalSizes, type NewElement } from "./minimum-degree/pivot-element.js";
import { finishElement, mergeIndistinguishable, pruneAndBound } from "./minimum-degree/update.js";
import { bucketInsert, bucketRemove, emitMembers, Field, MARK_START, MdWorkspace } from "./minimum-degree/workspace.js";

/** Options of {@link minimumDegree}. */
export interface MinimumDegreeOptions {
  /**
   * Vertices with more neighbours than this are set aside and placed last,
   * in increasing original index. Default max(16, 10·sqrt(n)). Use Infinity to keep all.
   */
  denseThreshold?: number;
  /** Absorb every element whose clique falls inside the new pivot's clique (default true). */
  aggressive?: boolean;
}

/** The default dense-row threshold for a graph of n vertices: max(16, 10·sqrt(n)). @internal */
export function defaultDenseThreshold(n: number): number {
  return Math.max(16, 10 * Math.sqrt(n));
}

/**
 * Fill-reducing ordering by approximate minimum degree.
 *
 * @param graph - symmetric adjacency (no self loops, sorted lists), e.g. from `adjacencyGraph(A)`.
 * @returns permutation, new position → original vertex.
 * @throws InputError when the graph or the options are malformed.
 */
export function minimumDegree(graph: Graph, options: MinimumDegreeOptions = {}): Int32Array {
  checkGraph(graph, "minimumDegree");
  const n = graph.n;
  const threshold = options.denseThreshold ?? defaultDenseThreshold(n);
  if (typeof threshold !== "number" || Number.isNaN(threshold) || threshold < 0) {
    throw new InputError(`minimumDegree: denseThreshold must be a non-negative number, got ${String(threshold)}`);
  }
  return minimumDegreeTrusted(graph, threshold, options.aggressive ?? true);
}

/**
 * Same as {@link minimumDegree} without checking the graph: for callers that
 * built the graph themselves (for example the leaves of nested dissection).
 * `arenaSlack` sets the spare room of the list arena (tests use a tiny value to exercise compaction).
 * The last `halo` vertices are halo: they count in the degrees of their
 * neighbours (unless dense: then they are dropped) but are never pivots and
 * never merged with the others; the result orders only the first n − halo vertices.
 * @internal
 */
export function minimumDegreeTrusted(graph: Graph, denseThreshold: number, aggressive: boolean, arenaSlack?: number, halo = 0): Int32Array {
  const n = graph.n;
  if (n === halo) return new Int32Array(0);
  const s = new MdWorkspace(graph, arenaSlack, halo);
  const dense = setAsideDense(s, graph, denseThreshold);
  const el: NewElement = { first: 0, end: 0, cliqueWeight: 0 };
  while (s.eliminated < s.firstHalo) {
    let d = s.minDegree;
    while (s.bucketHead[d] === -1) d++;
    s.minDegree = d;
    const me = s.bucketHead[d];
    bucketRemove(s, me);
    const bme = me * Field.Count;
    const w = s.node[bme + Field.Weight];
    s.node[bme + Field.Weight] = -w;
    s.eliminated += w;
    emitMembers(s, me, w);
    const atEnd = s.node[bme + Field.Elements] !== 0;
    buildElement(s, me, el);
    externalSizes(s, el);
    pruneAndBound(s, me, el, aggressive);
    s.mark0 += s.maxElement + 1; // past every mark0 + |Le \ Lme| written above
    mergeIndistinguishable(s, el); // leaves mark0 past its own marks
    s.node[bme + Field.Weight] = 0;
    finishElement(s, me, el, atEnd);
    if (s.mark0 > s.markLimit) resetMarks(s);
  }
  for (let k = 0; k < dense.length; k++) s.order[s.ordered++] = dense[k];
  return s.order;
}

/** Marks are about to leave the int32 range: set every live mark back to 1 and restart the base. */
function resetMarks(s: MdWorkspace): void {
  const node = s.node;
  for (let b = Field.Mark; b < node.length; b += Field.Count) if (node[b] !== 0) node[b] = 1;
  s.mark0 = MARK_START;
}

/**
 * Set aside vertices of degree above the threshold; bucket the other non-halo
 * vertices by their remaining degree. Dense halo vertices are dropped as well
 * (a halo vertex joined to a whole large leaf would otherwise be rescanned at
 * every pivot) but are not part of the returned list, which is ordered last.
 */
function setAsideDense(s: MdWorkspace, graph: Graph, threshold: number): Int32Array {
  const { n, offsets, neighbours } = graph;
  const { node, firstHalo } = s; // each Degree starts as the vertex's number of neighbours
  let count = 0;
  for (let j = 0; j < firstHalo; j++) if (offsets[j + 1] - offsets[j] > threshold) count++;
  const dense = new Int32Array(count);
  count = 0;
  for (let j = 0; j < n; j++) {
    if (offsets[j + 1] - offsets[j] <= threshold) continue;
    if (j < firstHalo) dense[count++] = j;
    const bj = j * Field.Count;
    node[bj + Field.Weight] = 0;
    node[bj + Field.Start] = -1;
    node[bj + Field.Size] = 0;
    for (let p = offsets[j]; p < offsets[j + 1]; p++) node[neighbours[p] * Field.Count + Field.Degree]--;
  }
  s.eliminated = count;
  s.minDegree = n;
  for (let j = 0, bj = 0; j < firstHalo; j++, bj += Field.Count) {
    if (node[bj + Field.Weight] !== 0) bucketInsert(s, j, node[bj + Field.Degree]);
  }
  return dense;
}
