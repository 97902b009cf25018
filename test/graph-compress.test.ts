import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compressGraph, compressIfSmaller, expandPermutation } from "../src/graph/compress.js";
import type { Graph } from "../src/graph/types.js";
import { graphFromEdges } from "./helpers/graphs.js";

/** Closed neighbourhood N[v] as a sorted string key, computed directly (brute force). */
function closedKey(g: Graph, v: number): string {
  return [v, ...g.neighbours.subarray(g.offsets[v], g.offsets[v + 1])].sort((a, b) => a - b).join(",");
}

const randomGraph = fc.integer({ min: 0, max: 30 }).chain((n) =>
  fc.tuple(fc.constant(n), fc.array(fc.tuple(fc.nat(Math.max(0, n - 1)), fc.nat(Math.max(0, n - 1))), { maxLength: 3 * n })));

/** Random graph with planted twins: each vertex may be copied (same closed neighbourhood). */
const twinGraph = randomGraph.chain(([n, edges]) => fc.tuple(fc.constant(n), fc.constant(edges), fc.array(fc.nat(Math.max(0, n - 1)), { maxLength: n })));

function withTwins(n: number, edges: Array<[number, number]>, copies: number[]): Graph {
  const base = graphFromEdges(n, edges);
  const all: Array<[number, number]> = [...edges];
  let m = n;
  for (const v of n > 0 ? copies : []) {
    const t = m++;
    all.push([t, v]);
    for (let p = base.offsets[v]; p < base.offsets[v + 1]; p++) all.push([t, base.neighbours[p]]);
  }
  return graphFromEdges(m, all.filter(([a, b]) => a < m && b < m));
}

describe("compressGraph", () => {
  it("groups exactly the vertices with equal closed neighbourhoods (property, brute-force reference)", () => {
    fc.assert(fc.property(twinGraph, ([n, edges, copies]) => {
      const g = withTwins(n, edges, copies);
      const c = compressGraph(g);
      const keys = Array.from({ length: g.n }, (_, v) => closedKey(g, v));
      // Definition of indistinguishable vertices (George & Liu 1981): N[u] = N[v] for adjacent u, v.
      for (let u = 0; u < g.n; u++) {
        for (let v = u + 1; v < g.n; v++) {
          const adjacent = keys[u].split(",").includes(String(v));
          const same = adjacent && keys[u] === keys[v];
          expect(c.supervariableOf[u] === c.supervariableOf[v]).toBe(same);
        }
      }
      let total = 0;
      for (let s = 0; s < c.graph.n; s++) {
        total += c.weights[s];
        expect(c.memberOffsets[s + 1] - c.memberOffsets[s]).toBe(c.weights[s]);
      }
      expect(total).toBe(g.n);
    }), { numRuns: 150 });
  });

  it("builds the quotient graph: s ~ t exactly when some members are adjacent", () => {
    fc.assert(fc.property(twinGraph, ([n, edges, copies]) => {
      const g = withTwins(n, edges, copies);
      const c = compressGraph(g);
      const expected = new Set<string>();
      for (let v = 0; v < g.n; v++) {
        for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) {
          const a = c.supervariableOf[v], b = c.supervariableOf[g.neighbours[p]];
          if (a !== b) expected.add(`${a}-${b}`);
        }
      }
      const got = new Set<string>();
      for (let s = 0; s < c.graph.n; s++) {
        const list = Array.from(c.graph.neighbours.subarray(c.graph.offsets[s], c.graph.offsets[s + 1]));
        expect(list).toEqual([...list].sort((x, y) => x - y));
        for (const t of list) got.add(`${s}-${t}`);
      }
      expect(got).toEqual(expected);
    }), { numRuns: 150 });
  });

  it("compresses a 3-dof-per-node elasticity pattern exactly 3:1 (common practice)", () => {
    const k = 6, dof = 3;
    const nodes = k * k * k;
    const edges: Array<[number, number]> = [];
    const id = (x: number, y: number, z: number) => (x * k + y) * k + z;
    for (let x = 0; x < k; x++) for (let y = 0; y < k; y++) for (let z = 0; z < k; z++) {
      for (let dx = -1; dx <= 1; dx++) for (let dy = -1; dy <= 1; dy++) for (let dz = -1; dz <= 1; dz++) {
        const X = x + dx, Y = y + dy, Z = z + dz;
        if (X < 0 || Y < 0 || Z < 0 || X >= k || Y >= k || Z >= k) continue;
        for (let a = 0; a < dof; a++) for (let b = 0; b < dof; b++) edges.push([dof * id(x, y, z) + a, dof * id(X, Y, Z) + b]);
      }
    }
    const c = compressGraph(graphFromEdges(nodes * dof, edges));
    expect(c.graph.n).toBe(nodes);
    expect(Array.from(c.weights).every((w) => w === dof)).toBe(true);
    for (let s = 0; s < nodes; s++) {
      const m = Array.from(c.members.subarray(c.memberOffsets[s], c.memberOffsets[s + 1]));
      expect(m).toEqual([dof * s, dof * s + 1, dof * s + 2]);
    }
  });

  it("expands a compressed ordering to a permutation with each supervariable contiguous", () => {
    const g = withTwins(5, [[0, 1], [1, 2], [2, 3], [3, 4]], [1, 1, 3]);
    const c = compressGraph(g);
    const order = Int32Array.from({ length: c.graph.n }, (_, i) => c.graph.n - 1 - i);
    const p = expandPermutation(c, order);
    expect([...p].sort((a, b) => a - b)).toEqual(Array.from({ length: g.n }, (_, i) => i));
    let k = 0;
    for (const s of order) for (let i = 0; i < c.weights[s]; i++) expect(c.supervariableOf[p[k++]]).toBe(s);
  });

  it("handles n = 0 and a star (no twins among leaves: they are not adjacent)", () => {
    expect(compressGraph({ n: 0, offsets: new Int32Array(1), neighbours: new Int32Array(0) }).graph.n).toBe(0);
    const star = graphFromEdges(50, Array.from({ length: 49 }, (_, i) => [0, i + 1] as [number, number]));
    expect(compressGraph(star).graph.n).toBe(50);
  });

  it("compressIfSmaller gives compressGraph's result when it shrinks enough and null otherwise (property, brute-force class count)", () => {
    fc.assert(fc.property(twinGraph, ([n, edges, copies]) => {
      const g = withTwins(n, edges, copies);
      const classes = new Set(Array.from({ length: g.n }, (_, v) => closedKey(g, v))).size;
      for (const ratio of [0.5, 0.75, 1]) {
        const c = compressIfSmaller(g, ratio);
        if (classes > ratio * g.n) expect(c).toBeNull();
        else expect(c).toEqual(compressGraph(g));
      }
    }), { numRuns: 200 });
  });
});
