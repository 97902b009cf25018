// Tests of reverse Cuthill–McKee (Cuthill & McKee 1969; George & Liu 1979 start vertex).
// Outside references: the bandwidth of a path is 1 and of the k×k grid graph is k
// (Chvátalová 1975, "Optimal labelling of a product of two paths", Discrete Math. 11;
// from memory), and the definition of a permutation and of connected components.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { reverseCuthillMcKee } from "../src/ordering/rcm.js";
import { InputError } from "../src/errors.js";
import type { Graph } from "../src/graph/types.js";
import { expectPermutation, graphFromEdges } from "./helpers/graphs.js";


/** k×k 5-point grid with vertex labels scrambled by `label` (old grid index → vertex). */
function grid(k: number, label: (v: number) => number = (v) => v): Graph {
  const edges: [number, number][] = [];
  for (let y = 0; y < k; y++) {
    for (let x = 0; x < k; x++) {
      const v = y * k + x;
      if (x + 1 < k) edges.push([label(v), label(v + 1)]);
      if (y + 1 < k) edges.push([label(v), label(v + k)]);
    }
  }
  return graphFromEdges(k * k, edges);
}


/** max |pos(u) − pos(v)| over edges: the half-bandwidth of P·A·Pᵀ (definition). */
function bandwidth(g: Graph, perm: Int32Array): number {
  const pos = new Int32Array(g.n);
  perm.forEach((v, k) => (pos[v] = k));
  let b = 0;
  for (let v = 0; v < g.n; v++) {
    for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) b = Math.max(b, Math.abs(pos[v] - pos[g.neighbours[p]]));
  }
  return b;
}

/** Component id of every vertex by union–find (independent of the BFS under test). */
function components(g: Graph): Int32Array {
  const root = Int32Array.from({ length: g.n }, (_, i) => i);
  const find = (x: number): number => (root[x] === x ? x : (root[x] = find(root[x])));
  for (let v = 0; v < g.n; v++) for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) root[find(v)] = find(g.neighbours[p]);
  return Int32Array.from({ length: g.n }, (_, i) => find(i));
}

const randomGraph = fc.integer({ min: 0, max: 80 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    edges: n === 0 ? fc.constant([] as [number, number][]) : fc.array(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: 2 * n }),
  }),
);

describe("reverseCuthillMcKee", () => {
  it("returns a permutation that keeps every connected component contiguous (property)", () => {
    fc.assert(
      fc.property(randomGraph, ({ n, edges }) => {
        const g = graphFromEdges(n, edges);
        const perm = reverseCuthillMcKee(g);
        expectPermutation(perm, n);
        expect([...reverseCuthillMcKee(g)]).toEqual([...perm]); // deterministic
        const comp = components(g);
        const closed = new Set<number>();
        for (let k = 0; k < n; k++) {
          if (k > 0 && comp[perm[k]] !== comp[perm[k - 1]]) closed.add(comp[perm[k - 1]]);
          expect(closed.has(comp[perm[k]])).toBe(false);
        }
      }),
      { numRuns: 300 },
    );
  });

  it("handles n = 0, n = 1, isolated vertices, stars, cliques and many components", () => {
    expect(reverseCuthillMcKee({ n: 0, offsets: new Int32Array(1), neighbours: new Int32Array(0) }).length).toBe(0);
    expect([...reverseCuthillMcKee(graphFromEdges(1, []))]).toEqual([0]);
    expectPermutation(reverseCuthillMcKee(graphFromEdges(1000, [])), 1000);
    const n = 100_000;
    const star: [number, number][] = [];
    for (let v = 1; v < n; v++) star.push([0, v]);
    const starPerm = reverseCuthillMcKee(graphFromEdges(n, star));
    expectPermutation(starPerm, n);
    // The search starts at a leaf (least degree); the hub is then second in Cuthill–McKee order, second to last reversed.
    expect(starPerm[n - 2]).toBe(0);
    const clique: [number, number][] = [];
    for (let a = 0; a < 30; a++) for (let b = a + 1; b < 30; b++) clique.push([a, b]);
    expectPermutation(reverseCuthillMcKee(graphFromEdges(30, clique)), 30);
    const pieces: [number, number][] = [];
    for (let c = 0; c < 500; c++) pieces.push([4 * c, 4 * c + 1], [4 * c + 1, 4 * c + 2]);
    expectPermutation(reverseCuthillMcKee(graphFromEdges(2000, pieces)), 2000);
  });

  it("reaches the optimal bandwidth on a path (1) and on a k×k grid (k), whatever the labels", () => {
    const n = 500;
    const shuffle = Int32Array.from({ length: n }, (_, i) => (i * 263) % n); // 263 coprime to 500
    const path = graphFromEdges(n, Array.from({ length: n - 1 }, (_, i) => [shuffle[i], shuffle[i + 1]] as [number, number]));
    expect(bandwidth(path, reverseCuthillMcKee(path))).toBe(1); // bandwidth of a path: 1
    for (const k of [5, 12, 31]) {
      const scramble = (v: number) => (v * 7919) % (k * k); // 7919 is prime, coprime to k²
      for (const g of [grid(k), grid(k, scramble)]) {
        expect(bandwidth(g, reverseCuthillMcKee(g))).toBe(k); // Chvátalová 1975: grid bandwidth k (from memory)
      }
    }
  });

  it("throws InputError on a malformed graph", () => {
    const asym: Graph = { n: 3, offsets: Int32Array.of(0, 1, 2, 2), neighbours: Int32Array.of(1, 2) };
    expect(() => reverseCuthillMcKee(asym)).toThrow(InputError);
    expect(() => reverseCuthillMcKee(asym)).toThrow(/vertex 0 lists 1 but 1 does not list 0/);
    const outOfRange: Graph = { n: 2, offsets: Int32Array.of(0, 1, 2), neighbours: Int32Array.of(1, -1) };
    expect(() => reverseCuthillMcKee(outOfRange)).toThrow(/vertex 1 lists neighbour -1/);
  });
});
