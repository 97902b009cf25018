/**
 * Matrix Market reading and writing, checked against the format description
 * (Boisvert, Pozo & Remington 1996, "The Matrix Market Exchange Formats:
 * Initial Design", NIST) and against ECMAScript's own Number() conversion for
 * the spelling of reals.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { readMatrixMarket, writeMatrixMarket, writeMatrixMarketArray } from "../src/matrix/market.js";
import type { MarketContents, MarketDense, MarketSparse } from "../src/matrix/market.js";
import { SparseMatrix } from "../src/matrix/sparse.js";
import { InputError, MatrixMarketError, NotSymmetricError } from "../src/errors.js";

function sparse(r: MarketContents): MarketSparse {
  if (r.kind !== "sparse") throw new Error(`expected a sparse result, got ${r.kind}`);
  return r;
}
function dense(r: MarketContents): MarketDense {
  if (r.kind !== "dense") throw new Error(`expected a dense result, got ${r.kind}`);
  return r;
}

/** Dense rows of an m × n matrix built by summing (row, col, value) triplets: the test's own model. */
function denseFromTriplets(m: number, n: number, entries: readonly (readonly [number, number, number])[]): number[][] {
  const out = Array.from({ length: m }, () => new Array<number>(n).fill(0));
  for (const [i, j, v] of entries) out[i]![j]! += v;
  return out;
}

/** The stored pattern of a matrix as "i,j" keys (0-based). */
function patternOf(a: SparseMatrix): string[] {
  const keys: string[] = [];
  for (let j = 0; j < a.ncols; j++) for (let p = a.colPtr[j]!; p < a.colPtr[j + 1]!; p++) keys.push(`${a.rowIdx[p]},${j}`);
  return keys;
}

/** Run `read` and return the MatrixMarketError it throws (fails the test if it does not throw one). */
function readError(text: string): MatrixMarketError {
  try {
    readMatrixMarket(text);
  } catch (e) {
    expect(e).toBeInstanceOf(MatrixMarketError);
    return e as MatrixMarketError;
  }
  throw new Error("expected a MatrixMarketError, nothing was thrown");
}

describe("examples in the shape of the NIST format description", () => {
  it("reads the 5 × 5 coordinate real general example (from memory)", () => {
    // The description's first example, as remembered: a comment block, a size
    // line with leading blanks, 8 entries in exponent form, one negative.
    const text = [
      "%%MatrixMarket matrix coordinate real general",
      "%=================================================================================",
      "%",
      "% This ASCII file represents a sparse MxN matrix with L",
      "% nonzeros in the following Matrix Market format:",
      "%",
      "%=================================================================================",
      "  5  5  8",
      "    1     1   1.000e+00",
      "    2     2   1.050e+01",
      "    3     3   1.500e-02",
      "    1     4   6.000e+00",
      "    4     2   2.505e+02",
      "    4     4  -2.800e+02",
      "    4     5   3.332e+01",
      "    5     5   1.200e+01",
    ].join("\n");
    const r = sparse(readMatrixMarket(text));
    expect(r.field).toBe("real");
    expect(r.symmetric).toBe(false);
    expect(r.comments).toHaveLength(6);
    expect(r.comments[2]).toBe("This ASCII file represents a sparse MxN matrix with L");
    // Expected dense matrix written out by hand from the 1-based entries above.
    expect(r.matrix.toDense()).toEqual([
      [1, 0, 0, 6, 0],
      [0, 10.5, 0, 0, 0],
      [0, 0, 0.015, 0, 0],
      [0, 250.5, 0, -280, 33.32],
      [0, 0, 0, 0, 12],
    ]);
  });

  it("reads an array real general file column by column (shape from memory)", () => {
    // The description's dense form: size line "M N", then M·N values in column-major order.
    const text = "%%MatrixMarket matrix array real general\n% a 4 x 3 matrix\n4 3\n1\n2\n3\n4\n5\n6\n7\n8\n9\n10\n11\n12\n";
    const r = dense(readMatrixMarket(text));
    expect([r.nrows, r.ncols]).toEqual([4, 3]);
    // Column-major: entry (i, j) is value number j·4 + i + 1.
    expect(Array.from(r.values)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]);
    expect(r.comments).toEqual(["a 4 x 3 matrix"]);
  });

  it("reads a symmetric coordinate file as the stored lower triangle (description: only entries on or below the diagonal)", () => {
    const text = "%%MatrixMarket matrix coordinate real symmetric\n3 3 4\n1 1 4\n2 1 -1\n2 2 4\n3 2 -1\n";
    const r = sparse(readMatrixMarket(text));
    expect(r.symmetric).toBe(true);
    expect(r.matrix.toDense()).toEqual([
      [4, 0, 0],
      [-1, 4, 0],
      [0, -1, 0],
    ]);
  });

  it("reads a symmetric array file (lower triangle column by column) into the full dense matrix", () => {
    const text = "%%MatrixMarket matrix array real symmetric\n3 3\n1\n2\n3\n4\n5\n6\n";
    const r = dense(readMatrixMarket(text));
    // Lower triangle in column order: (1,1)=1 (2,1)=2 (3,1)=3 (2,2)=4 (3,2)=5 (3,3)=6, mirrored.
    expect(Array.from(r.values)).toEqual([1, 2, 3, 2, 4, 5, 3, 5, 6]);
  });

  it("reads pattern files with every value 1 and integer files exactly", () => {
    const p = sparse(readMatrixMarket("%%MatrixMarket matrix coordinate pattern general\n2 3 3\n1 1\n2 3\n1 2\n"));
    expect(p.field).toBe("pattern");
    expect(p.matrix.toDense()).toEqual([[1, 1, 0], [0, 0, 1]]);
    const q = sparse(readMatrixMarket("%%MatrixMarket matrix coordinate integer general\n2 2 2\n1 1 -7\n2 2 9007199254740993\n"));
    expect(q.field).toBe("integer");
    // 2^53 + 1 is not a double; it rounds to 2^53 as Number("9007199254740993") does (ECMAScript).
    expect(q.matrix.toDense()).toEqual([[-7, 0], [0, Number("9007199254740993")]]);
  });
});

describe("lexical details", () => {
  it("accepts CRLF line endings, tabs, trailing blanks, blank lines and comments anywhere after the banner", () => {
    const text =
      "%%MatrixMarket Matrix COORDINATE Real General  \r\n" +
      "\r\n% first\r\n   \r\n" +
      "2\t2\t3 \r\n" +
      "% between entries\r\n" +
      "1 1 1.5 \t\r\n" +
      "\r\n" +
      "2\t1\t-2\r\n" +
      "   2 2 3   \r\n" +
      "% trailing comment\r\n\r\n";
    const r = sparse(readMatrixMarket(text));
    expect(r.matrix.toDense()).toEqual([[1.5, 0], [-2, 3]]);
    expect(r.comments).toEqual(["first", "between entries", "trailing comment"]);
  });

  it("reads the exponent and sign spellings 1e3, 1.5E-02, -.5, +2., 0.0e0, -0 as Number() does (ECMAScript)", () => {
    const spellings = ["1e3", "1.5E-02", "-.5", "+2.", "0.0e0", "-0", "1.e+2", "123456789012345678901234567890", "4.9e-324", "1.7976931348623157e308", "0.000001", "1.0000000000000000e+00"];
    const text = `%%MatrixMarket matrix array real general\n${spellings.length} 1\n${spellings.join("\n")}\n`;
    const r = dense(readMatrixMarket(text));
    spellings.forEach((s, k) => expect(Object.is(r.values[k], Number(s))).toBe(true));
  });

  it("sums duplicate entries (finite-element assembly convention of the library)", () => {
    const r = sparse(readMatrixMarket("%%MatrixMarket matrix coordinate real general\n2 2 4\n1 1 1\n2 2 5\n1 1 2.5\n1 1 -0.5\n"));
    expect(r.matrix.nnz).toBe(2);
    expect(r.matrix.toDense()).toEqual([[3, 0], [0, 5]]);
  });

  it("accepts bytes as well as text, and a UTF-8 byte order mark and non-ASCII comments", () => {
    // The long value takes the Number() fallback, which then works from bytes, not string offsets.
    const long = "0.1234567890123456789012345";
    const text = `\uFEFF%%MatrixMarket matrix coordinate real general\n% Grüße, ∇·u = 0\n1 1 1\n1 1 ${long}\n`;
    const fromText = sparse(readMatrixMarket(text));
    const fromBytes = sparse(readMatrixMarket(new TextEncoder().encode(text)));
    expect(fromText.matrix.toDense()).toEqual([[Number(long)]]);
    expect(fromBytes.matrix.toDense()).toEqual([[Number(long)]]);
    expect(fromBytes.comments).toEqual(["Grüße, ∇·u = 0"]);
    // A Node Buffer is a Uint8Array too.
    expect(sparse(readMatrixMarket(Buffer.from(text, "utf8"))).matrix.toDense()).toEqual([[Number(long)]]);
  });

  it("refuses input that is neither text nor bytes with an InputError", () => {
    expect(() => readMatrixMarket(42 as never)).toThrow(InputError);
    expect(() => readMatrixMarket(null as never)).toThrow(/got null/);
  });

  it("reads entries in any order, including row-major and reversed", () => {
    const r = sparse(readMatrixMarket("%%MatrixMarket matrix coordinate real general\n3 3 4\n3 3 4\n1 2 2\n1 1 1\n2 1 3\n"));
    expect(r.matrix.toDense()).toEqual([[1, 2, 0], [3, 0, 0], [0, 0, 4]]);
    expect(patternOf(r.matrix)).toEqual(["0,0", "1,0", "0,1", "2,2"]);
  });

  it("reads an empty matrix and a 0 × 0 matrix", () => {
    expect(sparse(readMatrixMarket("%%MatrixMarket matrix coordinate real general\n3 4 0\n")).matrix.nnz).toBe(0);
    expect(sparse(readMatrixMarket("%%MatrixMarket matrix coordinate real symmetric\n0 0 0")).matrix.ncols).toBe(0);
    expect(dense(readMatrixMarket("%%MatrixMarket matrix array real general\n0 5\n")).values.length).toBe(0);
  });
});

describe("malformed files: MatrixMarketError with the 1-based line", () => {
  const H = "%%MatrixMarket matrix coordinate real general\n";
  const S = "%%MatrixMarket matrix coordinate real symmetric\n";
  const cases: [string, string, number, string][] = [
    ["empty text", "", 1, "missing banner"],
    ["no banner", "3 3 1\n1 1 1\n", 1, "missing banner"],
    ["misspelt banner", "%%MatrixMarkt matrix coordinate real general\n1 1 0\n", 1, "missing banner"],
    ["banner with too few words", "%%MatrixMarket matrix coordinate real\n1 1 0\n", 1, "expected 4"],
    ["unknown object", "%%MatrixMarket vector coordinate real general\n1 1 0\n", 1, "unknown object 'vector'"],
    ["unknown format", "%%MatrixMarket matrix sparse real general\n1 1 0\n", 1, "unknown format 'sparse'"],
    ["unknown field", "%%MatrixMarket matrix coordinate float general\n1 1 0\n", 1, "unknown field 'float'"],
    ["unknown symmetry", "%%MatrixMarket matrix coordinate real lower\n1 1 0\n", 1, "unknown symmetry 'lower'"],
    ["complex refused by name", "%%MatrixMarket matrix coordinate complex general\n1 1 0\n", 1, "complex"],
    ["hermitian refused by name", "%%MatrixMarket matrix coordinate real hermitian\n1 1 0\n", 1, "Hermitian"],
    ["skew-symmetric refused by name", "%%MatrixMarket matrix coordinate real skew-symmetric\n1 1 0\n", 1, "skew-symmetric"],
    ["pattern array", "%%MatrixMarket matrix array pattern general\n1 1\n", 1, "'pattern' is not allowed"],
    ["missing size line", H + "% only a comment\n\n", 3, "missing size line"],
    ["size line with two fields", H + "% c\n3 3\n1 1 1\n", 3, "size line has 2 fields, expected 3"],
    ["size line with four fields", H + "3 3 1 1\n1 1 1\n", 2, "more than 3 fields"],
    ["negative size", H + "3 -3 1\n1 1 1\n", 2, "'-3' is not a non-negative integer"],
    ["non-integer size", H + "3 3.0 1\n1 1 1\n", 2, "'3.0' is not a non-negative integer"],
    ["non-square symmetric", S + "3 4 1\n1 1 1\n", 2, "must be square"],
    ["fewer entries than announced", H + "3 3 3\n1 1 1\n2 2 1\n", 4, "file ends after 2 of the 3 entries announced on line 2"],
    ["fewer entries, no final newline", H + "3 3 3\n1 1 1\n2 2 1", 4, "file ends after 2 of the 3"],
    ["more entries than announced", H + "3 3 1\n1 1 1\n% c\n2 2 1\n", 5, "more entries than the 1 announced on line 2"],
    ["row index out of range", H + "3 3 2\n1 1 1\n9 1 1\n", 4, "row index 9 out of range 1..3"],
    ["column index 0", H + "3 3 1\n1 0 1\n", 3, "column index 0 out of range 1..3"],
    ["negative row index", H + "3 3 1\n-1 1 1\n", 3, "row index -1 out of range 1..3"],
    ["non-integer index", H + "3 3 1\n1.0 1 1\n", 3, "row index '1.0' is not an integer"],
    ["unparsable number", H + "3 3 1\n1 1 1.2.3\n", 3, "cannot parse '1.2.3'"],
    ["letters for a number", H + "3 3 1\n1 1 abc\n", 3, "cannot parse 'abc'"],
    ["exponent without digits", H + "3 3 1\n1 1 1e\n", 3, "cannot parse '1e'"],
    ["hexadecimal is not decimal", H + "3 3 1\n1 1 0x10\n", 3, "cannot parse '0x10'"],
    ["overflowing value", H + "3 3 1\n1 1 1e400\n", 3, "value '1e400' is not finite"],
    ["infinity", H + "3 3 1\n1 1 -Infinity\n", 3, "not finite"],
    ["NaN", H + "3 3 1\n1 1 nan\n", 3, "not finite"],
    ["above the diagonal in a symmetric file", S + "3 3 2\n1 1 1\n1 2 1\n", 4, "entry (1, 2) lies above the diagonal"],
    ["too few fields", H + "3 3 1\n1 1\n", 3, "expected 3 fields (row column value), found 2"],
    ["only one field", H + "3 3 1\n1\n", 3, "expected 3 fields (row column value), found 1"],
    ["too many fields", H + "3 3 1\n1 1 1 4\n", 3, "expected 3 fields (row column value), found 4"],
    ["value on a pattern line", "%%MatrixMarket matrix coordinate pattern general\n3 3 1\n1 1 1\n", 3, "expected 2 fields (row column), found 3"],
    ["non-integer in an integer file", "%%MatrixMarket matrix coordinate integer general\n3 3 1\n1 1 1.5\n", 3, "'1.5' is not an integer"],
    ["array with too few values", "%%MatrixMarket matrix array real general\n2 2\n1\n2\n3\n", 5, "file ends after 3 of the 4 values"],
    ["array with too many values", "%%MatrixMarket matrix array real general\n1 2\n1\n2\n3\n", 5, "more entries than the 2 announced on line 2"],
    ["array with two values on a line", "%%MatrixMarket matrix array real general\n2 1\n1 2\n", 3, "expected 1 field (value), found 2"],
    ["array size line with three fields", "%%MatrixMarket matrix array real general\n2 1 2\n1\n2\n", 2, "more than 2 fields"],
    ["duplicates whose sum overflows (1e308 + 1e308 > DBL_MAX, IEEE 754)", H + "3 3 3\n1 1 1e308\n% c\n2 2 1\n\n1 1 1e308\n", 7, "entry (1, 1) summed with the earlier entries at (1, 1) gives Infinity"],
    ["CRLF file with an error on line 4", "%%MatrixMarket matrix coordinate real general\r\n3 3 2\r\n1 1 1\r\n4 1 1\r\n", 4, "row index 4 out of range 1..3"],
  ];
  for (const [name, text, line, message] of cases) {
    it(`${name}: line ${line}`, () => {
      const e = readError(text);
      expect(e.line).toBe(line);
      expect(e.message).toContain(`line ${line}: `);
      expect(e.message).toContain(message);
    });
  }

  it("mutated files either read or raise MatrixMarketError: never another error, never a hang (property)", () => {
    const base = [
      "%%MatrixMarket matrix coordinate real symmetric\n% c\n3 3 4\n1 1 4.5\n2 1 -1e-3\n3 3 2\n3 2 .5\n",
      "%%MatrixMarket matrix array integer general\n2 2\n1\n-2\n3\n4\n",
      "%%MatrixMarket matrix coordinate pattern general\n2 3 2\n1 3\n2 1\n",
    ];
    const alphabet = fc.constantFrom(..."0123456789 \t\r\n%.-+eEx");
    const edit = fc.tuple(fc.nat(), fc.constantFrom("replace", "insert", "delete"), alphabet);
    fc.assert(
      fc.property(fc.constantFrom(...base), fc.array(edit, { minLength: 1, maxLength: 4 }), (text, edits) => {
        let t = text;
        for (const [at, kind, ch] of edits) {
          const k = at % (t.length + 1);
          t = kind === "insert" ? t.slice(0, k) + ch + t.slice(k) : t.slice(0, k) + (kind === "replace" ? ch : "") + t.slice(k + 1);
        }
        try {
          readMatrixMarket(t);
        } catch (e) {
          expect(e).toBeInstanceOf(MatrixMarketError);
          expect((e as MatrixMarketError).line).toBeGreaterThanOrEqual(1);
        }
      }),
      { numRuns: 2000 },
    );
  });

  it("never allocates what the text cannot hold: a huge announced count fails at the end of the text", () => {
    const e = readError(H + "200000000 200000000 2000000000\n1 1 1\n");
    expect(e.line).toBe(3);
    expect(e.message).toContain("file ends after 1 of the 2000000000 entries");
    const d = readError("%%MatrixMarket matrix array real general\n100000 100000\n1\n");
    expect(d.line).toBe(3);
    expect(d.message).toContain("file ends after 1 of the 10000000000 values");
  });

  it("refuses on the size line, before allocating, sizes beyond 32-bit indices and dimensions beyond 2^28", () => {
    // 2147483647 columns would need 8 GiB of column pointers for a 60-byte file (it used to end the process)
    const cases: [string, string][] = [
      [H + "3000000000 1 0\n", "larger than 2147483647"],
      [H + "1 2147483647 1\n1 1 1\n", "2147483647 columns exceed the largest dimension septum handles, 268435456"],
      ["%%MatrixMarket matrix array real general\n268435457 1\n1\n", "268435457 rows exceed"],
    ];
    for (const [text, message] of cases) {
      const e = readError(text);
      expect(e.line).toBe(2);
      expect(e.message).toContain(message);
    }
    // the size line's entry count is not a dimension: a count above 2^28 reads on to the end of the text
    expect(readError(H + "2 2 300000000\n1 1 1\n").message).toContain("file ends after 1 of the 300000000 entries");
  });
});

// ---------------------------------------------------------------------------
// Round trips (property tests, fast-check).

/** Random m × n triplet lists with repeats allowed, values from the given arbitrary. */
function tripletsArb(value: fc.Arbitrary<number>, square = false) {
  return fc
    .tuple(fc.integer({ min: 1, max: 9 }), fc.integer({ min: 1, max: 9 }))
    .chain(([m, n0]) => {
      const n = square ? m : n0;
      const entry = fc.tuple(fc.integer({ min: 0, max: m - 1 }), fc.integer({ min: 0, max: n - 1 }), value);
      return fc.tuple(fc.constant(m), fc.constant(n), fc.array(entry, { maxLength: 40 }));
    });
}

/** Decimal strings of `digits` significant digits at and beside the midpoint above the double x > 0. */
function nearMidpoint(x: number, digits: number): string[] {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const bits = view.getBigUint64(0);
  const exponent = Number((bits >> 52n) & 0x7ffn) - 1075;
  const mantissa = (bits & ((1n << 52n) - 1n)) | (1n << 52n);
  const shift = BigInt(1 - exponent); // x > 2^-1000, so exponent < 0 for the range used
  const decimal = ((2n * mantissa + 1n) * 5n ** shift).toString(); // midpoint · 10^shift
  const pointAt = decimal.length - Number(shift);
  const cut = BigInt(decimal.slice(0, digits));
  return [cut - 1n, cut, cut + 1n].map((t) => `${t}e${pointAt - t.toString().length}`);
}

const anyDouble = fc.double({ noNaN: true, noDefaultInfinity: true });
const smallInteger = fc.integer({ min: -1000, max: 1000 });

describe("round trips (property tests)", () => {
  it("general real: write then read gives back every double exactly (shortest form)", () => {
    fc.assert(
      fc.property(tripletsArb(anyDouble), ([m, n, entries]) => {
        // Distinct positions so that summing cannot change values.
        const seen = new Set<string>();
        const unique = entries.filter(([i, j]) => !seen.has(`${i},${j}`) && seen.add(`${i},${j}`));
        const a = SparseMatrix.fromTriplets(m, n, unique.map((e) => e[0]), unique.map((e) => e[1]), unique.map((e) => e[2]));
        const back = sparse(readMatrixMarket(writeMatrixMarket(a)));
        expect(back.matrix.nrows).toBe(m);
        expect(back.matrix.ncols).toBe(n);
        expect(Array.from(back.matrix.colPtr)).toEqual(Array.from(a.colPtr));
        expect(Array.from(back.matrix.rowIdx)).toEqual(Array.from(a.rowIdx));
        for (let p = 0; p < a.nnz; p++) expect(Object.is(back.matrix.values[p], a.values[p])).toBe(true);
      }),
    );
  });

  it("general integer and pattern: the values (or the pattern) come back", () => {
    fc.assert(
      fc.property(tripletsArb(smallInteger), ([m, n, entries]) => {
        const a = SparseMatrix.fromTriplets(m, n, entries.map((e) => e[0]), entries.map((e) => e[1]), entries.map((e) => e[2]));
        const ints = sparse(readMatrixMarket(writeMatrixMarket(a, { field: "integer" })));
        expect(ints.field).toBe("integer");
        // Model: dense sum of the triplets, built by the test itself.
        expect(ints.matrix.toDense()).toEqual(denseFromTriplets(m, n, entries));
        const pat = sparse(readMatrixMarket(writeMatrixMarket(a, { field: "pattern" })));
        expect(pat.field).toBe("pattern");
        expect(patternOf(pat.matrix)).toEqual(patternOf(a));
        expect(Array.from(pat.matrix.values).every((v) => v === 1)).toBe(true);
      }),
    );
  });

  it("symmetric: lower, upper and full storage all write the same file, which reads back as the lower triangle", () => {
    fc.assert(
      fc.property(tripletsArb(smallInteger, true), ([n, , entries]) => {
        // Model: a symmetric dense matrix from the triplets, S = B + Bᵀ.
        const b = denseFromTriplets(n, n, entries);
        const s = b.map((row, i) => row.map((v, j) => v + b[j]![i]!));
        const lower: number[][] = s.map((row, i) => row.map((v, j) => (i >= j ? v : 0)));
        const upper: number[][] = s.map((row, i) => row.map((v, j) => (i <= j ? v : 0)));
        const files = [SparseMatrix.fromDense(s), SparseMatrix.fromDense(lower), SparseMatrix.fromDense(upper)].map((a) =>
          writeMatrixMarket(a, { symmetric: true }),
        );
        expect(files[1]).toBe(files[0]);
        expect(files[2]).toBe(files[0]);
        const back = sparse(readMatrixMarket(files[0]!));
        expect(back.symmetric).toBe(true);
        expect(back.matrix.toDense()).toEqual(lower);
      }),
    );
  });

  it("dense arrays, general and symmetric, come back exactly", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 6 }),
        fc.integer({ min: 0, max: 6 }),
        fc.array(anyDouble, { minLength: 36, maxLength: 36 }),
        (m, n, pool) => {
          const values = Float64Array.from(pool.slice(0, m * n));
          const back = dense(readMatrixMarket(writeMatrixMarketArray(m, n, values)));
          expect([back.nrows, back.ncols]).toEqual([m, n]);
          for (let k = 0; k < m * n; k++) expect(Object.is(back.values[k], values[k])).toBe(true);
          // Symmetric: mirror the lower triangle of an n × n block.
          const sym = new Float64Array(n * n);
          for (let j = 0; j < n; j++) for (let i = j; i < n; i++) sym[j * n + i] = sym[i * n + j] = pool[(j * n + i) % 36]!;
          const text = writeMatrixMarketArray(n, n, sym, { symmetric: true });
          expect(text.trim().split("\n")).toHaveLength(2 + (n * (n + 1)) / 2);
          const sback = dense(readMatrixMarket(text));
          expect(sback.symmetric).toBe(true);
          for (let k = 0; k < n * n; k++) expect(Object.is(sback.values[k], sym[k])).toBe(true);
        },
      ),
    );
  });

  it("reals in any decimal spelling read as Number() reads them (ECMAScript StringToNumber is correctly rounded)", () => {
    const spelling = fc.oneof(
      anyDouble.map((x) => String(x)),
      fc.tuple(anyDouble, fc.integer({ min: 0, max: 20 })).map(([x, d]) => x.toExponential(d)),
      fc.tuple(anyDouble, fc.integer({ min: 1, max: 21 })).map(([x, d]) => x.toPrecision(d).toUpperCase()),
      fc.tuple(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.integer({ min: 0, max: 30 })).map(([x, d]) => x.toFixed(d)),
      fc.tuple(fc.stringMatching(/^[0-9]{0,25}$/), fc.stringMatching(/^[0-9]{0,25}$/), fc.integer({ min: -340, max: 340 }), fc.constantFrom("", "+", "-"))
        .filter(([a, b]) => a.length + b.length > 0)
        .map(([a, b, e, sign]) => `${sign}${a}.${b}e${e}`),
    );
    fc.assert(
      fc.property(fc.array(spelling, { minLength: 1, maxLength: 20 }), (words) => {
        const finite = words.filter((w) => Number.isFinite(Number(w)));
        const text = `%%MatrixMarket matrix array real general\n${finite.length} 1\n${finite.join("\n")}\n`;
        const r = dense(readMatrixMarket(text));
        finite.forEach((w, k) => expect(Object.is(r.values[k], Number(w))).toBe(true));
      }),
    );
  });

  it("16 to 19 digit decimals next to the exact midpoint between two adjacent doubles read as Number() reads them", () => {
    // The hardest inputs for correct rounding. The midpoint (2m + 1)·2^(e−1) of a
    // double m·2^e is written out exactly with BigInt arithmetic, cut to d digits,
    // and the neighbours one unit away in the last digit are added.
    const words: string[] = [];
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1e6, noNaN: true }), (x) => {
        words.push(...nearMidpoint(x, 16), ...nearMidpoint(x, 17), ...nearMidpoint(x, 18), ...nearMidpoint(x, 19));
      }),
      { numRuns: 2000 },
    );
    const r = dense(readMatrixMarket(`%%MatrixMarket matrix array real general\n${words.length} 1\n${words.join("\n")}\n`));
    const wrong = words.filter((w, k) => !Object.is(r.values[k], Number(w)));
    expect(wrong).toEqual([]);
  });

  it("randomly formatted files (blanks, tabs, CRLF, comments, blank lines, repeats) read as the summed triplets", () => {
    const sep = fc.constantFrom(" ", "\t", "   ", " \t ");
    fc.assert(
      fc.property(tripletsArb(smallInteger), fc.infiniteStream(fc.tuple(sep, sep, fc.boolean(), fc.boolean(), fc.boolean())), ([m, n, entries], noise) => {
        const it = noise[Symbol.iterator]();
        const eol = entries.length % 2 === 0 ? "\n" : "\r\n";
        const lines = ["%%MatrixMarket matrix coordinate real general", "% generated", `${m} ${n} ${entries.length}`];
        for (const [i, j, v] of entries) {
          const [s1, s2, comment, blank, trailing] = it.next().value!;
          if (comment) lines.push("% noise");
          if (blank) lines.push("");
          lines.push(`${trailing ? s1 : ""}${i + 1}${s1}${j + 1}${s2}${v}${trailing ? s2 : ""}`);
        }
        const r = sparse(readMatrixMarket(lines.join(eol)));
        expect(r.matrix.toDense()).toEqual(denseFromTriplets(m, n, entries));
      }),
    );
  });
});

describe("writer", () => {
  it("writes the banner, comments, size line and 1-based entries column by column", () => {
    const a = SparseMatrix.fromDense([[2, 0], [-1, 0.5]]);
    const text = writeMatrixMarket(a, { comment: "two\n\n indented" });
    expect(text).toBe(
      "%%MatrixMarket matrix coordinate real general\n% two\n%\n%  indented\n2 2 3\n1 1 2\n2 1 -1\n2 2 0.5\n",
    );
    // Comments round-trip exactly, blank and indented lines included.
    expect(readMatrixMarket(text).comments).toEqual(["two", "", " indented"]);
  });

  it("writes a fixed number of significant digits when asked, rounding to within half a unit in the last place", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e300, max: 1e300, noNaN: true }), fc.integer({ min: 1, max: 17 }), (x, digits) => {
        const a = SparseMatrix.fromTriplets(1, 1, [0], [0], [x]);
        const back = sparse(readMatrixMarket(writeMatrixMarket(a, { precision: digits }))).matrix.values[0]!;
        // Rounding to d significant digits errs by at most half a unit in the d-th digit (common practice).
        expect(Math.abs(back - x)).toBeLessThanOrEqual(0.5 * Math.pow(10, 1 - digits) * Math.abs(x) * (1 + 1e-12));
      }),
    );
  });

  it("refuses what it cannot write, with typed errors", () => {
    const rect = SparseMatrix.fromDense([[1, 2, 3]]);
    expect(() => writeMatrixMarket(rect, { symmetric: true })).toThrow(InputError);
    const unsym = SparseMatrix.fromDense([[1, 2], [3, 1]]);
    expect(() => writeMatrixMarket(unsym, { symmetric: true })).toThrow(NotSymmetricError);
    const frac = SparseMatrix.fromDense([[1.5]]);
    expect(() => writeMatrixMarket(frac, { field: "integer" })).toThrow(/entry \(row 0, column 0\): value 1.5 is not an integer/);
    expect(() => writeMatrixMarket(frac, { precision: 0 })).toThrow(InputError);
    expect(() => writeMatrixMarket(frac, { precision: 18 })).toThrow(InputError);
    expect(() => writeMatrixMarket(frac, { field: "complex" as never })).toThrow(InputError);
    expect(() => writeMatrixMarketArray(2, 2, [1, 2, 3])).toThrow(/length 3, expected/);
    expect(() => writeMatrixMarketArray(1, 1, [Number.NaN])).toThrow(/not finite/);
    expect(() => writeMatrixMarketArray(2, 2, [1, 2, 3, 4], { symmetric: true })).toThrow(NotSymmetricError);
    expect(() => writeMatrixMarketArray(2, 1, [1, 2], { symmetric: true })).toThrow(InputError);
  });

  it("writes large integers without an exponent in an integer file", () => {
    const a = SparseMatrix.fromTriplets(1, 1, [0], [0], [1e22]);
    const text = writeMatrixMarket(a, { field: "integer" });
    expect(text).toContain("1 1 10000000000000000000000\n");
    expect(sparse(readMatrixMarket(text)).matrix.values[0]).toBe(1e22);
  });
});
