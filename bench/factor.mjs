// Numeric factorization benchmark (issue 3). Run `npm run build` first; this
// imports the BUILT package. Medians of RUNS runs (default 3) per figure.
//
//   node bench/factor.mjs                 # all cases
//   RUNS=5 KERNELS=js node bench/factor.mjs kernel 2d 3d dense
//
// Reports, per grid Laplacian (2-D 500², 3-D 40³, nested dissection):
// factor seconds, GF/s (flops = Σ c_j², design.md), solve seconds, bytes of L
// and of the whole store (factor + contribution stack), and the ratio of the
// factor's GF/s to the dense kernel's own GF/s on a 256×256 SYRK measured
// right before each factorization (median of the per-run ratios: the machine
// is shared, so only back-to-back figures compare). Then the speed-up over
// ml-matrix's dense Cholesky at n = 2500, and our own dense POTRF beside it.
import { CholeskyDecomposition, Matrix } from "ml-matrix";
import { analyze, getKernels } from "../dist/index.js";
import { grid2d, grid3d, median } from "./common.mjs";

const RUNS = Number(process.env.RUNS ?? 3);
const KERNELS = process.env.KERNELS ?? "js";
const cases = process.argv.slice(2).length ? process.argv.slice(2) : ["kernel", "2d", "3d", "dense"];

const now = () => performance.now() / 1000;
const fmt = (x, d = 3) => Number(x).toFixed(d);
const mib = (b) => `${fmt(b / 2 ** 20, 1)} MiB`;

/** GF/s of the kernel set's lower GEMM (SYRK) C −= A·Aᵀ, 256×256×256, median of `reps` after 3 warm-ups. */
function kernelRate(reps = 9) {
  const K = getKernels(KERNELS);
  const n = 256, S = K.reserve(2 * n * n);
  for (let i = 0; i < S.length; i++) S[i] = Math.sin(i);
  const t = [];
  for (let r = 0; r < reps + 3; r++) {
    const t0 = now();
    K.gemm(n, n, n, 0, n, 0, n, n * n, n, true);
    if (r >= 3) t.push(now() - t0);
  }
  return (n * (n + 1) * n) / median(t) / 1e9;
}

function benchSparse(name, A, { runs = RUNS, warmups = 0, ordering = "nested-dissection" } = {}) {
  const t0 = now();
  const analysis = analyze(A, { ordering });
  const analyseSeconds = now() - t0;
  const F = analysis.factor(A, { kernels: KERNELS });
  const fs = [], ss = [];
  const b = new Float64Array(A.ncols).map((_, i) => Math.sin(i + 1));
  for (let w = 0; w < warmups; w++) { F.refactor(A); F.solve(b); } // let the JIT settle on small cases
  const ratios = [];
  for (let r = 0; r < runs; r++) {
    // The machine is shared: measure the kernel right before each factorization and compare like with like.
    const rate = kernelRate(5);
    F.refactor(A);
    fs.push(F.stats.seconds);
    ratios.push(analysis.stats.flops / F.stats.seconds / 1e9 / rate);
    const s0 = now();
    F.solve(b);
    ss.push(now() - s0);
  }
  const info = F.solveWithInfo(b);
  const sec = median(fs), flops = analysis.stats.flops;
  return {
    name, n: A.ncols, ordering, analyseSeconds, nnzL: analysis.stats.nnzL, flops, supernodes: F.stats.supernodes,
    factorSeconds: sec, gflops: flops / sec / 1e9, solveSeconds: median(ss),
    factorBytes: F.stats.factorBytes, peakBytes: F.stats.peakBytes, backwardError: info.backwardError,
    ratio: median(ratios), ratios,
  };
}

function benchDense() {
  const A = grid2d(50), n = A.ncols;
  const sparse = benchSparse("2-D 50² (n = 2500)", A, { runs: Math.max(RUNS, 9), warmups: 10 });
  const M = new Matrix(n, n);
  for (let j = 0; j < n; j++) for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) {
    M.set(A.rowIdx[p], j, A.values[p]); M.set(j, A.rowIdx[p], A.values[p]);
  }
  const t = [];
  for (let r = 0; r < Math.min(RUNS, 3); r++) {
    const t0 = now();
    new CholeskyDecomposition(M);
    t.push(now() - t0);
  }
  // The same dense matrix through our own blocked POTRF (dense against dense).
  const K = getKernels(KERNELS);
  const S = K.reserve(n * n), tp = [];
  for (let r = 0; r < Math.min(RUNS, 3); r++) {
    for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) S[i + j * n] = M.get(i, j);
    const t0 = now();
    if (K.potrf(n, 0, n) !== -1) throw new Error("dense potrf failed");
    tp.push(now() - t0);
  }
  const potrfSeconds = median(tp);
  return {
    sparse, denseSeconds: median(t), speedup: median(t) / sparse.factorSeconds,
    potrfSeconds, potrfGflops: (n * n * n) / 3 / potrfSeconds / 1e9, potrfSpeedup: median(t) / potrfSeconds,
  };
}

function report(r) {
  console.log(`${r.name}: n=${r.n} ordering=${r.ordering} supernodes=${r.supernodes} nnzL=${r.nnzL} flops=${r.flops.toExponential(3)}`);
  console.log(`  analyse ${fmt(r.analyseSeconds)} s | factor ${fmt(r.factorSeconds)} s, ${fmt(r.gflops, 2)} GF/s` +
    ` = ${fmt(r.ratio, 2)} × kernel (median of per-run ratios ${r.ratios.map((x) => fmt(x, 2)).join(", ")})` +
    ` | solve ${fmt(r.solveSeconds)} s | L ${mib(r.factorBytes)} | store ${mib(r.peakBytes)} | backward error ${r.backwardError.toExponential(1)}`);
}

const out = { runs: RUNS, kernels: KERNELS };
const rates = [];
if (cases.includes("kernel") || cases.includes("2d") || cases.includes("3d")) {
  rates.push(kernelRate());
  console.log(`kernel (${KERNELS}) SYRK 256×256×256: ${fmt(rates[0], 2)} GF/s`);
}
for (const c of ["2d", "3d"]) {
  if (!cases.includes(c)) continue;
  const A = c === "2d" ? grid2d(500) : grid3d(40);
  const r = benchSparse(c === "2d" ? "2-D 500²" : "3-D 40³", A);
  rates.push(kernelRate());
  report(r);
  out[c] = r;
}
if (cases.includes("dense")) {
  const d = benchDense();
  report(d.sparse);
  console.log(`  ml-matrix dense Cholesky n=2500: ${fmt(d.denseSeconds)} s → septum sparse speed-up ${fmt(d.speedup, 1)}×`);
  console.log(`  septum dense POTRF (${KERNELS}) on the same 2500×2500: ${fmt(d.potrfSeconds)} s, ${fmt(d.potrfGflops, 2)} GF/s (n³/3) → ${fmt(d.potrfSpeedup, 1)}× ml-matrix`);
  out.dense = d;
}
if (rates.length) console.log(`kernel rate, median over the run: ${fmt(median(rates), 2)} GF/s (${rates.map((x) => fmt(x, 2)).join(", ")})`);
console.log(JSON.stringify(out));
