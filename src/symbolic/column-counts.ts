/**
 * Column counts of the Cholesky factor in near-linear time (Gilbert, Ng &
 * Peyton 1994, "An efficient algorithm to compute row and column counts for
 * sparse Cholesky factorization", SIAM J. Matrix Anal. Appl. 15(4)).
 *
 * Row i of L is the row subtree T_i: the union of the tree paths from each
 * k < i adjacent to i up to i. A column count c_j is the number of row
 * subtrees containing j. Give every node a weight so that the sum of weights
 * over the subtree of j counts them: +1 at each leaf of each T_i, −1 at the
 * least common ancestor of consecutive leaves (in postorder), −1 at the
 * parent of each root i, and +1 for the one-node subtree T_j of a tree leaf
 * j. Leaves are detected by first descendants, least common ancestors by a
 * disjoint-set forest over the nodes already visited in postorder.
 */
import type { Graph } from "../graph/types.js";

/**
 * c[j] (diagonal included) for each new index j, given the elimination tree
 * `parent` and a postorder `order` of it (both in the new numbering).
 */
export function columnCounts(
  g: Graph, permutation: Int32Array, inverse: Int32Array, parent: Int32Array, order: Int32Array,
): Int32Array {
  const n = g.n, { offsets, neighbours } = g;
  const first = new Int32Array(n).fill(-1); // smallest position in each subtree
  const delta = new Int32Array(n);
  for (let t = 0; t < n; t++) {
    let j = order[t];
    delta[j] = first[j] === -1 ? 1 : 0;
    for (; j !== -1 && first[j] === -1; j = parent[j]) first[j] = t;
  }
  for (let j = 0; j < n; j++) if (parent[j] !== -1) delta[parent[j]]--;
  const lastLeafFirst = new Int32Array(n).fill(-1); // per row i: first[] of its latest leaf
  const previousLeaf = new Int32Array(n).fill(-1);
  const set = new Int32Array(n);
  for (let j = 0; j < n; j++) set[j] = j;
  for (let t = 0; t < n; t++) {
    const j = order[t], v = permutation[j];
    for (let p = offsets[v]; p < offsets[v + 1]; p++) {
      const i = inverse[neighbours[p]];
      if (i <= j || first[j] <= lastLeafFirst[i]) continue; // not a new leaf of T_i
      lastLeafFirst[i] = first[j];
      delta[j]++;
      const prev = previousLeaf[i];
      if (prev !== -1) delta[findRoot(set, prev)]--;
      previousLeaf[i] = j;
    }
    if (parent[j] !== -1) set[j] = parent[j];
  }
  const counts = delta;
  for (let t = 0; t < n; t++) {
    const j = order[t];
    if (parent[j] !== -1) counts[parent[j]] += counts[j];
  }
  return counts;
}

/** Root of x's set with path halving. */
function findRoot(set: Int32Array, x: number): number {
  while (set[x] !== x) {
    set[x] = set[set[x]];
    x = set[x];
  }
  return x;
}
