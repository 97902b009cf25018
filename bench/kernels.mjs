// Dense kernel rates, WebAssembly SIMD vs plain JS, and (when the numeric
// factorization is built) whole factorizations of 3-D grids with both sets.
// Run: npm run build && node bench/kernels.mjs [--sizes 64,128,256,512] [--grids 30,50] [--runs 5] [--js no]
// With `node --experimental-wasm-relaxed-simd bench/kernels.mjs` (Node 20) the
// wasm set runs its fused-multiply-add build; the header line says which.
// All ratios come from the same run. Time is the process's CPU time
// (process.cpuUsage, user + system), not wall time, because the benchmark
// machine is shared: CPU time does not count the slices another process ran
// on our core. GF/s = flops / seconds / 1e9 with
// GEMM 2·m·n·k, SYRK k·n·(n+1), POTRF Σ_j (n−j)² ≈ n³/3 (design.md convention: Σ c_j²).
import { getKernels, analyze } from "../dist/index.js";
import { grid3d, median } from "./common.mjs";

const arg = (name, dflt) => {
  const i = process.argv.indexOf(`--${name}`);
  return i < 0 ? dflt : process.argv[i + 1];
};
const sizes = arg("sizes", "64,128,256,512").split(",").map(Number);
const grids = arg("grids", "30,50").split(",").filter(Boolean).map(Number);
const runs = Number(arg("runs", "5"));
const withJs = arg("js", "yes") !== "no"; // --js no: wasm only (the ratios then are not printed)

function fill(S, len, seed) {
  let s = seed | 0 || 1;
  for (let i = 0; i < len; i++) {
    s ^= s << 13; s ^= s >>> 17; s ^= s << 5;
    S[i] = (s >>> 0) / 2 ** 32 - 0.5;
  }
}

/** CPU milliseconds of this process so far. */
function cpuMs() {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

/** Median GF/s of `runs` samples; each sample repeats op until ≥ 40 ms of CPU. `setup` runs untimed before each op. */
function rate(flops, op, setup) {
  const samples = [];
  for (let w = 0; w < 3; w++) { setup?.(); op(); } // warm-up (tier-up of the wasm / JIT code)
  for (let r = 0; r < runs; r++) {
    let reps = 0, spent = 0;
    while (spent < 40) {
      setup?.();
      const t0 = cpuMs();
      op();
      spent += cpuMs() - t0;
      reps++;
    }
    samples.push((flops * reps) / (spent / 1000) / 1e9);
  }
  return median(samples);
}

function kernelRates(K, n) {
  const a = 0, b = n * n, c = 2 * n * n, len = 3 * n * n;
  const S = K.reserve(len);
  fill(S, len, n);
  const gemm = rate(2 * n * n * n, () => K.gemm(n, n, n, a, n, b, n, c, n, false));
  const syrk = rate(n * n * (n + 1), () => K.gemm(n, n, n, a, n, a, n, c, n, true));
  // POTRF on a fresh SPD matrix each time (copied in, untimed): A = B·Bᵀ-ish diagonal-dominant fill
  const spd = new Float64Array(n * n);
  fill(spd, n * n, 7);
  for (let j = 0; j < n; j++) spd[j + j * n] = n;
  let potrfFlops = 0;
  for (let j = 0; j < n; j++) potrfFlops += (n - j) ** 2;
  const potrf = rate(potrfFlops, () => {
    if (K.potrf(n, a, n) !== -1) throw new Error("potrf failed");
  }, () => K.view().set(spd, a));
  return { gemm, syrk, potrf };
}

console.log(`dense kernels, GF/s (median of ${runs} samples, CPU time), node ${process.version}, ` +
  `wasm build "${getKernels("wasm").variant}"`);
const rows = [];
for (const n of sizes) {
  const w = kernelRates(getKernels("wasm"), n);
  const j = withJs ? kernelRates(getKernels("js"), n) : { gemm: NaN, syrk: NaN, potrf: NaN };
  rows.push({ n, wasm: w, js: j });
  const jsPart = withJs
    ? `  |  js gemm ${j.gemm.toFixed(1).padStart(5)}` +
      `  syrk ${j.syrk.toFixed(1).padStart(5)}  potrf ${j.potrf.toFixed(1).padStart(5)}` +
      `  |  wasm/js gemm ${(w.gemm / j.gemm).toFixed(2)}  potrf ${(w.potrf / j.potrf).toFixed(2)}`
    : "";
  console.log(
    `n=${String(n).padStart(4)}  wasm gemm ${w.gemm.toFixed(1).padStart(5)}  syrk ${w.syrk.toFixed(1).padStart(5)}` +
    `  potrf ${w.potrf.toFixed(1).padStart(5)}${jsPart}`);
}
const micro = rows.find((r) => r.n === 256) ?? rows[rows.length - 1];

for (const k of grids) {
  const A = grid3d(k);
  const t0 = performance.now();
  const analysis = analyze(A, { ordering: "nested-dissection" });
  const tAnalyze = (performance.now() - t0) / 1000;
  const st = analysis.stats;
  const res = {};
  // the JS run is slow on big grids: fewer samples there
  for (const name of withJs ? ["wasm", "js"] : ["wasm"]) {
    const times = [];
    const reps = k >= 50 && name === "js" ? Math.min(runs, 2) : Math.min(runs, 3);
    for (let r = 0; r < reps; r++) {
      const t = cpuMs();
      analysis.factor(A, { kernels: name });
      times.push((cpuMs() - t) / 1000);
    }
    res[name] = median(times);
  }
  const gfW = st.flops / res.wasm / 1e9, gfJ = st.flops / res.js / 1e9;
  console.log(
    `grid ${k}^3: n=${st.n} nnzL=${st.nnzL} flops=${st.flops.toExponential(2)} analyze ${tAnalyze.toFixed(2)} s | ` +
    `factor wasm ${res.wasm.toFixed(2)} s (${gfW.toFixed(1)} GF/s)` +
    (withJs ? `  js ${res.js.toFixed(2)} s (${gfJ.toFixed(1)} GF/s) | wasm/js ${(res.js / res.wasm).toFixed(2)}x` : "") +
    ` | factor ÷ wasm syrk(${micro.n}) ${(gfW / micro.wasm.syrk).toFixed(2)}`);
}
