// Minimum degree and reverse Cuthill–McKee on 2-D 5-point grids (k = 300, 1000),
// a 2-D 9-point grid and a 3-D 7-point grid. Target (issue 4): minimum degree of
// the 1000² grid under 1.5 s. Ordering time is the median of `runs` calls of the
// ordering alone on the adjacency graph (wall and process CPU time, since the
// machine is shared); nnz(L) and flops (Σ c_j², issue conventions) come from
// analyze() with the permutation handed in.
// Run: npm run build && node bench/ordering-md.mjs [runs]
import { SparseMatrix, adjacencyGraph, analyze, minimumDegree, reverseCuthillMcKee } from "../dist/index.js";
import { grid2d, grid3d, measure, table } from "./common.mjs";

const runs = Number(process.argv[2] ?? 3);

/** 9-point stencil on a k×k grid, lower triangle. */
function grid9(k) {
  const r = [], c = [], v = [];
  for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
    const i = y * k + x;
    r.push(i); c.push(i); v.push(8);
    for (const [dx, dy] of [[1, 0], [-1, 1], [0, 1], [1, 1]]) {
      const xx = x + dx, yy = y + dy;
      if (xx >= 0 && xx < k && yy < k) { r.push(yy * k + xx); c.push(i); v.push(-1); }
    }
  }
  return SparseMatrix.fromTriplets(k * k, k * k, Int32Array.from(r), Int32Array.from(c), Float64Array.from(v));
}

const rows = [];
const problems = [
  ["2-D 5-pt 300²", () => grid2d(300)],
  ["2-D 5-pt 1000²", () => grid2d(1000)],
  ["2-D 9-pt 300²", () => grid9(300)],
  ["3-D 7-pt 40³", () => grid3d(40)],
];
for (const [label, make] of problems) {
  const A = make();
  const g = adjacencyGraph(A);
  for (const [name, order] of [["minimum degree", minimumDegree], ["reverse Cuthill-McKee", reverseCuthillMcKee]]) {
    const m = measure(() => order(g), runs);
    const s = analyze(A, { ordering: m.result }).stats;
    rows.push({ problem: label, ordering: name, n: s.n, nnzL: s.nnzL, flops: s.flops, "wall s": m.wall, "cpu s": m.cpu });
  }
}
table(rows);
