/**
 * Two-way edge-cut refinement by Fiduccia–Mattheyses passes (Fiduccia &
 * Mattheyses 1982, "A linear-time heuristic for improving network partitions",
 * 19th Design Automation Conf.): move boundary vertices one at a time in order
 * of cut gain, each at most once per pass, accepting temporary losses, under a
 * balance bound; then roll back to the best state seen. Internal/external
 * degrees and the boundary list are kept up to date, so a pass costs time in
 * proportion to the boundary, not the graph.
 */
import { hierarchyArenas, type HierarchyArenas } from "./arena.js";
import { MaxHeap } from "./heap.js";
import { coverWork, type CoverWork } from "./separator.js";
import type { WGraph } from "./wgraph.js";

/** A 2-way partition: label[v] ∈ {0, 1}. */
export interface Bisection {
  label: Int8Array;
  weight: [number, number];
  cut: number;
}

/** Workspace for graphs of up to `capacity` vertices, reused across levels and pieces. */
export interface FmWork {
  heaps: [MaxHeap, MaxHeap];
  /** Move log of the separator passes (pairs vertex, previous label), grown on demand. */
  log: Int32Array;
  moved: Uint8Array;
  moves: Int32Array;
  /** Internal and external edge weight of each vertex. */
  id: Int32Array;
  ed: Int32Array;
  /** Boundary vertices (ed > 0) and their positions in the list (-1 when absent). */
  boundary: Int32Array;
  boundaryPos: Int32Array;
  boundaryCount: number;
  /** Separator vertices of the vertex-separator refinement (two lists, swapped after each pass) and a mark per vertex. */
  separator: [Int32Array, Int32Array];
  mark: Uint8Array;
  /** Workspace of the edge-to-vertex separator cover. */
  cover: CoverWork;
  /** Storage of the coarsening hierarchy of the piece being cut. */
  arenas: HierarchyArenas;
}

/** Workspace for graphs of up to `capacity` vertices and `edges` adjacency entries. */
export function fmWork(capacity: number, edges: number): FmWork {
  return {
    heaps: [new MaxHeap(capacity), new MaxHeap(capacity)], log: new Int32Array(Math.max(16, capacity >> 2)), moved: new Uint8Array(capacity),
    moves: new Int32Array(capacity), id: new Int32Array(capacity), ed: new Int32Array(capacity),
    boundary: new Int32Array(capacity), boundaryPos: new Int32Array(capacity).fill(-1), boundaryCount: 0,
    separator: [new Int32Array(capacity), new Int32Array(capacity)], mark: new Uint8Array(capacity),
    cover: coverWork(capacity), arenas: hierarchyArenas(capacity, edges),
  };
}

/** Computes part weights, cut, degrees and boundary of a labelling; O(edges). */
export function evaluate(g: WGraph, label: Int8Array, w: FmWork): Bisection {
  for (let i = 0; i < w.boundaryCount; i++) w.boundaryPos[w.boundary[i]] = -1;
  w.boundaryCount = 0;
  let cut = 0;
  const weight: [number, number] = [0, 0];
  for (let v = 0; v < g.n; v++) {
    weight[label[v]] += g.vertexWeight[v];
    scanVertex(g, label, v, w);
    cut += w.ed[v];
  }
  return { label, weight, cut: cut / 2 };
}

/**
 * The bisection of `fine` that gives each vertex the label of its coarse
 * vertex (coarseOf), given the coarse bisection b last refined with w: the
 * result of {@link evaluate} on the projected labelling, without scanning
 * every list. A fine vertex can have a neighbour across only when its coarse
 * vertex does (its neighbours lie in its coarse vertex and in that one's
 * neighbours), so only the lists of vertices under the coarse boundary are
 * scanned; the others are interior, their internal degree their weighted
 * degree (`degree`; when null, the list's length for unit edges, else summed),
 * and the weights and the cut carry over. Scanning every list at every level
 * was 6 % of a 1000² grid's time.
 */
export function projectBisection(fine: WGraph, coarseOf: Int32Array, degree: Int32Array | null, b: Bisection, w: FmWork): Bisection {
  const { boundary, boundaryPos, mark, moves, id, ed } = w;
  const coarseLabel = b.label;
  const coarseCount = w.boundaryCount;
  for (let i = 0; i < coarseCount; i++) {
    const c = boundary[i];
    mark[c] = 1; boundaryPos[c] = -1; moves[i] = c; // moves: free between FM passes, keeps the list to clear the marks
  }
  // every vertex first as interior (id its weighted degree, ed 0), in bulk: the
  // candidates' degrees are then overwritten by their scans, and the loop below
  // touches four arrays instead of seven
  ed.fill(0, 0, fine.n);
  if (degree !== null) id.set(degree.subarray(0, fine.n)); else weightedDegrees(fine, id);
  const label = new Int8Array(fine.n);
  let candidates = 0; // fine vertices under the coarse boundary, listed in `boundary` (free now)
  for (let v = 0; v < fine.n; v++) {
    const c = coarseOf[v];
    label[v] = coarseLabel[c];
    if (mark[c] !== 0) boundary[candidates++] = v;
  }
  for (let i = 0; i < coarseCount; i++) mark[moves[i]] = 0;
  w.boundaryCount = 0;
  for (let i = 0; i < candidates; i++) scanVertex(fine, label, boundary[i], w); // lists the boundary in place, ascending
  return { label, weight: [b.weight[0], b.weight[1]], cut: b.cut };
}

/** Internal and external degree of v, and v's entry in the boundary list when it has an external edge. */
function scanVertex(g: WGraph, label: Int8Array, v: number, w: FmWork): void {
  const { offsets, neighbours, edgeWeight } = g;
  const s = label[v];
  let inside = 0;
  let outside = 0;
  for (let p = offsets[v], pe = offsets[v + 1]; p < pe; p++) {
    if (label[neighbours[p]] === s) inside += edgeWeight[p]; else outside += edgeWeight[p];
  }
  w.id[v] = inside;
  w.ed[v] = outside;
  if (outside > 0) addBoundary(w, v);
}

/** Writes each vertex's weighted degree (its list's length for unit edges) to out. */
function weightedDegrees(g: WGraph, out: Int32Array): void {
  const { offsets, edgeWeight } = g;
  if (g.unitEdges) {
    for (let v = 0; v < g.n; v++) out[v] = offsets[v + 1] - offsets[v];
    return;
  }
  for (let v = 0; v < g.n; v++) {
    let d = 0;
    for (let p = offsets[v], pe = offsets[v + 1]; p < pe; p++) d += edgeWeight[p];
    out[v] = d;
  }
}

function addBoundary(w: FmWork, v: number): void {
  if (w.boundaryPos[v] >= 0) return;
  w.boundaryPos[v] = w.boundaryCount;
  w.boundary[w.boundaryCount++] = v;
}

function dropBoundary(w: FmWork, v: number): void {
  const i = w.boundaryPos[v];
  if (i < 0) return;
  const last = w.boundary[--w.boundaryCount];
  w.boundary[i] = last;
  w.boundaryPos[last] = i;
  w.boundaryPos[v] = -1;
}

/** Weight by which the heavier of parts 0 and 1 exceeds the bound (0 when balanced); for edge bisections and separator states alike. */
export function excess(b: { readonly weight: readonly number[] }, maxPart: number): number {
  return Math.max(0, b.weight[0] - maxPart, b.weight[1] - maxPart);
}

/** Moves without improvement after which an FM pass stops (edge and separator passes alike). */
export function patience(n: number): number {
  return Math.max(15, Math.min(150, n >> 6));
}

/** Runs up to `passes` FM passes on b (freshly evaluated with w) in place. */
export function refineBisection(g: WGraph, b: Bisection, maxPart: number, passes: number, w: FmWork): void {
  for (let pass = 0; pass < passes; pass++) {
    const before = b.cut;
    const beforeExcess = excess(b, maxPart);
    fmPass(g, b, maxPart, w);
    if (b.cut >= before && excess(b, maxPart) >= beforeExcess) break;
  }
}

function fmPass(g: WGraph, b: Bisection, maxPart: number, w: FmWork): void {
  const { heaps, moves } = w;
  for (let i = 0; i < w.boundaryCount; i++) {
    const v = w.boundary[i];
    heaps[b.label[v]].push(v, w.ed[v] - w.id[v]);
  }
  const limit = patience(g.n);
  let count = 0;
  let bestCount = 0;
  let bestCut = b.cut;
  let bestExcess = excess(b, maxPart);
  let sinceBest = 0;
  while (sinceBest < limit) {
    const from = pickSide(g, b, maxPart, heaps);
    if (from < 0) break;
    const v = heaps[from].pop();
    w.moved[v] = 1;
    moveVertex(g, b, v, w, true);
    moves[count++] = v;
    const ex = excess(b, maxPart);
    if (ex < bestExcess || (ex === bestExcess && b.cut < bestCut)) {
      bestExcess = ex; bestCut = b.cut; bestCount = count; sinceBest = 0;
    } else sinceBest++;
  }
  heaps[0].clear();
  heaps[1].clear();
  for (let i = count - 1; i >= bestCount; i--) moveVertex(g, b, moves[i], w, false);
  for (let i = 0; i < count; i++) w.moved[moves[i]] = 0;
}

/** Side to move from: forced from an overweight side, else the better admissible gain. */
function pickSide(g: WGraph, b: Bisection, maxPart: number, heaps: [MaxHeap, MaxHeap]): number {
  let best = -1;
  let bestGain = -Infinity;
  for (let s = 0; s < 2; s++) {
    if (heaps[s].size === 0) continue;
    const v = heaps[s].top();
    const overweight = b.weight[s] > maxPart;
    if (!overweight && b.weight[1 - s] + g.vertexWeight[v] > maxPart) continue;
    const gain = heaps[s].topKey() + (overweight ? 1 << 29 : 0);
    if (gain > bestGain || (gain === bestGain && b.weight[s] > b.weight[best])) { best = s; bestGain = gain; }
  }
  return best;
}

/** Moves v to the other part, updating degrees, boundary and (when `queue`) the heaps. */
function moveVertex(g: WGraph, b: Bisection, v: number, w: FmWork, queue: boolean): void {
  const { offsets, neighbours, edgeWeight } = g;
  const { id, ed, heaps, moved } = w;
  const label = b.label;
  const s = label[v];
  b.cut -= ed[v] - id[v];
  label[v] = 1 - s;
  b.weight[s] -= g.vertexWeight[v];
  b.weight[1 - s] += g.vertexWeight[v];
  const t = id[v]; id[v] = ed[v]; ed[v] = t;
  if (ed[v] > 0) addBoundary(w, v); else dropBoundary(w, v);
  for (let p = offsets[v], pe = offsets[v + 1]; p < pe; p++) {
    const u = neighbours[p];
    const e = edgeWeight[p];
    if (label[u] === s) { id[u] -= e; ed[u] += e; } else { id[u] += e; ed[u] -= e; }
    if (ed[u] > 0) addBoundary(w, u); else dropBoundary(w, u);
    if (!queue || moved[u]) continue;
    const h = heaps[label[u]];
    if (h.has(u)) h.update(u, ed[u] - id[u]);
    else if (ed[u] > 0) h.push(u, ed[u] - id[u]);
  }
}
