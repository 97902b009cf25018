// Symbolic analysis speed: natural order of a 1000×1000 5-point grid (n = 10^6)
// and of a 100³ 7-point grid. Target (issue 2): linear growth, well under 2 s at n = 10^6.
// Reports graph + elimination tree + counts + supernodes + structure time (ordering excluded).
import { analyze } from "../dist/index.js";
import { grid2d, grid3d, median, table } from "./common.mjs";

const rows = [];
for (const [label, make] of [["2-D 250²", () => grid2d(250)], ["2-D 500²", () => grid2d(500)], ["2-D 1000²", () => grid2d(1000)], ["3-D 50³", () => grid3d(50)], ["3-D 100³", () => grid3d(100)]]) {
  const A = make();
  const times = [];
  let a;
  for (let r = 0; r < 3; r++) {
    const t0 = performance.now();
    a = analyze(A, { ordering: "natural" });
    times.push((performance.now() - t0) / 1000 - a.stats.orderingSeconds);
  }
  const s = median(times);
  rows.push({ problem: label, n: a.stats.n, nnzL: a.stats.nnzL, supernodes: a.stats.supernodes, "symbolic s": s, "nodes/s": Math.round(a.stats.n / s) });
}
table(rows);
