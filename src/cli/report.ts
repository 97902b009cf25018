/** `septum report`: the HTML page for one matrix. */
import type { SparseMatrix } from "../matrix/sparse.js";
import type { OrderingName } from "../solver/analyze.js";
import { adjacencyGraph } from "../graph/adjacency.js";
import { renderReport, THUMBNAIL_LIMIT } from "../report/page.js";
import { exactFactorPattern } from "../report/pattern.js";
import type { ReportInput, ReportOrdering } from "../report/types.js";
import { analyzeAll, type Analysed } from "./analyze.js";
import { writeText } from "./files.js";
import { UsageError, type CliIO } from "./io.js";
import { DISSECTION_THRESHOLD } from "../ordering/index.js";
import { dissectionChoice, orderingChoiceOption, ORDERINGS, positionals, type Parsed } from "./options.js";
import { loadSymmetric } from "./pipeline.js";
import { progressLine } from "./progress.js";
import { VERSION } from "./version.js";

/** Report input from analyses of the lower triangle of A. */
export function reportInput(title: string, source: string, A: SparseMatrix, list: readonly Analysed[], shown: OrderingName, factorSeconds?: readonly number[]): ReportInput {
  const graph = adjacencyGraph(A);
  const orderings: ReportOrdering[] = list.map((a, i) => {
    // the exact pattern costs a second symbolic pass and up to nnz(L) row indices: only
    // for factors small enough to be drawn as thumbnails; larger ones are drawn from the
    // analysis's own structure, which may show explicit zeros of amalgamation
    const exact = a.analysis.stats.nnzL <= THUMBNAIL_LIMIT ? exactFactorPattern(graph, a.analysis.orderingPermutation) : null;
    return {
      name: a.ordering,
      permutation: a.analysis.orderingPermutation,
      separatorTree: a.analysis.separatorTree,
      structure: exact?.structure ?? a.analysis.structure,
      structurePermutation: exact?.permutation ?? a.analysis.permutation,
      figures: {
        nnzL: a.analysis.stats.nnzL, flops: a.analysis.stats.flops, supernodes: a.analysis.stats.supernodes,
        factorBytes: a.analysis.stats.factorBytes, orderingSeconds: a.analysis.stats.orderingSeconds, analyzeSeconds: a.seconds,
        factorSeconds: factorSeconds?.[i],
      },
    };
  });
  const nnzLower = A.colPtr[A.ncols];
  let diag = 0;
  for (let j = 0; j < A.ncols; j++) for (let p = A.colPtr[j]; p < A.colPtr[j + 1]; p++) if (A.rowIdx[p] === j) diag++;
  return {
    title, source, n: A.ncols, lowerColPtr: A.colPtr, lowerRowIdx: A.rowIdx, nnzA: 2 * nnzLower - diag,
    orderings, shown: Math.max(0, list.findIndex((a) => a.ordering === shown)),
    footer: `Made by septum ${VERSION} on ${new Date().toISOString().slice(0, 10)}.`,
  };
}

/**
 * The ordering drawn in detail with `--ordering auto`: the one
 * the library's default keeps, the fewer flops of nested dissection and
 * minimum degree (minimum degree alone up to DISSECTION_THRESHOLD unknowns).
 */
export function defaultShown(list: readonly Analysed[], n: number): OrderingName {
  if (n <= DISSECTION_THRESHOLD) return "minimum-degree";
  const flops = (o: OrderingName): number => list.find((a) => a.ordering === o)?.analysis.stats.flops ?? Infinity;
  return flops("minimum-degree") < flops("nested-dissection") ? "minimum-degree" : "nested-dissection";
}

export function reportCommand(io: CliIO, p: Parsed): number {
  const [path] = positionals("report", p.positionals, ["the matrix file A.mtx"]);
  if (!p.values.output) throw new UsageError("report: -o report.html is required");
  const choice = orderingChoiceOption(p.values.ordering);
  const nd = dissectionChoice(p.values);
  const line = progressLine(io, io.stderrIsTTY && !p.values.quiet);
  const A = loadSymmetric(io, path);
  const list = analyzeAll(io, A, ORDERINGS, nd, line);
  line.done();
  // the page is about the blocks a dissection exposes: nested dissection unless another ordering (or auto) is asked for
  const shown = p.values.ordering === undefined ? "nested-dissection" : choice ?? defaultShown(list, A.ncols);
  const html = renderReport(reportInput(`Sparsity report: ${path}`, `${path} — symmetric, n = ${A.ncols}`, A, list, shown));
  writeText(io, String(p.values.output), html);
  if (!p.values.quiet) io.stdout(`wrote ${p.values.output} (${(html.length / 1024).toFixed(0)} kB)\n`);
  return 0;
}
