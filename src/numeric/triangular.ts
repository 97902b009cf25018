/**
 * Supernodal triangular solves with the factor in the store: forward
 * L·y = b over the supernodes in order, backward Lᵀ·x = y in reverse (the
 * column sweeps of Liu 1992 §6 / Golub & Van Loan §3.1 applied per panel).
 * Per supernode: a dense triangular solve on the diagonal block (contiguous
 * unknowns), a dense product with the rows below into a small gathered
 * vector, and one scatter (forward) or gather (backward) through the row
 * indices, so the indirect accesses are m per supernode, not m·c. k
 * right-hand sides (n×k column-major) pass through each panel while it is
 * in cache, so the factor is read from memory once per sweep.
 */
import type { SupernodalStructure } from "../symbolic/types.js";

/** Forward solve L·y = y in place; `unit` for the unit-diagonal L of L·D·Lᵀ. `tmp` holds at least max(m − c) doubles. */
export function forwardSweep(
  S: Float64Array, st: SupernodalStructure, y: Float64Array, k: number, unit: boolean, tmp: Float64Array,
): void {
  const n = st.n, { rowPtr, rowIdx, superStart, factorPtr } = st;
  for (let s = 0; s < st.supernodeCount; s++) {
    const r0 = rowPtr[s], m = rowPtr[s + 1] - r0, f = superStart[s], c = superStart[s + 1] - f, b = m - c;
    const panel = factorPtr[s];
    for (let r = 0, yo = f; r < k; r++, yo += n) {
      for (let jj = 0; jj < c; jj++) {
        const col = panel + jj * m;
        let yj = y[yo + jj];
        if (!unit) { yj /= S[col + jj]; y[yo + jj] = yj; }
        if (yj !== 0) for (let ii = jj + 1; ii < c; ii++) y[yo + ii] -= S[col + ii] * yj;
      }
      if (b === 0) continue;
      tmp.fill(0, 0, b);
      for (let jj = 0; jj < c; jj++) {
        const yj = y[yo + jj], col = panel + jj * m + c;
        if (yj !== 0) for (let ii = 0; ii < b; ii++) tmp[ii] += S[col + ii] * yj;
      }
      const base = r * n, ri = r0 + c;
      for (let ii = 0; ii < b; ii++) y[base + rowIdx[ri + ii]] -= tmp[ii];
    }
  }
}

/** Backward solve Lᵀ·x = y in place. */
export function backwardSweep(
  S: Float64Array, st: SupernodalStructure, y: Float64Array, k: number, unit: boolean, tmp: Float64Array,
): void {
  const n = st.n, { rowPtr, rowIdx, superStart, factorPtr } = st;
  for (let s = st.supernodeCount - 1; s >= 0; s--) {
    const r0 = rowPtr[s], m = rowPtr[s + 1] - r0, f = superStart[s], c = superStart[s + 1] - f, b = m - c;
    const panel = factorPtr[s];
    for (let r = 0, yo = f; r < k; r++, yo += n) {
      if (b > 0) {
        const base = r * n, ri = r0 + c;
        for (let ii = 0; ii < b; ii++) tmp[ii] = y[base + rowIdx[ri + ii]];
        for (let jj = 0; jj < c; jj++) {
          const col = panel + jj * m + c;
          let t = 0;
          for (let ii = 0; ii < b; ii++) t += S[col + ii] * tmp[ii];
          y[yo + jj] -= t;
        }
      }
      for (let jj = c - 1; jj >= 0; jj--) {
        const col = panel + jj * m;
        let t = y[yo + jj];
        for (let ii = jj + 1; ii < c; ii++) t -= S[col + ii] * y[yo + ii];
        y[yo + jj] = unit ? t : t / S[col + jj];
      }
    }
  }
}

/** y := D⁻¹·y, D on the diagonals of the L·D·Lᵀ panels. */
export function diagonalSweep(S: Float64Array, st: SupernodalStructure, y: Float64Array, k: number): void {
  const n = st.n, { rowPtr, superStart, factorPtr } = st;
  for (let s = 0; s < st.supernodeCount; s++) {
    const m = rowPtr[s + 1] - rowPtr[s], f = superStart[s], c = superStart[s + 1] - f;
    for (let jj = 0; jj < c; jj++) {
      const inv = 1 / S[factorPtr[s] + jj * (m + 1)];
      for (let r = 0, yo = 0; r < k; r++, yo += n) y[yo + f + jj] *= inv;
    }
  }
}

/** Largest m − c over the supernodes: the length `tmp` needs. */
export function largestBelow(st: SupernodalStructure): number {
  let b = 0;
  for (let s = 0; s < st.supernodeCount; s++) {
    b = Math.max(b, st.rowPtr[s + 1] - st.rowPtr[s] - (st.superStart[s + 1] - st.superStart[s]));
  }
  return b;
}
