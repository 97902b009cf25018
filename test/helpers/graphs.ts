/** Graph helpers shared by the ordering tests. */
import { expect } from "vitest";
import type { Graph } from "../../src/graph/types.js";
import type { SeparatorTree } from "../../src/ordering/types.js";

/** Graph from an undirected edge list (duplicates and self loops dropped). */
export function graphFromEdges(n: number, edges: ReadonlyArray<readonly [number, number]>): Graph {
  const sets: Set<number>[] = Array.from({ length: n }, () => new Set<number>());
  for (const [a, b] of edges) {
    if (a === b) continue;
    sets[a].add(b);
    sets[b].add(a);
  }
  const offsets = new Int32Array(n + 1);
  for (let v = 0; v < n; v++) offsets[v + 1] = offsets[v] + sets[v].size;
  const neighbours = new Int32Array(offsets[n]);
  for (let v = 0; v < n; v++) neighbours.set([...sets[v]].sort((x, y) => x - y), offsets[v]);
  return { n, offsets, neighbours };
}

/** Every vertex exactly once (definition of a permutation); reports the first bad position. */
export function expectPermutation(perm: Int32Array, n: number): void {
  expect(perm.length).toBe(n);
  const seen = new Uint8Array(n);
  let bad = -1;
  for (let k = 0; k < n && bad < 0; k++) {
    const v = perm[k];
    if (!(v >= 0 && v < n) || seen[v]) bad = k;
    else seen[v] = 1;
  }
  expect(bad).toBe(-1);
}

/** Graph built by a callback that adds undirected edges (self loops dropped). */
export function graphOf(n: number, add: (edge: (a: number, b: number) => void) => void): Graph {
  const edges: Array<[number, number]> = [];
  add((a, b) => { edges.push([a, b]); });
  return graphFromEdges(n, edges);
}

/** The k×k grid graph: 5-point, or 9-point with `nine` (both diagonals of every cell). */
export function gridGraph(k: number, nine = false): Graph {
  return graphOf(k * k, (e) => {
    for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
      const v = y * k + x;
      if (x + 1 < k) e(v, v + 1);
      if (y + 1 < k) e(v, v + k);
      if (nine && x + 1 < k && y + 1 < k) { e(v, v + k + 1); e(v + 1, v + k); }
    }
  });
}

/** The k×k×k 7-point grid graph. */
export function cubeGraph(k: number): Graph {
  return graphOf(k * k * k, (e) => {
    for (let v = 0; v < k * k * k; v++) {
      const x = v % k, y = Math.floor(v / k) % k, z = Math.floor(v / (k * k));
      if (x + 1 < k) e(v, v + 1);
      if (y + 1 < k) e(v, v + k);
      if (z + 1 < k) e(v, v + k * k);
    }
  });
}

/** nnz(L) incl. diagonal by brute-force symbolic elimination in the given order (the definition; Rose 1972 graph model). */
export function eliminationFill(g: Graph, perm: ArrayLike<number>): number {
  const adj: Set<number>[] = Array.from({ length: g.n }, (_, v) => new Set(g.neighbours.subarray(g.offsets[v], g.offsets[v + 1])));
  let nnz = g.n;
  for (let k = 0; k < perm.length; k++) {
    const v = perm[k];
    const nb = [...adj[v]];
    nnz += nb.length;
    for (const a of nb) {
      adj[a].delete(v);
      for (const b of nb) if (a !== b) adj[a].add(b);
    }
    adj[v].clear();
  }
  return nnz;
}

/**
 * Separator tree: node ranges nest, children partition [first, separatorFirst)
 * of their parent, roots partition 0..n, and no edge of the graph joins two
 * different child subtrees of a node (so the separator really separates).
 * Returns a description of the first violation, or "" (plain loops: cheap on large graphs).
 */
export function treeProblem(g: Graph, perm: Int32Array, t: SeparatorTree): string {
  const n = g.n;
  const pos = new Int32Array(n);
  for (let k = 0; k < n; k++) pos[perm[k]] = k;
  const childRanges: Array<Array<[number, number]>> = Array.from({ length: t.count }, () => []);
  const roots: Array<[number, number]> = [];
  for (let i = 0; i < t.count; i++) {
    if (!(t.first[i] <= t.separatorFirst[i] && t.separatorFirst[i] <= t.end[i])) return `node ${i}: ranges out of order`;
    if (t.parent[i] === -1) roots.push([t.first[i], t.end[i]]);
    else if (t.parent[i] <= i) return `node ${i}: parent listed before child`;
    else childRanges[t.parent[i]].push([t.first[i], t.end[i]]);
  }
  const tiles = (ranges: Array<[number, number]>, lo: number, hi: number): boolean => {
    ranges.sort((a, b) => a[0] - b[0]);
    let at = lo;
    for (const [a, b] of ranges) { if (a !== at) return false; at = b; }
    return at === hi;
  };
  if (!tiles(roots, 0, n)) return "roots do not partition 0..n";
  const owner = new Int32Array(n).fill(-1);
  // no edge may join two children of a node, nor two roots (children of a virtual node over 0..n with no separator)
  const crossing = (ranges: Array<[number, number]>, first: number, sepFirst: number): string => {
    ranges.forEach(([a, b], c) => { for (let k = a; k < b; k++) owner[k] = c; });
    for (let k = first; k < sepFirst; k++) {
      const v = perm[k];
      for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) {
        const q = pos[g.neighbours[p]];
        if (q >= first && q < sepFirst && owner[q] !== owner[k]) return `edge ${v}-${g.neighbours[p]}`;
      }
    }
    return "";
  };
  const rootProblem = crossing(roots, 0, n);
  if (rootProblem) return `${rootProblem} joins two roots`;
  for (let i = 0; i < t.count; i++) {
    if (childRanges[i].length === 0) continue;
    if (!tiles(childRanges[i], t.first[i], t.separatorFirst[i])) return `node ${i}: children do not partition its range`;
    const problem = crossing(childRanges[i], t.first[i], t.separatorFirst[i]);
    if (problem) return `node ${i}: ${problem} crosses its separator`;
  }
  return "";
}

export function expectTreeConsistent(g: Graph, perm: Int32Array, t: SeparatorTree): void {
  expect(treeProblem(g, perm, t)).toBe("");
}
