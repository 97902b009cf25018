/**
 * Tree parts of a piece. In a piece without cycles (a forest), a postorder
 * eliminates every vertex after its children, when its only remaining
 * neighbour is its parent: no fill at all (Parter 1961, "The use of
 * linear graphs in Gauss elimination", SIAM Review 3(2); from memory). A piece
 * that is not a tree may still carry "hairs": trees hanging from a single
 * vertex of its 2-core, found by repeatedly peeling vertices of degree one.
 * Dissection then cuts only the core; each hair follows the vertex it hangs
 * from, and its weight counts there for the balance.
 */
import type { WGraph } from "./wgraph.js";

/** True when g has no cycle (a forest: edges = vertices − components); one search, only when edges < vertices. */
export function isForest(g: WGraph): boolean {
  const { n, offsets, neighbours } = g;
  const edges = neighbours.length / 2;
  if (edges >= n) return false;
  const seen = new Uint8Array(n);
  const stack = new Int32Array(n);
  let components = 0;
  for (let r = 0; r < n; r++) {
    if (seen[r]) continue;
    components++;
    seen[r] = 1;
    let top = 0;
    stack[0] = r;
    while (top >= 0) {
      const v = stack[top--];
      for (let p = offsets[v], pe = offsets[v + 1]; p < pe; p++) {
        const u = neighbours[p];
        if (!seen[u]) { seen[u] = 1; stack[++top] = u; }
      }
    }
  }
  return edges === n - components;
}

/**
 * Postorder of the forest g (new → old local ids). Each tree is rooted at the
 * first vertex of `roots` it contains (the vertices joined to the rest of the
 * graph), else at its lowest vertex. Iterative depth-first search with one
 * edge pointer per vertex.
 */
export function treePostorder(g: WGraph, roots: Int32Array): Int32Array {
  const { n, offsets, neighbours } = g;
  const order = new Int32Array(n);
  const stack = new Int32Array(n);
  const parent = new Int32Array(n).fill(-1);
  const next = offsets.slice(0, n);
  let k = 0;
  for (let i = 0; i < roots.length + n; i++) {
    const r = i < roots.length ? roots[i] : i - roots.length;
    if (parent[r] >= 0) continue;
    parent[r] = r;
    let top = 0;
    stack[0] = r;
    while (top >= 0) {
      const v = stack[top];
      if (next[v] < offsets[v + 1]) {
        const u = neighbours[next[v]++];
        if (parent[u] < 0) { parent[u] = v; stack[++top] = u; }
        continue;
      }
      order[k++] = v;
      top--;
    }
  }
  return order;
}

/** The hairs of a piece: its 2-core's vertices, and for every peeled vertex the core vertex it hangs from. */
export interface Hairs {
  /** Core vertices (local ids of the piece), ascending. */
  core: Int32Array;
  /** root[v]: v itself for a core vertex, else the core vertex v's hair hangs from. */
  root: Int32Array;
}

/**
 * Peels the vertices of degree one, repeatedly, from the connected piece g
 * (not a tree, so a non-empty core remains). Returns null when nothing peels
 * (meshes: one pass over the offsets) or nothing would remain. Linear in the size of the piece.
 */
export function peelHairs(g: WGraph): Hairs | null {
  const { n, offsets, neighbours } = g;
  let leaves = 0;
  for (let v = 0; v < n; v++) if (offsets[v + 1] - offsets[v] === 1) leaves++;
  if (leaves === 0) return null;
  const degree = new Int32Array(n);
  const queue = new Int32Array(n);
  const root = new Int32Array(n).fill(-1);
  let tail = 0;
  for (let v = 0; v < n; v++) {
    degree[v] = offsets[v + 1] - offsets[v];
    if (degree[v] === 1) queue[tail++] = v;
  }
  // root[v] = the neighbour still present when v was peeled; -1 for core vertices
  for (let head = 0; head < tail; head++) {
    const v = queue[head];
    degree[v] = 0;
    for (let p = offsets[v], pe = offsets[v + 1]; p < pe; p++) {
      const u = neighbours[p];
      if (degree[u] === 0) continue;
      root[v] = u;
      if (--degree[u] === 1) queue[tail++] = u;
    }
  }
  const core = new Int32Array(n - tail);
  let c = 0;
  for (let v = 0; v < n; v++) if (root[v] < 0) { root[v] = v; core[c++] = v; }
  if (c === 0) return null;
  // peeled later = closer to the core: resolve in reverse peeling order
  for (let i = tail - 1; i >= 0; i--) root[queue[i]] = root[root[queue[i]]];
  return { core, root };
}
