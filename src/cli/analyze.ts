/** `septum analyze`: ordering and symbolic statistics, optionally for every ordering. */
import type { SparseMatrix } from "../matrix/sparse.js";
import { predictWorkspace } from "../numeric/workspace.js";
import type { FactorMethod } from "../numeric/types.js";
import type { OrderingName } from "../solver/analyze.js";
import type { Analysis } from "../solver/analysis.js";
import type { CliIO } from "./io.js";
import { dissectionChoice, methodOption, orderingChoiceOption, ORDERINGS, positionals, shortOrderingName, type DissectionChoice, type Parsed } from "./options.js";
import { analyzeWith, loadSymmetric } from "./pipeline.js";
import { progressLine, type ProgressLine } from "./progress.js";
import { num, secs, table } from "./format.js";

/** One ordering's analysis with its wall time. */
export interface Analysed {
  readonly ordering: OrderingName;
  readonly analysis: Analysis;
  readonly seconds: number;
}

/** Analyze A with each ordering in turn. */
export function analyzeAll(io: CliIO, A: SparseMatrix, orderings: readonly OrderingName[], nd: DissectionChoice, line: ProgressLine): Analysed[] {
  return orderings.map((ordering) => {
    const t = io.now();
    const analysis = analyzeWith(A, ordering, nd, line, orderings.length > 1 ? `${shortOrderingName(ordering)}: ` : "");
    return { ordering, analysis, seconds: io.now() - t };
  });
}

/** One analysis with the named ordering, or the library's default choice when none is named. */
function analyzeOne(io: CliIO, A: SparseMatrix, choice: OrderingName | undefined, nd: DissectionChoice, line: ProgressLine): Analysed {
  const t = io.now();
  const analysis = analyzeWith(A, choice, nd, line);
  return { ordering: analysis.stats.ordering as OrderingName, analysis, seconds: io.now() - t };
}

/**
 * Predicted peak bytes of the factorization by `method`. AnalysisStats.peakBytes
 * is the Cholesky figure (the analysis does not know the method); L·D·Lᵀ also
 * needs a scratch block.
 */
function peakBytes(a: Analysed, method: FactorMethod): number {
  return method === "cholesky" ? a.analysis.stats.peakBytes : predictWorkspace(a.analysis.structure, method).peakBytes;
}

function record(a: Analysed, method: FactorMethod) {
  const s = a.analysis.stats;
  return {
    ordering: a.ordering, n: s.n, nnzA: s.nnzA, nnzL: s.nnzL, flops: s.flops, supernodes: s.supernodes,
    largestFront: s.largestFront, factorBytes: s.factorBytes, method, peakBytes: peakBytes(a, method),
    orderingSeconds: s.orderingSeconds, symbolicSeconds: s.symbolicSeconds, seconds: a.seconds,
  };
}

/** The comparison table printed by analyze --compare and the demo. */
export function compareTable(list: readonly Analysed[], factorSeconds?: readonly number[]): string {
  const bestFlops = Math.min(...list.map((a) => a.analysis.stats.flops));
  const header = ["ordering", "nnz(L)", "fill", "flops", "vs best", "supernodes", "factor MiB", "analyze"];
  if (factorSeconds) header.push("factor");
  const rows = list.map((a, i) => {
    const s = a.analysis.stats;
    const r = [a.ordering, num(s.nnzL), `${(s.nnzL / s.nnzA).toFixed(1)}×`, num(s.flops, true), `${(s.flops / bestFlops).toFixed(1)}×`,
      num(s.supernodes), (s.factorBytes / 2 ** 20).toFixed(1), secs(a.seconds)];
    if (factorSeconds) r.push(secs(factorSeconds[i]));
    return r;
  });
  return table(header, rows);
}

export function analyzeCommand(io: CliIO, p: Parsed): number {
  const [path] = positionals("analyze", p.positionals, ["the matrix file A.mtx"]);
  const choice = orderingChoiceOption(p.values.ordering);
  const method = methodOption(p.values.method);
  const nd = dissectionChoice(p.values);
  const line = progressLine(io, io.stderrIsTTY && !p.values.quiet);
  const A = loadSymmetric(io, path);
  const list = p.values.compare ? analyzeAll(io, A, ORDERINGS, nd, line) : [analyzeOne(io, A, choice, nd, line)];
  const ordering = list[0].ordering;
  line.done();
  if (p.values.json) {
    io.stdout(JSON.stringify(p.values.compare ? list.map((a) => record(a, method)) : record(list[0], method)) + "\n");
    return 0;
  }
  const s = list[0].analysis.stats;
  if (p.values.compare) {
    io.stdout(`septum analyze ${path}: n = ${num(s.n)}, nnz(A) = ${num(s.nnzA)} (lower triangle incl. diagonal)\n\n${compareTable(list)}`);
    return 0;
  }
  io.stdout(`septum analyze ${path}
  n             ${num(s.n)}
  nnz(A)        ${num(s.nnzA)} (lower triangle incl. diagonal)
  ordering      ${ordering}
  nnz(L)        ${num(s.nnzL)} (${(s.nnzL / s.nnzA).toFixed(1)}× A)
  flops         ${num(s.flops, true)} (Σ c_j² over the columns of L)
  supernodes    ${num(s.supernodes)} (largest front ${num(s.largestFront)} rows)
  factor        ${(s.factorBytes / 2 ** 20).toFixed(1)} MiB, peak ${(peakBytes(list[0], method) / 2 ** 20).toFixed(1)} MiB predicted for ${method}
  seconds       ordering ${secs(s.orderingSeconds)}, symbolic ${secs(s.symbolicSeconds)}
`);
  return 0;
}
