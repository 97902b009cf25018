/**
 * Reverse Cuthill–McKee ordering (Cuthill & McKee 1969; reversal by George
 * 1971), one connected component at a time, each started at a pseudo-peripheral
 * vertex found by repeated breadth-first search (George & Liu 1979, ACM TOMS
 * 5(3)): from the current start, take the vertex of least degree in the last
 * level, and stop once the number of levels no longer grows.
 * Linear time apart from sorting each vertex's new neighbours by degree.
 */
import type { Graph } from "../graph/types.js";
import { checkGraph } from "../graph/check.js";

/** Cap on start-vertex searches per component; the level count rarely grows more than a few times. */
const MAX_START_SEARCHES = 16;

/**
 * Bandwidth-reducing ordering by reverse Cuthill–McKee.
 *
 * @param graph - symmetric adjacency (no self loops, sorted lists), e.g. from `adjacencyGraph(A)`.
 * @returns permutation, new position → original vertex.
 * @throws InputError when the graph is malformed.
 */
export function reverseCuthillMcKee(graph: Graph): Int32Array {
  checkGraph(graph, "reverseCuthillMcKee");
  const n = graph.n;
  const order = new Int32Array(n);
  const queue = new Int32Array(n); // BFS scratch for the start-vertex search
  const level = new Int32Array(n); // BFS stamp of the last search that reached each vertex
  const keys = new Float64Array(n); // sort keys degree·n + vertex for neighbour batches
  const placed = new Uint8Array(n);
  const bfs: BfsState = { stamp: 0, size: 0, depth: 0 };
  let filled = 0;
  for (let v = 0; v < n; v++) {
    if (placed[v]) continue;
    const start = peripheralStart(graph, v, queue, level, bfs);
    filled = cuthillMcKee(graph, start, order, filled, placed, keys);
  }
  order.reverse();
  return order;
}

interface BfsState {
  stamp: number;
  size: number;
  depth: number;
}

/** George–Liu search: returns a vertex of (near) maximal eccentricity in v's component. */
function peripheralStart(g: Graph, v: number, queue: Int32Array, level: Int32Array, st: BfsState): number {
  let start = lowestDegree(g, v, queue, level, st);
  let depth = -1;
  for (let round = 0; round < MAX_START_SEARCHES; round++) {
    const lastLevelFirst = levelSearch(g, start, queue, level, st);
    if (st.depth <= depth) break;
    depth = st.depth;
    const best = leastDegree(g, queue, lastLevelFirst, st.size);
    if (best === start) break;
    start = best;
  }
  return start;
}

/** One BFS from v to find the component; returns its vertex of least degree. */
function lowestDegree(g: Graph, v: number, queue: Int32Array, level: Int32Array, st: BfsState): number {
  levelSearch(g, v, queue, level, st);
  return leastDegree(g, queue, 0, st.size);
}

/** The first vertex of least degree among queue[from..to). */
function leastDegree(g: Graph, queue: Int32Array, from: number, to: number): number {
  const { offsets } = g;
  let best = queue[from];
  for (let k = from + 1; k < to; k++) {
    const u = queue[k];
    if (offsets[u + 1] - offsets[u] < offsets[best + 1] - offsets[best]) best = u;
  }
  return best;
}

/** Plain BFS from s with a fresh stamp; sets st.size and st.depth, returns where the last level begins. */
function levelSearch(g: Graph, s: number, queue: Int32Array, level: Int32Array, st: BfsState): number {
  const { offsets, neighbours } = g;
  const mark = ++st.stamp;
  level[s] = mark;
  queue[0] = s;
  let head = 0;
  let tail = 1;
  let depth = 0;
  let levelFirst = 0;
  while (head < tail) {
    const levelEnd = tail;
    levelFirst = head;
    while (head < levelEnd) {
      const u = queue[head++];
      for (let p = offsets[u]; p < offsets[u + 1]; p++) {
        const w = neighbours[p];
        if (level[w] !== mark) {
          level[w] = mark;
          queue[tail++] = w;
        }
      }
    }
    if (tail > levelEnd) depth++;
  }
  st.size = tail;
  st.depth = depth;
  return levelFirst;
}

/** Cuthill–McKee BFS from start; each vertex's unplaced neighbours enter by increasing degree (then index). */
function cuthillMcKee(g: Graph, start: number, order: Int32Array, filled: number, placed: Uint8Array, keys: Float64Array): number {
  const { n, offsets, neighbours } = g;
  placed[start] = 1;
  order[filled] = start;
  let head = filled;
  let tail = filled + 1;
  while (head < tail) {
    const u = order[head++];
    const batch = tail;
    for (let p = offsets[u]; p < offsets[u + 1]; p++) {
      const w = neighbours[p];
      if (placed[w]) continue;
      placed[w] = 1;
      keys[tail - filled] = (offsets[w + 1] - offsets[w]) * n + w;
      tail++;
    }
    sortBatch(keys, batch - filled, tail - filled);
    for (let k = batch; k < tail; k++) order[k] = keys[k - filled] % n;
  }
  return tail;
}

/** Ascending sort of keys[from..to): insertion sort for short runs, typed-array sort otherwise. */
function sortBatch(keys: Float64Array, from: number, to: number): void {
  if (to - from > 24) {
    keys.subarray(from, to).sort();
    return;
  }
  for (let i = from + 1; i < to; i++) {
    const x = keys[i];
    let j = i - 1;
    while (j >= from && keys[j] > x) {
      keys[j + 1] = keys[j];
      j--;
    }
    keys[j + 1] = x;
  }
}
