/**
 * The WebAssembly SIMD kernel set against outside references: the ml-matrix
 * package (Matrix.mmul, CholeskyDecomposition), naive loops written straight
 * from the definitions (C − A·Bᵀ, X·Lᵀ = B, A = L·D·Lᵀ), and the plain-JS
 * kernel set (same interface, written independently). Shapes, leading
 * dimensions and offsets are drawn by fast-check, with edge sizes 1..17 that
 * are not multiples of the 4×4 tile and sizes crossing the 32-column block,
 * the 128-row slab and the 256-deep k slice. Also: the embedded binary equals
 * the compiled source, and the memory growth / capacity paths.
 */
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import fc from "fast-check";
import { CholeskyDecomposition, Matrix } from "ml-matrix";
import wabtInit from "wabt";
import { describe, expect, it } from "vitest";
import { randoms } from "./helpers/random.js";
import { CapacityError, SeptumError } from "../src/errors.js";
import { autoChoice, getKernels } from "../src/kernels/index.js";
import { jsKernels } from "../src/kernels/js/index.js";
import type { DenseKernels } from "../src/kernels/types.js";
import { SparseMatrix } from "../src/matrix/sparse.js";
import { backwardError } from "./helpers/numeric.js";
import { analyze } from "../src/solver/analyze.js";
import { STORE_BASE_BYTES, WASM32_MAX_PAGES, type WasmKernels, wasmKernelBytes, wasmKernels } from "../src/kernels/wasm/index.js";
import { TILE_MULADDS, compileKernels, fusedText } from "../scripts/wasm-source.mjs";

const EPS = 2 ** -52;


/** Copy an m×n column-major block at off (leading dim ld) of S into an ml-matrix Matrix. */
function toMatrix(S: Float64Array, m: number, n: number, off: number, ld: number): Matrix {
  const M = new Matrix(m, n);
  for (let j = 0; j < n; j++) for (let i = 0; i < m; i++) M.set(i, j, S[off + i + j * ld]);
  return M;
}

const edge = fc.integer({ min: 1, max: 17 });
const size = fc.oneof(edge, fc.integer({ min: 18, max: 70 }));
const pad = fc.integer({ min: 0, max: 5 });

describe("embedded binaries", () => {
  it("are byte-identical to kernels.wat compiled with wabt (plain SIMD and the fused-multiply-add build)", async () => {
    const wabt = await wabtInit();
    const text = readFileSync(new URL("../src/kernels/wasm/kernels.wat", import.meta.url), "utf8");
    const { simd, fma } = compileKernels(wabt, text);
    expect(simd.length).toBeGreaterThan(0);
    expect(Buffer.from(wasmKernelBytes("simd")).equals(Buffer.from(simd))).toBe(true);
    expect(Buffer.from(wasmKernelBytes("fma")).equals(Buffer.from(fma))).toBe(true);
  });

  it("the fused build differs from the plain one only in the tile's eight multiply-adds", () => {
    const text = readFileSync(new URL("../src/kernels/wasm/kernels.wat", import.meta.url), "utf8");
    const fused = fusedText(text);
    expect(fused.split("(f64x2.relaxed_madd ").length - 1).toBe(TILE_MULADDS);
    expect(fused.replace(/\(f64x2\.relaxed_madd \(local\.get (\$a\d)\) \(local\.get \$bb\) \(local\.get (\$c\d\d)\)\)/g,
      "(f64x2.add (local.get $2) (f64x2.mul (local.get $1) (local.get $bb)))")).toBe(text);
  });

  it("the fused build computes C − A·Bᵀ and a Cholesky correctly where relaxed SIMD is on (child node process)", () => {
    // Node 20 validates relaxed SIMD only behind a V8 flag, so run the fma binary in a child with it.
    const b64 = Buffer.from(wasmKernelBytes("fma")).toString("base64");
    const code = `
      const bytes = Buffer.from(${JSON.stringify(b64)}, "base64");
      if (!WebAssembly.validate(bytes)) { console.log("invalid"); process.exit(0); }
      const memory = new WebAssembly.Memory({ initial: ${STORE_BASE_BYTES / 65536 + 4} });
      const x = new WebAssembly.Instance(new WebAssembly.Module(bytes), { env: { memory } }).exports;
      const S = new Float64Array(memory.buffer, ${STORE_BASE_BYTES});
      const m = 13, n = 9, k = 37, base = ${STORE_BASE_BYTES};
      let s = 7; const rnd = () => { s ^= s << 13; s ^= s >>> 17; s ^= s << 5; return (s >>> 0) / 2 ** 32 - 0.5; };
      for (let i = 0; i < m * k + n * k + m * n; i++) S[i] = rnd();
      const a = 0, b = m * k, c = b + n * k, C0 = S.slice(c, c + m * n);
      x.gemm(m, n, k, base + 8 * a, m, base + 8 * b, n, base + 8 * c, m, 0);
      let err = 0;
      for (let j = 0; j < n; j++) for (let i = 0; i < m; i++) {
        let t = C0[i + j * m];
        for (let p = 0; p < k; p++) t -= S[a + i + p * m] * S[b + j + p * n];
        err = Math.max(err, Math.abs(t - S[c + i + j * m]));
      }
      const N = 70, d = c + m * n;  // SPD: N on the diagonal, entries in [-0.5, 0.5) below
      for (let j = 0; j < N; j++) for (let i = j; i < N; i++) S[d + i + j * N] = i === j ? N : rnd();
      const A0 = S.slice(d, d + N * N);
      const info = x.potrf(N, base + 8 * d, N);
      let res = 0;
      for (let j = 0; j < N; j++) for (let i = j; i < N; i++) {
        let t = 0;
        for (let p = 0; p <= j; p++) t += S[d + i + p * N] * S[d + j + p * N];
        res = Math.max(res, Math.abs(t - A0[i + j * N]));
      }
      console.log(JSON.stringify({ err, info, res }));`;
    const out = spawnSync(process.execPath, ["--experimental-wasm-relaxed-simd", "-e", code], { encoding: "utf8" });
    expect(out.status).toBe(0);
    const r = JSON.parse(out.stdout) as { err: number; info: number; res: number };
    // dot-product bound 4·(k+1)·eps for entries in [-0.5, 0.5) (Higham §3.1, from memory);
    // Cholesky backward error c·n·eps·‖A‖ (Higham §10.1, from memory)
    expect(r.err).toBeLessThanOrEqual(4 * 38 * EPS);
    expect(r.info).toBe(-1);
    expect(r.res).toBeLessThanOrEqual(4 * 70 * EPS * 70);
  });
});

/** Run C −= A·Bᵀ through kernel set K on a store filled from seed; return the store copy before and after. */
function runGemm(K: DenseKernels, m: number, n: number, k: number, lower: boolean,
  pa: number, pb: number, pc: number, oa: number, seed: number) {
  const lda = m + pa, ldb = n + pb, ldc = m + pc;
  const a = oa, b = a + lda * k + 3, c = b + ldb * k + 2, len = c + ldc * n + 4;
  const S = K.reserve(len);
  S.set(randoms(len, seed));
  const before = S.slice(0, len);
  K.gemm(m, n, k, a, lda, b, ldb, c, ldc, lower);
  return { before, after: K.view().slice(0, len), a, b, c, lda, ldb, ldc, len };
}

describe("wasm gemm: C := C − A·Bᵀ", () => {
  it("matches ml-matrix (C − A·Bᵀ) on random shapes, leading dims, offsets; lower variant touches only i ≥ j", () => {
    const K = wasmKernels();
    fc.assert(fc.property(edge, size, size, fc.boolean(), pad, pad, pad, fc.integer({ min: 0, max: 7 }),
      fc.integer({ min: 1, max: 2 ** 30 }),
      (m, n0, k, lower, pa, pb, pc, oa, seed) => {
        const n = lower ? m : n0;
        const r = runGemm(K, m, n, k, lower, pa, pb, pc, oa, seed);
        const A = toMatrix(r.before, m, k, r.a, r.lda), B = toMatrix(r.before, n, k, r.b, r.ldb);
        const ref = toMatrix(r.before, m, n, r.c, r.ldc).sub(A.mmul(B.transpose()));
        // entrywise bound k·eps·(|A||B|ᵀ + |C|) for a length-k dot product (Higham, Accuracy and
        // Stability of Numerical Algorithms, §3.1; from memory), here |entries| ≤ 1 so ≤ (k+1)·eps·4.
        const tol = 4 * (k + 1) * EPS;
        for (let j = 0; j < n; j++) {
          for (let i = 0; i < m; i++) {
            const got = r.after[r.c + i + j * r.ldc];
            if (lower && i < j) expect(got).toBe(r.before[r.c + i + j * r.ldc]);
            else expect(Math.abs(got - ref.get(i, j))).toBeLessThanOrEqual(tol);
          }
        }
        // nothing outside C changes (padding rows of C, A, B, the gaps)
        for (let t = 0; t < r.len; t++) {
          const inC = t >= r.c && t < r.c + r.ldc * n && (t - r.c) % r.ldc < m;
          if (!inC) expect(r.after[t]).toBe(r.before[t]);
        }
      }), { numRuns: 150 });
  });

  it("agrees with the naive loop across the cache blocks (k > 256, m > 128, n > 512), both variants", () => {
    const K = wasmKernels();
    const cases = [[301, 67, 530, false], [261, 261, 300, true], [130, 130, 257, true], [40, 600, 20, false], [530, 530, 13, true]] as const;
    for (const [m, n, k, lower] of cases) {
      const r = runGemm(K, m, n, k, lower, 3, 1, 2, 5, m * 7 + k);
      let worst = 0;
      for (let j = 0; j < n; j++) {
        for (let i = lower ? j : 0; i < m; i++) {
          let s = r.before[r.c + i + j * r.ldc];
          for (let p = 0; p < k; p++) s -= r.before[r.a + i + p * r.lda] * r.before[r.b + j + p * r.ldb];
          worst = Math.max(worst, Math.abs(s - r.after[r.c + i + j * r.ldc]));
        }
        for (let i = 0; lower && i < j; i++) expect(r.after[r.c + i + j * r.ldc]).toBe(r.before[r.c + i + j * r.ldc]);
      }
      expect(worst).toBeLessThanOrEqual(4 * (k + 1) * EPS);
    }
  });
});

/** A well-conditioned lower triangle (diag in [1, 2], strict lower entries in [-1, 1)/n) at a, ld lda. */
function fillLower(S: Float64Array, n: number, a: number, lda: number, seed: number): void {
  const r = randoms(n * n, seed);
  for (let j = 0; j < n; j++) {
    S[a + j + j * lda] = 1.5 + 0.5 * r[j + j * n];
    for (let i = j + 1; i < n; i++) S[a + i + j * lda] = r[i + j * n] / n;
  }
}

describe("wasm trsm: B := B·L⁻ᵀ", () => {
  it("solves X·Lᵀ = B (residual against the naive product), unit flag ignores the stored diagonal", () => {
    const K = wasmKernels();
    fc.assert(fc.property(size, size, fc.boolean(), pad, pad, fc.integer({ min: 1, max: 2 ** 30 }),
      (m, n, unit, pa, pb, seed) => {
        const lda = n + pa, ldb = m + pb, a = 3, b = a + lda * n + 1;
        const S = K.reserve(b + ldb * n);
        S.fill(0);
        fillLower(S, n, a, lda, seed);
        if (unit) for (let j = 0; j < n; j++) S[a + j + j * lda] = 7; // must be ignored
        S.set(randoms(ldb * n, seed + 1), b);
        const B0 = S.slice(b, b + ldb * n);
        K.trsm(m, n, a, lda, b, ldb, unit);
        const X = K.view();
        // residual of X·Lᵀ = B, normwise: ‖X·Lᵀ − B‖∞ ≤ c·n·eps·‖X‖∞·‖L‖∞ (Higham §8.1, from memory)
        let res = 0, xn = 0;
        for (let i = 0; i < m; i++) {
          let rowX = 0;
          for (let j = 0; j < n; j++) {
            let s = 0;
            for (let p = 0; p <= j; p++) {
              const l = p === j ? (unit ? 1 : S[a + j + j * lda]) : S[a + j + p * lda];
              s += X[b + i + p * ldb] * l;
            }
            res = Math.max(res, Math.abs(s - B0[i + j * ldb]));
            rowX += Math.abs(X[b + i + j * ldb]);
          }
          xn = Math.max(xn, rowX);
        }
        expect(res).toBeLessThanOrEqual(8 * n * EPS * Math.max(1, xn) * 3);
      }), { numRuns: 100 });
  });
});

/** SPD A = G·Gᵀ + n·I (n×n, lower triangle at a with ld lda), G from seed. */
function fillSpd(S: Float64Array, n: number, a: number, lda: number, seed: number): void {
  const g = randoms(n * n, seed);
  for (let j = 0; j < n; j++) {
    for (let i = j; i < n; i++) {
      let s = i === j ? n : 0;
      for (let p = 0; p < n; p++) s += g[i + p * n] * g[j + p * n];
      S[a + i + j * lda] = s;
    }
  }
}

describe("wasm potrf", () => {
  it("L·Lᵀ reproduces A (backward error) and L matches ml-matrix's Cholesky", () => {
    const K = wasmKernels();
    fc.assert(fc.property(size, pad, fc.integer({ min: 0, max: 9 }), fc.integer({ min: 1, max: 2 ** 30 }),
      (n, pa, a, seed) => {
        const lda = n + pa;
        const S = K.reserve(a + lda * n);
        S.fill(0);
        fillSpd(S, n, a, lda, seed);
        const A = toMatrix(S, n, n, a, lda);
        for (let j = 0; j < n; j++) for (let i = 0; i < j; i++) A.set(i, j, A.get(j, i));
        expect(K.potrf(n, a, lda)).toBe(-1);
        const L = toMatrix(K.view(), n, n, a, lda);
        for (let j = 0; j < n; j++) for (let i = 0; i < j; i++) L.set(i, j, 0);
        // backward error ‖A − L·Lᵀ‖max ≤ c·n·eps·‖A‖max (Cholesky is backward stable; Higham §10.1, from memory)
        const R = A.clone().sub(L.mmul(L.transpose()));
        expect(Math.max(R.max(), -R.min())).toBeLessThanOrEqual(4 * n * EPS * A.max());
        const ref = new CholeskyDecomposition(A).lowerTriangularMatrix;
        const D = L.clone().sub(ref);
        expect(Math.max(D.max(), -D.min())).toBeLessThanOrEqual(1e-10 * Math.sqrt(A.max()));
      }), { numRuns: 60 });
  });

  it("factors across the two block levels (n = 300 > 256): backward error against the naive product", () => {
    const K = wasmKernels();
    const n = 300, lda = 303, a = 4;
    const S = K.reserve(a + lda * n);
    fillSpd(S, n, a, lda, 99);
    const A0 = S.slice(a, a + lda * n);
    expect(K.potrf(n, a, lda)).toBe(-1);
    const L = K.view();
    let worst = 0, amax = 0;
    for (let j = 0; j < n; j++) {
      for (let i = j; i < n; i++) {
        let s = 0;
        for (let p = 0; p <= j; p++) s += L[a + i + p * lda] * L[a + j + p * lda];
        worst = Math.max(worst, Math.abs(s - A0[i + j * lda]));
        amax = Math.max(amax, Math.abs(A0[i + j * lda]));
      }
    }
    // backward stability of Cholesky (Higham §10.1, from memory): ‖A − L·Lᵀ‖ ≲ c·n·eps·‖A‖
    expect(worst).toBeLessThanOrEqual(4 * n * EPS * amax);
  });

  it("reports the first non-positive pivot at its local column, pivot left unrooted", () => {
    // A = M·diag(d)·Mᵀ with unit lower M: the Cholesky pivots are exactly d (common practice),
    // so with d[t] < 0 and d[0..t-1] > 0 the failure column is t and the pivot is d[t].
    const K = wasmKernels();
    for (const [n, t] of [[1, 0], [5, 3], [40, 33], [70, 64], [70, 31], [300, 290], [300, 100]] as const) {
      const m = randoms(n * n, n + t);
      const d = Array.from({ length: n }, (_, i) => (i === t ? -0.5 : 1 + (i % 3)));
      const lda = n + 2, a = 1;
      const S = K.reserve(a + lda * n);
      for (let j = 0; j < n; j++) {
        for (let i = j; i < n; i++) {
          let s = 0;
          for (let p = 0; p <= j; p++) {
            const mi = p === i ? 1 : m[i + p * n] * 0.3, mj = p === j ? 1 : m[j + p * n] * 0.3;
            s += mi * d[p] * mj;
          }
          S[a + i + j * lda] = s;
        }
      }
      expect(K.potrf(n, a, lda)).toBe(t);
      expect(K.view()[a + t + t * lda]).toBeCloseTo(-0.5, 10);
    }
  });
});

describe("degenerate calls", () => {
  it("empty shapes are no-ops; NaN and infinite pivots are reported like non-positive ones (as the JS set does)", () => {
    const W = wasmKernels(), J = jsKernels();
    for (const K of [W, J]) {
      const S = K.reserve(64);
      S.fill(3);
      K.gemm(0, 5, 5, 0, 1, 0, 5, 0, 1, false);
      K.gemm(5, 5, 0, 0, 5, 0, 5, 0, 5, true);
      K.trsm(0, 4, 0, 4, 0, 1, false);
      K.trsm(4, 0, 0, 1, 0, 4, true);
      expect(K.view().slice(0, 64).every((v) => v === 3)).toBe(true);
      expect(K.potrf(0, 0, 1)).toBe(-1);
      expect(K.ldlt(0, 0, 1, 1e-14)).toBe(-1);
      for (const bad of [Number.NaN, Number.POSITIVE_INFINITY]) {
        S.fill(0);
        for (let j = 0; j < 6; j++) S[j + j * 6] = j === 4 ? bad : 2;
        expect(K.potrf(6, 0, 6)).toBe(4);
        S.fill(0);
        for (let j = 0; j < 6; j++) S[j + j * 6] = j === 4 ? bad : -2;
        expect(K.ldlt(6, 0, 6, 1e-14)).toBe(4);
      }
    }
  });
});

describe("wasm ldlt", () => {
  it("recovers the unit L and signed D of a quasi-definite A = L·D·Lᵀ", () => {
    const K = wasmKernels();
    fc.assert(fc.property(size, pad, fc.integer({ min: 1, max: 2 ** 30 }), (n, pa, seed) => {
      const r = randoms(n * n + n, seed);
      const L = new Float64Array(n * n), d = new Float64Array(n);
      for (let j = 0; j < n; j++) {
        d[j] = (r[n * n + j] < 0 ? -1 : 1) * (1 + Math.abs(r[n * n + j]));
        L[j + j * n] = 1;
        for (let i = j + 1; i < n; i++) L[i + j * n] = r[i + j * n] / Math.sqrt(n);
      }
      const lda = n + pa, a = 2;
      const S = K.reserve(a + lda * n);
      for (let j = 0; j < n; j++) {
        for (let i = j; i < n; i++) {
          let s = 0;
          for (let p = 0; p <= j; p++) s += L[i + p * n] * d[p] * L[j + p * n];
          S[a + i + j * lda] = s;
        }
      }
      expect(K.ldlt(n, a, lda, 1e-14)).toBe(-1);
      const V = K.view();
      // L·D·Lᵀ without pivoting is unique when it exists (Golub & Van Loan §4.1, from memory)
      for (let j = 0; j < n; j++) {
        expect(Math.abs(V[a + j + j * lda] - d[j])).toBeLessThanOrEqual(1e-9);
        for (let i = j + 1; i < n; i++) expect(Math.abs(V[a + i + j * lda] - L[i + j * n])).toBeLessThanOrEqual(1e-9);
      }
    }), { numRuns: 60 });
  });

  it("reports the first tiny pivot at its local column, across the 128-row chunks of the update", () => {
    const K = wasmKernels();
    for (const [n, t] of [[3, 0], [9, 8], [150, 140], [200, 37], [300, 280]] as const) {
      const lda = n + 1, a = 0;
      const S = K.reserve(lda * n);
      // A = M·diag(d)·Mᵀ, M unit lower with entries 0.1; d[t] = 1e-20 below tiny = 1e-14
      for (let j = 0; j < n; j++) {
        for (let i = j; i < n; i++) {
          let s = 0;
          for (let p = 0; p <= j; p++) s += (p === i ? 1 : 0.1) * (p === t ? 1e-20 : -(1 + (p % 2))) * (p === j ? 1 : 0.1);
          S[a + i + j * lda] = s;
        }
      }
      expect(K.ldlt(n, a, lda, 1e-14)).toBe(t);
      expect(Math.abs(K.view()[a + t + t * lda])).toBeLessThanOrEqual(1e-14);
    }
  });
});

describe("wasm and js kernel sets agree", () => {
  it("on gemm, trsm, potrf, ldlt over random shapes (same store contents in, same results out)", () => {
    const W = wasmKernels(), J = jsKernels();
    fc.assert(fc.property(size, size, size, pad, fc.integer({ min: 1, max: 2 ** 30 }), (m, n, k, p, seed) => {
      const len = (m + p) * (n + k + p) + (n + p) * (n + k) + 64;
      const init = randoms(len, seed);
      const both = (f: (K: DenseKernels) => number | void) => {
        const out: Float64Array[] = [];
        const ret: unknown[] = [];
        for (const K of [W, J]) { K.reserve(len).set(init); ret.push(f(K)); out.push(K.view().slice(0, len)); }
        expect(ret[0]).toBe(ret[1]);
        let diff = 0;
        for (let t = 0; t < len; t++) diff = Math.max(diff, Math.abs(out[0][t] - out[1][t]));
        return diff;
      };
      const b = (m + p) * k, c = b + (n + p) * k;
      expect(both((K) => K.gemm(m, n, k, 0, m + p, b, n + p, c, m + p, false)))
        .toBeLessThanOrEqual(8 * k * EPS);
      const spd = (K: DenseKernels, ld: number) => {
        const S = K.view();
        for (let j = 0; j < n; j++) S[j + j * ld] = 2 * n + 1;
        for (let j = 0; j < n; j++) for (let i = j + 1; i < n; i++) S[i + j * ld] *= 0.5;
      };
      expect(both((K) => { spd(K, n + p); return K.potrf(n, 0, n + p); })).toBeLessThanOrEqual(1e-12);
      expect(both((K) => { spd(K, n + p); return K.ldlt(n, 0, n + p, 1e-14); })).toBeLessThanOrEqual(1e-12);
      expect(both((K) => { spd(K, n + p); K.trsm(m, n, 0, n + p, (n + p) * n, m + p, false); }))
        .toBeLessThanOrEqual(1e-12);
    }), { numRuns: 60 });
  });
  it("on potrf and ldlt of a 300×300 quasi-definite / SPD block (two block levels)", () => {
    const W = wasmKernels(), J = jsKernels();
    const n = 300, lda = 301, len = lda * n;
    const init = randoms(len, 4242);
    for (let j = 0; j < n; j++) {
      init[j + j * lda] = (j % 3 === 2 ? -1 : 1) * (n + 1); // diagonally dominant, signs mixed for ldlt
      for (let i = j + 1; i < n; i++) init[i + j * lda] *= 0.5;
    }
    const run = (K: DenseKernels, f: (K: DenseKernels) => number) => { K.reserve(len).set(init); return [f(K), K.view().slice(0, len)] as const; };
    const [rw, lw] = run(W, (K) => K.ldlt(n, 0, lda, 1e-14));
    const [rj, lj] = run(J, (K) => K.ldlt(n, 0, lda, 1e-14));
    expect(rw).toBe(-1);
    expect(rj).toBe(-1);
    let diff = 0;
    for (let t = 0; t < len; t++) diff = Math.max(diff, Math.abs(lw[t] - lj[t]));
    expect(diff).toBeLessThanOrEqual(1e-12 * (n + 1));
    for (let j = 0; j < n; j++) init[j + j * lda] = n + 1;
    const [pw, cw] = run(W, (K) => K.potrf(n, 0, lda));
    const [pj, cj] = run(J, (K) => K.potrf(n, 0, lda));
    expect(pw).toBe(-1);
    expect(pj).toBe(-1);
    diff = 0;
    for (let t = 0; t < len; t++) diff = Math.max(diff, Math.abs(cw[t] - cj[t]));
    expect(diff).toBeLessThanOrEqual(1e-12 * Math.sqrt(n + 1));
  });
});

describe("store memory", () => {
  it("grows on reserve, re-creates views, keeps operands at the same offsets", () => {
    const K = wasmKernels();
    const v1 = K.reserve(10);
    expect(v1.length).toBeGreaterThanOrEqual(10);
    const v2 = K.reserve(3_000_000);
    expect(v2.length).toBeGreaterThanOrEqual(3_000_000);
    expect(K.view()).toBe(v2);
    expect(v1.length).toBe(0); // the old view's buffer was detached by the growth
    v2[2_999_999] = 5;
    v2[0] = 4;
    K.gemm(1, 1, 1, 0, 1, 0, 1, 2_999_999, 1, false); // 5 − 4·4
    expect(K.view()[2_999_999]).toBe(-11);
  });

  it("operands above 2 GiB (unsigned addressing) give the same results as at low offsets", () => {
    // Only the touched pages get committed: the memory grows past 2^31 bytes but uses little RAM.
    const K = wasmKernels();
    const n = 37, k = 29, lda = n + 3, len = lda * (n + 2 * k) + 16;
    const hi = 2 ** 31 / 8 + 12345;
    const S = K.reserve(hi + len);
    const init = randoms(len, 77);
    for (let j = 0; j < n; j++) init[j + j * lda] = 4 * n;
    const run = (o: number) => {
      S.set(init, o);
      K.gemm(n, n, k, o + lda * n, lda, o + lda * (n + k), lda, o, lda, true);
      const info = K.potrf(n, o, lda);
      K.trsm(n, k, o, lda, o + lda * n, lda, false);
      return [info, S.slice(o, o + len)] as const;
    };
    const [infoLow, low] = run(0);
    const [infoHigh, high] = run(hi);
    expect(infoLow).toBe(-1);
    expect(infoHigh).toBe(-1);
    expect(Buffer.from(high.buffer).equals(Buffer.from(low.buffer))).toBe(true);
  });

  it("Node's engine accepts the wasm32 limit of 65536 pages and refuses one more", () => {
    // WebAssembly JS API: maximum above the engine's limit is a RangeError (spec); wasm32 = 4 GiB.
    expect(() => new WebAssembly.Memory({ initial: 1, maximum: WASM32_MAX_PAGES })).not.toThrow();
    expect(() => new WebAssembly.Memory({ initial: 1, maximum: WASM32_MAX_PAGES + 1 })).toThrow(RangeError);
  });

  it("throws CapacityError naming the bytes and the limit, without allocating", () => {
    const K = wasmKernels();
    const beyond = (2 ** 32 - STORE_BASE_BYTES) / 8 + 1; // one double more than 4 GiB holds above the scratch
    expect(() => K.reserve(beyond)).toThrow(CapacityError);
    expect(() => K.reserve(beyond)).toThrow(`${STORE_BASE_BYTES + 8 * beyond} bytes`);
    expect(() => K.reserve(2 ** 40)).toThrow(/limit is 65536 pages = 4294967296 bytes/);
    // a memory capped at 28 pages (the store gets 28·65536 − 1638400 bytes = 24576 doubles)
    const small = wasmKernels({ maxPages: 28 });
    expect(small.reserve(24_576).length).toBe(24_576);
    expect(() => small.reserve(24_577)).toThrow(/1835016 bytes.*limit is 28 pages = 1835008 bytes/);
  });
});

describe("kernel selection", () => {
  it("auto picks wasm where SIMD validates and falls back to js when the validator refuses", () => {
    expect(getKernels("auto").name).toBe("wasm");
    expect(getKernels("auto", { validate: () => false }).name).toBe("js");
    expect(getKernels("auto", { validate: () => { throw new Error("no wasm"); } }).name).toBe("js");
    // a runtime with SIMD but without relaxed SIMD gets the plain build, one with both the fused build
    const fma = wasmKernelBytes("fma");
    expect(autoChoice((b) => b !== fma)).toBe("simd");
    expect(autoChoice(() => true)).toBe("fma");
    expect(autoChoice(() => false)).toBe("js");
    // this Node validates relaxed SIMD only behind a flag: auto runs the plain SIMD build here
    const here = getKernels("auto") as WasmKernels;
    expect(here.variant).toBe(WebAssembly.validate(fma) ? "fma" : "simd");
    expect(getKernels("js").name).toBe("js");
    expect(getKernels("wasm").name).toBe("wasm");
    expect(() => getKernels("fortran" as never)).toThrow(SeptumError);
  });
});

describe("whole factorization on either kernel set", () => {
  /** Random sparse SPD matrix: random symmetric pattern, |values| < 1, diagonal = row sum of |off-diagonals| + 1 (strictly diagonally dominant ⇒ SPD, common practice). */
  function randomSpd(n: number, density: number, seed: number): SparseMatrix {
    const r = randoms(n * n, seed);
    const rows: number[] = [], cols: number[] = [], vals: number[] = [];
    const diag = new Float64Array(n).fill(1);
    for (let j = 0; j < n; j++) {
      for (let i = j + 1; i < n; i++) {
        if (Math.abs(r[i + j * n]) < density) {
          const v = r[j + i * n];
          rows.push(i); cols.push(j); vals.push(v);
          diag[i] += Math.abs(v); diag[j] += Math.abs(v);
        }
      }
    }
    for (let j = 0; j < n; j++) { rows.push(j); cols.push(j); vals.push(diag[j]); }
    return SparseMatrix.fromTriplets(n, n, Int32Array.from(rows), Int32Array.from(cols), Float64Array.from(vals));
  }

  it("wasm and js factors give the same solution of random sparse SPD systems, small residual", () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 120 }), fc.double({ min: 0.02, max: 0.3, noNaN: true }),
      fc.integer({ min: 1, max: 2 ** 30 }), (n, density, seed) => {
        const A = randomSpd(n, density, seed);
        const analysis = analyze(A);
        const b = randoms(n, seed + 3);
        const xw = analysis.factor(A, { kernels: "wasm" }).solve(b);
        const xj = analysis.factor(A, { kernels: "js" }).solve(b);
        // normwise backward error ‖b − A·x‖∞ / (‖A‖∞‖x‖∞ + ‖b‖∞) ≤ c·n·eps (Cholesky, Higham §10.1; from memory)
        expect(backwardError(A, xw, b)).toBeLessThanOrEqual(8 * n * EPS);
        let xn = 0;
        for (let i = 0; i < n; i++) xn = Math.max(xn, Math.abs(xw[i]));
        for (let i = 0; i < n; i++) expect(Math.abs(xw[i] - xj[i])).toBeLessThanOrEqual(1e-10 * (xn + 1));
      }), { numRuns: 40 });
  });

  it("3-D 7-point grid 12³ (fronts past the 128-row slab): wasm and js solutions agree, L·D·Lᵀ too", () => {
    const k = 12, n = k * k * k;
    const rows: number[] = [], cols: number[] = [], vals: number[] = [];
    for (let z = 0; z < k; z++) for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
      const i = (z * k + y) * k + x;
      rows.push(i); cols.push(i); vals.push(6);
      if (x + 1 < k) { rows.push(i + 1); cols.push(i); vals.push(-1); }
      if (y + 1 < k) { rows.push(i + k); cols.push(i); vals.push(-1); }
      if (z + 1 < k) { rows.push(i + k * k); cols.push(i); vals.push(-1); }
    }
    const A = SparseMatrix.fromTriplets(n, n, Int32Array.from(rows), Int32Array.from(cols), Float64Array.from(vals));
    const analysis = analyze(A);
    const b = randoms(n, 5);
    for (const method of ["cholesky", "ldlt"] as const) {
      const xw = analysis.factor(A, { kernels: "wasm", method }).solve(b);
      const xj = analysis.factor(A, { kernels: "js", method }).solve(b);
      let d = 0, xn = 0;
      for (let i = 0; i < n; i++) { d = Math.max(d, Math.abs(xw[i] - xj[i])); xn = Math.max(xn, Math.abs(xw[i])); }
      // the 7-point Laplacian's condition number is O(k²) (common practice): agreement to ~1e-12 relative
      expect(d).toBeLessThanOrEqual(1e-12 * xn * k * k);
    }
  });
});
