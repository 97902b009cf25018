/**
 * Reading the Matrix Market exchange format (Boisvert, Pozo & Remington 1996,
 * "The Matrix Market Exchange Formats: Initial Design", NIST).
 *
 * One linear pass over the bytes: banner, comments, size line, then one entry
 * per line. `coordinate` files become a SparseMatrix holding exactly the
 * file's entries (0-based, duplicates summed); `array` files become a dense
 * column-major Float64Array. Every problem is a MatrixMarketError naming the
 * 1-based line.
 */

import { InputError, MatrixMarketError } from "../errors.js";
import { DuplicateSumError, MAX_DIMENSION, SparseMatrix } from "./sparse.js";
import { Cursor, decodeText, lineEnd, scanInteger, scanReal } from "./market-scan.js";

/** The value field of a Matrix Market file that septum reads. */
export type MarketField = "real" | "integer" | "pattern";

/** A `coordinate` file: a sparse matrix. */
export interface MarketSparse {
  kind: "sparse";
  /**
   * The entries exactly as the file stores them, 0-based, duplicates summed.
   * For a symmetric file this is the lower triangle (diagonal included).
   */
  matrix: SparseMatrix;
  /** True when the banner says `symmetric` (only the lower triangle is stored). */
  symmetric: boolean;
  /** The value field; `pattern` entries are read as 1. */
  field: MarketField;
  /** Comment lines after the banner, without the leading '%' and one following space. */
  comments: string[];
}

/** An `array` file: a dense matrix such as right-hand sides or solutions. */
export interface MarketDense {
  kind: "dense";
  nrows: number;
  ncols: number;
  /** All nrows × ncols values in column-major order (a symmetric file is mirrored). */
  values: Float64Array;
  /** True when the banner says `symmetric` (the file held only the lower triangle). */
  symmetric: boolean;
  /** The value field. */
  field: "real" | "integer";
  /** Comment lines after the banner, without the leading '%' and one following space. */
  comments: string[];
}

/** What `readMatrixMarket` returns: a sparse (`coordinate`) or dense (`array`) matrix. */
export type MarketContents = MarketSparse | MarketDense;

/** The parsed banner line. */
interface Banner {
  format: "coordinate" | "array";
  field: MarketField;
  symmetric: boolean;
}

const BANNER = "%%matrixmarket";

/**
 * Parse Matrix Market text (a string or its UTF-8 bytes).
 *
 * Reads `matrix coordinate` (real, integer, pattern; general or symmetric) and
 * `matrix array` (real, integer; general or symmetric). Complex, Hermitian and
 * skew-symmetric files are refused by name.
 *
 * @throws MatrixMarketError with the 1-based line number of the first problem.
 */
export function readMatrixMarket(text: string | Uint8Array): MarketContents {
  if (typeof text !== "string" && !(text instanceof Uint8Array)) {
    throw new InputError(`readMatrixMarket expects a string or a Uint8Array, got ${text === null ? "null" : typeof text}`);
  }
  const bytes = typeof text === "string" ? new TextEncoder().encode(text) : text;
  // UTF-8 and UTF-16 lengths agree exactly when the text is pure ASCII.
  const c = new Cursor(bytes, typeof text === "string" && text.length === bytes.length ? text : null);
  skipByteOrderMark(c);
  const banner = readBanner(c);
  const comments: string[] = [];
  if (!c.toContent(comments)) throw new MatrixMarketError(c.lastLine(), "missing size line after the banner");
  return banner.format === "coordinate" ? readCoordinate(c, banner, comments) : readArray(c, banner, comments);
}

function skipByteOrderMark(c: Cursor): void {
  const b = c.bytes;
  if (b.length >= 3 && b[0] === 0xef && b[1] === 0xbb && b[2] === 0xbf) c.pos = 3;
}

/** Read and check line 1: `%%MatrixMarket matrix <format> <field> <symmetry>`. */
function readBanner(c: Cursor): Banner {
  const b = c.bytes;
  const end = lineEnd(b, c.pos);
  // A banner is short; never decode more of a first line than this.
  const words = decodeText(b.subarray(c.pos, Math.min(end, c.pos + 4096))).trim().split(/[ \t\r]+/);
  if (words[0]!.toLowerCase() !== BANNER) {
    c.fail("missing banner: the first line must begin with %%MatrixMarket");
  }
  if (words.length !== 5) {
    c.fail(`banner has ${words.length - 1} words after %%MatrixMarket, expected 4 (object format field symmetry)`);
  }
  const [object, format, field, symmetry] = words.slice(1).map((w) => w.toLowerCase()) as [string, string, string, string];
  if (object !== "matrix") c.fail(`unknown object '${words[1]}' (expected 'matrix')`);
  if (format !== "coordinate" && format !== "array") c.fail(`unknown format '${words[2]}' (expected 'coordinate' or 'array')`);
  const f = checkField(c, field, words[3]!, format);
  const symmetric = checkSymmetry(c, symmetry, words[4]!);
  c.nextLine();
  return { format, field: f, symmetric };
}

function checkField(c: Cursor, field: string, original: string, format: string): MarketField {
  if (field === "complex") c.fail("complex matrices are not supported (field 'complex')");
  if (field !== "real" && field !== "integer" && field !== "pattern") {
    c.fail(`unknown field '${original}' (expected 'real', 'integer' or 'pattern')`);
  }
  if (field === "pattern" && format === "array") c.fail("field 'pattern' is not allowed with format 'array'");
  return field;
}

function checkSymmetry(c: Cursor, symmetry: string, original: string): boolean {
  if (symmetry === "skew-symmetric") c.fail("skew-symmetric matrices are not supported (symmetry 'skew-symmetric')");
  if (symmetry === "hermitian") c.fail("Hermitian matrices are not supported (symmetry 'hermitian')");
  if (symmetry !== "general" && symmetry !== "symmetric") {
    c.fail(`unknown symmetry '${original}' (expected 'general' or 'symmetric')`);
  }
  return symmetry === "symmetric";
}

/**
 * Read the `count` non-negative integers of the size line (cursor at its first field).
 * Returns them in a plain array and leaves the cursor on the next line.
 */
function readSizeLine(c: Cursor, count: number, what: string): number[] {
  const out: number[] = [];
  while (!c.atLineEnd()) {
    if (out.length === count) c.fail(`size line has more than ${count} fields (expected ${what})`);
    const token = c.token();
    const v = scanInteger(c);
    if (!(v >= 0)) c.fail(`size line: '${token}' is not a non-negative integer (expected ${what})`);
    if (v > 0x7fffffff) c.fail(`size line: ${token} is larger than 2147483647`);
    if (out.length < 2 && v > MAX_DIMENSION) {
      c.fail(`size line: ${token} ${out.length === 0 ? "rows" : "columns"} exceed the largest dimension septum handles, ${MAX_DIMENSION}`);
    }
    out.push(v);
  }
  if (out.length !== count) c.fail(`size line has ${out.length} field${out.length === 1 ? "" : "s"}, expected ${count} (${what})`);
  c.nextLine();
  return out;
}

/** A symmetric file must describe a square matrix. */
function checkSquare(sizeLine: number, m: number, n: number): void {
  if (m !== n) throw new MatrixMarketError(sizeLine, `a symmetric matrix must be square, the size line says ${m} × ${n}`);
}

/** After the announced entries: only blank and comment lines may follow. */
function expectNoMore(c: Cursor, announced: number, sizeLine: number, comments: string[]): void {
  if (c.toContent(comments)) {
    c.fail(`more entries than the ${announced} announced on line ${sizeLine}`);
  }
}

/** Throw the error for a line whose field count is wrong. `found` fields were read. */
function wrongFieldCount(c: Cursor, found: number, expected: number, what: string): never {
  let total = found;
  while (!c.atLineEnd()) {
    total++;
    c.skipToken();
  }
  c.fail(`expected ${expected} field${expected === 1 ? "" : "s"} (${what}), found ${total}`);
}

/** Read an entry's value at the cursor, checking the field's grammar and finiteness. */
function readValue(c: Cursor, integer: boolean): number {
  const start = c.pos;
  const v = integer ? scanInteger(c) : scanReal(c);
  if (Number.isFinite(v)) return v;
  c.pos = start;
  const text = c.token();
  if (Number.isNaN(v) && !/^[+-]?(inf|infinity|nan)$/i.test(text)) {
    c.fail(integer ? `'${text}' is not an integer (field 'integer')` : `cannot parse '${text}' as a real number`);
  }
  return c.fail(`value '${text}' is not finite`);
}

/** Read the data lines of a `coordinate` file into a SparseMatrix. */
function readCoordinate(c: Cursor, banner: Banner, comments: string[]): MarketSparse {
  const sizeLine = c.line;
  const [m, n, nnz] = readSizeLine(c, 3, "rows columns entries") as [number, number, number];
  if (banner.symmetric) checkSquare(sizeLine, m, n);
  // Every entry needs at least "i j\n" (4 bytes): never allocate beyond what the text can hold.
  const room = Math.min(nnz, Math.floor((c.bytes.length - c.pos + 1) / 4));
  const rows = new Int32Array(room);
  const cols = new Int32Array(room);
  const vals = new Float64Array(room);
  const first = { pos: c.pos, line: c.line };
  const stored = readEntries(c, banner, [m, n, nnz], { rows, cols, vals }, comments);
  if (stored < nnz) {
    throw new MatrixMarketError(c.lastLine(), `file ends after ${stored} of the ${nnz} entries announced on line ${sizeLine}`);
  }
  expectNoMore(c, nnz, sizeLine, comments);
  let matrix: SparseMatrix;
  try {
    matrix = assemble(m, n, { rows, cols, vals });
  } catch (e) {
    if (!(e instanceof DuplicateSumError)) throw e;
    const at = `(${e.row + 1}, ${e.column + 1})`;
    throw new MatrixMarketError(entryLine(c.bytes, first, e.entry), `entry ${at} summed with the earlier entries at ${at} gives ${e.sum}, which is not finite`);
  }
  return { kind: "sparse", matrix, symmetric: banner.symmetric, field: banner.field, comments };
}

/** Line of the k-th (0-based) entry, counting data lines from `first` (the line after the size line). For error messages only. */
function entryLine(bytes: Uint8Array, first: { pos: number; line: number }, k: number): number {
  const c = new Cursor(bytes);
  c.pos = first.pos;
  c.line = first.line;
  for (let t = 0; t < k && c.toContent([]); t++) c.nextLine();
  c.toContent([]);
  return c.line;
}

/**
 * CSC from the entries read: directly when the file lists them column by
 * column with strictly increasing rows (the usual layout, and ours when
 * writing), otherwise by bucket sorting with duplicates summed.
 * Indices and values were already checked while reading.
 */
function assemble(m: number, n: number, t: Triplets): SparseMatrix {
  const { rows, cols, vals } = t;
  const nz = rows.length;
  for (let k = 1; k < nz; k++) {
    const dc = cols[k]! - cols[k - 1]!;
    if (dc < 0 || (dc === 0 && rows[k]! <= rows[k - 1]!)) return SparseMatrix.fromTriplets(m, n, rows, cols, vals);
  }
  const colPtr = new Int32Array(n + 1);
  for (let k = 0; k < nz; k++) colPtr[cols[k]! + 1]++;
  for (let j = 0; j < n; j++) colPtr[j + 1]! += colPtr[j]!;
  return SparseMatrix.trusted(m, n, colPtr, rows, vals);
}

interface Triplets {
  rows: Int32Array;
  cols: Int32Array;
  vals: Float64Array;
}

/**
 * The hot loop: read up to `nnz` entries `i j [v]` into `out` (0-based).
 * Returns the number read (fewer only when the text ends early).
 */
function readEntries(c: Cursor, banner: Banner, size: number[], out: Triplets, comments: string[]): number {
  const [m, n, nnz] = size as [number, number, number];
  const { rows, cols, vals } = out;
  const pattern = banner.field === "pattern";
  const integer = banner.field === "integer";
  const fields = pattern ? 2 : 3;
  const what = pattern ? "row column" : "row column value";
  for (let k = 0; k < nnz; k++) {
    if (!c.toContent(comments)) return k;
    const i = readIndex(c, "row", m);
    if (c.atLineEnd()) wrongFieldCount(c, 1, fields, what);
    const j = readIndex(c, "column", n);
    let v = 1;
    if (!pattern) {
      if (c.atLineEnd()) wrongFieldCount(c, 2, fields, what);
      v = readValue(c, integer);
    }
    if (!c.atLineEnd()) wrongFieldCount(c, fields, fields, what);
    if (banner.symmetric && i < j) {
      c.fail(`entry (${i}, ${j}) lies above the diagonal; a symmetric file stores only the lower triangle`);
    }
    if (k >= rows.length) c.fail("more entries than the text can hold"); // unreachable by construction
    rows[k] = i - 1;
    cols[k] = j - 1;
    vals[k] = v;
    c.nextLine();
  }
  return nnz;
}

/** Read a 1-based row or column index and check it against 1..limit. */
function readIndex(c: Cursor, what: "row" | "column", limit: number): number {
  const v = scanInteger(c);
  if (Number.isNaN(v)) c.fail(`${what} index '${c.token()}' is not an integer`);
  if (v < 1 || v > limit) c.fail(`${what} index ${v} out of range 1..${limit}`);
  return v;
}

/** Read the data lines of an `array` file: one value per line, column by column. */
function readArray(c: Cursor, banner: Banner, comments: string[]): MarketDense {
  const sizeLine = c.line;
  const [m, n] = readSizeLine(c, 2, "rows columns") as [number, number];
  if (banner.symmetric) checkSquare(sizeLine, m, n);
  const count = banner.symmetric ? (n * (n + 1)) / 2 : m * n;
  // Every value needs at least "v\n" (2 bytes): a count the text cannot hold
  // is never allocated; reading then stops at the end of the text with an error.
  const fits = count <= (c.bytes.length - c.pos + 1) / 2;
  const values = new Float64Array(fits ? m * n : 0);
  const integer = banner.field === "integer";
  let read = 0;
  for (let j = 0; j < n; j++) {
    for (let i = banner.symmetric ? j : 0; i < m; i++) {
      if (!c.toContent(comments)) {
        throw new MatrixMarketError(c.lastLine(), `file ends after ${read} of the ${count} values announced on line ${sizeLine}`);
      }
      const v = readValue(c, integer);
      if (!c.atLineEnd()) wrongFieldCount(c, 1, 1, "value");
      if (fits) {
        values[j * m + i] = v;
        if (banner.symmetric) values[i * m + j] = v;
      }
      read++;
      c.nextLine();
    }
  }
  expectNoMore(c, count, sizeLine, comments);
  return { kind: "dense", nrows: m, ncols: n, values, symmetric: banner.symmetric, field: integer ? "integer" : "real", comments };
}
