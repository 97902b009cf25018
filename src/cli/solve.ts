/** `septum solve`: read, order, analyze, factor, solve, and summarise. */
import { NotPositiveDefiniteError } from "../errors.js";
import { writeMatrixMarketArray } from "../matrix/market.js";
import { symmetricMultiply } from "../matrix/symmetric.js";
import { readRhsFile, writeText } from "./files.js";
import { FileError, UsageError, type CliIO } from "./io.js";
import { dissectionChoice, methodOption, orderingChoiceOption, positionals, type Parsed } from "./options.js";
import { analyzeWith, loadSymmetric, pivotMessage, progressCallback } from "./pipeline.js";
import { progressLine } from "./progress.js";
import { num, sci, secs } from "./format.js";

export function solveCommand(io: CliIO, p: Parsed): number {
  const [path] = positionals("solve", p.positionals, ["the matrix file A.mtx"]);
  const choice = orderingChoiceOption(p.values.ordering);
  const method = methodOption(p.values.method);
  const nd = dissectionChoice(p.values);
  const kernels = kernelsOption(p.values.kernels);
  const line = progressLine(io, io.stderrIsTTY && !p.values.quiet);
  const t0 = io.now();
  const A = loadSymmetric(io, path);
  const n = A.ncols;
  const rhs = p.values.rhs ? readRhsFile(io, String(p.values.rhs), n) : { values: symmetricMultiply(A, new Float64Array(n).fill(1)), columns: 1 };
  const t1 = io.now();
  const analysis = analyzeWith(A, choice, nd, line);
  const ordering = analysis.stats.ordering; // the one kept when none was named
  const t2 = io.now();
  let F;
  try {
    F = analysis.factor(A, { method, kernels, onProgress: progressCallback(line) });
  } catch (e) {
    line.done();
    if (e instanceof NotPositiveDefiniteError) throw new FileError(pivotMessage(path, e, method));
    throw e;
  }
  line.done();
  const t3 = io.now();
  const { x, backwardError } = F.solveWithInfo(rhs.values); // the library's Rigal–Gaches backward error
  const t4 = io.now();
  const q = { ...quality(A, x, rhs.values, rhs.columns, !p.values.rhs), backwardError };
  if (p.values.output) {
    writeText(io, String(p.values.output), writeMatrixMarketArray(n, rhs.columns, x, { comment: `solution of ${path} by septum` }));
  }
  const s = analysis.stats, fs = F.stats;
  if (fs.smallestPivot < SINGULAR_PIVOT) io.stderr(singularWarning(path, fs.smallestPivot, fs.smallestPivotColumn));
  const seconds = { read: t1 - t0, analyze: t2 - t1, ordering: s.orderingSeconds, factor: t3 - t2, solve: t4 - t3, total: io.now() - t0 };
  if (p.values.json) {
    io.stdout(JSON.stringify({
      file: path, n, nnzA: s.nnzA, nnzL: s.nnzL, flops: s.flops, supernodes: s.supernodes, factorBytes: fs.factorBytes, peakBytes: fs.peakBytes,
      ordering, method, kernels: fs.kernels, gflopsPerSecond: fs.gflopsPerSecond, rightHandSides: rhs.columns,
      smallestPivot: fs.smallestPivot, smallestPivotColumn: fs.smallestPivotColumn + 1, residual: q.residual, backwardError: q.backwardError, ...(q.maxError === undefined ? {} : { maxError: q.maxError }), seconds,
    }) + "\n");
    return 0;
  }
  io.stdout(`septum solve ${path}
  n          ${num(n)}    nnz(A) ${num(s.nnzA)} (lower triangle incl. diagonal)
  ordering   ${ordering}    nnz(L) ${num(s.nnzL)} (${(s.nnzL / s.nnzA).toFixed(1)}× A)    flops ${num(s.flops, true)}    supernodes ${num(s.supernodes)}
  method     ${method}, ${fs.kernels} kernels, ${fs.gflopsPerSecond.toFixed(2)} GF/s, factor ${(fs.factorBytes / 2 ** 20).toFixed(1)} MiB
  seconds    read ${secs(seconds.read)}   analyze ${secs(seconds.analyze)} (ordering ${secs(seconds.ordering)})   factor ${secs(seconds.factor)}   solve ${secs(seconds.solve)}   total ${secs(seconds.total)}
  residual   ‖b − A·x‖₂ / ‖b‖₂ = ${sci(q.residual)}    backward error ${sci(q.backwardError)}${q.maxError === undefined ? "" : `
  error      max |x − 1| = ${sci(q.maxError)}   (b = A·1, exact solution all ones)`}
${p.values.output ? `  wrote      ${p.values.output}\n` : ""}`);
  return 0;
}

/** Smallest relative pivot (FactorStats.smallestPivot) below which solve warns that A is singular to working precision. */
export const SINGULAR_PIVOT = 1e-10;

/** One stderr line, in the form of the CLI's error lines, saying what a rounding-sized pivot means, where, and what to check. */
function singularWarning(path: string, pivot: number, column: number): string {
  return `septum: warning: ${path}: smallest relative pivot ${sci(pivot)} at column ${column + 1} (below ${SINGULAR_PIVOT}): the matrix is singular or nearly so ` +
    "to working precision; the solution may be meaningless even with a small backward error (ground a graph Laplacian, check the model's constraints)\n";
}

function kernelsOption(v: string | boolean | undefined): "auto" | "wasm" | "js" {
  if (v === undefined) return "auto";
  if (v === "auto" || v === "wasm" || v === "js") return v;
  throw new UsageError(`--kernels: unknown kernel set '${v}'; expected auto, wasm or js`);
}

/** Largest relative 2-norm residual over the columns, and with b = A·1 the largest error against the all-ones solution. */
function quality(A: Parameters<typeof symmetricMultiply>[0], x: Float64Array, b: Float64Array, k: number, ones: boolean) {
  const n = A.ncols;
  const r = new Float64Array(n);
  let residual = 0, maxError = 0;
  for (let c = 0; c < k; c++) {
    const xc = x.subarray(c * n, (c + 1) * n), bc = b.subarray(c * n, (c + 1) * n);
    symmetricMultiply(A, xc, r);
    let rr = 0, bb = 0;
    for (let i = 0; i < n; i++) {
      const d = bc[i] - r[i];
      rr += d * d; bb += bc[i] * bc[i];
      if (ones) maxError = Math.max(maxError, Math.abs(xc[i] - 1));
    }
    residual = Math.max(residual, bb > 0 ? Math.sqrt(rr / bb) : Math.sqrt(rr));
  }
  return { residual, maxError: ones ? maxError : undefined };
}
