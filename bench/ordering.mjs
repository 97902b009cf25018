// Fill-reducing orderings side by side (issue 4): natural, reverse Cuthill–McKee,
// minimum degree, nested dissection (and nested dissection with node
// coordinates where the problem has them) on model and unstructured problems.
// Prints nnz(L) (diagonal included), flops = Σ c_j² (design.md conventions),
// the ordering's wall and process-CPU seconds (median of RUNS runs, default 3, of the
// ordering alone; the machine is shared, so CPU time is the steadier figure),
// flops relative to minimum degree, and "sweeps": the ordering's CPU time in
// units of one breadth-first sweep of the same graph (median of 7), a measure
// that carries across machines and loads. nnz/flops come from analyze() with the
// permutation handed in; natural and RCM are skipped where their factor would
// not fit in memory.
//
//   npm run build && node bench/ordering.mjs            # every problem
//   node bench/ordering.mjs grid2-300 grid3-40          # a selection
//   ONLY=minimum-degree,nested-dissection node bench/ordering.mjs grid2-1000   # some orderings only
//   RUNS=1 ...                                           # one run each (the first call of a process is the slowest)
//   THREADS=1 ...                                        # nested dissection on the calling thread only
// "threads" is the number of threads nested dissection ran on (by default up to
// 4, no more than the cores, for graphs of 100,000 vertices or more); wall
// seconds then fall below CPU seconds, which count every thread.
import { SparseMatrix, adjacencyGraph, analyze, computeOrdering } from "../dist/index.js";
import { measure, sweepSeconds } from "./common.mjs";

const RUNS = Number(process.env.RUNS ?? 3); // medians of several runs: the machine is shared
const SEED = Number(process.env.SEED ?? 1);
const ONLY = process.env.ONLY ? new Set(process.env.ONLY.split(",")) : null;
const THREADS = process.env.THREADS ? { threads: Number(process.env.THREADS) } : {};

/** Lower-triangle matrix with a dominant diagonal from an edge callback (pattern is all that matters here). */
function fromEdges(n, add) {
  const r = [], c = [], v = [];
  const deg = new Float64Array(n);
  add((a, b) => {
    if (a === b) return;
    r.push(Math.max(a, b)); c.push(Math.min(a, b)); v.push(-1); deg[a]++; deg[b]++;
  });
  for (let i = 0; i < n; i++) { r.push(i); c.push(i); v.push(deg[i] + 1); }
  return SparseMatrix.fromTriplets(n, n, Int32Array.from(r), Int32Array.from(c), Float64Array.from(v));
}

/** Edges of the k×k grid (5-point, or 9-point with `nine`). */
function grid2Edges(k, e, nine = false) {
  for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
    const v = y * k + x;
    if (x + 1 < k) e(v, v + 1);
    if (y + 1 < k) e(v, v + k);
    if (nine && x + 1 < k && y + 1 < k) { e(v, v + k + 1); e(v + 1, v + k); }
  }
}

function grid2(k, nine) {
  const xy = new Float64Array(2 * k * k);
  for (let v = 0; v < k * k; v++) { xy[2 * v] = v % k; xy[2 * v + 1] = Math.floor(v / k); }
  return { A: fromEdges(k * k, (e) => grid2Edges(k, e, nine)), xy };
}

function grid3(k) {
  const n = k ** 3, xyz = new Float64Array(3 * n);
  for (let v = 0; v < n; v++) { xyz[3 * v] = v % k; xyz[3 * v + 1] = Math.floor(v / k) % k; xyz[3 * v + 2] = Math.floor(v / (k * k)); }
  const A = fromEdges(n, (e) => {
    for (let v = 0; v < n; v++) {
      if (v % k + 1 < k) e(v, v + 1);
      if (Math.floor(v / k) % k + 1 < k) e(v, v + k);
      if (v + k * k < n) e(v, v + k * k);
    }
  });
  return { A, xy: xyz };
}

/** k³ nodes, 3 unknowns per node, every unknown of nodes within one step (27-point) coupled. */
function elasticity(k) {
  const nodes = k ** 3, n = 3 * nodes, xyz = new Float64Array(3 * n);
  const at = (v) => [v % k, Math.floor(v / k) % k, Math.floor(v / (k * k))];
  for (let u = 0; u < n; u++) xyz.set(at(Math.floor(u / 3)), 3 * u);
  const A = fromEdges(n, (e) => {
    for (let v = 0; v < nodes; v++) {
      const [x, y, z] = at(v);
      for (let dz = 0; dz <= 1; dz++) for (let dy = -1; dy <= 1; dy++) for (let dx = -1; dx <= 1; dx++) {
        if (dz === 0 && (dy < 0 || (dy === 0 && dx < 0))) continue;
        const X = x + dx, Y = y + dy, Z = z + dz;
        if (X < 0 || Y < 0 || X >= k || Y >= k || Z >= k) continue;
        const u = (Z * k + Y) * k + X;
        for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) e(3 * v + a, 3 * u + b);
      }
    }
  });
  return { A, xy: xyz };
}

/** Deterministic uniform numbers (xorshift32) so every run sees the same problems. */
function uniform(seed) {
  let s = seed | 0 || 1;
  return () => { s ^= s << 13; s ^= s >>> 17; s ^= s << 5; return (s >>> 0) / 4294967296; };
}

/** n random points in the unit square, joined when closer than r (average degree about 8). */
function geometric(n) {
  const rand = uniform(12345), xy = new Float64Array(2 * n);
  for (let i = 0; i < 2 * n; i++) xy[i] = rand();
  const r = Math.sqrt(8 / (Math.PI * n)), cells = Math.max(1, Math.floor(1 / r));
  const bucket = new Map();
  const key = (i, j) => i * cells + j;
  for (let v = 0; v < n; v++) {
    const k = key(Math.min(cells - 1, Math.floor(xy[2 * v] * cells)), Math.min(cells - 1, Math.floor(xy[2 * v + 1] * cells)));
    if (!bucket.has(k)) bucket.set(k, []);
    bucket.get(k).push(v);
  }
  const A = fromEdges(n, (e) => {
    for (let v = 0; v < n; v++) {
      const i = Math.min(cells - 1, Math.floor(xy[2 * v] * cells)), j = Math.min(cells - 1, Math.floor(xy[2 * v + 1] * cells));
      for (let di = -1; di <= 1; di++) for (let dj = -1; dj <= 1; dj++) {
        for (const u of bucket.get(key(i + di, j + dj)) ?? []) {
          if (u > v && (xy[2 * u] - xy[2 * v]) ** 2 + (xy[2 * u + 1] - xy[2 * v + 1]) ** 2 < r * r) e(u, v);
        }
      }
    }
  });
  return { A, xy };
}

/**
 * Unstructured-looking P1 mesh: a k×k lattice with jittered points, three
 * circular holes removed, each remaining square split into two triangles
 * along a randomly chosen diagonal; the pattern couples the vertices of each triangle.
 */
function jitteredMesh(k) {
  const rand = uniform(777), id = new Int32Array(k * k).fill(-1), pts = [];
  const holes = [[0.3, 0.3, 0.12], [0.7, 0.6, 0.15], [0.35, 0.75, 0.08]];
  for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
    const px = (x + 0.35 * (rand() - 0.5)) / (k - 1), py = (y + 0.35 * (rand() - 0.5)) / (k - 1);
    if (holes.some(([cx, cy, rr]) => (px - cx) ** 2 + (py - cy) ** 2 < rr * rr)) continue;
    id[y * k + x] = pts.length / 2;
    pts.push(px, py);
  }
  const n = pts.length / 2;
  const A = fromEdges(n, (e) => {
    for (let y = 0; y + 1 < k; y++) for (let x = 0; x + 1 < k; x++) {
      const a = id[y * k + x], b = id[y * k + x + 1], c = id[(y + 1) * k + x], d = id[(y + 1) * k + x + 1];
      if (a < 0 || b < 0 || c < 0 || d < 0) continue;
      const tris = rand() < 0.5 ? [[a, b, d], [a, d, c]] : [[a, b, c], [b, d, c]];
      for (const [p, q, s] of tris) { e(p, q); e(q, s); e(p, s); }
    }
  });
  return { A, xy: Float64Array.from(pts) };
}

const problems = {
  "grid2-100": () => grid2(100), "grid2-300": () => grid2(300), "grid2-1000": () => grid2(1000),
  "grid3-20": () => grid3(20), "grid3-40": () => grid3(40), "grid3-60": () => grid3(60),
  "grid9-255": () => grid2(255, true), "elastic-16": () => elasticity(16),
  "geometric-100k": () => geometric(100000), "mesh-holes-400": () => jitteredMesh(400),
  // shapes that defeat plain dissection: a tree, hubs joined to everything, a grid bordered by dense rows
  "path-1m": () => ({ A: fromEdges(1e6, (e) => { for (let v = 1; v < 1e6; v++) e(v - 1, v); }) }),
  "hubs-100k": () => ({ A: fromEdges(1e5, (e) => { for (let v = 10; v < 1e5; v++) for (let h = 0; h < 10; h++) e(h, v); }) }),
  // a cycle of 20 with a path of 4000 hanging from each vertex, and one vertex joined to all
  "hub-paths-80k": () => ({ A: fromEdges(80021, (e) => { for (let i = 0; i < 20; i++) { e(i, (i + 1) % 20); let prev = i; for (let j = 0; j < 4000; j++) { const v = 20 + i * 4000 + j; e(prev, v); prev = v; } } for (let v = 0; v < 80020; v++) e(80020, v); }) }),
  "bordered-300": () => ({ A: fromEdges(300 * 300 + 2, (e) => { grid2Edges(300, e); for (let v = 0; v < 300 * 300; v++) { e(90000, v); if (v % 2 === 0) e(90001, v); } }) }),
};

/** Orderings whose factor fits comfortably: natural and RCM only up to this many unknowns. */
const BANDED_LIMIT = 100000;

const selected = process.argv.slice(2).length ? process.argv.slice(2) : Object.keys(problems);
const rows = [];
for (const name of selected) {
  const { A, xy } = problems[name]();
  const graph = adjacencyGraph(A);
  const runs = [["minimum-degree", { ordering: "minimum-degree" }], ["nested-dissection", { ordering: "nested-dissection", seed: SEED, ...THREADS }]];
  if (A.ncols <= BANDED_LIMIT) runs.unshift(["natural", { ordering: "natural" }], ["reverse-cuthill-mckee", { ordering: "reverse-cuthill-mckee" }]);
  if (xy && !name.startsWith("grid2-1000")) {
    runs.push(["nd+coordinates", { ordering: "nested-dissection", seed: SEED, coordinates: xy, ...THREADS }]);
    runs.push(["nd+coordinates(plain)", { ordering: "nested-dissection", seed: SEED, coordinates: xy, coordinateMode: "plain", ...THREADS }]);
  }
  let mdFlops = NaN;
  const sweep = sweepSeconds(graph);
  for (const [label, options] of runs) {
    if (ONLY && !ONLY.has(label)) continue;
    const m = measure(() => computeOrdering(graph, options), RUNS);
    const stats = analyze(A, { ordering: m.result.permutation, amalgamation: false }).stats;
    if (label === "minimum-degree") mdFlops = stats.flops;
    const row = {
      problem: name, n: A.ncols, ordering: label, nnzL: stats.nnzL.toExponential(3), flops: stats.flops.toExponential(3),
      "vs MD flops": Number.isNaN(mdFlops) ? "-" : (stats.flops / mdFlops).toFixed(3), "wall s": m.wall.toFixed(2), "cpu s": m.cpu.toFixed(2), sweeps: (m.cpu / sweep).toFixed(0),
      threads: m.result.threads ?? 1,
    };
    rows.push(row);
    console.log(Object.values(row).join("\t"));
  }
}
console.log("\n" + Object.keys(rows[0]).join("\t"));
for (const r of rows) console.log(Object.values(r).join("\t"));
