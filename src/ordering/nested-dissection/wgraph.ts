/**
 * Weighted graphs for the multilevel dissection: vertex weights count original
 * vertices (supervariables, coarse vertices), edge weights count the fine edges
 * a coarse edge stands for (Hendrickson & Leland 1995, "A multilevel algorithm
 * for partitioning graphs", Supercomputing '95). Also induced subgraphs and
 * connected components, both linear in the size of the piece.
 */
import type { Graph } from "../../graph/types.js";

/**
 * Vertex v's neighbours are neighbours[offsets[v] .. offsets[v+1]) with edge
 * weights edgeWeight at the same positions. Unlike Graph, lists of coarse
 * graphs are not sorted, so a WGraph is not a Graph.
 */
export interface WGraph {
  readonly n: number;
  readonly offsets: Int32Array;
  readonly neighbours: Int32Array;
  readonly edgeWeight: Int32Array;
  readonly vertexWeight: Int32Array;
  readonly totalWeight: number;
  /** The largest vertex weight (0 for an empty graph). */
  readonly maxVertexWeight: number;
}

/** Wraps an unweighted graph; `vertexWeights` defaults to all ones. */
export function weightedGraph(g: Graph, vertexWeights?: Int32Array): WGraph {
  const vertexWeight = vertexWeights ?? new Int32Array(g.n).fill(1);
  let total = 0;
  let max = 0;
  for (let v = 0; v < g.n; v++) {
    total += vertexWeight[v];
    if (vertexWeight[v] > max) max = vertexWeight[v];
  }
  const edgeWeight = new Int32Array(g.neighbours.length).fill(1);
  return { n: g.n, offsets: g.offsets, neighbours: g.neighbours, edgeWeight, vertexWeight, totalWeight: total, maxVertexWeight: max };
}

/**
 * The subgraph induced by `vertices` (local ids of g), built in one pass over
 * their adjacency into arrays sized by their degree sum. `localOf` is a
 * length-g.n workspace that must hold -1 everywhere; it is restored before returning.
 */
export function inducedSubgraph(g: WGraph, vertices: Int32Array, localOf: Int32Array): WGraph {
  const { offsets: gx, neighbours: ga, edgeWeight: ge, vertexWeight: gv } = g;
  const m = vertices.length;
  let bound = 0;
  for (let i = 0; i < m; i++) {
    const v = vertices[i];
    localOf[v] = i;
    bound += gx[v + 1] - gx[v];
  }
  const offsets = new Int32Array(m + 1);
  const neighbours = new Int32Array(bound);
  const edgeWeight = new Int32Array(bound);
  const vertexWeight = new Int32Array(m);
  let k = 0;
  let total = 0;
  let max = 0;
  for (let i = 0; i < m; i++) {
    const v = vertices[i];
    vertexWeight[i] = gv[v];
    total += gv[v];
    if (gv[v] > max) max = gv[v];
    for (let p = gx[v], pe = gx[v + 1]; p < pe; p++) {
      const u = localOf[ga[p]];
      if (u >= 0) { neighbours[k] = u; edgeWeight[k++] = ge[p]; }
    }
    offsets[i + 1] = k;
  }
  for (let i = 0; i < m; i++) localOf[vertices[i]] = -1;
  return {
    n: m, offsets, neighbours: trimmed(neighbours, k), edgeWeight: trimmed(edgeWeight, k), vertexWeight, totalWeight: total, maxVertexWeight: max,
  };
}

/**
 * The first `used` entries of `a`: edges leaving the piece were counted in its
 * length, so it is trimmed (copied only when much was cut off). A function of
 * its own rather than a closure: a closure would capture the fill counter of
 * the loops above and move it to the heap.
 */
function trimmed(a: Int32Array, used: number): Int32Array {
  return used === a.length ? a : 2 * used >= a.length ? a.subarray(0, used) : a.slice(0, used);
}

/**
 * Connected components of the vertices whose `label` equals `which` (all
 * vertices when `label` is null). Returns the vertices grouped by component and the
 * component offsets. Breadth-first, no recursion.
 */
export function components(g: WGraph, label: Int8Array | null, which: number): { order: Int32Array; starts: number[] } {
  const n = g.n;
  const seen = new Uint8Array(n);
  const order = new Int32Array(n);
  const starts: number[] = [];
  let tail = 0;
  for (let s = 0; s < n; s++) {
    if (seen[s] || (label !== null && label[s] !== which)) continue;
    starts.push(tail);
    let head = tail;
    order[tail++] = s;
    seen[s] = 1;
    while (head < tail) {
      const v = order[head++];
      for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) {
        const u = g.neighbours[p];
        if (!seen[u] && (label === null || label[u] === which)) { seen[u] = 1; order[tail++] = u; }
      }
    }
  }
  starts.push(tail);
  return { order: order.subarray(0, tail), starts };
}
