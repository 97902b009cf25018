/**
 * Edge separator → vertex separator. The cut edges form a bipartite graph
 * between the boundary vertices of the two parts; a minimum vertex cover of it
 * separates the parts. The cover comes from a maximum matching (augmenting
 * paths, Hopcroft & Karp 1973, SIAM J. Comput. 2(4)) by König's theorem
 * (König 1931): cover = (left ∖ Z) ∪ (right ∩ Z), Z = vertices reachable from
 * unmatched left vertices along alternating paths (Pothen & Fan 1990, "Computing
 * the block triangular form of a sparse matrix", ACM TOMS 16(4)).
 */
import type { WGraph } from "./wgraph.js";

/** Labels: 0 and 1 for the two parts, 2 for the separator. */
export const SEPARATOR = 2;

/**
 * Workspace of the cover for graphs of up to `capacity` vertices. `mate` and
 * `stamp` hold -1 between calls (only boundary entries are touched and reset).
 */
export interface CoverWork { mate: Int32Array; stamp: Int32Array; parent: Int32Array; queue: Int32Array; boundary: Int32Array }

export function coverWork(capacity: number): CoverWork {
  return {
    mate: new Int32Array(capacity).fill(-1), stamp: new Int32Array(capacity).fill(-1),
    parent: new Int32Array(capacity), queue: new Int32Array(capacity), boundary: new Int32Array(capacity),
  };
}

/**
 * Turns a 2-way labelling into a vertex separator in place (label 2), choosing
 * the lightest of the König cover and the two one-sided boundaries (a boundary
 * on a tie: it keeps the parts' shapes simple). `known` is the boundary of the
 * labelling when the caller keeps it (the edge refinement does), saving a scan of the graph.
 * Returns the weight taken into the separator from part 0 and from part 1.
 */
export function vertexSeparatorFromCut(g: WGraph, label: Int8Array, w: CoverWork, known?: { list: Int32Array; count: number }): [number, number] {
  const { boundary, mate, stamp } = w;
  const count = known === undefined ? scanBoundary(g, label, boundary) : sortedCopy(known.list, known.count, boundary);
  let w0 = 0;
  let w1 = 0;
  for (let i = 0; i < count; i++) {
    const v = boundary[i];
    if (label[v] === 0) w0 += g.vertexWeight[v]; else w1 += g.vertexWeight[v];
  }
  const list = boundary.subarray(0, count);
  matchBoundary(g, label, list, w);
  for (let i = 0; i < count; i++) stamp[list[i]] = -1;
  alternatingReach(g, label, list, w);
  // cover = (left ∖ Z) ∪ (right ∩ Z); stamp[v] === REACHED marks Z
  let wc = 0;
  for (let i = 0; i < count; i++) {
    const v = list[i];
    if ((label[v] === 0) !== (stamp[v] === REACHED)) wc += g.vertexWeight[v];
  }
  const useCover = wc < w0 && wc < w1;
  const side = w0 <= w1 ? 0 : 1;
  const taken: [number, number] = [0, 0];
  for (let i = 0; i < count; i++) {
    const v = list[i];
    const inCover = (label[v] === 0) !== (stamp[v] === REACHED);
    mate[v] = -1;
    stamp[v] = -1;
    if (useCover ? inCover : label[v] === side) { taken[label[v]] += g.vertexWeight[v]; label[v] = SEPARATOR; }
  }
  return taken;
}

const REACHED = -2;

/** Writes the vertices with a neighbour in the other part to `out`, ascending; returns their number. */
function scanBoundary(g: WGraph, label: Int8Array, out: Int32Array): number {
  let count = 0;
  for (let v = 0; v < g.n; v++) {
    const s = label[v];
    for (let p = g.offsets[v], pe = g.offsets[v + 1]; p < pe; p++) {
      if (label[g.neighbours[p]] !== s) { out[count++] = v; break; }
    }
  }
  return count;
}

/** Copies a boundary list kept by the refinement to `out` in ascending order (the order of a scan). */
function sortedCopy(list: Int32Array, count: number, out: Int32Array): number {
  out.set(list.subarray(0, count));
  out.subarray(0, count).sort();
  return count;
}

/** Maximum matching of the cut edges: greedy start, then augmenting paths from each free left vertex. */
function matchBoundary(g: WGraph, label: Int8Array, list: Int32Array, w: CoverWork): void {
  const { mate } = w;
  for (let i = 0; i < list.length; i++) {
    const v = list[i];
    if (label[v] !== 0) continue;
    for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) {
      const u = g.neighbours[p];
      if (label[u] === 1 && mate[u] === -1) { mate[u] = v; mate[v] = u; break; }
    }
  }
  for (let i = 0; i < list.length; i++) {
    const v = list[i];
    if (label[v] === 0 && mate[v] === -1) augment(g, label, v, w);
  }
}

/** Breadth-first search for an augmenting path from free left vertex `root`; flips it if found. */
function augment(g: WGraph, label: Int8Array, root: number, w: CoverWork): boolean {
  const { mate, parent } = w;
  w.queue[0] = root;
  let r = alternatingSearch(g, label, w, 1, root);
  if (r === -1) return false;
  for (;;) {
    const l = parent[r];
    const next = mate[l];
    mate[r] = l;
    mate[l] = r;
    if (l === root) return true;
    r = next;
  }
}

/** Z: vertices reachable from free left vertices by non-matching (left→right) then matching (right→left) edges. */
function alternatingReach(g: WGraph, label: Int8Array, list: Int32Array, w: CoverWork): void {
  const { mate, stamp, queue } = w;
  let tail = 0;
  for (let i = 0; i < list.length; i++) {
    const v = list[i];
    if (label[v] === 0 && mate[v] === -1) { stamp[v] = REACHED; queue[tail++] = v; }
  }
  // the matching is maximum, so no free right vertex is met (the search runs to the end)
  alternatingSearch(g, label, w, tail, REACHED);
}

/**
 * Breadth-first search along alternating paths from the left vertices
 * queue[0..tail): each right neighbour not yet stamped `mark` gets the stamp and
 * its BFS parent, and its mate (stamped too) joins the queue. Stops at the first
 * free right vertex, which it returns (-1 when none is met).
 */
function alternatingSearch(g: WGraph, label: Int8Array, w: CoverWork, tail: number, mark: number): number {
  const { mate, stamp, parent, queue } = w;
  for (let head = 0; head < tail; head++) {
    const v = queue[head];
    for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) {
      const u = g.neighbours[p];
      if (label[u] !== 1 || stamp[u] === mark) continue;
      stamp[u] = mark;
      parent[u] = v;
      const m = mate[u];
      if (m === -1) return u;
      stamp[m] = mark;
      queue[tail++] = m;
    }
  }
  return -1;
}
