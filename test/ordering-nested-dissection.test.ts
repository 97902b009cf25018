import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { Graph } from "../src/graph/types.js";
import { cubeGraph, expectPermutation, expectTreeConsistent, graphOf, gridGraph } from "./helpers/graphs.js";
import { coordinateCut, validateCoordinates } from "../src/ordering/coordinates.js";
import { leafMinimumDegree } from "../src/ordering/leaf-degree.js";
import { minimumDegree } from "../src/ordering/minimum-degree.js";
import { hierarchyArenas, Int32Arena } from "../src/ordering/nested-dissection/arena.js";
import { coarsen } from "../src/ordering/nested-dissection/coarsen.js";
import { Rng } from "../src/ordering/nested-dissection/rng.js";
import { nestedDissection } from "../src/ordering/nested-dissection/index.js";
import { coverWork, SEPARATOR, vertexSeparatorFromCut } from "../src/ordering/nested-dissection/separator.js";
import { MaxHeap } from "../src/ordering/nested-dissection/heap.js";
import { defaultBisectOptions, multilevelSeparator } from "../src/ordering/nested-dissection/multilevel.js";
import { evaluate, fmWork } from "../src/ordering/nested-dissection/refine.js";
import { refineSeparator, separatorState } from "../src/ordering/nested-dissection/separator-refine.js";
import { inducedSubgraph, weightedGraph } from "../src/ordering/nested-dissection/wgraph.js";
import { countFill } from "../src/symbolic/index.js";

// ---------- graphs ----------
const star = (n: number) => graphOf(n, (e) => { for (let i = 1; i < n; i++) e(0, i); });
const path = (n: number) => graphOf(n, (e) => { for (let i = 1; i < n; i++) e(i - 1, i); });
const clique = (n: number) => graphOf(n, (e) => { for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) e(i, j); });

// ---------- checks ----------
const leafOrder = (g: Graph, halo: number) => leafMinimumDegree(g, undefined, halo);
const nd = (g: Graph, seed = 1, leafSize?: number) => nestedDissection(g, { orderLeaf: leafOrder, seed, leafSize });

/** nnz(L) and flops Σ c_j² from the symbolic module's column counts. */
function factorStats(g: Graph, perm: Int32Array): { nnz: number; flops: number } {
  const { nnzL, flops } = countFill(g, perm);
  return { nnz: nnzL, flops };
}

const randomGraph = fc.integer({ min: 0, max: 400 }).chain((n) => fc.tuple(
  fc.constant(n), fc.array(fc.tuple(fc.nat(Math.max(0, n - 1)), fc.nat(Math.max(0, n - 1))), { maxLength: 3 * n }), fc.integer()));

describe("nested dissection: valid orderings on any graph", () => {
  it("returns a permutation with a consistent separator tree (property, random sparse graphs)", () => {
    fc.assert(fc.property(randomGraph, ([n, edges, seed]) => {
      const g = graphOf(n, (e) => { for (const [a, b] of edges) e(a, b); });
      const r = nestedDissection(g, { orderLeaf: leafOrder, seed, leafSize: 16 });
      expectPermutation(r.permutation, n);
      expectTreeConsistent(g, r.permutation, r.separatorTree!);
    }), { numRuns: 60 });
  });

  it("handles adversarial shapes: n = 0, 1, stars, paths, cliques, isolated vertices, many components", () => {
    const many = graphOf(3000, (e) => { for (let c = 0; c < 1000; c++) { e(3 * c, 3 * c + 1); } });
    const shapes: Graph[] = [graphOf(0, () => {}), graphOf(1, () => {}), star(5000), path(20000), clique(300),
      graphOf(500, () => {}), many];
    for (const g of shapes) {
      const r = nd(g, 1, 32);
      expectPermutation(r.permutation, g.n);
      expectTreeConsistent(g, r.permutation, r.separatorTree!);
    }
  });

  it("is deterministic for a seed and varies with it", () => {
    const g = gridGraph(60);
    expect(nd(g, 7).permutation).toEqual(nd(g, 7).permutation);
    expect(nd(g, 7).permutation).not.toEqual(nd(g, 8).permutation);
  });

  it("respects vertex weights (a heavy half is not split evenly by count)", () => {
    const g = gridGraph(40);
    const w = new Int32Array(g.n).fill(1);
    for (let v = 0; v < g.n; v++) if (v % 40 < 10) w[v] = 10;
    const r = nestedDissection(g, { orderLeaf: leafOrder, vertexWeights: w, leafSize: 64 });
    const t = r.separatorTree!;
    const root = t.count - 1;
    // Weight-balanced children: each child's weight within [0.25, 0.75] of the total (loose bound, common practice).
    const total = w.reduce((a, b) => a + b, 0);
    let children = 0;
    for (let i = 0; i < t.count; i++) {
      if (t.parent[i] !== root) continue;
      children++;
      let wi = 0;
      for (let k = t.first[i]; k < t.end[i]; k++) wi += w[r.permutation[k]];
      expect(wi / total).toBeLessThan(0.75);
    }
    expect(children).toBeGreaterThanOrEqual(2); // the root was really cut, so the loop checked something
  });
});

describe("nested dissection: separators", () => {
  // A k×k grid is split by a line of k vertices, a k³ grid by a plane of k² (common practice);
  // the top separator found must be within 25 % of that.
  it("finds a top separator close to a grid line (2-D) and a grid plane (3-D)", () => {
    for (const [g, bound] of [[gridGraph(64), 64], [cubeGraph(14), 14 * 14]] as const) {
      const t = nd(g).separatorTree!;
      const root = t.count - 1;
      expect(t.parent[root]).toBe(-1);
      const size = t.end[root] - t.separatorFirst[root];
      expect(size).toBeGreaterThan(0);
      expect(size).toBeLessThanOrEqual(1.25 * bound);
    }
  });

  // The refinement uses no random numbers, so with the same seed the first start gives the
  // same separator with or without a second one, and keeping the lighter of two can only
  // help: a check of the bookkeeping between the two runs (definition of the choice).
  it("a second start never gives a heavier separator than the first start alone, and both are separators (property, grids with holes)", () => {
    fc.assert(fc.property(fc.integer({ min: 25, max: 40 }), fc.integer({ min: 1, max: 1000 }), fc.double({ min: 0, max: 0.3, noNaN: true }), (k, seed, holes) => {
      const mask = new Rng(seed);
      const open = Uint8Array.from({ length: k * k }, () => (mask.below(1000) >= 1000 * holes ? 1 : 0));
      const g = weightedGraph(graphOf(k * k, (e) => {
        for (let v = 0; v < k * k; v++) {
          if (!open[v]) continue;
          if (v % k + 1 < k && open[v + 1]) e(v, v + 1);
          if (v + k < k * k && open[v + k]) e(v, v + k);
        }
      }));
      const weight = (label: Int8Array) => separatorState(g, label).weight[2];
      const one = multilevelSeparator(g, new Rng(seed), { ...defaultBisectOptions, secondStart: 0 }, fmWork(g.n, g.neighbours.length));
      const two = multilevelSeparator(g, new Rng(seed), { ...defaultBisectOptions, secondStartAbove: 0 }, fmWork(g.n, g.neighbours.length));
      for (const label of [one, two]) {
        for (let v = 0; v < g.n; v++) for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) {
          expect(label[v] + label[g.neighbours[p]]).not.toBe(1); // no edge joins part 0 to part 1
        }
      }
      expect(weight(two)).toBeLessThanOrEqual(weight(one));
    }), { numRuns: 6 });
  });

  // A 45° staircase cutting off a corner triangle that holds a third of a k×k 5-point grid
  // needs one vertex per row it crosses, about √(2/3)·k ≈ 0.82k (geometry, closed form):
  // lighter than the middle line of k vertices and within the allowed imbalance. The second
  // start, grown to 35 % of the weight, finds such cuts; the first alone mostly slides to the
  // middle (3 of 8 seeds lighter than k without it, measured with the earlier shared stream). With the random
  // stream drawn per piece, 11 of these 16 seeds (17 of seeds 1–24) cut lighter than k.
  it("often cuts a corner off a grid, more lightly than the middle line (seeds 1–16)", () => {
    const k = 100, g = gridGraph(k);
    const sizes = Array.from({ length: 16 }, (_, i) => {
      const t = nd(g, i + 1).separatorTree!;
      return t.end[t.count - 1] - t.separatorFirst[t.count - 1];
    });
    for (const size of sizes) expect(size).toBeLessThanOrEqual(k);
    expect(sizes.filter((size) => size < k).length).toBeGreaterThanOrEqual(8);
    expect(Math.min(...sizes)).toBeGreaterThanOrEqual(Math.floor(0.6 * k)); // no cut is much below the corner bound
  });

  it("gives consistent trees with coordinate bisection, plain and refined", () => {
    const k = 50;
    const g = gridGraph(k);
    const xy = new Float64Array(2 * g.n);
    for (let v = 0; v < g.n; v++) { xy[2 * v] = (v % k) + 0.1 * Math.sin(v); xy[2 * v + 1] = Math.floor(v / k); }
    for (const coordinateMode of ["plain", "refine"] as const) {
      const r = nestedDissection(g, { orderLeaf: leafOrder, coordinates: validateCoordinates(xy, g.n), coordinateMode });
      expectPermutation(r.permutation, g.n);
      expectTreeConsistent(g, r.permutation, r.separatorTree!);
    }
  });
});

describe("nested dissection: fill and work", () => {
  // George 1973, SIAM J. Numer. Anal. 10(2), for a k×k 9-point mesh: storage ≈ (31/4) k² log₂ k and
  // multiplications ≈ (829/84) k³ to leading order (from memory). We take multiplications ≈ Σ c_j²/2
  // (common practice). Loose band: lower-order terms and a non-ideal dissection both move the ratio.
  it.each([127, 255])("9-point k×k mesh, k = %i, lies within a loose band of George's leading terms", (k) => {
    const g = gridGraph(k, true);
    const s = factorStats(g, nd(g).permutation);
    const storage = s.nnz / ((31 / 4) * k * k * Math.log2(k));
    const work = s.flops / 2 / ((829 / 84) * k ** 3);
    expect(storage).toBeGreaterThan(0.4);
    expect(storage).toBeLessThan(1.5);
    expect(work).toBeGreaterThan(0.4);
    expect(work).toBeLessThan(2.5);
  });

  it("beats minimum degree on a 2-D 5-point grid (k = 200): no more fill, less work", () => {
    // Nested dissection is asymptotically optimal on 2-D grids (George 1973; Hoffman, Martin & Rose 1973).
    const g = gridGraph(200);
    const a = factorStats(g, nd(g).permutation);
    const b = factorStats(g, minimumDegree(g));
    expect(a.nnz).toBeLessThanOrEqual(b.nnz * 1.02);
    expect(a.flops).toBeLessThan(0.95 * b.flops);
  });

  it("does much less work than minimum degree on a 3-D 7-point grid (k = 25)", () => {
    const g = cubeGraph(25);
    const a = factorStats(g, nd(g).permutation);
    const b = factorStats(g, minimumDegree(g));
    expect(a.flops).toBeLessThan(0.8 * b.flops);
  });
});

describe("nested dissection: edge cut to vertex separator (König cover) with a reused workspace", () => {
  /** Smallest vertex cover of the cut edges by exhaustive search over subsets of the boundary (outside reference: brute force). */
  function bruteCover(g: Graph, label: Int8Array): number {
    const cut: Array<[number, number]> = [];
    for (let v = 0; v < g.n; v++) for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) {
      const u = g.neighbours[p];
      if (v < u && label[v] !== label[u]) cut.push([v, u]);
    }
    const ends = [...new Set(cut.flat())];
    let best = ends.length;
    for (let mask = 0; mask < 1 << ends.length; mask++) {
      const chosen = new Set(ends.filter((_, i) => (mask >> i) & 1));
      if (chosen.size < best && cut.every(([a, b]) => chosen.has(a) || chosen.has(b))) best = chosen.size;
    }
    return best;
  }

  it("separates, is a minimum cover (König's theorem, brute force on small cuts) and leaves the workspace clean (property)", () => {
    const small = fc.integer({ min: 2, max: 14 }).chain((n) => fc.tuple(
      fc.constant(n), fc.array(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: 2 * n }), fc.array(fc.boolean(), { minLength: n, maxLength: n })));
    const work = coverWork(14); // one workspace for every run, as the dissection reuses it
    fc.assert(fc.property(small, ([n, edges, side]) => {
      const plain = graphOf(n, (e) => { for (const [a, b] of edges) e(a, b); });
      const g = weightedGraph(plain);
      const label = Int8Array.from(side, (s) => (s ? 1 : 0));
      const expected = bruteCover(plain, label);
      vertexSeparatorFromCut(g, label, work);
      let size = 0;
      for (let v = 0; v < n; v++) {
        if (label[v] === SEPARATOR) size++;
        for (let p = plain.offsets[v]; p < plain.offsets[v + 1]; p++) {
          const u = plain.neighbours[p];
          expect(label[v] === 0 && label[u] === 1).toBe(false); // no edge left between the parts
        }
      }
      expect(size).toBe(expected);
      expect(work.mate.every((x) => x === -1)).toBe(true);
      expect(work.stamp.every((x) => x === -1)).toBe(true);
    }), { numRuns: 200 });
  });

  it("gives the same separator from the refinement's boundary list as from its own scan (property)", () => {
    const small = fc.integer({ min: 2, max: 30 }).chain((n) => fc.tuple(
      fc.constant(n), fc.array(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: 3 * n }), fc.array(fc.boolean(), { minLength: n, maxLength: n })));
    const work = coverWork(30);
    const fm = fmWork(30, 200);
    fc.assert(fc.property(small, ([n, edges, side]) => {
      const g = weightedGraph(graphOf(n, (e) => { for (const [a, b] of edges) e(a, b); }));
      const scanned = Int8Array.from(side, (s) => (s ? 1 : 0));
      const listed = scanned.slice();
      evaluate(g, listed, fm); // fills fm.boundary; FM moves leave it unsorted, so hand it over reversed
      const list = fm.boundary.slice(0, fm.boundaryCount).reverse();
      vertexSeparatorFromCut(g, scanned, work);
      vertexSeparatorFromCut(g, listed, work, { list, count: list.length });
      expect(Array.from(listed)).toEqual(Array.from(scanned));
    }), { numRuns: 200 });
  });
});

describe("nested dissection: FM priority queues", () => {
  type Op = { kind: "push" | "update" | "remove" | "pop" | "clear"; v: number; k: number };
  const ops = (n: number, lo: number, hi: number) => fc.array(fc.record({
    kind: fc.constantFrom("push", "push", "update", "update", "remove", "pop", "clear"),
    v: fc.nat(n - 1), k: fc.integer({ min: lo, max: hi }),
  }), { maxLength: 120 }) as fc.Arbitrary<Op[]>;

  it("binary heap: top key is the largest key (property; reference: a scan of a plain list)", () => {
    const n = 12;
    fc.assert(fc.property(ops(n, -50, 50), (list) => {
      const h = new MaxHeap(n); // fresh per run, so a shrunk counterexample starts clean
      const ref = new Map<number, number>();
      for (const { kind, v, k } of list) {
        if (kind === "push" && !ref.has(v)) { h.push(v, k); ref.set(v, k); }
        if (kind === "update" && ref.has(v)) { h.update(v, k); ref.set(v, k); }
        if (kind === "remove") { h.remove(v); ref.delete(v); }
        if (kind === "pop" && ref.size > 0) { const u = h.pop(); expect(ref.get(u)).toBe(Math.max(...ref.values())); ref.delete(u); }
        if (kind === "clear") { h.clear(); ref.clear(); }
        expect(h.size).toBe(ref.size);
        if (ref.size > 0) expect(h.topKey()).toBe(Math.max(...ref.values()));
      }
    }), { numRuns: 300 });
  });

  it("separator FM keeps a separator, true weights, and ends no worse than it started (property, unit and heavy vertex weights)", () => {
    const small = fc.integer({ min: 2, max: 40 }).chain((n) => fc.tuple(
      fc.constant(n), fc.array(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: 3 * n }),
      fc.array(fc.boolean(), { minLength: n, maxLength: n }), fc.array(fc.integer({ min: 1, max: 40 }), { minLength: n, maxLength: n }), fc.boolean()));
    const fm = fmWork(40, 300);
    const cover = coverWork(40);
    fc.assert(fc.property(small, ([n, edges, side, weights, unit]) => {
      const plain = graphOf(n, (e) => { for (const [a, b] of edges) e(a, b); });
      const g = weightedGraph(plain, unit ? undefined : Int32Array.from(weights));
      const label = Int8Array.from(side, (s) => (s ? 1 : 0));
      vertexSeparatorFromCut(g, label, cover);
      const st = separatorState(g, label);
      const maxPart = Math.ceil(0.6 * g.totalWeight) + g.maxVertexWeight;
      const score = (w: readonly number[]) => [Math.max(0, w[0] - maxPart, w[1] - maxPart), w[2]];
      const before = score(st.weight);
      refineSeparator(g, st, maxPart, 8, fm);
      const recount = [0, 0, 0]; // outside reference: the weights recounted from the labels
      for (let v = 0; v < n; v++) {
        recount[label[v]] += g.vertexWeight[v];
        for (let p = plain.offsets[v]; p < plain.offsets[v + 1]; p++) expect(label[v] + label[plain.neighbours[p]]).not.toBe(1);
      }
      expect(st.weight).toEqual(recount);
      const after = score(st.weight);
      expect(after[0] < before[0] || (after[0] === before[0] && after[1] <= before[1])).toBe(true);
      expect(fm.moved.every((x) => x === 0)).toBe(true);
    }), { numRuns: 300 });
  });
});

describe("nested dissection: induced subgraph", () => {
  it("keeps exactly the edges among the chosen vertices, with their weights (property; outside reference: the edge list filtered by hand)", () => {
    const input = fc.integer({ min: 1, max: 25 }).chain((n) => fc.tuple(
      fc.constant(n), fc.array(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: 3 * n }), fc.array(fc.boolean(), { minLength: n, maxLength: n })));
    fc.assert(fc.property(input, ([n, edges, keep]) => {
      const plain = graphOf(n, (e) => { for (const [a, b] of edges) e(a, b); });
      const g = weightedGraph(plain);
      const chosen = Int32Array.from(keep.flatMap((k, v) => (k ? [v] : [])));
      const localOf = new Int32Array(n).fill(-1);
      const sub = inducedSubgraph(g, chosen, localOf);
      expect(localOf.every((x) => x === -1)).toBe(true);
      const pairs = (a: Int32Array, x: Int32Array, map: (v: number) => number) => {
        const out: string[] = [];
        for (let v = 0; v + 1 < x.length; v++) for (let p = x[v]; p < x[v + 1]; p++) out.push(`${map(v)}-${map(a[p])}`);
        return out.sort();
      };
      const expected = pairs(plain.neighbours, plain.offsets, (v) => v).filter((s) => s.split("-").every((v) => keep[Number(v)]));
      expect(pairs(sub.neighbours, sub.offsets, (v) => chosen[v])).toEqual(expected);
      expect(sub.neighbours.length).toBe(sub.offsets[sub.n]);
      expect(sub.edgeWeight.length).toBe(sub.neighbours.length);
      expect(sub.totalWeight).toBe(chosen.length);
    }), { numRuns: 200 });
  });
});

describe("nested dissection: hierarchy arena", () => {
  it("hands out disjoint arrays, returns trimmed tails, and falls back to fresh arrays when full", () => {
    const arena = new Int32Arena(10);
    const a = arena.take(4).fill(1);
    const b = arena.take(5).fill(2);
    expect(Array.from(a)).toEqual([1, 1, 1, 1]); // b did not overwrite a
    const bt = arena.trim(b, 2);
    expect(bt.length).toBe(2);
    const c = arena.take(4).fill(3); // fits again only because b's tail came back
    expect(c.buffer).toBe(a.buffer);
    expect(Array.from(bt)).toEqual([2, 2]);
    const d = arena.take(1); // 4 + 2 + 4 = 10 used: this one cannot fit
    expect(d.buffer).not.toBe(a.buffer);
    arena.reset();
    expect(arena.take(10).buffer).toBe(a.buffer);
  });
});

describe("nested dissection: coordinate cut", () => {
  it("labels 0 exactly the weighted lower half of the (coordinate, index) order along the widest axis (reference: a full sort, the definition)", () => {
    const problem = fc.integer({ min: 1, max: 120 }).chain((n) => fc.record({
      d: fc.constantFrom(2, 3),
      values: fc.array(fc.integer({ min: 0, max: 6 }), { minLength: 3 * n, maxLength: 3 * n }), // few values: many ties
      weights: fc.array(fc.integer({ min: 1, max: 9 }), { minLength: n, maxLength: n }),
    }));
    fc.assert(fc.property(problem, ({ d, values, weights }) => {
      const n = weights.length;
      const x = Float64Array.from(values.slice(0, d * n));
      const g = weightedGraph({ n, offsets: new Int32Array(n + 1), neighbours: new Int32Array(0) }, Int32Array.from(weights));
      const ids = Int32Array.from({ length: n }, (_, i) => i);
      const label = coordinateCut(g, ids, { dimension: d as 2 | 3, values: x });
      let axis = 0, widest = -1;
      for (let a = 0; a < d; a++) {
        const col = Array.from({ length: n }, (_, i) => x[i * d + a]);
        if (Math.max(...col) - Math.min(...col) > widest) { widest = Math.max(...col) - Math.min(...col); axis = a; }
      }
      const order = ids.slice().sort((a, b) => x[a * d + axis] - x[b * d + axis] || a - b);
      let before = 0;
      for (const v of order) {
        expect(label[v]).toBe(before < g.totalWeight / 2 ? 0 : 1);
        before += weights[v];
      }
    }), { numRuns: 300 });
  });
});

describe("nested dissection: 9-point grids", () => {
  it("heavy-edge matching breaks weight ties by common neighbours: a 9-point grid pairs along its axes (reference: brute-force neighbour sets)", () => {
    const k = 60;
    const g = gridGraph(k, true);
    const nb = (v: number) => new Set(g.neighbours.subarray(g.offsets[v], g.offsets[v + 1]));
    const common = (a: number, b: number) => [...nb(a)].filter((x) => nb(b).has(x)).length;
    const v = 30 * k + 30; // an interior vertex: axis edges share 4 neighbours, diagonal edges 2
    expect([common(v, v + 1), common(v, v + k), common(v, v + k + 1), common(v, v + k - 1)]).toEqual([4, 4, 2, 2]);
    for (const seed of [1, 2, 3]) {
      const levels = coarsen(weightedGraph(g), new Rng(seed), 100, hierarchyArenas(g.n, g.neighbours.length));
      const coarseOf = levels[0].coarseOf;
      const first = new Int32Array(g.n).fill(-1);
      let pairs = 0;
      let diagonal = 0;
      for (let u = 0; u < g.n; u++) {
        const w = first[coarseOf[u]];
        if (w < 0) { first[coarseOf[u]] = u; continue; }
        pairs++;
        if (u - w !== 1 && u - w !== k) diagonal++;
      }
      // ties broken at random would pair about half of them diagonally (8 equal edges, 4 diagonal)
      expect(pairs).toBeGreaterThan(0.4 * g.n);
      expect(diagonal).toBeLessThan(0.05 * pairs);
    }
  });

  it("separator FM slides a straight separator of a 9-point strip towards balance (reference: row counts of the strip)", () => {
    const W = 200;
    const H = 40; // the separator (W vertices) is longer than the FM's patience on n = W·H vertices
    const strip = graphOf(W * H, (e) => {
      for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) {
        const v = y * W + x;
        if (x + 1 < W) e(v, v + 1);
        if (y + 1 < H) e(v, v + W);
        if (x + 1 < W && y + 1 < H) { e(v, v + W + 1); e(v + 1, v + W); }
      }
    });
    const g = weightedGraph(strip);
    const label = new Int8Array(W * H);
    for (let v = 0; v < W * H; v++) { const y = Math.floor(v / W); label[v] = y < 5 ? 0 : y === 5 ? 2 : 1; }
    const st = separatorState(g, label);
    expect(st.weight).toEqual([5 * W, 34 * W, W]);
    refineSeparator(g, st, Math.ceil(0.8 * W * H), 8, fmWork(W * H, strip.neighbours.length));
    // every move of a one-row shift leaves W or W + 2 separator vertices; a balanced straight row splits 19·W / 20·W
    expect(st.weight[2]).toBeLessThanOrEqual(W);
    expect(Math.min(st.weight[0], st.weight[1])).toBeGreaterThanOrEqual(15 * W);
  });
});
