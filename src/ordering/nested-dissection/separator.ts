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
 * Turns a 2-way labelling into a vertex separator in place (label 2), choosing
 * the lightest of the König cover and the two one-sided boundaries (a boundary
 * on a tie: it keeps the parts' shapes simple).
 */
export function vertexSeparatorFromCut(g: WGraph, label: Int8Array): void {
  const n = g.n;
  const boundary: number[] = [];
  let w0 = 0;
  let w1 = 0;
  for (let v = 0; v < n; v++) {
    for (let p = g.xadj[v]; p < g.xadj[v + 1]; p++) {
      if (label[g.adj[p]] !== label[v]) {
        boundary.push(v);
        if (label[v] === 0) w0 += g.vwgt[v]; else w1 += g.vwgt[v];
        break;
      }
    }
  }
  const cover = minimumCover(g, label, boundary);
  let wc = 0;
  for (const v of cover) wc += g.vwgt[v];
  if (wc < w0 && wc < w1) for (const v of cover) label[v] = SEPARATOR;
  else {
    const side = w0 <= w1 ? 0 : 1;
    for (const v of boundary) if (label[v] === side) label[v] = SEPARATOR;
  }
}

/** Minimum vertex cover of the cut edges between boundary vertices. */
function minimumCover(g: WGraph, label: Int8Array, boundary: number[]): number[] {
  const n = g.n;
  const mate = new Int32Array(n).fill(-1);
  const stamp = new Int32Array(n).fill(-1);
  const parent = new Int32Array(n);
  const queue = new Int32Array(n);
  const left = boundary.filter((v) => label[v] === 0);
  for (const v of left) {
    for (let p = g.xadj[v]; p < g.xadj[v + 1]; p++) {
      const u = g.adj[p];
      if (label[u] === 1 && mate[u] === -1) { mate[u] = v; mate[v] = u; break; }
    }
  }
  for (const v of left) if (mate[v] === -1) augment(g, label, v, { mate, stamp, parent, queue });
  const reached = stamp.fill(-1);
  alternatingReach(g, label, left, mate, reached, queue);
  return boundary.filter((v) => (label[v] === 0) !== (reached[v] === 1));
}

interface MatchWork { mate: Int32Array; stamp: Int32Array; parent: Int32Array; queue: Int32Array }

/** Breadth-first search for an augmenting path from free left vertex `root`; flips it if found. */
function augment(g: WGraph, label: Int8Array, root: number, w: MatchWork): boolean {
  const { mate, stamp, parent, queue } = w;
  let tail = 0;
  queue[tail++] = root;
  for (let head = 0; head < tail; head++) {
    const v = queue[head];
    for (let p = g.xadj[v]; p < g.xadj[v + 1]; p++) {
      const u = g.adj[p];
      if (label[u] !== 1 || stamp[u] === root) continue;
      stamp[u] = root;
      parent[u] = v;
      const m = mate[u];
      if (m === -1) {
        let r = u;
        for (;;) {
          const l = parent[r];
          const next = mate[l];
          mate[r] = l;
          mate[l] = r;
          if (l === root) return true;
          r = next;
        }
      }
      queue[tail++] = m;
    }
  }
  return false;
}

/** Z: vertices reachable from free left vertices by non-matching (left→right) then matching (right→left) edges. */
function alternatingReach(g: WGraph, label: Int8Array, left: number[], mate: Int32Array, reached: Int32Array, queue: Int32Array): void {
  let tail = 0;
  for (const v of left) if (mate[v] === -1) { reached[v] = 1; queue[tail++] = v; }
  for (let head = 0; head < tail; head++) {
    const v = queue[head];
    for (let p = g.xadj[v]; p < g.xadj[v + 1]; p++) {
      const u = g.adj[p];
      if (label[u] !== 1 || reached[u] === 1) continue;
      reached[u] = 1;
      const m = mate[u];
      if (m !== -1 && reached[m] !== 1) { reached[m] = 1; queue[tail++] = m; }
    }
  }
}
