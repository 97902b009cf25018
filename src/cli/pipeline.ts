/**
 * The steps shared by solve, analyze, report and demo: read a matrix and
 * check its symmetry, analyze it with progress, and turn library errors into
 * messages in the file's 1-based numbering.
 */
import { NotPositiveDefiniteError, NotSymmetricError } from "../errors.js";
import type { SparseMatrix } from "../matrix/sparse.js";
import { lowerTriangle } from "../matrix/symmetric.js";
import { analyze, type OrderingName, type Progress } from "../solver/analyze.js";
import type { Analysis } from "../solver/analysis.js";
import { readMatrixFile } from "./files.js";
import { FileError, type CliIO } from "./io.js";
import type { ProgressLine } from "./progress.js";
import type { DissectionChoice } from "./options.js";

/** onProgress callback drawing the phase on the progress line. */
export function progressCallback(line: ProgressLine, prefix = ""): (p: Progress) => void {
  return (p) => line.update(prefix + p.phase, p.fraction);
}

/** Read A and reduce it to its lower triangle; a general file whose triangles disagree is an error naming the entry. */
export function loadSymmetric(io: CliIO, path: string): SparseMatrix {
  const matrix = readMatrixFile(io, path);
  try {
    return lowerTriangle(matrix); // a symmetric file already holds the lower triangle and comes back as is
  } catch (e) {
    if (e instanceof NotSymmetricError) {
      const i = e.row + 1, j = e.column + 1;
      throw new FileError(`${path}: the matrix is not symmetric: entry (${i}, ${j}) does not match entry (${j}, ${i}); Cholesky and L·D·Lᵀ need a symmetric matrix`);
    }
    throw e;
  }
}

/** Analyze with one ordering (undefined: the library's default choice), progress reported on the line with the given prefix. */
export function analyzeWith(A: SparseMatrix, ordering: OrderingName | undefined, nd: DissectionChoice, line: ProgressLine, prefix = ""): Analysis {
  return analyze(A, { ordering, seed: nd.seed, threads: nd.threads, onProgress: progressCallback(line, prefix) });
}

/**
 * Rephrase a pivot failure in the file's 1-based numbering. Cholesky met a
 * pivot that is not positive: A is not positive definite. L·D·Lᵀ does not
 * need a definite matrix; it stopped on a zero or tiny pivot, so A is singular
 * or, without pivoting, too close to singular in this elimination order.
 */
export function pivotMessage(path: string, e: NotPositiveDefiniteError, method: string): string {
  const at = `${e.pivot.toPrecision(3)} at column ${e.column + 1}`;
  if (method === "cholesky") return `${path}: the matrix is not positive definite: pivot ${at} (for a quasi-definite matrix try --method ldlt)`;
  return `${path}: L·D·Lᵀ met a zero or tiny pivot ${at}: the matrix is singular, or too close to it for this ordering ` +
    "without pivoting (if it is nonsingular, another --ordering may avoid the pivot)";
}
