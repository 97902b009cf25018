// Matrix Market reading and writing speed on a file of about 10 million entries:
// the lower triangle of the 3-D 7-point Laplacian on a k×k×k grid (symmetric).
// Variant 1: short values (6 and -1) as a finite-difference code writes them.
// Variant 2: random reals in shortest round-trip form (about 17 digits), as
//            writeMatrixMarket writes them; these take the Number() fallback.
// Usage: npm run build && node bench/market.mjs [k]   (k = 136 gives 10.0 M entries)
import { readMatrixMarket, writeMatrixMarket, SparseMatrix } from "../dist/index.js";
import { median, table } from "./common.mjs";

const k = Number(process.argv[2] ?? 136);
const RUNS = 3;

/** Write the decimal digits of a positive integer into `out` at `p`; returns the new position. */
function putInt(out, p, v) {
  const start = p;
  do {
    out[p++] = 48 + (v % 10);
    v = Math.floor(v / 10);
  } while (v > 0);
  for (let a = start, b = p - 1; a < b; a++, b--) {
    const t = out[a];
    out[a] = out[b];
    out[b] = t;
  }
  return p;
}

/** The stencil file as bytes, built directly (no per-line strings). */
function stencilFile(k) {
  const n = k * k * k;
  const nnz = n + 3 * k * k * (k - 1);
  const head = new TextEncoder().encode(`%%MatrixMarket matrix coordinate real symmetric\n% 7-point Laplacian, ${k}^3 grid\n${n} ${n} ${nnz}\n`);
  const out = new Uint8Array(head.length + nnz * (2 * String(n).length + 5));
  out.set(head);
  let p = head.length;
  const entry = (i, j, diag) => {
    p = putInt(out, p, i + 1);
    out[p++] = 32;
    p = putInt(out, p, j + 1);
    out[p++] = 32;
    if (diag) out[p++] = 54; // "6"
    else { out[p++] = 45; out[p++] = 49; } // "-1"
    out[p++] = 10;
  };
  for (let z = 0; z < k; z++) for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
    const j = (z * k + y) * k + x;
    entry(j, j, true);
    if (x + 1 < k) entry(j + 1, j, false);
    if (y + 1 < k) entry(j + k, j, false);
    if (z + 1 < k) entry(j + k * k, j, false);
  }
  return { bytes: out.subarray(0, p), nnz };
}

/** Median wall seconds and CPU seconds of `runs` parses; returns the last result too. */
function timeParse(input, runs) {
  const wall = [], cpu = [];
  let result;
  for (let r = 0; r < runs; r++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    result = readMatrixMarket(input);
    wall.push((performance.now() - t0) / 1000);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1e6);
  }
  return { wall: median(wall), cpu: median(cpu), all: wall, result };
}

const rows = [];
const report = (name, bytes, nnz, t) => {
  rows.push({
    case: name,
    entries: nnz,
    MB: bytes / 1e6,
    "parse s (median)": t.wall,
    "runs s": t.all.map((s) => s.toFixed(2)).join(" "),
    "cpu s": t.cpu,
    "M entries/s": nnz / t.wall / 1e6,
    "MB/s": bytes / t.wall / 1e6,
  });
};

const { bytes, nnz } = stencilFile(k);
const short = timeParse(bytes, RUNS);
report("stencil, values 6/-1 (bytes)", bytes.length, nnz, short);
const A = short.result.matrix;
if (A.nnz !== nnz) throw new Error(`read ${A.nnz} entries, expected ${nnz}`);

// Random reals in shortest round-trip form, written by writeMatrixMarket.
const vals = new Float64Array(A.nnz);
let seed = 12345;
for (let p = 0; p < vals.length; p++) {
  seed = (seed * 1103515245 + 12345) >>> 0;
  vals[p] = (2 * seed) / 4294967296 - 1;
}
const B = SparseMatrix.fromCSC(A.nrows, A.ncols, A.colPtr, A.rowIdx, vals);
const w0 = performance.now();
const wc0 = process.cpuUsage();
const text = writeMatrixMarket(B, { symmetric: true });
const writeSeconds = (performance.now() - w0) / 1000;
const wc = process.cpuUsage(wc0);
const writeCpu = (wc.user + wc.system) / 1e6;
const realBytes = new TextEncoder().encode(text);
const reals = timeParse(realBytes, RUNS);
report("stencil, random 17-digit reals (bytes)", realBytes.length, nnz, reals);
const fromString = timeParse(text, 1);
report("same, given as a string", text.length, nnz, fromString);
for (let p = 0; p < vals.length; p++) {
  if (!Object.is(reals.result.matrix.values[p], vals[p])) throw new Error(`round trip differs at entry ${p}`);
}

table(rows);
console.log(
  `write (random reals, symmetric): ${writeSeconds.toFixed(2)} s (cpu ${writeCpu.toFixed(2)} s), ` +
    `${(nnz / writeSeconds / 1e6).toFixed(2)} M entries/s, ${(text.length / 1e6).toFixed(0)} MB; round trip exact`,
);
console.log(`load average while running: ${(await import("node:os")).loadavg().map((x) => x.toFixed(1)).join(" ")} on ${(await import("node:os")).availableParallelism()} cores`);
