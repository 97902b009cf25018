// Tests of halo minimum degree (Pellegrini, Roman & Amestoy 2000, "Hybridizing nested
// dissection and halo approximate minimum degree for efficient sparse matrix ordering",
// Concurrency: Practice and Experience 12; cited from memory): the last `halo` vertices
// of the graph count in the degrees of their neighbours but are never ordered.
// Outside references: the definition of a permutation; the definition of minimum degree
// (each pivot has the least external degree, counting every neighbour, in the elimination
// graph — Tinney & Walker 1967; Rose 1972 graph model), replayed by brute force on sets;
// symbolic elimination by brute force (helpers/graphs.ts); the orders of the
// implementation before halos existed (commit d290cd0), pinned as hashes for halo = 0.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { Graph } from "../src/graph/types.js";
import { adjacencyGraph } from "../src/graph/adjacency.js";
import { grid2d, grid3d } from "../src/generate/grids.js";
import { plateMesh2d } from "../src/generate/plate.js";
import { elasticity3d } from "../src/generate/elasticity.js";
import { defaultDenseThreshold, minimumDegreeTrusted } from "../src/ordering/minimum-degree.js";
import { LEAF_LIMIT, leafMinimumDegree, leafWork } from "../src/ordering/leaf-degree.js";
import { nestedDissection } from "../src/ordering/nested-dissection/index.js";
import { eliminationFill, expectPermutation, expectTreeConsistent, graphFromEdges } from "./helpers/graphs.js";

/** FNV-1a hash of an order (hex). */
function hash(a: Int32Array): string {
  let x = 2166136261;
  for (const v of a) { x ^= v; x = Math.imul(x, 16777619); }
  return (x >>> 0).toString(16);
}

/** The subgraph induced by vertices 0..m−1. */
function firstVertices(g: Graph, m: number): Graph {
  const offsets = new Int32Array(m + 1), nb: number[] = [];
  for (let v = 0; v < m; v++) {
    for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) if (g.neighbours[p] < m) nb.push(g.neighbours[p]);
    offsets[v + 1] = nb.length;
  }
  return { n: m, offsets, neighbours: Int32Array.from(nb) };
}

const amd = (g: Graph, halo: number, slack?: number): Int32Array => minimumDegreeTrusted(g, defaultDenseThreshold(g.n), true, slack, halo);
const exact = (g: Graph, halo: number): Int32Array => leafMinimumDegree(g, undefined, halo);

/** Random graph on `leaf` + `halo` vertices; halo–halo edges only when `haloEdges`. */
const haloGraph = fc.record({
  leaf: fc.integer({ min: 0, max: 120 }), halo: fc.integer({ min: 0, max: 40 }), density: fc.integer({ min: 0, max: 4 }),
  seed: fc.integer(), haloEdges: fc.boolean(),
}).map(({ leaf, halo, density, seed, haloEdges }) => {
  let s = seed | 0 || 1;
  const r = (m: number): number => { s ^= s << 13; s ^= s >>> 17; s ^= s << 5; return (s >>> 0) % m; };
  const n = leaf + halo, edges: [number, number][] = [];
  for (let e = n === 0 ? 0 : density * n; e > 0; e--) {
    const a = r(n), b = r(n);
    if (haloEdges || a < leaf || b < leaf) edges.push([a, b]);
  }
  return { g: graphFromEdges(n, edges), halo };
});

/**
 * Replays `perm` on the elimination graph held as sets and returns "" when every pivot had
 * the least external degree (neighbours, halo included, minus the other members of its
 * supervariable) among the non-halo supervariables, else a description. Supervariables as
 * the bitset implementation defines them: after each elimination, clique vertices with
 * equal closed neighbourhoods merge, and clique vertices left adjacent to nothing but the
 * rest of the clique are eliminated with the pivot (they must follow it in the order).
 */
function replayMinimumDegree(g: Graph, halo: number, perm: Int32Array): string {
  const n = g.n, m = n - halo;
  const adj = Array.from({ length: n }, (_, v) => new Set(g.neighbours.subarray(g.offsets[v], g.offsets[v + 1])));
  const group: Set<number>[] = Array.from({ length: n }, (_, v) => new Set([v]));
  const done = new Uint8Array(n);
  const ext = (x: number): number => adj[x].size - (group[x].size - 1);
  const remove = (x: number): void => { for (const a of adj[x]) adj[a].delete(x); adj[x].clear(); done[x] = 1; };
  for (let k = 0; k < m;) {
    const v = perm[k];
    let least = Infinity;
    for (let x = 0; x < m; x++) if (!done[x]) least = Math.min(least, ext(x));
    if (ext(v) !== least) return `position ${k}: vertex ${v} has external degree ${ext(v)}, least is ${least}`;
    const members = [...group[v]];
    const clique = [...adj[v]].filter((x) => !group[v].has(x));
    for (const a of clique) for (const b of clique) if (a !== b) adj[a].add(b);
    for (const x of members) remove(x);
    const massed = clique.filter((x) => x < m && adj[x].size === clique.length - 1);
    for (const x of massed) remove(x);
    const block = new Set([...members, ...massed]);
    const seen = new Set(perm.subarray(k, k + block.size));
    if (seen.size !== block.size || [...seen].some((x) => !block.has(x))) return `position ${k}: block ${[...seen]} is not ${[...block]}`;
    k += block.size;
    const live = clique.filter((x) => x < m && !done[x]);
    const closed = (x: number): string => [...adj[x], x].sort((a, b) => a - b).join(",");
    for (let a = 0; a < live.length; a++) {
      for (let b = a + 1; b < live.length; b++) {
        const x = live[a], y = live[b];
        if (group[x] !== group[y] && closed(x) === closed(y)) for (const z of group[y]) { group[x].add(z); group[z] = group[x]; }
      }
    }
  }
  return "";
}

describe("halo minimum degree: halo = 0 changes nothing", () => {
  it("approximate and exact minimum degree give the orders of commit d290cd0 (pinned hashes)", () => {
    const grid = adjacencyGraph(grid2d(100).matrix), cube = adjacencyGraph(grid3d(15).matrix);
    const plate = adjacencyGraph(plateMesh2d(60).matrix), el = adjacencyGraph(elasticity3d(6).matrix);
    expect(hash(minimumDegreeTrusted(grid, defaultDenseThreshold(grid.n), true, undefined, 0))).toBe("57760f3");
    expect(hash(minimumDegreeTrusted(cube, defaultDenseThreshold(cube.n), true, undefined, 0))).toBe("4f2fbe3c");
    expect(hash(minimumDegreeTrusted(cube, Infinity, false, undefined, 0))).toBe("8fb2bfc");
    expect(hash(minimumDegreeTrusted(cube, 5, true, undefined, 0))).toBe("46d2ea12");
    expect(hash(minimumDegreeTrusted(plate, Infinity, false, 3, 0))).toBe("e83c51b8");
    expect(hash(minimumDegreeTrusted(el, 5, true, undefined, 0))).toBe("4e26a86a");
    const work = leafWork();
    const pieces = [30, 100, 200, 256].map((m) => hash(leafMinimumDegree(firstVertices(cube, m), work, 0)));
    expect(pieces).toEqual(["73750700", "7677864f", "84d8dba5", "102973ab"]);
    expect(hash(leafMinimumDegree(firstVertices(el, 200), work, 0))).toBe("137aa903");
  });
});

describe("halo minimum degree: orders exactly the non-halo vertices", () => {
  it("both implementations return a permutation of 0..n−halo−1 (property, random graphs and halo sizes)", () => {
    const work = leafWork(LEAF_LIMIT);
    fc.assert(fc.property(haloGraph, ({ g, halo }) => {
      const m = g.n - halo;
      expectPermutation(amd(g, halo), m);
      expectPermutation(minimumDegreeTrusted(g, 3, false, undefined, halo), m); // dense rows set aside, no aggressive absorption
      expectPermutation(leafMinimumDegree(g, work, halo), m);
      // a nearly full arena forces compaction: same order (the arena holds no ordering state)
      expect(Array.from(amd(g, halo, 2))).toEqual(Array.from(amd(g, halo)));
    }), { numRuns: 300 });
  });

  it("above the size limit the bitset version hands the halo to approximate minimum degree", () => {
    const cube = adjacencyGraph(grid3d(8).matrix); // 512 vertices; the last 100 are halo
    expect(Array.from(leafMinimumDegree(cube, leafWork(), 100))).toEqual(Array.from(amd(cube, 100)));
    expectPermutation(leafMinimumDegree(cube, leafWork(), 100), 412);
  });

  it("halo vertices without edges change nothing in the exact version (definition: they touch no degree)", () => {
    fc.assert(fc.property(haloGraph, fc.integer({ min: 1, max: 30 }), ({ g }, extra) => {
      const padded: Graph = { n: g.n + extra, offsets: Int32Array.from([...g.offsets, ...Array(extra).fill(g.offsets[g.n])]), neighbours: g.neighbours };
      expect(Array.from(exact(padded, extra))).toEqual(Array.from(exact(g, 0)));
    }), { numRuns: 100 });
  });
});

describe("halo minimum degree: the halo counts in degrees", () => {
  // Path 0-1-2-3-4 (ends of degree 1) and one halo vertex 5 joined to one end: that end
  // now has degree 2, so by the definition of minimum degree the other end goes first, and
  // eliminating the path from that end with the halo last creates no fill. Both labellings
  // are tried so that no tie-breaking rule passes by luck.
  for (const end of [0, 4]) {
    it(`halo joined to end ${end} of a path: the other end is the first pivot, no fill (brute force)`, () => {
      const g = graphFromEdges(6, [[0, 1], [1, 2], [2, 3], [3, 4], [end, 5]]);
      for (const order of [amd, exact]) {
        const perm = order(g, 1);
        expect(perm[0]).toBe(4 - end);
        expect(eliminationFill(g, [...perm, 5])).toBe(6 + 5); // n + |E|: no fill
      }
    });
  }

  it("every pivot of the exact version has least external degree, halo included (brute-force replay)", () => {
    const work = leafWork(LEAF_LIMIT);
    fc.assert(fc.property(haloGraph, ({ g, halo }) => {
      expect(replayMinimumDegree(g, halo, leafMinimumDegree(g, work, halo))).toBe("");
    }), { numRuns: 150 });
  });

  it("the replay does catch a non-minimum pivot (the check can fail)", () => {
    const g = graphFromEdges(6, [[0, 1], [1, 2], [2, 3], [3, 4], [0, 5]]);
    expect(replayMinimumDegree(g, 1, Int32Array.of(0, 1, 2, 3, 4))).not.toBe("");
    expect(replayMinimumDegree(g, 1, Int32Array.of(4, 3, 2, 1, 0))).toBe("");
  });
});

describe("nested dissection with halo leaves", () => {
  it("leaf graphs list the leaf then its halo, sorted and symmetric, halo joined only to the leaf; the result is a valid dissection", () => {
    const work = leafWork();
    fc.assert(fc.property(fc.integer({ min: 8, max: 30 }), fc.integer(), (k, seed) => {
      const g = adjacencyGraph(grid2d(k).matrix);
      let problem = "", halos = 0;
      const orderLeaf = (leaf: Graph, halo: number): Int32Array => {
        const m = leaf.n - halo;
        halos += halo;
        for (let v = 0; v < leaf.n && problem === ""; v++) {
          const list = Array.from(leaf.neighbours.subarray(leaf.offsets[v], leaf.offsets[v + 1]));
          if (list.some((u, i) => i > 0 && u <= list[i - 1])) problem = `list of ${v} not sorted`;
          if (v >= m && (list.length === 0 || list.some((u) => u >= m))) problem = `halo vertex ${v} lists ${list}`;
          for (const u of list) if (!leaf.neighbours.subarray(leaf.offsets[u], leaf.offsets[u + 1]).includes(v)) problem = `${u} lacks ${v}`;
        }
        return leafMinimumDegree(leaf, work, halo);
      };
      const r = nestedDissection(g, { orderLeaf, seed, leafSize: 16 });
      expect(problem).toBe("");
      expect(halos).toBeGreaterThan(0); // grids above the leaf size are cut, so leaves have halos
      expectPermutation(r.permutation, g.n);
      expectTreeConsistent(g, r.permutation, r.separatorTree!);
    }), { numRuns: 30 });
  });
});
