/**
 * Coarsening by heavy-edge matching (Karypis & Kumar 1998, "A fast and high
 * quality multilevel scheme for partitioning irregular graphs", SIAM J. Sci.
 * Comput. 20(1)): visit vertices in random order, match each unmatched vertex
 * with the unmatched neighbour joined by the heaviest edge, and contract the
 * matched pairs. Linear in the size of the graph per level. Ties between
 * edges of equal weight go to the edge whose ends share more neighbours (the
 * edge-density idea of heavy-clique matching, Karypis & Kumar 1998).
 */
import { resetArenas, type HierarchyArenas, type Int32Arena } from "./arena.js";
import type { Rng } from "./rng.js";
import type { WGraph } from "./wgraph.js";

/** One level of the hierarchy: the coarse graph and the fine → coarse vertex map. */
export interface Level {
  readonly graph: WGraph;
  readonly coarseOf: Int32Array;
  /** Sum of the edge weights at each coarse vertex (summed while contracting: the refinement's interior vertices need it). */
  readonly degree: Int32Array;
}

/**
 * Heavy-edge matching; returns match[v] (v itself when unmatched). Among edges
 * of equal weight it takes the one whose ends share the most neighbours: on a
 * 9-point grid the axis edges (4 common neighbours, diagonals 2), so coarse
 * graphs keep the grid's rows and columns. `stamp` null: no tie-break (the
 * first heaviest edge), for graphs without triangles.
 */
function heavyEdgeMatching(g: WGraph, rng: Rng, maxVertexWeight: number, arena: Int32Arena, stamp: Int32Array | null, base: number): Int32Array {
  const { n, offsets, neighbours, edgeWeight, vertexWeight } = g;
  const match = arena.take(n).fill(-1);
  const visit = blockShuffledOrder(n, rng, arena);
  if (g.unitEdges && stamp === null && 2 * g.maxVertexWeight <= maxVertexWeight) return firstFreeMatching(g, visit, match);
  for (let i = 0; i < n; i++) {
    const v = visit[i];
    if (match[v] >= 0) continue;
    let best = v;
    let bestW = -1;
    let bestC = -1;
    const room = maxVertexWeight - vertexWeight[v];
    for (let p = offsets[v], pe = offsets[v + 1]; p < pe; p++) {
      const u = neighbours[p];
      const w = edgeWeight[p];
      if (w < bestW || match[u] >= 0 || vertexWeight[u] > room) continue; // the weight first: it is read in sequence, the others scattered
      if (w === bestW) {
        if (stamp === null || offsets[u + 1] - offsets[u] > TIE_DEGREE) continue;
        if (bestC < 0) {
          if (stamp[v] !== base + v) stampNeighbours(g, v, stamp, base);
          bestC = offsets[best + 1] - offsets[best] > TIE_DEGREE ? 0 : commonNeighbours(g, best, base + v, stamp);
        }
        const c = commonNeighbours(g, u, base + v, stamp);
        if (c <= bestC) continue;
        bestC = c;
      } else bestC = -1;
      best = u;
      bestW = w;
    }
    match[v] = best;
    match[best] = v;
  }
  return match;
}

/**
 * Heavy-edge matching where every edge weighs the same, ties are not broken
 * and any two vertices may merge (the finest level of a triangle-free piece):
 * each vertex takes its first unmatched neighbour, the choice of the general
 * loop, which would scan the rest of the list in vain (whole hierarchy of the
 * 1000² grid: 6 % less time, .scratch A/B in one process).
 */
function firstFreeMatching(g: WGraph, visit: Int32Array, match: Int32Array): Int32Array {
  const { offsets, neighbours } = g;
  for (let i = 0; i < g.n; i++) {
    const v = visit[i];
    if (match[v] >= 0) continue;
    let best = v;
    for (let p = offsets[v], pe = offsets[v + 1]; p < pe; p++) {
      if (match[neighbours[p]] < 0) { best = neighbours[p]; break; }
    }
    match[v] = best;
    match[best] = v;
  }
  return match;
}

/**
 * Candidates of higher degree are not compared by common neighbours: counting
 * costs their degree, and a hub next to many vertices would be counted by
 * each of them (quadratic). Meshes stay far below it.
 */
const TIE_DEGREE = 128;

/**
 * Marks v's neighbours (and v itself, as the sign that they are marked) with
 * base + v: stamps of different levels differ by their base, so one array
 * serves the whole hierarchy without clearing.
 */
function stampNeighbours(g: WGraph, v: number, stamp: Int32Array, base: number): void {
  for (let p = g.offsets[v], pe = g.offsets[v + 1]; p < pe; p++) stamp[g.neighbours[p]] = base + v;
  stamp[v] = base + v;
}

/** Number of neighbours of u stamped with `mark`: u's neighbours in common with the stamped vertex v, plus 1 for v itself when u is adjacent to v. */
function commonNeighbours(g: WGraph, u: number, mark: number, stamp: Int32Array): number {
  let c = 0;
  for (let p = g.offsets[u], pe = g.offsets[u + 1]; p < pe; p++) if (stamp[g.neighbours[p]] === mark) c++;
  return c;
}

/**
 * Whether an edge at one of 64 vertices spread over g lies in a triangle
 * (stamps with base 0). On a triangle-free graph (5- and 7-point grids)
 * common neighbours appear only on coarse levels, as artefacts of the matching,
 * and breaking ties by them there measured worse: no tie-break at all then.
 */
function hasTriangles(g: WGraph, stamp: Int32Array): boolean {
  const step = Math.max(1, Math.floor(g.n / 64));
  for (let v = 0; v < g.n; v += step) {
    stampNeighbours(g, v, stamp, 0);
    for (let p = g.offsets[v], pe = g.offsets[v + 1]; p < pe; p++) {
      if (commonNeighbours(g, g.neighbours[p], v, stamp) > 1) return true; // v itself is counted
    }
  }
  return false;
}

/**
 * Visiting order: blocks of 32 consecutive ids in random order, each block in
 * sequence. Random enough to vary the matching, local enough for the cache.
 */
function blockShuffledOrder(n: number, rng: Rng, arena: Int32Arena): Int32Array {
  const blocks = arena.take((n + 31) >> 5);
  for (let b = 0; b < blocks.length; b++) blocks[b] = b;
  rng.shuffle(blocks);
  const visit = arena.take(n);
  let k = 0;
  for (let b = 0; b < blocks.length; b++) {
    const end = Math.min(n, (blocks[b] + 1) << 5);
    for (let v = blocks[b] << 5; v < end; v++) visit[k++] = v;
  }
  return visit;
}

/** Contracts matched pairs into single vertices, summing vertex and parallel-edge weights. */
function contract(g: WGraph, match: Int32Array, arenas: HierarchyArenas): Level {
  const { n, offsets: fx, neighbours: fa, edgeWeight: fe, vertexWeight: fv } = g;
  const coarseOf = arenas.vertices.take(n);
  let nc = 0;
  for (let v = 0; v < n; v++) {
    const u = match[v];
    if (u >= v) { coarseOf[v] = nc; coarseOf[u] = nc; nc++; }
  }
  const offsets = arenas.vertices.take(nc + 1);
  const vertexWeight = arenas.vertices.take(nc);
  const degree = arenas.vertices.take(nc);
  const slot = arenas.vertices.take(nc).fill(-1);
  const neighbours = arenas.adjacency.take(fa.length);
  const edgeWeight = arenas.edgeWeights.take(fa.length);
  offsets[0] = 0;
  let k = 0;
  let c = 0;
  let max = 0;
  for (let v = 0; v < n; v++) {
    const u = match[v];
    if (u < v) continue;
    const start = k;
    let d = 0;
    let vw = fv[v];
    for (let p = fx[v], pe = fx[v + 1]; p < pe; p++) {
      const t = coarseOf[fa[p]];
      if (t === c) continue;
      const e = fe[p];
      d += e;
      const q = slot[t];
      if (q >= start) { edgeWeight[q] += e; continue; }
      slot[t] = k;
      neighbours[k] = t;
      edgeWeight[k++] = e;
    }
    if (u !== v) {
      // the loop above again for the partner: written out twice because a shared
      // helper measured 12–20 % slower here (.scratch micro-benchmark, 10⁶ grid);
      // e and vw are locals because fe[p] and vertexWeight[c], re-read after
      // every store (V8 cannot tell the arrays apart), cost a few % more
      vw += fv[u];
      for (let p = fx[u], pe = fx[u + 1]; p < pe; p++) {
        const t = coarseOf[fa[p]];
        if (t === c) continue;
        const e = fe[p];
        d += e;
        const q = slot[t];
        if (q >= start) { edgeWeight[q] += e; continue; }
        slot[t] = k;
        neighbours[k] = t;
        edgeWeight[k++] = e;
      }
    }
    degree[c] = d;
    vertexWeight[c] = vw;
    if (vw > max) max = vw;
    offsets[++c] = k;
  }
  const graph: WGraph = {
    n: nc, offsets, neighbours: arenas.adjacency.trim(neighbours, k), edgeWeight: arenas.edgeWeights.trim(edgeWeight, k), vertexWeight, totalWeight: g.totalWeight, maxVertexWeight: max, unitEdges: false,
  };
  return { graph, coarseOf, degree };
}

/**
 * Builds the hierarchy, finest first, until the graph has at most `coarsestSize`
 * vertices or a level shrinks by less than 15 % (stars and other graphs that
 * match poorly stop early instead of looping). The levels live in `arenas`
 * (reset here) and are valid until the next call.
 */
export function coarsen(g: WGraph, rng: Rng, coarsestSize: number, arenas: HierarchyArenas): Level[] {
  resetArenas(arenas);
  const levels: Level[] = [];
  let current = g;
  const maxVertexWeight = Math.max(1, Math.ceil((1.5 * g.totalWeight) / coarsestSize));
  const stamp = arenas.vertices.take(g.n).fill(-1);
  const ties = hasTriangles(g, stamp);
  if (!ties) arenas.vertices.trim(stamp, 0);
  let base = g.n;
  while (current.n > coarsestSize) {
    const match = heavyEdgeMatching(current, rng, maxVertexWeight, arenas.vertices, ties ? stamp : null, base);
    base += current.n;
    const level = contract(current, match, arenas);
    if (level.graph.n > 0.85 * current.n) break;
    levels.push(level);
    current = level.graph;
  }
  return levels;
}
