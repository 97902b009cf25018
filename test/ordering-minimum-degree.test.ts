// Tests of the approximate minimum degree ordering (Amestoy, Davis & Duff 1996).
// Outside references: the definition of symbolic Cholesky elimination (fill of
// vertex v = its uneliminated neighbours become a clique; brute force below),
// the closed form for the natural ordering of a k×k grid (common practice, see
// /work/shared/design.md §6), and a naive exact minimum degree written here.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { minimumDegree, minimumDegreeTrusted } from "../src/ordering/minimum-degree.js";
import { InputError } from "../src/errors.js";
import type { Graph } from "../src/graph/types.js";
import { eliminationFill, expectPermutation, graphFromEdges, gridGraph } from "./helpers/graphs.js";





/** Naive exact minimum degree: always eliminate a vertex of least current degree (smallest index on ties). */
function exactMinimumDegree(g: Graph): Int32Array {
  const adj: Set<number>[] = Array.from({ length: g.n }, (_, v) => new Set(g.neighbours.subarray(g.offsets[v], g.offsets[v + 1])));
  const done = new Uint8Array(g.n);
  const perm = new Int32Array(g.n);
  for (let k = 0; k < g.n; k++) {
    let best = -1;
    for (let v = 0; v < g.n; v++) if (!done[v] && (best < 0 || adj[v].size < adj[best].size)) best = v;
    perm[k] = best;
    done[best] = 1;
    const nb = [...adj[best]];
    for (const a of nb) {
      adj[a].delete(best);
      for (const b of nb) if (a !== b) adj[a].add(b);
    }
  }
  return perm;
}

const edgeCount = (g: Graph) => g.offsets[g.n] / 2;
const identity = (n: number) => Int32Array.from({ length: n }, (_, i) => i);

const randomGraph = fc.integer({ min: 0, max: 60 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    edges: n === 0 ? fc.constant([] as [number, number][]) : fc.array(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: 4 * n }),
  }),
);

const randomTree = fc.integer({ min: 1, max: 80 }).chain((n) =>
  fc.record({ n: fc.constant(n), parents: fc.array(fc.double({ min: 0, max: 1, maxExcluded: true, noNaN: true }), { minLength: n - 1, maxLength: n - 1 }) }),
);

describe("minimumDegree: valid permutation", () => {
  it("on random graphs (property)", () => {
    fc.assert(
      fc.property(randomGraph, fc.boolean(), ({ n, edges }, aggressive) => {
        const g = graphFromEdges(n, edges);
        const perm = minimumDegree(g, { aggressive });
        expectPermutation(perm, n);
        expect([...minimumDegree(g, { aggressive })]).toEqual([...perm]); // deterministic
        expectPermutation(minimumDegree(g, { denseThreshold: 3 }), n);
      }),
      { numRuns: 300 },
    );
  });

  it("on n = 0, n = 1, isolated vertices and many components", () => {
    expectPermutation(minimumDegree({ n: 0, offsets: new Int32Array(1), neighbours: new Int32Array(0) }), 0);
    expect([...minimumDegree(graphFromEdges(1, []))]).toEqual([0]);
    expectPermutation(minimumDegree(graphFromEdges(50, [])), 50);
    const pieces: [number, number][] = [];
    for (let c = 0; c < 300; c++) pieces.push([3 * c, 3 * c + 1], [3 * c + 1, 3 * c + 2]);
    const g = graphFromEdges(1000, pieces); // 300 paths of 3 plus 100 isolated vertices
    const perm = minimumDegree(g);
    expectPermutation(perm, 1000);
    expect(eliminationFill(g, perm)).toBe(1000 + edgeCount(g)); // forests: no fill
  });

  it("on cliques (fill is the whole lower triangle whatever the order)", () => {
    for (const n of [2, 5, 40]) {
      const edges: [number, number][] = [];
      for (let a = 0; a < n; a++) for (let b = a + 1; b < n; b++) edges.push([a, b]);
      const g = graphFromEdges(n, edges);
      const perm = minimumDegree(g, { denseThreshold: Infinity });
      expectPermutation(perm, n);
      expect(eliminationFill(g, perm)).toBe((n * (n + 1)) / 2);
    }
  });

  it("on a large star and a long path without trouble", () => {
    // The default threshold sets the hub aside; with no threshold every leaf
    // elimination rescans the hub (the reason dense rows are set aside, as
    // published), so that case runs on a smaller star.
    for (const [n, dense] of [[100_000, undefined], [3_000, Infinity]] as const) {
      const star: [number, number][] = [];
      for (let v = 1; v < n; v++) star.push([0, v]);
      const perm = minimumDegree(graphFromEdges(n, star), { denseThreshold: dense });
      expectPermutation(perm, n);
      expect(perm.indexOf(0)).toBeGreaterThanOrEqual(n - 2); // hub among the last two: no fill
    }
    const n = 100_000;
    const path: [number, number][] = [];
    for (let v = 1; v < n; v++) path.push([v - 1, v]);
    expectPermutation(minimumDegree(graphFromEdges(n, path)), n);
  });
});

describe("minimumDegree: arena compaction", () => {
  it("gives the same ordering with almost no spare arena room (compaction and growth exercised)", () => {
    fc.assert(
      fc.property(randomGraph, fc.integer({ min: 0, max: 8 }), ({ n, edges }, slack) => {
        const g = graphFromEdges(n, edges);
        const roomy = minimumDegreeTrusted(g, Infinity, true);
        const tight = minimumDegreeTrusted(g, Infinity, true, slack);
        expect([...tight]).toEqual([...roomy]);
      }),
      { numRuns: 300 },
    );
    const g = gridGraph(40);
    expect([...minimumDegreeTrusted(g, Infinity, true, 0)]).toEqual([...minimumDegreeTrusted(g, Infinity, true)]);
  });
});

describe("minimumDegree: no fill on tree patterns", () => {
  it("arrow, path and random trees (property); fill counted by brute-force elimination", () => {
    const arrow = graphFromEdges(30, Array.from({ length: 29 }, (_, i) => [29, i] as [number, number]));
    const path = graphFromEdges(30, Array.from({ length: 29 }, (_, i) => [i, i + 1] as [number, number]));
    for (const g of [arrow, path]) expect(eliminationFill(g, minimumDegree(g))).toBe(g.n + edgeCount(g));
    fc.assert(
      fc.property(randomTree, ({ n, parents }) => {
        const g = graphFromEdges(n, parents.map((r, i) => [i + 1, Math.floor(r * (i + 1))] as [number, number]));
        for (const aggressive of [true, false]) {
          const perm = minimumDegree(g, { aggressive });
          expectPermutation(perm, n);
          expect(eliminationFill(g, perm)).toBe(n + edgeCount(g));
        }
      }),
      { numRuns: 200 },
    );
  });
});

describe("minimumDegree: fill quality on grids", () => {
  it("k×k 5-point grid: below the natural ordering's closed form and close to exact minimum degree", () => {
    for (const k of [6, 10, 14, 18]) {
      const g = gridGraph(k);
      const n = k * k;
      const natural = eliminationFill(g, identity(n));
      expect(natural).toBe((n - k) * (k + 1) + 2 * k - 1); // common practice (envelope fully filled)
      const amd = eliminationFill(g, minimumDegree(g));
      const exact = eliminationFill(g, exactMinimumDegree(g));
      expect(amd).toBeLessThanOrEqual(natural);
      expect(amd).toBeLessThanOrEqual(1.15 * exact);
    }
  });

  it("9-point grid and random sparse graphs: within 15% of exact minimum degree", () => {
    const g9 = gridGraph(12, true);
    expect(eliminationFill(g9, minimumDegree(g9))).toBeLessThanOrEqual(1.15 * eliminationFill(g9, exactMinimumDegree(g9)));
    fc.assert(
      fc.property(fc.integer({ min: 40, max: 120 }), fc.integer({ min: 1, max: 1 << 30 }), (n, seed) => {
        let x = seed;
        const rand = () => ((x = (Math.imul(x, 1103515245) + 12345) >>> 0) / 2 ** 32);
        const edges: [number, number][] = [];
        for (let e = 0; e < 2 * n; e++) edges.push([Math.floor(rand() * n), Math.floor(rand() * n)]);
        const g = graphFromEdges(n, edges);
        const amd = eliminationFill(g, minimumDegree(g));
        expect(amd).toBeLessThanOrEqual(1.15 * eliminationFill(g, exactMinimumDegree(g)) + 5);
      }),
      { numRuns: 20 },
    );
  });
});

/** d unknowns per node of a 9-point k×k mesh, all unknowns of adjacent nodes coupled (elasticity-like pattern). */
function multiDofMesh(k: number, d: number): Graph {
  const mesh = gridGraph(k, true);
  const edges: [number, number][] = [];
  for (let v = 0; v < mesh.n; v++) {
    for (let a = 0; a < d; a++) for (let b = a + 1; b < d; b++) edges.push([d * v + a, d * v + b]);
    for (let p = mesh.offsets[v]; p < mesh.offsets[v + 1]; p++) {
      const u = mesh.neighbours[p];
      if (u > v) for (let a = 0; a < d; a++) for (let b = 0; b < d; b++) edges.push([d * v + a, d * u + b]);
    }
  }
  return graphFromEdges(mesh.n * d, edges);
}

/** Random geometric graph: n points in the unit square, edges below distance r (graph-Laplacian pattern). */
function geometricGraph(n: number, r: number, seed: number): Graph {
  let x = seed;
  const rand = () => ((x = (Math.imul(x, 1664525) + 1013904223) >>> 0) / 2 ** 32);
  const pts = Array.from({ length: n }, () => [rand(), rand()]);
  const edges: [number, number][] = [];
  for (let a = 0; a < n; a++) {
    for (let b = a + 1; b < n; b++) if (Math.hypot(pts[a][0] - pts[b][0], pts[a][1] - pts[b][1]) < r) edges.push([a, b]);
  }
  return graphFromEdges(n, edges);
}

describe("minimumDegree: other patterns met in practice", () => {
  it("3-dof mesh, random geometric graph and disconnected copies: within 15% of exact minimum degree", () => {
    const cases = [multiDofMesh(7, 3), geometricGraph(300, 0.1, 7), geometricGraph(300, 0.05, 11)];
    for (const g of cases) {
      const perm = minimumDegree(g);
      expectPermutation(perm, g.n);
      expect(eliminationFill(g, perm)).toBeLessThanOrEqual(1.15 * eliminationFill(g, exactMinimumDegree(g)));
    }
    // Two disjoint copies of a grid: fill is exactly additive over the pieces for exact minimum degree
    // (definition); the approximate method must stay within the same 15% band.
    const k = 9;
    const one = gridGraph(k);
    const edges: [number, number][] = [];
    for (let v = 0; v < one.n; v++) {
      for (let p = one.offsets[v]; p < one.offsets[v + 1]; p++) edges.push([v, one.neighbours[p]], [v + one.n, one.neighbours[p] + one.n]);
    }
    const two = graphFromEdges(2 * one.n, edges);
    expect(eliminationFill(two, minimumDegree(two))).toBeLessThanOrEqual(1.15 * 2 * eliminationFill(one, exactMinimumDegree(one)));
  });
});

describe("minimumDegree: dense rows and bad input", () => {
  it("rows above the threshold go last, in increasing index", () => {
    const k = 12; // n = 146, default threshold 10·sqrt(146) ≈ 120.8 < 144
    const base = gridGraph(k);
    const edges: [number, number][] = [];
    for (let v = 0; v < k * k; v++) {
      for (let p = base.offsets[v]; p < base.offsets[v + 1]; p++) edges.push([v, base.neighbours[p]]);
      edges.push([v, k * k], [v, k * k + 1]); // two hubs linked to everything
    }
    const g = graphFromEdges(k * k + 2, edges);
    const perm = minimumDegree(g);
    expectPermutation(perm, g.n);
    expect([...perm.subarray(g.n - 2)]).toEqual([k * k, k * k + 1]);
  });

  it("throws InputError naming the entry", () => {
    const asym: Graph = { n: 3, offsets: Int32Array.of(0, 1, 2, 2), neighbours: Int32Array.of(1, 2) };
    expect(() => minimumDegree(asym)).toThrow(InputError);
    expect(() => minimumDegree(asym)).toThrow(/vertex 0 lists 1 but 1 does not list 0/);
    const outOfRange: Graph = { n: 2, offsets: Int32Array.of(0, 1, 2), neighbours: Int32Array.of(1, 5) };
    expect(() => minimumDegree(outOfRange)).toThrow(/vertex 1 lists neighbour 5/);
    const loop: Graph = { n: 2, offsets: Int32Array.of(0, 1, 1), neighbours: Int32Array.of(0) };
    expect(() => minimumDegree(loop)).toThrow(/vertex 0 lists itself/);
    expect(() => minimumDegree(gridGraph(3), { denseThreshold: -1 })).toThrow(InputError);
    expect(() => minimumDegree({ n: 2, offsets: Int32Array.of(0, 1), neighbours: new Int32Array(0) })).toThrow(/offsets has length/);
  });
});
