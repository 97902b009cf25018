import { describe, expect, it } from "vitest";
import { AbortedError, InputError } from "../src/errors.js";
import type { Graph } from "../src/graph/types.js";
import { SparseMatrix } from "../src/matrix/sparse.js";
import { expectPermutation, graphOf, gridGraph } from "./helpers/graphs.js";
import { computeOrdering, DISSECTION_THRESHOLD } from "../src/ordering/index.js";
import type { SeparatorTree } from "../src/ordering/types.js";
import { countFill } from "../src/symbolic/index.js";

const grid2 = (k: number): Graph => gridGraph(k);
/** k×k×k nodes, `dof` unknowns per node, all unknowns of nodes within one step (27-point) coupled: elasticity-like. */
function elasticity(k: number, dof: number): Graph {
  const nodes = k * k * k;
  return graphOf(nodes * dof, (e) => {
    for (let v = 0; v < nodes; v++) {
      const x = v % k, y = Math.floor(v / k) % k, z = Math.floor(v / (k * k));
      for (let dz = -1; dz <= 1; dz++) for (let dy = -1; dy <= 1; dy++) for (let dx = -1; dx <= 1; dx++) {
        const X = x + dx, Y = y + dy, Z = z + dz;
        if (X < 0 || Y < 0 || Z < 0 || X >= k || Y >= k || Z >= k) continue;
        const u = (Z * k + Y) * k + X;
        for (let a = 0; a < dof; a++) for (let b = 0; b < dof; b++) e(dof * v + a, dof * u + b);
      }
    }
  });
}
function flops(g: Graph, perm: Int32Array): number {
  return countFill(g, perm).flops;
}
function rangesPartition(t: SeparatorTree, n: number): boolean {
  let covered = 0;
  for (let i = 0; i < t.count; i++) if (t.parent[i] === -1) covered += t.end[i] - t.first[i];
  for (let i = 0; i < t.count; i++) if (t.first[i] > t.separatorFirst[i] || t.separatorFirst[i] > t.end[i]) return false;
  return covered === n;
}

describe("computeOrdering", () => {
  it("runs every named ordering and returns a permutation", () => {
    const g = grid2(30);
    for (const ordering of ["nested-dissection", "minimum-degree", "reverse-cuthill-mckee", "natural"] as const) {
      const r = computeOrdering(g, { ordering });
      expect(r.name).toBe(ordering);
      expectPermutation(r.permutation, g.n);
    }
    expect(Array.from(computeOrdering(g, { ordering: "natural" }).permutation)).toEqual(Array.from({ length: g.n }, (_, i) => i));
  });

  it("defaults to minimum degree for small graphs and nested dissection above the threshold", () => {
    expect(computeOrdering(grid2(10)).name).toBe("minimum-degree");
    const big = grid2(Math.ceil(Math.sqrt(DISSECTION_THRESHOLD)) + 2);
    const r = computeOrdering(big);
    expect(r.name).toBe("nested-dissection");
    expect(r.separatorTree).toBeDefined();
  });

  it("accepts a valid user permutation and names the first bad entry of an invalid one", () => {
    const g = grid2(3);
    const p = Int32Array.from([8, 7, 6, 5, 4, 3, 2, 1, 0]);
    expect(computeOrdering(g, { ordering: p }).permutation).toEqual(p);
    expect(() => computeOrdering(g, { ordering: Int32Array.from([0, 1, 2]) })).toThrow(/length 3, expected n = 9/);
    expect(() => computeOrdering(g, { ordering: Int32Array.from([0, 1, 2, 3, 4, 5, 6, 7, 9]) })).toThrow(/ordering\[8\] = 9 is out of range/);
    expect(() => computeOrdering(g, { ordering: Int32Array.from([0, 1, 2, 3, 4, 5, 6, 1, 8]) })).toThrow(/ordering\[7\] = 1 repeats ordering\[1\]/);
    expect(() => computeOrdering(g, { ordering: Int32Array.from([0, 1, 2, 3, -4, 5, 6, 7, 8]) })).toThrow(InputError);
  });

  it("rejects unknown orderings, bad seeds and bad coordinates with InputError naming the entry", () => {
    const g = grid2(20);
    expect(() => computeOrdering(g, { ordering: "banded" as never })).toThrow(InputError);
    expect(() => computeOrdering(g, { seed: Number.NaN })).toThrow(InputError);
    expect(() => computeOrdering(g, { ordering: "nested-dissection", coordinates: new Float64Array(5) })).toThrow(/coordinates has length 5/);
    const bad = new Float64Array(2 * g.n);
    bad[7] = Number.POSITIVE_INFINITY;
    expect(() => computeOrdering(g, { ordering: "nested-dissection", coordinates: bad })).toThrow(/coordinates\[7\] \(vertex 3, axis 1\)/);
    // Checked for every ordering, as threads are: an ordering that ignores them does not hide the mistake.
    for (const ordering of ["minimum-degree", "reverse-cuthill-mckee", "natural"] as const) {
      expect(() => computeOrdering(g, { ordering, coordinates: new Float64Array(5) })).toThrow(/coordinates has length 5/);
      expect(() => computeOrdering(g, { ordering, coordinates: bad })).toThrow(/coordinates\[7\] \(vertex 3, axis 1\)/);
      expect(() => computeOrdering(g, { ordering, coordinateMode: "exact" as never })).toThrow(/coordinateMode must be/);
    }
  });

  it("a malformed graph given to nested dissection is an InputError, not a crash deep in the dissection", () => {
    // One-directional edge 0→1 (the definition of an undirected adjacency needs both directions).
    const oneWay = { n: 300, offsets: new Int32Array(301).fill(1), neighbours: Int32Array.from([1]) };
    oneWay.offsets[0] = 0;
    expect(() => computeOrdering(oneWay, { ordering: "nested-dissection" })).toThrow(InputError);
    const outOfRange = { n: 3, offsets: Int32Array.from([0, 1, 2, 2]), neighbours: Int32Array.from([1, 7]) };
    expect(() => computeOrdering(outOfRange, { ordering: "nested-dissection" })).toThrow(InputError);
  });

  it("a matrix or a wrongly typed object handed in as the graph is an InputError that says what was expected", () => {
    // The mistake this guards against: passing A itself (analyze takes a matrix, computeOrdering its graph).
    const A = SparseMatrix.fromTriplets(2, 2, Int32Array.of(0, 1), Int32Array.of(0, 1), Float64Array.of(1, 1));
    for (const ordering of ["nested-dissection", "minimum-degree", "reverse-cuthill-mckee", "natural"] as const) {
      expect(() => computeOrdering(A as unknown as Graph, { ordering })).toThrow(/got a sparse matrix; pass adjacencyGraph/);
    }
    const plain = { n: 2, offsets: [0, 1, 2], neighbours: [1, 0] } as unknown as Graph;
    expect(() => computeOrdering(plain)).toThrow(/must be Int32Arrays/);
    expect(() => computeOrdering(null as unknown as Graph)).toThrow(/expected a Graph, got null/);
    expect(() => computeOrdering({ n: 1.5 } as unknown as Graph)).toThrow(/graph.n must be a non-negative integer, got 1.5/);
    // options: null means none; an ordering name where { ordering } was meant is named
    const g = grid2(5);
    expect(Array.from(computeOrdering(g, null as never).permutation)).toEqual(Array.from(computeOrdering(g).permutation));
    expect(() => computeOrdering(g, "minimum-degree" as never)).toThrow(/computeOrdering: options must be an object, got "minimum-degree"/);
  });

  it("stops with AbortedError when the signal is aborted, before or during the dissection", () => {
    const g = grid2(60);
    const before = new AbortController();
    before.abort();
    expect(() => computeOrdering(g, { ordering: "nested-dissection", signal: before.signal })).toThrow(AbortedError);
    const during = new AbortController();
    let calls = 0;
    const onProgress = (f: number) => { calls++; if (f > 0.2) during.abort(); };
    expect(() => computeOrdering(g, { ordering: "nested-dissection", signal: during.signal, onProgress })).toThrow(AbortedError);
    expect(calls).toBeGreaterThan(0);
  });

  it("reports progress from 0 to 1", () => {
    const seen: number[] = [];
    computeOrdering(grid2(40), { ordering: "nested-dissection", onProgress: (f) => seen.push(f) });
    expect(seen.every((f, i) => f >= 0 && f <= 1 && (i === 0 || f >= seen[i - 1]))).toBe(true);
    expect(seen[seen.length - 1]).toBe(1);
  });

  it("orders a 3-dof elasticity pattern through compression: each node's dofs adjacent, tree in original positions", () => {
    const dof = 3;
    const g = elasticity(8, dof);
    const r = computeOrdering(g, { ordering: "nested-dissection" });
    expectPermutation(r.permutation, g.n);
    for (let k = 0; k < g.n; k += dof) {
      const node = Math.floor(r.permutation[k] / dof);
      for (let a = 1; a < dof; a++) expect(Math.floor(r.permutation[k + a] / dof)).toBe(node);
    }
    expect(rangesPartition(r.separatorTree!, g.n)).toBe(true);
    for (let i = 0; i < r.separatorTree!.count; i++) expect(r.separatorTree!.end[i] % dof).toBe(0);
  });

  it("uses coordinates: coordinate bisection gives a valid, competitive ordering of a grid", () => {
    const k = 80;
    const g = grid2(k);
    const xy = new Float64Array(2 * g.n);
    for (let v = 0; v < g.n; v++) { xy[2 * v] = v % k; xy[2 * v + 1] = Math.floor(v / k); }
    const withXY = computeOrdering(g, { ordering: "nested-dissection", coordinates: xy });
    const plain = computeOrdering(g, { ordering: "nested-dissection" });
    expectPermutation(withXY.permutation, g.n);
    expect(flops(g, withXY.permutation)).toBeLessThan(1.3 * flops(g, plain.permutation));
  });

  it("handles the empty graph and a single vertex", () => {
    const empty = graphOf(0, () => {});
    for (const ordering of ["nested-dissection", "minimum-degree", "reverse-cuthill-mckee", "natural"] as const) {
      expect(computeOrdering(empty, { ordering }).permutation.length).toBe(0);
      expect(Array.from(computeOrdering(graphOf(1, () => {}), { ordering }).permutation)).toEqual([0]);
    }
  });
});
