/**
 * Supervariable compression: vertices with identical closed neighbourhoods
 * (indistinguishable nodes, George & Liu 1981, "Computer Solution of Large
 * Sparse Positive Definite Systems", §5; Ashcraft 1995, "Compressed graphs and
 * the minimum degree algorithm", SIAM J. Sci. Comput. 16(6)) are merged into one
 * weighted vertex. Candidates are found by hashing each closed neighbourhood into
 * an open-addressing table, so the work is O(nnz) expected.
 */
import type { Graph } from "./types.js";

/** A graph whose vertices stand for groups of indistinguishable original vertices. */
export interface CompressedGraph {
  /** The quotient graph: one vertex per supervariable. */
  readonly graph: Graph;
  /** Number of original vertices in each supervariable. */
  readonly weights: Int32Array;
  /** Original vertices of supervariable s are members[memberOffsets[s] .. memberOffsets[s+1]). */
  readonly members: Int32Array;
  readonly memberOffsets: Int32Array;
  /** Supervariable that holds each original vertex. */
  readonly supervariableOf: Int32Array;
}

/** Hash of the closed neighbourhood N[v] = N(v) ∪ {v}, independent of list order. */
function closedHash(g: Graph, v: number): number {
  let h = Math.imul(v + 1, 0x9e3779b1);
  for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) {
    h = (h + Math.imul(g.neighbours[p] + 1, 0x9e3779b1)) | 0;
  }
  return h ^ (g.offsets[v + 1] - g.offsets[v]);
}

/** True when adjacent vertices u, v have N[u] = N[v] (both lists sorted ascending). */
function sameClosed(g: Graph, u: number, v: number): boolean {
  const { offsets, neighbours } = g;
  if (offsets[u + 1] - offsets[u] !== offsets[v + 1] - offsets[v]) return false;
  let p = offsets[u];
  let q = offsets[v];
  const pe = offsets[u + 1];
  const qe = offsets[v + 1];
  let adjacent = false;
  for (;;) {
    if (p < pe && neighbours[p] === v) { p++; adjacent = true; continue; }
    if (q < qe && neighbours[q] === u) { q++; continue; }
    if (p >= pe || q >= qe) return adjacent && p >= pe && q >= qe;
    if (neighbours[p] !== neighbours[q]) return false;
    p++;
    q++;
  }
}

/**
 * Assigns each vertex to a supervariable representative (the first vertex of
 * its class). Indistinguishable vertices are adjacent (each lies in the
 * other's closed neighbourhood), so v is compared only with its lower-numbered
 * neighbours of equal hash: one pass over the lists, no table (a hash table
 * over all vertices, probed at random, took about ten times as long on a
 * 10⁶-vertex grid, where nothing merges).
 */
function findRepresentatives(g: Graph): Int32Array {
  const n = g.n;
  const { offsets, neighbours } = g;
  const rep = new Int32Array(n);
  const hashOf = new Int32Array(n);
  for (let v = 0; v < n; v++) hashOf[v] = closedHash(g, v);
  for (let v = 0; v < n; v++) {
    rep[v] = v;
    const h = hashOf[v];
    for (let p = offsets[v], pe = offsets[v + 1]; p < pe; p++) {
      const u = neighbours[p];
      if (u >= v) break; // sorted lists: the lower neighbours come first
      if (hashOf[u] === h && sameClosed(g, u, v)) { rep[v] = rep[u]; break; }
    }
  }
  return rep;
}

/**
 * Merges indistinguishable vertices of `graph`. Supervariables are numbered in
 * order of their first (lowest-numbered) member; members are listed ascending.
 */
export function compressGraph(graph: Graph): CompressedGraph {
  return compressed(graph, findRepresentatives(graph));
}

/**
 * compressGraph when the quotient graph keeps at most `ratio` of the vertices,
 * else null — found from the representatives alone, before the quotient graph
 * (the costly part) is built.
 */
export function compressIfSmaller(graph: Graph, ratio: number): CompressedGraph | null {
  const rep = findRepresentatives(graph);
  let m = 0;
  for (let v = 0; v < graph.n; v++) if (rep[v] === v) m++;
  return m > ratio * graph.n ? null : compressed(graph, rep);
}

function compressed(graph: Graph, rep: Int32Array): CompressedGraph {
  const n = graph.n;
  const supervariableOf = new Int32Array(n);
  let m = 0;
  for (let v = 0; v < n; v++) supervariableOf[v] = rep[v] === v ? m++ : supervariableOf[rep[v]];
  const weights = new Int32Array(m);
  for (let v = 0; v < n; v++) weights[supervariableOf[v]]++;
  const memberOffsets = new Int32Array(m + 1);
  for (let s = 0; s < m; s++) memberOffsets[s + 1] = memberOffsets[s] + weights[s];
  const fill = memberOffsets.slice(0, m);
  const members = new Int32Array(n);
  for (let v = 0; v < n; v++) members[fill[supervariableOf[v]]++] = v;
  return { graph: quotientGraph(graph, supervariableOf, members, memberOffsets), weights, members, memberOffsets, supervariableOf };
}

/** Adjacency between supervariables, read from each supervariable's first member. */
function quotientGraph(g: Graph, sv: Int32Array, members: Int32Array, memberOffsets: Int32Array): Graph {
  const m = memberOffsets.length - 1;
  const offsets = new Int32Array(m + 1);
  const marker = new Int32Array(m).fill(-1);
  const work = new Int32Array(g.neighbours.length);
  let total = 0;
  for (let s = 0; s < m; s++) {
    const v = members[memberOffsets[s]];
    marker[s] = s;
    const start = total;
    for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) {
      const t = sv[g.neighbours[p]];
      if (marker[t] !== s) { marker[t] = s; work[total++] = t; }
    }
    work.subarray(start, total).sort();
    offsets[s + 1] = total;
  }
  return { n: m, offsets, neighbours: work.slice(0, total) };
}

/**
 * Expands an ordering of the compressed graph (new → old supervariable) into an
 * ordering of the original vertices: each supervariable's members take
 * consecutive positions, in ascending original order.
 */
export function expandPermutation(c: CompressedGraph, compressedPermutation: Int32Array): Int32Array {
  const out = new Int32Array(c.members.length);
  let k = 0;
  for (let i = 0; i < compressedPermutation.length; i++) {
    const s = compressedPermutation[i];
    for (let p = c.memberOffsets[s]; p < c.memberOffsets[s + 1]; p++) out[k++] = c.members[p];
  }
  return out;
}
