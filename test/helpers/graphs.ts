/** Graph helpers shared by the ordering tests. */
import { expect } from "vitest";
import type { Graph } from "../../src/graph/types.js";

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
