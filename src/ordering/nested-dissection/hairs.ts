/**
 * Tree parts of a piece. In a piece without cycles (a forest), a postorder
 * eliminates every vertex after its children, when its only remaining
 * neighbour is its parent: no fill at all when each tree is rooted at its one
 * vertex joined to the rest of the graph (Parter 1961, "The use of
 * linear graphs in Gauss elimination", SIAM Review 3(2); from memory). A piece
 * that is not a tree may still carry "hairs": trees hanging from a single
 * vertex of its 2-core, found by repeatedly peeling vertices of degree one.
 * Dissection then cuts only the core; each hair follows the vertex it hangs
 * from, and its weight counts there for the balance.
 */
import { components, type WGraph } from "./wgraph.js";

/** True when g has no cycle (a forest: edges = vertices − components); searched only when edges < vertices. */
export function isForest(g: WGraph): boolean {
  const edges = g.neighbours.length / 2;
  return edges < g.n && edges === g.n - (components(g, null, 0).starts.length - 1);
}

/**
 * Postorder of the forest g (new → old local ids) in which each tree is
 * rooted at its one vertex marked in `attached` (joined to the rest of the
 * graph), or at its lowest vertex when it has none; then no tree adds fill
 * anywhere. Null when a tree has two or more attached vertices: every
 * ordering then fills between them, and minimum degree decides better where.
 * Iterative depth-first search with one edge pointer per vertex.
 */
export function treePostorder(g: WGraph, attached: Uint8Array): Int32Array | null {
  const { n, offsets, neighbours } = g;
  const order = new Int32Array(n);
  const stack = new Int32Array(n);
  const parent = new Int32Array(n).fill(-1);
  const next = offsets.slice(0, n);
  let k = 0;
  for (let i = 0; i < 2 * n; i++) {
    const r = i < n ? i : i - n;
    if (parent[r] >= 0 || (i < n && attached[r] === 0)) continue; // attached vertices root their trees first
    parent[r] = r;
    let top = 0;
    stack[0] = r;
    while (top >= 0) {
      const v = stack[top];
      if (next[v] < offsets[v + 1]) {
        const u = neighbours[next[v]++];
        if (parent[u] < 0) {
          if (attached[u] !== 0) return null;
          parent[u] = v;
          stack[++top] = u;
        }
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
 * Peels the vertices of degree one, repeatedly, from g. A component that is a
 * tree keeps its last peeled vertex as a core vertex of its own. Returns null
 * when nothing peels (meshes: one pass over the offsets). Linear in the size of g.
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
  let c = 0;
  for (let v = 0; v < n; v++) if (root[v] < 0) c++;
  const core = new Int32Array(c);
  c = 0;
  for (let v = 0; v < n; v++) if (root[v] < 0) { root[v] = v; core[c++] = v; }
  // peeled later = closer to the core: resolve in reverse peeling order
  for (let i = tail - 1; i >= 0; i--) root[queue[i]] = root[root[queue[i]]];
  return { core, root };
}
