import { afterAll, describe, expect, it } from "vitest";
import { mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { main } from "../src/cli/main.js";
import { VERSION } from "../src/cli/version.js";
import { HELP, MAIN_HELP } from "../src/cli/help.js";
import { SPECS } from "../src/cli/options.js";
import { readMatrixMarket, writeMatrixMarket } from "../src/matrix/market.js";
import { grid2d as grid2dLower } from "./helpers/patterns.js";
import { powerLawLaplacian } from "./helpers/networks.js";
import { symmetricMultiply } from "../src/matrix/symmetric.js";
import { SparseMatrix } from "../src/matrix/sparse.js";

const dir = mkdtempSync(join(tmpdir(), "septum-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function file(name: string, text: string): string {
  writeFileSync(join(dir, name), text);
  return name;
}

/** Run the command in-process with captured output and a clock advancing 0.3 s per reading. */
function run(args: string[], tty = false) {
  let out = "", err = "", t = 0;
  const code = main(args, { stdout: (s) => (out += s), stderr: (s) => (err += s), stderrIsTTY: tty, cwd: dir, now: () => (t += 0.3) });
  return { code, out, err };
}

/** One line on stderr, no stack trace. */
function expectOneLineError(r: { code: number; err: string }, code: number, ...parts: string[]) {
  expect(r.code).toBe(code);
  const lines = r.err.trim().split("\n");
  expect(lines[0]).toMatch(/^septum: /);
  for (const p of parts) expect(lines[0]).toContain(p);
  expect(r.err).not.toMatch(/\n\s+at /);
}

const SPD3 = `%%MatrixMarket matrix coordinate real symmetric
3 3 5
1 1 4
2 1 -1
2 2 4
3 2 -1
3 3 4
`;

describe("septum: errors a person can act on", () => {
  it("missing file", () => expectOneLineError(run(["solve", "nope.mtx"]), 1, "nope.mtx: no such file"));

  it("a directory", () => {
    mkdirSync(join(dir, "adir"), { recursive: true });
    expectOneLineError(run(["solve", "adir"]), 1, "adir: is a directory");
  });

  it("an empty file", () => expectOneLineError(run(["analyze", file("empty.mtx", "")]), 1, "empty.mtx: the file is empty"));

  it("an index out of range names the file and the 1-based line", () => {
    const bad = file("bad.mtx", "%%MatrixMarket matrix coordinate real general\n3 3 2\n1 1 1\n9 1 2\n");
    expectOneLineError(run(["solve", bad]), 1, "bad.mtx: line 4:", "row index 9 out of range 1..3");
  });

  it("a non-symmetric matrix asked for Cholesky names the entry in file numbering", () => {
    const ns = file("ns.mtx", "%%MatrixMarket matrix coordinate real general\n3 3 5\n1 1 4\n2 2 4\n3 3 4\n3 1 1\n1 3 2\n");
    expectOneLineError(run(["solve", ns]), 1, "ns.mtx: the matrix is not symmetric", "(3, 1)", "(1, 3)");
  });

  it("a matrix that is not positive definite names the column in file numbering", () => {
    // diag(1, 2, -3, 4): the only non-positive pivot is the diagonal entry of column 3, whatever the ordering
    const d = file("diag.mtx", "%%MatrixMarket matrix coordinate real symmetric\n4 4 4\n1 1 1\n2 2 2\n3 3 -3\n4 4 4\n");
    for (const ordering of ["nested-dissection", "minimum-degree", "natural"]) {
      expectOneLineError(run(["solve", d, "--ordering", ordering]), 1, "diag.mtx: the matrix is not positive definite", "at column 3", "--method ldlt");
    }
    // [[1, 2], [2, 1]] in natural order: second pivot 1 − 2·2/1 = −3 at column 2 (hand computation)
    const t = file("indef.mtx", "%%MatrixMarket matrix coordinate real symmetric\n2 2 3\n1 1 1\n2 1 2\n2 2 1\n");
    expectOneLineError(run(["solve", t, "--ordering", "natural"]), 1, "pivot -3.00 at column 2");
  });

  it("L·D·Lᵀ stopped by a zero pivot says so in L·D·Lᵀ terms, not 'not positive definite', with the column in file numbering", () => {
    // diag(1, 2, 0, 4): d_j is the diagonal entry itself, so the zero pivot is column 3 whatever the ordering (by hand).
    const d = file("diag0.mtx", "%%MatrixMarket matrix coordinate real symmetric\n4 4 4\n1 1 1\n2 2 2\n3 3 0\n4 4 4\n");
    for (const ordering of ["nested-dissection", "minimum-degree", "natural"]) {
      const r = run(["solve", d, "--method", "ldlt", "--ordering", ordering]);
      expectOneLineError(r, 1, "diag0.mtx: L·D·Lᵀ met a zero or tiny pivot 0.00 at column 3", "singular", "another --ordering");
      expect(r.err).not.toContain("positive definite");
    }
    // [[1, 2], [2, 4]] (rank 1) in natural order: d1 = 1, d2 = 4 − 2·2/1 = 0 at column 2 (hand computation).
    const s = file("rank1.mtx", "%%MatrixMarket matrix coordinate real symmetric\n2 2 3\n1 1 1\n2 1 2\n2 2 4\n");
    expectOneLineError(run(["solve", s, "--method", "ldlt", "--ordering", "natural"]), 1, "rank1.mtx: L·D·Lᵀ met a zero or tiny pivot 0.00 at column 2");
    // Cholesky's message is unchanged: the same matrix is positive semidefinite, and its zero pivot is not positive.
    expectOneLineError(run(["solve", s, "--ordering", "natural"]), 1, "rank1.mtx: the matrix is not positive definite: pivot 0.00 at column 2", "try --method ldlt");
  });

  it("bad options: exit code 2 and a hint", () => {
    const a = file("a.mtx", SPD3);
    expectOneLineError(run(["solve", a, "--frobnicate"]), 2, "unknown option", "--frobnicate");
    expectOneLineError(run(["solve", a, "--ordering", "sideways"]), 2, "unknown ordering 'sideways'");
    expectOneLineError(run(["solve", a, "--method", "lu"]), 2, "unknown method 'lu'");
    expectOneLineError(run(["solve"]), 2, "missing the matrix file");
    expectOneLineError(run(["solve", a, "b.mtx"]), 2, "unexpected argument 'b.mtx'");
    expectOneLineError(run(["transmogrify"]), 2, "unknown command 'transmogrify'");
    expectOneLineError(run(["generate", "grid2d", "zero", "-o", "g.mtx"]), 2, "generate grid2d: the size must be a positive integer, got 'zero'");
    expectOneLineError(run(["generate", "grid2d", "5", "--stencil", "7", "-o", "g.mtx"]), 2, "--stencil: expected 5 or 9");
    expectOneLineError(run(["generate", "mesh2d", "10", "-o", "g.mtx"]), 1, "mesh2d size must be an integer in 60..6000");
    expectOneLineError(run(["report", a]), 2, "-o report.html is required");
    expectOneLineError(run(["analyze", a, "--threads", "0"]), 2, "--threads: expected an integer in 1..256, got '0'");
    expectOneLineError(run(["solve", a, "--threads", "two"]), 2, "--threads: expected an integer in 1..256, got 'two'");
    expect(run(["solve", a, "--frobnicate"]).err).toContain("Try 'septum --help'");
    // a negative value reaches the option's own check (parseArgs alone calls it "ambiguous", naming no value)
    expectOneLineError(run(["analyze", a, "--threads", "-1"]), 2, "--threads: expected an integer in 1..256, got '-1'");
    expectOneLineError(run(["analyze", a, "--seed", "-3"]), 2, "--seed: expected an integer in 0..2147483647, got '-3'");
    expectOneLineError(run(["demo", "--size", "-.5", "-o", "d"]), 2, "--size: expected a number in 0.3..6, got '-.5'");
    // an option the kind does not read is refused, not ignored
    expectOneLineError(run(["generate", "grid2d", "5", "--contrast", "10", "-o", "g.mtx"]), 2, "generate grid2d: --contrast applies to mesh2d only");
    expectOneLineError(run(["generate", "grid3d", "5", "--seed", "2", "-o", "g.mtx"]), 2, "generate grid3d: --seed applies to laplacian only");
  });

  it("--debug shows the stack", () => {
    const r = run(["solve", "nope.mtx", "--debug"]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/\n\s+at /);
  });
});

describe("septum: help and version", () => {
  it("--version matches package.json", () => {
    const pkg = JSON.parse(readFileSync(new URL("../package.json", import.meta.url), "utf8"));
    expect(VERSION).toBe(pkg.version);
    expect(run(["--version"]).out.trim()).toBe(pkg.version);
  });
  it("main and per-command help", () => {
    expect(run(["--help"]).out).toContain("Commands:");
    for (const c of ["solve", "analyze", "report", "generate", "demo"]) {
      const r = run([c, "--help"]);
      expect(r.code).toBe(0);
      expect(r.out).toContain(`Usage: septum ${c}`);
    }
  });
  it("every option a command accepts is in its help (--help and --debug in the main help), and so is every alias", () => {
    // the documentation is the help text itself: an accepted flag missing from it is undocumented
    for (const [c, spec] of Object.entries(SPECS)) {
      for (const [name, o] of Object.entries(spec)) {
        const text = name === "help" || name === "debug" ? MAIN_HELP : HELP[c];
        expect(text, `${c} --${name}`).toMatch(new RegExp(`--${name}\\b`));
        if (o.short) expect(text, `${c} -${o.short}`).toMatch(new RegExp(`(^|[\\s\\[])-${o.short}\\b`, "m"));
      }
    }
    expect(run(["-v"]).out.trim()).toBe(VERSION);
    expect(MAIN_HELP).toMatch(/-v, --version/);
    expect(run(["help", "solve"]).out).toBe(HELP.solve);
    expect(MAIN_HELP).toContain("septum help solve");
  });
});

describe("septum solve", () => {
  it("--json: one object with the documented fields; natural ordering of a k×k grid fills the envelope", () => {
    const k = 12, n = k * k;
    expect(run(["generate", "grid2d", String(k), "-o", "g12.mtx", "--quiet"]).code).toBe(0);
    const r = run(["solve", "g12.mtx", "--json", "--ordering", "natural"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    for (const key of ["n", "nnzA", "nnzL", "flops", "supernodes", "residual", "seconds", "maxError"]) expect(j).toHaveProperty(key);
    expect(j.n).toBe(n);
    expect(j.nnzA).toBe(n + 2 * k * (k - 1)); // lower triangle of the 5-point stencil: n diagonal + 2k(k−1) edges (closed form)
    expect(j.nnzL).toBe((n - k) * (k + 1) + 2 * k - 1); // envelope fill of the natural ordering (design.md, common practice)
    const eps = Number.EPSILON;
    expect(j.residual).toBeLessThan(100 * n * eps); // b = A·1, ‖A‖ ≤ 8, cond ≈ 60 for k = 12
    expect(j.maxError).toBeLessThan(1000 * n * eps);
    expect(typeof j.seconds.factor).toBe("number");
  });

  it("--rhs and -o: the written solution satisfies A x = b", () => {
    const a = file("a3.mtx", SPD3);
    file("b3.mtx", "%%MatrixMarket matrix array real general\n3 2\n1\n2\n3\n0\n-1\n5\n");
    const r = run(["solve", a, "--rhs", "b3.mtx", "-o", "out/x3.mtx", "--method", "ldlt"]);
    expect(r.code).toBe(0);
    expect(r.out).toContain("residual");
    const x = readMatrixMarket(readFileSync(join(dir, "out/x3.mtx")));
    if (x.kind !== "dense") throw new Error("expected an array file");
    const A = readMatrixMarket(SPD3);
    if (A.kind !== "sparse") throw new Error("expected a coordinate file");
    const b = [[1, 2, 3], [0, -1, 5]];
    for (let c = 0; c < 2; c++) {
      const Ax = symmetricMultiply(A.matrix, x.values.subarray(3 * c, 3 * c + 3));
      for (let i = 0; i < 3; i++) expect(Math.abs(Ax[i] - b[c][i])).toBeLessThan(1e-14 * 16);
    }
  });

  it("--rhs from a symmetric coordinate file uses both triangles (the format stores only the lower one)", () => {
    // B = [[1, 2, 0], [2, 0, 5], [0, 5, 3]] stored as its lower triangle; each column of the solution must satisfy A·x = B(:, c).
    file("bsym.mtx", "%%MatrixMarket matrix coordinate real symmetric\n3 3 4\n1 1 1\n2 1 2\n3 2 5\n3 3 3\n");
    expect(run(["solve", file("a3s.mtx", SPD3), "--rhs", "bsym.mtx", "-o", "out/xsym.mtx", "--quiet"]).code).toBe(0);
    const x = readMatrixMarket(readFileSync(join(dir, "out/xsym.mtx")));
    if (x.kind !== "dense") throw new Error("expected an array file");
    expect([x.nrows, x.ncols]).toEqual([3, 3]);
    const A = readMatrixMarket(SPD3);
    if (A.kind !== "sparse") throw new Error("expected a coordinate file");
    const B = [[1, 2, 0], [2, 0, 5], [0, 5, 3]];
    for (let c = 0; c < 3; c++) {
      const Ax = symmetricMultiply(A.matrix, x.values.subarray(3 * c, 3 * c + 3));
      for (let i = 0; i < 3; i++) expect(Math.abs(Ax[i] - B[i][c])).toBeLessThan(1e-14 * 16); // tridiag(−1, 4, −1): cond < 3 (closed form)
    }
  });

  it("a quasi-definite saddle point: Cholesky refuses with a hint, --method ldlt solves it", () => {
    expect(run(["generate", "saddle2d", "10", "-o", "s10.mtx", "--quiet"]).code).toBe(0);
    expectOneLineError(run(["solve", "s10.mtx"]), 1, "s10.mtx: the matrix is not positive definite", "try --method ldlt");
    const r = run(["solve", "s10.mtx", "--method", "ldlt", "--json"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.n).toBe(2 * 100 + 81);
    expect(j.backwardError).toBeLessThan(j.n * Number.EPSILON * 10); // normwise backward error O(n·eps) for a stable factorization (common practice)
  });

  it("a general file holding both triangles gives the same analysis as the symmetric file", () => {
    const full = file("full3.mtx", "%%MatrixMarket matrix coordinate real general\n3 3 7\n1 1 4\n2 1 -1\n1 2 -1\n2 2 4\n3 2 -1\n2 3 -1\n3 3 4\n");
    const a = JSON.parse(run(["solve", full, "--json"]).out), b = JSON.parse(run(["solve", file("sym3.mtx", SPD3), "--json"]).out);
    for (const k of ["n", "nnzA", "nnzL", "flops"]) expect(a[k]).toBe(b[k]);
    expect(a.maxError).toBeLessThan(16 * Number.EPSILON * 4); // tridiag(−1, 4, −1) of order 3 is well conditioned (cond < 3, closed form)
  });

  it("a right-hand side of the wrong length names both sizes", () => {
    file("b4.mtx", "%%MatrixMarket matrix array real general\n4 1\n1\n2\n3\n4\n");
    expectOneLineError(run(["solve", file("a3b.mtx", SPD3), "--rhs", "b4.mtx"]), 1, "b4.mtx: has 4 rows, but the matrix has 3");
  });

  it("a progress line appears on a TTY and not with --quiet", () => {
    expect(run(["generate", "grid2d", "30", "-o", "g30.mtx", "--quiet"]).code).toBe(0);
    const tty = run(["solve", "g30.mtx"], true);
    expect(tty.err).toContain("\r");
    expect(tty.err).toMatch(/factor|ordering|symbolic/);
    expect(run(["solve", "g30.mtx", "--quiet"], true).err).toBe("");
    expect(run(["solve", "g30.mtx"], false).err).toBe("");
  });
});

describe("septum solve: a singular matrix is flagged", () => {
  it("warns on stderr when the smallest relative pivot is below 1e-10 (ungrounded path Laplacian), not for a grid", () => {
    // Path Laplacian with weights 1 + e/7 and no grounded node: the constant vector spans its null space (Fiedler
    // 1973), so the last pivot is 0 in exact arithmetic and of rounding size here; weights that are not binary
    // fractions keep it from being exactly 0 (which Cholesky refuses instead).
    const n = 10, r: number[] = [], c: number[] = [], v: number[] = [], d = new Array<number>(n).fill(0);
    for (let e = 0; e + 1 < n; e++) { const w = 1 + e / 7; r.push(e + 1); c.push(e); v.push(-w); d[e] += w; d[e + 1] += w; }
    for (let i = 0; i < n; i++) { r.push(i); c.push(i); v.push(d[i]); }
    const name = file("path10.mtx", writeMatrixMarket(SparseMatrix.fromTriplets(n, n, r, c, v), { symmetric: true }));
    const text = run(["solve", name, "--ordering", "natural"]);
    expect(text.code).toBe(0);
    expect(text.out).toContain("backward error");
    expect(text.err.trim().split("\n")).toHaveLength(1);
    // In natural order the rounding-sized pivot is the last one (the leading blocks of a connected Laplacian are
    // nonsingular, Fiedler 1973): node 10 in the file's 1-based numbering.
    expect(text.err).toMatch(/^septum: warning: path10\.mtx: smallest relative pivot \S+ at column 10 \(below 1e-10\): the matrix is singular/);
    const json = run(["solve", name, "--ordering", "natural", "--json"]);
    expect(JSON.parse(json.out).smallestPivot).toBeLessThan(1e-12);
    expect(JSON.parse(json.out).smallestPivotColumn).toBe(10);
    expect(json.err).toContain("septum: warning:");
    // The grounded 5-point grid: every pivot is a Schur complement diagonal, at least λ_min(A) = 8·sin²(π/26) (closed
    // form for k = 12; S⁻¹ is a principal block of A⁻¹), over diagonal entries 4: ratios ≥ 2·sin²(π/26) ≈ 0.029.
    expect(run(["generate", "grid2d", "12", "-o", "grid12.mtx", "--quiet"]).code).toBe(0);
    const grid = run(["solve", "grid12.mtx", "--json"]);
    expect(grid.err).toBe("");
    expect(JSON.parse(grid.out).smallestPivot).toBeGreaterThanOrEqual(2 * Math.sin(Math.PI / 26) ** 2);
  });
});

describe("septum analyze and report", () => {
  it("without --ordering, solve and analyze keep the fewer flops of nested dissection and minimum degree, as the library does", () => {
    // A power-law network, where minimum degree fills less than dissection (the README's rule: the default keeps the better).
    const A = powerLawLaplacian(600, 2, 1, 1e-2);
    const name = file("net600.mtx", writeMatrixMarket(A, { symmetric: true }));
    const flopsOf = (f: string, o: string) => JSON.parse(run(["analyze", f, "--json", "--ordering", o]).out).flops as number;
    const nd = flopsOf(name, "nd"), md = flopsOf(name, "md");
    expect(md).toBeLessThan(nd);
    const solved = JSON.parse(run(["solve", name, "--json"]).out);
    expect(solved.ordering).toBe("minimum-degree");
    expect(solved.flops).toBe(md);
    expect(solved.backwardError).toBeLessThan(20 * 600 * Number.EPSILON);
    const analysed = JSON.parse(run(["analyze", name, "--json"]).out);
    expect([analysed.ordering, analysed.flops]).toEqual(["minimum-degree", md]);
    expect(JSON.parse(run(["analyze", name, "--json", "--ordering", "auto"]).out).flops).toBe(md);
    // report draws nested dissection in detail by default; with auto, the ordering solve would use
    const drawn = (args: string[]): string => {
      expect(run(["report", name, "-o", "net.html", "--quiet", ...args]).code).toBe(0);
      return /<tr class="shown"><th>([^<]+)/.exec(readFileSync(join(dir, "net.html"), "utf8"))?.[1].trim() ?? "";
    };
    expect([drawn([]), drawn(["--ordering", "auto"]), drawn(["--ordering", "nd"])]).toEqual(["nested-dissection", "minimum-degree", "nested-dissection"]);
    // On a grid the same rule holds, whichever ordering wins there.
    const grid = file("g30.mtx", writeMatrixMarket(grid2dLower(30), { symmetric: true }));
    const gnd = flopsOf(grid, "nd"), gmd = flopsOf(grid, "md");
    const g = JSON.parse(run(["solve", grid, "--json"]).out);
    expect(g.flops).toBe(Math.min(gnd, gmd));
    expect(g.ordering).toBe(gmd < gnd ? "minimum-degree" : "nested-dissection");
  });

  it("--threads is accepted and leaves the ordering as it is", () => {
    const grid = file("g40.mtx", writeMatrixMarket(grid2dLower(40), { symmetric: true }));
    const nnzL = (threads: string) => JSON.parse(run(["analyze", grid, "--ordering", "nd", "--threads", threads, "--json"]).out).nnzL;
    expect(nnzL("3")).toBe(nnzL("1"));
  });

  it("--compare --json lists every ordering with the same n and nnzA", () => {
    expect(run(["generate", "mesh2d", "60", "-o", "m60.mtx", "--quiet"]).code).toBe(0);
    const r = run(["analyze", "m60.mtx", "--compare", "--json"]);
    expect(r.code).toBe(0);
    const list = JSON.parse(r.out);
    expect(list.map((x: { ordering: string }) => x.ordering)).toEqual(["nested-dissection", "minimum-degree", "reverse-cuthill-mckee", "natural"]);
    for (const x of list) {
      expect(x.n).toBe(list[0].n);
      expect(x.nnzL).toBeGreaterThanOrEqual(x.nnzA); // L holds at least the lower triangle of A (no cancellation in the symbolic pattern)
    }
    const table = run(["analyze", "m60.mtx", "--compare"]).out;
    expect(table).toContain("reverse-cuthill-mckee");
  });

  it("analyze --method: the predicted peak is the one of the factorization solve then reserves for that method", () => {
    // Reference: the store the factorization actually reserves (solve --json peakBytes, FactorStats), for each method;
    // L·D·Lᵀ needs a scratch block W = L21·D more, which is not empty when some supernode has rows below its columns.
    expect(run(["generate", "grid2d", "20", "-o", "g20.mtx", "--quiet"]).code).toBe(0);
    const peak: Record<string, number> = {};
    for (const method of ["cholesky", "ldlt"]) {
      const a = JSON.parse(run(["analyze", "g20.mtx", "--json", "--ordering", "nd", "--method", method]).out);
      const s = JSON.parse(run(["solve", "g20.mtx", "--json", "--ordering", "nd", "--method", method]).out);
      expect([a.method, a.peakBytes]).toEqual([method, s.peakBytes]);
      expect(run(["analyze", "g20.mtx", "--ordering", "nd", "--method", method]).out).toMatch(new RegExp(`peak \\d+\\.\\d MiB predicted for ${method}`));
      peak[method] = a.peakBytes;
    }
    expect(peak.ldlt).toBeGreaterThan(peak.cholesky);
    expect(JSON.parse(run(["analyze", "g20.mtx", "--json", "--ordering", "nd"]).out).peakBytes).toBe(peak.cholesky); // default: Cholesky
    expectOneLineError(run(["analyze", "g20.mtx", "--method", "lu"]), 2, "unknown method 'lu'");
  });

  it("report writes one self-contained page under a few MB", () => {
    expect(run(["generate", "grid3d", "12", "-o", "c12.mtx", "--quiet"]).code).toBe(0);
    const r = run(["report", "c12.mtx", "-o", "rep/c12.html"]);
    expect(r.code).toBe(0);
    const html = readFileSync(join(dir, "rep/c12.html"), "utf8");
    expect(html).toContain("data:image/png;base64,");
    expect(html).toContain("Separator tree");
    expect(html).not.toMatch(/(src|href)="https?:/);
    expect(statSync(join(dir, "rep/c12.html")).size).toBeLessThan(3 * 2 ** 20);
  });
});
