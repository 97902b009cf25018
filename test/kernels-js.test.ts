/**
 * The plain-JS dense kernels against two outside references: naive triple
 * loops written straight from the definitions (C − A·Bᵀ, B·L⁻ᵀ) and the
 * ml-matrix package (CholeskyDecomposition, Matrix.mmul). Shapes, leading
 * dimensions and offsets are drawn by fast-check, with edge sizes 1..9 and
 * sizes crossing the 32-column block width.
 */
import fc from "fast-check";
import { CholeskyDecomposition, Matrix } from "ml-matrix";
import { describe, expect, it } from "vitest";
import { randoms } from "./helpers/random.js";
import { jsKernels } from "../src/kernels/js/index.js";

const EPS = 2 ** -52;


const size = fc.oneof(fc.integer({ min: 1, max: 9 }), fc.integer({ min: 10, max: 70 }));
const pad = fc.integer({ min: 0, max: 5 });

describe("gemm: C := C − A·Bᵀ", () => {
  it("matches the naive triple loop for random shapes, leading dims and offsets (both variants)", () => {
    fc.assert(
      fc.property(size, size, size, pad, pad, pad, fc.integer({ min: 0, max: 7 }), fc.boolean(), fc.integer(),
        (m, n0, k, pa, pb, pc, off, lower, seed) => {
          const n = lower ? m : n0;
          const lda = m + pa, ldb = n + pb, ldc = m + pc;
          const a = off, b = a + lda * k, c = b + ldb * k;
          const K = jsKernels();
          const S = K.reserve(c + ldc * n + 3);
          S.set(randoms(S.length, seed));
          const before = S.slice();
          K.gemm(m, n, k, a, lda, b, ldb, c, ldc, lower);
          // Reference: the definition C(i,j) −= Σ_p A(i,p)·B(j,p), naive loop.
          for (let idx = 0; idx < S.length; idx++) {
            const rel = idx - c, j = Math.floor(rel / ldc), i = rel - j * ldc;
            const inC = rel >= 0 && j < n && i < m && (!lower || i >= j);
            let want = before[idx];
            if (inC) {
              let s = 0, bound = 0;
              for (let p = 0; p < k; p++) {
                s += before[a + i + p * lda] * before[b + j + p * ldb];
                bound += Math.abs(before[a + i + p * lda] * before[b + j + p * ldb]);
              }
              want -= s;
              // Standard dot-product error bound |err| ≤ k·ε·Σ|a||b| (Higham 2002, §3.1; from memory).
              expect(Math.abs(S[idx] - want)).toBeLessThanOrEqual((k + 2) * EPS * (bound + Math.abs(before[idx])));
            } else {
              expect(S[idx]).toBe(want); // entries outside C (or above its diagonal) untouched
            }
          }
        }),
      { numRuns: 60 },
    );
  });

  it("matches the naive loop on shapes crossing the 128-row and 256-deep cache blocks", () => {
    for (const [m, n, k, lower] of [[261, 261, 300, true], [203, 141, 263, false], [130, 130, 257, true]] as const) {
      const lda = m + 3, ldb = n + 1, ldc = m + 2;
      const a = 5, b = a + lda * k, c = b + ldb * k;
      const K = jsKernels();
      const S = K.reserve(c + ldc * n);
      S.set(randoms(S.length, m * k));
      const before = S.slice();
      K.gemm(m, n, k, a, lda, b, ldb, c, ldc, lower);
      for (let j = 0; j < n; j++) for (let i = 0; i < m; i++) {
        let want = before[c + i + j * ldc], bound = Math.abs(want);
        if (!lower || i >= j) {
          // Naive definition C(i,j) −= Σ_p A(i,p)·B(j,p).
          for (let p = 0; p < k; p++) {
            const t = before[a + i + p * lda] * before[b + j + p * ldb];
            want -= t; bound += Math.abs(t);
          }
        }
        expect(Math.abs(S[c + i + j * ldc] - want)).toBeLessThanOrEqual((k + 2) * EPS * bound);
      }
      for (let q = 0; q < c; q++) expect(S[q]).toBe(before[q]);
    }
  });

  it("agrees with ml-matrix's Matrix.mmul on a 37×29×45 product", () => {
    const m = 37, n = 29, k = 45;
    const K = jsKernels();
    const S = K.reserve(m * k + n * k + m * n);
    S.set(randoms(S.length, 7));
    const A = new Matrix(m, k), B = new Matrix(n, k), C = new Matrix(m, n);
    for (let p = 0; p < k; p++) for (let i = 0; i < m; i++) A.set(i, p, S[i + p * m]);
    for (let p = 0; p < k; p++) for (let j = 0; j < n; j++) B.set(j, p, S[m * k + j + p * n]);
    for (let j = 0; j < n; j++) for (let i = 0; i < m; i++) C.set(i, j, S[m * k + n * k + i + j * m]);
    const want = C.sub(A.mmul(B.transpose())); // ml-matrix reference
    K.gemm(m, n, k, 0, m, m * k, n, m * k + n * k, m, false);
    for (let j = 0; j < n; j++) for (let i = 0; i < m; i++) {
      expect(S[m * k + n * k + i + j * m]).toBeCloseTo(want.get(i, j), 12);
    }
  });
});

/** Random SPD n×n (column-major, ld) at offset: B·Bᵀ + n·I. */
function spd(S: Float64Array, n: number, at: number, ld: number, seed: number): Matrix {
  const R = randoms(n * n, seed);
  const M = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) {
    let s = i === j ? n : 0;
    for (let p = 0; p < n; p++) s += R[i + p * n] * R[j + p * n];
    M.set(i, j, s); M.set(j, i, s);
    S[at + i + j * ld] = s;
    if (i !== j) S[at + j + i * ld] = 12345; // storage-only upper entries: must stay untouched
  }
  return M;
}

describe("potrf", () => {
  it("matches ml-matrix's CholeskyDecomposition on random SPD blocks", () => {
    fc.assert(
      fc.property(size, pad, fc.integer({ min: 0, max: 5 }), fc.integer(), (n, p, off, seed) => {
        const ld = n + p;
        const K = jsKernels();
        const S = K.reserve(off + ld * n);
        S.fill(0);
        const M = spd(S, n, off, ld, seed);
        expect(K.potrf(n, off, ld)).toBe(-1);
        const L = new CholeskyDecomposition(M).lowerTriangularMatrix; // ml-matrix reference
        for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) {
          if (i >= j) {
            expect(Math.abs(S[off + i + j * ld] - L.get(i, j))).toBeLessThanOrEqual(1e3 * n * EPS * Math.sqrt(n * n));
          } else expect(S[off + i + j * ld]).toBe(12345);
        }
      }),
      { numRuns: 40 },
    );
  });

  it("reports the first non-positive pivot's local column and leaves it unrooted", () => {
    // diag(4, 9, −1, 16): the third pivot is −1 (by inspection of a diagonal matrix).
    const K = jsKernels();
    const S = K.reserve(16);
    S.fill(0);
    S[0] = 4; S[5] = 9; S[10] = -1; S[15] = 16;
    expect(K.potrf(4, 0, 4)).toBe(2);
    expect(S[0]).toBe(2);
    expect(S[10]).toBe(-1);
    // A 40×40 SPD block with one entry made indefinite past the first 32-column block.
    const K2 = jsKernels();
    const T = K2.reserve(1600);
    T.fill(0);
    for (let i = 0; i < 40; i++) T[i + 40 * i] = 1;
    T[35 + 40 * 35] = 0;
    expect(K2.potrf(40, 0, 40)).toBe(35);
  });
});

describe("ldlt", () => {
  it("on SPD blocks reproduces ml-matrix's Cholesky: D = diag(L)², unit L = L·diag(L)⁻¹", () => {
    fc.assert(
      fc.property(size, pad, fc.integer(), (n, p, seed) => {
        const ld = n + p;
        const K = jsKernels();
        const S = K.reserve(ld * n);
        S.fill(0);
        const M = spd(S, n, 0, ld, seed);
        expect(K.ldlt(n, 0, ld, 0)).toBe(-1);
        const L = new CholeskyDecomposition(M).lowerTriangularMatrix; // ml-matrix reference
        for (let j = 0; j < n; j++) {
          const ljj = L.get(j, j);
          expect(Math.abs(S[j + j * ld] - ljj * ljj) / (ljj * ljj)).toBeLessThan(1e3 * n * EPS);
          for (let i = j + 1; i < n; i++) expect(S[i + j * ld]).toBeCloseTo(L.get(i, j) / ljj, 9);
          for (let i = 0; i < j; i++) expect(S[i + j * ld]).toBe(12345);
        }
      }),
      { numRuns: 40 },
    );
  });

  it("factors a quasi-definite block [[H, Bᵀ],[B, −C]]: L·D·Lᵀ reproduces it, signs of D give the inertia", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 40 }), fc.integer({ min: 1, max: 40 }), fc.integer(), (n1, n2, seed) => {
        const n = n1 + n2;
        const K = jsKernels();
        const S = K.reserve(n * n);
        S.fill(0);
        const R = randoms(n * n, seed);
        const M = new Matrix(n, n);
        for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) {
          let v = R[i + j * n];
          if (i === j) v = i < n1 ? n + 1 + Math.abs(v) : -(n + 1 + Math.abs(v)); // diagonally dominant blocks
          else if (i >= n1 && j >= n1) v *= 0.5;
          M.set(i, j, v); M.set(j, i, v);
          S[i + j * n] = v;
        }
        expect(K.ldlt(n, 0, n, 0)).toBe(-1);
        // Quasi-definite matrices are strongly factorizable (Vanderbei 1995, from memory): D has n1 positive, n2 negative entries.
        let pos = 0;
        for (let j = 0; j < n; j++) if (S[j + j * n] > 0) pos++;
        expect(pos).toBe(n1);
        const L = new Matrix(n, n), D = new Matrix(n, n);
        for (let j = 0; j < n; j++) {
          L.set(j, j, 1); D.set(j, j, S[j + j * n]);
          for (let i = j + 1; i < n; i++) L.set(i, j, S[i + j * n]);
        }
        const back = L.mmul(D).mmul(L.transpose()); // ml-matrix products
        const scale = M.norm("frobenius");
        expect(back.sub(M).norm("frobenius")).toBeLessThanOrEqual(100 * n * EPS * scale);
      }),
      { numRuns: 30 },
    );
  });

  it("stops at a tiny pivot", () => {
    // [[1, 1], [1, 1 + 1e-15]]: the second pivot is 1e-15 (hand computation).
    const K = jsKernels();
    const S = K.reserve(4);
    S.set([1, 1, 0, 1 + 1e-15]);
    expect(K.ldlt(2, 0, 2, 1e-12)).toBe(1);
  });
});

describe("trsm: B := B·L⁻ᵀ", () => {
  it("satisfies X·Lᵀ = B (checked by the naive product) for random shapes, unit and non-unit", () => {
    fc.assert(
      fc.property(size, size, pad, pad, fc.boolean(), fc.integer(), (m, n, pa, pb, unit, seed) => {
        const lda = n + pa, ldb = m + pb;
        const K = jsKernels();
        const S = K.reserve(lda * n + ldb * n);
        S.set(randoms(S.length, seed));
        for (let j = 0; j < n; j++) S[j + j * lda] = 2 + Math.abs(S[j + j * lda]); // well-conditioned L
        for (let j = 0; j < n; j++) for (let i = j + 1; i < n; i++) S[i + j * lda] *= 1 / n;
        const before = S.slice();
        const b = lda * n;
        K.trsm(m, n, 0, lda, b, ldb, unit);
        for (let j = 0; j < n; j++) for (let i = 0; i < ldb; i++) {
          if (i >= m) { expect(S[b + i + j * ldb]).toBe(before[b + i + j * ldb]); continue; }
          // Naive product (X·Lᵀ)(i,j) = Σ_{p≤j} X(i,p)·L(j,p).
          let s = 0, bound = 0;
          for (let p = 0; p <= j; p++) {
            const l = p === j && unit ? 1 : before[j + p * lda];
            s += S[b + i + p * ldb] * l;
            bound += Math.abs(S[b + i + p * ldb] * l);
          }
          expect(Math.abs(s - before[b + i + j * ldb])).toBeLessThanOrEqual(50 * n * EPS * (bound + 1));
        }
        for (let i = 0; i < lda * n; i++) expect(S[i]).toBe(before[i]); // L untouched
      }),
      { numRuns: 60 },
    );
  });
});

describe("store", () => {
  it("reserve grows the store, view returns it, impossible sizes are a CapacityError", async () => {
    const { CapacityError } = await import("../src/errors.js");
    const K = jsKernels();
    expect(K.name).toBe("js");
    const S = K.reserve(100);
    expect(S.length).toBe(100);
    expect(K.view()).toBe(S);
    expect(K.reserve(50)).toBe(S); // large enough already: kept
    expect(K.reserve(200).length).toBe(200);
    expect(() => K.reserve(2 ** 40)).toThrow(CapacityError);
    expect(() => K.reserve(-1)).toThrow(CapacityError);
  });
});
