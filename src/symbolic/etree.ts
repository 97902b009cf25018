/**
 * Elimination tree of the Cholesky factor of P·A·Pᵀ, computed from the graph
 * of A and the ordering without forming the permuted matrix: Liu's algorithm
 * with path compression through a virtual-ancestor array (Liu 1990, "The role
 * of elimination trees in sparse factorization", SIAM J. Matrix Anal. Appl.
 * 11(1)). Near-linear time, O(n) workspace.
 */
import type { Graph } from "../graph/types.js";

/**
 * parent[k] of each new index k (-1 for roots). `permutation` maps new → old,
 * `inverse` old → new.
 */
export function eliminationTree(g: Graph, permutation: Int32Array, inverse: Int32Array): Int32Array {
  const n = g.n, { offsets, neighbours } = g;
  const parent = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n).fill(-1);
  for (let i = 0; i < n; i++) {
    const v = permutation[i];
    for (let p = offsets[v]; p < offsets[v + 1]; p++) {
      let k = inverse[neighbours[p]];
      // Climb from k towards the root of its current subtree, pointing every
      // visited node's virtual ancestor at i (path compression).
      while (k !== -1 && k < i) {
        const next = ancestor[k];
        ancestor[k] = i;
        if (next === -1) { parent[k] = i; break; }
        k = next;
      }
    }
  }
  return parent;
}

/** Invert a permutation (assumed valid). */
export function invertPermutation(p: Int32Array): Int32Array {
  const inv = new Int32Array(p.length);
  for (let k = 0; k < p.length; k++) inv[p[k]] = k;
  return inv;
}

/** The children of every node of a forest, ascending: node s's are children[childPtr[s] .. childPtr[s+1]). */
export function childLists(parent: Int32Array): { childPtr: Int32Array; children: Int32Array } {
  const n = parent.length;
  const childPtr = new Int32Array(n + 1);
  for (let s = 0; s < n; s++) if (parent[s] >= 0) childPtr[parent[s] + 1]++;
  for (let s = 0; s < n; s++) childPtr[s + 1] += childPtr[s];
  const children = new Int32Array(childPtr[n]), fill = childPtr.slice(0, n);
  for (let s = 0; s < n; s++) if (parent[s] >= 0) children[fill[parent[s]]++] = s;
  return { childPtr, children };
}

/**
 * A postorder of the forest: order[t] is the node visited t-th. Children are
 * visited in increasing index order, so a forest already in postorder maps to
 * the identity. Iterative (no recursion depth limit on paths).
 */
export function postorder(parent: Int32Array): Int32Array {
  const n = parent.length;
  const head = new Int32Array(n).fill(-1), next = new Int32Array(n).fill(-1);
  for (let j = n - 1; j >= 0; j--) {
    const p = parent[j];
    if (p !== -1) { next[j] = head[p]; head[p] = j; }
  }
  const order = new Int32Array(n), stack = new Int32Array(n);
  let t = 0;
  for (let root = 0; root < n; root++) {
    if (parent[root] !== -1) continue;
    let top = 0;
    stack[0] = root;
    while (top >= 0) {
      const j = stack[top], child = head[j];
      if (child === -1) { order[t++] = j; top--; }
      else { head[j] = next[child]; stack[++top] = child; }
    }
  }
  return order;
}
