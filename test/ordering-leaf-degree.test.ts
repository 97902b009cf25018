// Tests of the bitset minimum degree for leaf pieces (Tinney & Walker 1967; Rose 1972 graph model).
// Outside references: the definition of a permutation; the definition of symbolic
// elimination (eliminating v makes its remaining neighbours a clique; brute force below)
// and the fact that a tree has a perfect elimination ordering (leaves first, Rose 1970/1972),
// so minimum degree must order it with zero fill; the approximate minimum degree ordering
// already in the project as a fill yardstick.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { LEAF_LIMIT, leafMinimumDegree, leafWork } from "../src/ordering/leaf-degree.js";
import { defaultDenseThreshold, minimumDegreeTrusted } from "../src/ordering/minimum-degree.js";
import { countFill } from "../src/symbolic/index.js";
import type { Graph } from "../src/graph/types.js";
import { eliminationFill, expectPermutation, graphFromEdges } from "./helpers/graphs.js";


/** Deterministic xorshift32 integers in [0, m). */
function rng(seed: number): (m: number) => number {
  let s = seed | 0 || 1;
  return (m) => { s ^= s << 13; s ^= s >>> 17; s ^= s << 5; return (s >>> 0) % m; };
}

/** Random graph of a given shape on n vertices, randomly relabelled. */
function shaped(shape: number, n: number, seed: number): Graph {
  const r = rng(seed), edges: [number, number][] = [];
  const label = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) { const j = r(i + 1); [label[i], label[j]] = [label[j], label[i]]; }
  const add = (a: number, b: number): void => { edges.push([label[a], label[b]]); };
  const k = Math.min(n, 1 + r(24)); // size of the clique / star / path part
  if (shape === 0) for (let e = r(3 * n + 1); e > 0; e--) add(r(n), r(n)); // random, with isolated vertices
  if (shape === 1) for (let a = 0; a < k; a++) for (let b = a + 1; b < k; b++) add(a, b); // clique + isolated
  if (shape === 2) for (let a = 1; a < n; a++) add(0, a); // star
  if (shape === 3) for (let a = 1; a < n; a++) add(a - 1, a); // path
  if (shape === 4) for (let a = 1; a < n; a++) if (a % k !== 0) add(a - 1, a); // disconnected paths
  if (shape === 5) { // clique, star and random part side by side
    for (let a = 0; a < k; a++) for (let b = a + 1; b < k; b++) add(a, b);
    for (let a = k + 1; a < Math.min(n, 2 * k); a++) add(k, a);
    for (let e = r(2 * n + 1); e > 0; e--) { const a = 2 * k + r(Math.max(1, n - 2 * k)); const b = 2 * k + r(Math.max(1, n - 2 * k)); if (a < n && b < n) add(a, b); }
  }
  return graphFromEdges(n, edges);
}

/** Random tree: vertex i > 0 hangs from a random earlier vertex, then random labels. */
function randomTree(n: number, seed: number): Graph {
  const r = rng(seed), edges: [number, number][] = [];
  const label = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) { const j = r(i + 1); [label[i], label[j]] = [label[j], label[i]]; }
  for (let i = 1; i < n; i++) edges.push([label[i], label[r(i)]]);
  return graphFromEdges(n, edges);
}

/** Random geometric graph (points in the unit square joined below a radius giving mean degree ≈ deg). */
function geometric(n: number, deg: number, seed: number): Graph {
  const r = rng(seed), xs = Array.from({ length: n }, () => r(1 << 20) / (1 << 20)), ys = xs.map(() => r(1 << 20) / (1 << 20));
  const r2 = deg / (Math.PI * n), edges: [number, number][] = [];
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) if ((xs[i] - xs[j]) ** 2 + (ys[i] - ys[j]) ** 2 < r2) edges.push([i, j]);
  return graphFromEdges(n, edges);
}

const edgeCount = (g: Graph): number => g.offsets[g.n] / 2;

describe("leafMinimumDegree", () => {
  it("returns a permutation on random graphs of many shapes, n 0..256 (definition of a permutation)", () => {
    const work = leafWork(LEAF_LIMIT);
    fc.assert(fc.property(fc.integer({ min: 0, max: 5 }), fc.integer({ min: 0, max: 256 }), fc.integer(), (shape, n, seed) => {
      const g = shaped(shape, n, seed);
      expectPermutation(leafMinimumDegree(g, work), n);
      expectPermutation(leafMinimumDegree(g), n);
    }), { numRuns: 150 });
  });

  it("a reused workspace gives the same ordering as a fresh one (workspace holds no state between calls)", () => {
    const work = leafWork(LEAF_LIMIT), r = rng(7);
    for (let t = 0; t < 60; t++) {
      const g = shaped(t % 6, r(257), t + 1);
      expect(Array.from(leafMinimumDegree(g, work))).toEqual(Array.from(leafMinimumDegree(g, leafWork(g.n))));
    }
  });

  it("orders trees (paths, stars, random trees) with zero fill: nnz(L) = n + |E| by brute-force elimination", () => {
    const work = leafWork(LEAF_LIMIT);
    for (let t = 0; t < 40; t++) {
      const n = 1 + ((t * 37) % 256);
      for (const g of [shaped(3, n, t + 1), shaped(2, n, t + 1), randomTree(n, t + 1), shaped(4, n, t + 1)]) {
        expect(eliminationFill(g, leafMinimumDegree(g, work))).toBe(g.n + edgeCount(g));
      }
    }
  });

  it("orders a clique with fill n(n+1)/2, the only possible value (closed form)", () => {
    for (const n of [1, 2, 5, 33, 64, 65]) {
      const edges: [number, number][] = [];
      for (let a = 0; a < n; a++) for (let b = a + 1; b < n; b++) edges.push([a, b]);
      const g = graphFromEdges(n, edges);
      expect(eliminationFill(g, leafMinimumDegree(g))).toBe((n * (n + 1)) / 2);
    }
  });

  it("countFill agrees with brute-force elimination on its orderings (so the fill comparison below measures fill)", () => {
    for (let t = 0; t < 20; t++) {
      const g = t % 2 ? geometric(40 + t * 5, 6, t + 3) : shaped(0, 40 + t * 5, t + 3);
      const perm = leafMinimumDegree(g);
      expect(countFill(g, perm).nnzL).toBe(eliminationFill(g, perm));
    }
  });

  it("fill within 10% of approximate minimum degree summed over 50 random graphs", () => {
    // Measured when written: ours / approximate = 1.004 on these 50 graphs.
    let ours = 0, amd = 0;
    for (let t = 0; t < 50; t++) {
      const n = 60 + ((t * 53) % 190);
      const g = t % 2 ? geometric(n, 4 + (t % 5), t + 11) : shaped(0, n, t + 11);
      ours += countFill(g, leafMinimumDegree(g)).nnzL;
      amd += countFill(g, minimumDegreeTrusted(g, defaultDenseThreshold(g.n), true)).nnzL;
    }
    expect(ours).toBeLessThanOrEqual(1.1 * amd);
  });

  it("falls back to approximate minimum degree above the size limit (same ordering)", () => {
    for (const n of [LEAF_LIMIT + 1, 400]) {
      const g = geometric(n, 6, n);
      const expected = minimumDegreeTrusted(g, defaultDenseThreshold(n), true);
      expect(Array.from(leafMinimumDegree(g, leafWork(LEAF_LIMIT)))).toEqual(Array.from(expected));
      expectPermutation(leafMinimumDegree(g), n);
    }
  });
});
