/**
 * Reading and writing the files the command works on, with errors that name
 * the file and, for Matrix Market problems, the line.
 */
import { readFileSync, statSync, writeFileSync, mkdirSync } from "node:fs";
import { dirname, resolve } from "node:path";
import { MatrixMarketError } from "../errors.js";
import { readMatrixMarket } from "../matrix/market.js";
import type { SparseMatrix } from "../matrix/sparse.js";
import { FileError, type CliIO } from "./io.js";

/** Bytes of a file; FileError for a missing file, a directory or an empty file. */
function readBytes(io: CliIO, path: string): Uint8Array {
  const full = resolve(io.cwd, path);
  let size: number;
  try {
    const st = statSync(full);
    if (st.isDirectory()) throw new FileError(`${path}: is a directory, expected a Matrix Market file`);
    size = st.size;
  } catch (e) {
    if (e instanceof FileError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    throw new FileError(code === "ENOENT" ? `${path}: no such file` : `${path}: cannot read (${code ?? String(e)})`);
  }
  if (size === 0) throw new FileError(`${path}: the file is empty, expected a Matrix Market file`);
  try {
    return readFileSync(full);
  } catch (e) {
    throw new FileError(`${path}: cannot read (${(e as NodeJS.ErrnoException).code ?? String(e)})`);
  }
}

/** Parse a Matrix Market file; a format error names the file and the line. */
function readMarketFile(io: CliIO, path: string): ReturnType<typeof readMatrixMarket> {
  const bytes = readBytes(io, path);
  try {
    return readMatrixMarket(bytes);
  } catch (e) {
    if (e instanceof MatrixMarketError) throw new FileError(`${path}: ${e.message}`);
    throw e;
  }
}

/** A square sparse matrix from a Matrix Market `coordinate` file. */
export function readMatrixFile(io: CliIO, path: string): SparseMatrix {
  const contents = readMarketFile(io, path);
  if (contents.kind !== "sparse") throw new FileError(`${path}: is a dense 'array' file, expected a sparse 'coordinate' matrix`);
  const A = contents.matrix;
  if (A.nrows !== A.ncols) throw new FileError(`${path}: the matrix is ${A.nrows} × ${A.ncols}, expected a square matrix`);
  if (A.nrows === 0) throw new FileError(`${path}: the matrix is 0 × 0; there is nothing to solve`);
  return A;
}

/**
 * Right-hand sides (n × k, column-major) from an `array` or `coordinate` file;
 * a symmetric coordinate file stores one triangle and stands for both.
 */
export function readRhsFile(io: CliIO, path: string, n: number): { values: Float64Array; columns: number } {
  const contents = readMarketFile(io, path);
  const rows = contents.kind === "dense" ? contents.nrows : contents.matrix.nrows;
  const cols = contents.kind === "dense" ? contents.ncols : contents.matrix.ncols;
  if (rows !== n) throw new FileError(`${path}: has ${rows} rows, but the matrix has ${n}`);
  if (cols < 1) throw new FileError(`${path}: has no columns`);
  if (contents.kind === "dense") return { values: contents.values, columns: cols };
  const values = new Float64Array(n * cols);
  const M = contents.matrix;
  for (let j = 0; j < cols; j++) {
    for (let p = M.colPtr[j]; p < M.colPtr[j + 1]; p++) {
      const i = M.rowIdx[p];
      values[j * n + i] = M.values[p];
      if (contents.symmetric) values[i * n + j] = M.values[p]; // square by the reader's check
    }
  }
  return { values, columns: cols };
}

/** Write text, creating the directory; FileError naming the path on failure. */
export function writeText(io: CliIO, path: string, text: string): void {
  const full = resolve(io.cwd, path);
  try {
    mkdirSync(dirname(full), { recursive: true });
    writeFileSync(full, text);
  } catch (e) {
    throw new FileError(`${path}: cannot write (${(e as NodeJS.ErrnoException).code ?? String(e)})`);
  }
}
