// Factorization time and store size of two or more builds, in one process
// with the runs interleaved (build 1, build 2, ..., build 1, ...) so that the
// load of the shared machine falls on all of them alike. Medians of RUNS runs
// (default 5, after WARMUPS = 1 untimed) of `refactor` per build, problem and
// kernel set: wall seconds (FactorStats.seconds) and process CPU seconds,
// the steadier figure when other jobs share the cores.
//
//   npm run build && cp -r dist /tmp/before && <change> && npm run build
//   RUNS=5 KERNELS=js,auto node bench/factor-builds.mjs /tmp/before/index.js ../dist/index.js
//
// Without arguments it measures the current build alone. Problems: 3-D 7-point
// 40³, elasticity 16³ bricks, 2-D 5-point 500² (nested dissection; Cholesky, or
// L·D·Lᵀ with METHOD=ldlt; add e.g. saddle2d:300 to PROBLEMS).
import { pathToFileURL } from "node:url";
import { resolve } from "node:path";
import { median } from "./common.mjs";

const RUNS = Number(process.env.RUNS ?? 5);
const WARMUPS = Number(process.env.WARMUPS ?? 1);
const KERNELS = (process.env.KERNELS ?? "auto").split(",");
const PROBLEMS = (process.env.PROBLEMS ?? "grid3d:40,elasticity3d:16,grid2d:500").split(",");
const METHOD = process.env.METHOD ?? "cholesky"; // or "ldlt"
const paths = process.argv.slice(2);
const builds = paths.length ? await Promise.all(paths.map((p) => import(pathToFileURL(resolve(p)).href)))
  : [await import("../dist/index.js")];
const names = paths.length ? paths : ["../dist/index.js"];
const mib = (b) => (b / 2 ** 20).toFixed(1);

for (const spec of PROBLEMS) {
  const [gen, size] = spec.split(":");
  for (const kernels of KERNELS) {
    // Each build analyses and factors with its own classes; the orderings are deterministic.
    const runs = builds.map((lib) => {
      const A = lib[gen](Number(size)).matrix;
      const analysis = lib.analyze(A);
      return { A, analysis, F: analysis.factor(A, { kernels, method: METHOD }), seconds: [], cpu: [] };
    });
    const nnzL = runs.map((r) => r.analysis.stats.nnzL);
    if (new Set(nnzL).size !== 1) throw new Error(`${spec}: the builds analyse differently (nnz(L) ${nnzL.join(", ")})`);
    for (let w = 0; w < WARMUPS; w++) for (const x of runs) x.F.refactor(x.A); // let the JIT settle
    for (let r = 0; r < RUNS; r++) {
      for (const x of runs) {
        const c0 = process.cpuUsage();
        x.F.refactor(x.A);
        const c = process.cpuUsage(c0);
        x.seconds.push(x.F.stats.seconds);
        x.cpu.push((c.user + c.system) / 1e6);
      }
    }
    const base = median(runs[0].seconds), baseCpu = median(runs[0].cpu);
    console.log(`${spec} ${METHOD} ${kernels} (${runs[0].F.stats.kernels}) n=${runs[0].A.ncols} nnz(L)=${nnzL[0]}`);
    runs.forEach((x, i) => {
      const s = x.F.stats, med = median(x.seconds), cpu = median(x.cpu);
      console.log(`  ${names[i]}: factor ${med.toFixed(3)} s wall (runs ${x.seconds.map((t) => t.toFixed(2)).join(" ")})` +
        ` ratio ${(med / base).toFixed(3)}, ${cpu.toFixed(3)} s CPU ratio ${(cpu / baseCpu).toFixed(3)}` +
        ` | L ${mib(s.factorBytes)} MiB, store ${mib(s.peakBytes)} MiB` +
        ` (stack + scratch ${mib(s.peakBytes - s.factorBytes)} MiB)`);
    });
  }
}
