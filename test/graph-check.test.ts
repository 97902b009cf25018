// Tests of the structural graph check (src/graph/check.ts).
// Outside reference: the definition of a well-formed adjacency (offsets from 0,
// non-decreasing, within the neighbour array; each list strictly ascending, in
// 0..n−1, without the vertex itself; every edge listed by both ends), evaluated
// here by brute force with a set of edges.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { checkGraph } from "../src/graph/check.js";
import { InputError } from "../src/errors.js";
import type { Graph } from "../src/graph/types.js";
import { graphFromEdges } from "./helpers/graphs.js";

/** The definition, entry by entry, with a set of directed edges for the symmetry. */
function wellFormed(g: Graph): boolean {
  const { n, offsets, neighbours } = g;
  if (offsets[0] !== 0 || offsets[n] > neighbours.length) return false;
  for (let v = 0; v < n; v++) if (offsets[v + 1] < offsets[v]) return false;
  const edges = new Set<string>();
  for (let v = 0; v < n; v++) {
    for (let p = offsets[v]; p < offsets[v + 1]; p++) {
      const u = neighbours[p];
      if (u < 0 || u >= n || u === v) return false;
      if (p > offsets[v] && u <= neighbours[p - 1]) return false;
      edges.add(`${v},${u}`);
    }
  }
  for (const e of edges) {
    const [v, u] = e.split(",");
    if (!edges.has(`${u},${v}`)) return false;
  }
  return true;
}

/** A random graph, then (sometimes) one corruption of its arrays. */
const corruptedGraph = fc
  .record({
    n: fc.integer({ min: 1, max: 9 }),
    edges: fc.array(fc.tuple(fc.nat(8), fc.nat(8)), { maxLength: 20 }),
    kind: fc.integer({ min: 0, max: 5 }),
    at: fc.nat(40),
    value: fc.integer({ min: -2, max: 10 }),
  })
  .map(({ n, edges, kind, at, value }): Graph => {
    const g = graphFromEdges(n, edges.map(([a, b]) => [a % n, b % n] as [number, number]));
    const offsets = g.offsets.slice();
    let neighbours = g.neighbours.slice();
    const m = neighbours.length;
    if (kind === 1 && m > 0) neighbours[at % m] = value; // any value in any slot
    if (kind === 2 && m > 1) {
      const p = at % (m - 1); // swap two adjacent entries
      [neighbours[p], neighbours[p + 1]] = [neighbours[p + 1], neighbours[p]];
    }
    if (kind === 3) offsets[at % (n + 1)] = Math.max(0, value); // any offset
    if (kind === 4 && m > 0) {
      // drop one entry (one direction of an edge)
      const p = at % m;
      neighbours = Int32Array.from([...neighbours.subarray(0, p), ...neighbours.subarray(p + 1)]);
      for (let v = 0; v < n; v++) if (offsets[v + 1] > p) offsets[v + 1]--;
    }
    if (kind === 5) neighbours = neighbours.subarray(0, Math.max(0, m - 1)); // neighbour array too short
    return { n, offsets, neighbours };
  });

describe("checkGraph", () => {
  it("throws InputError exactly on graphs that break the definition (random graphs, one corruption)", () => {
    let bad = 0;
    fc.assert(
      fc.property(corruptedGraph, (g) => {
        const ok = wellFormed(g);
        if (!ok) bad++;
        if (ok) expect(() => checkGraph(g, "t")).not.toThrow();
        else expect(() => checkGraph(g, "t")).toThrow(InputError);
      }),
      { numRuns: 2000, seed: 11 },
    );
    expect(bad).toBeGreaterThan(200); // the corruptions do produce malformed graphs
  });

  it("names an entry that breaks the definition, out-of-range entries before missing reverse edges", () => {
    // lists: 0: [1], 1: [0, 2], 2: [9]; 9 is out of range, and 2 does not list 1 back
    const g: Graph = { n: 4, offsets: Int32Array.of(0, 1, 3, 4, 4), neighbours: Int32Array.of(1, 0, 2, 9) };
    expect(() => checkGraph(g, "t")).toThrow(/vertex 2 lists neighbour 9, outside 0..3/);
    // lists: 0: [1, 2], 1: [0], 2: [1]; by hand: 2 lists 1 but 1 does not list 2
    const h: Graph = { n: 3, offsets: Int32Array.of(0, 2, 3, 4), neighbours: Int32Array.of(1, 2, 0, 1) };
    expect(() => checkGraph(h, "t")).toThrow(/not symmetric: vertex 2 lists 1 but 1 does not list 2/);
  });
});
