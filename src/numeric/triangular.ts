/**
 * Supernodal triangular solves with the factor in the store: forward
 * L·y = b over the supernodes in order, backward Lᵀ·x = y in reverse (the
 * column-oriented sweeps of Liu 1992 §6 / Golub & Van Loan §3.1 applied per
 * panel). k right-hand sides (n×k column-major) go through each panel
 * together, so the factor is read once per sweep. These sweeps are
 * memory-bound: two flops per factor entry per right-hand side.
 */
import type { SupernodalStructure } from "../symbolic/types.js";

/** Forward solve L·y = y in place; `unit` for the unit-diagonal L of L·D·Lᵀ. */
export function forwardSweep(
  S: Float64Array, st: SupernodalStructure, y: Float64Array, k: number, unit: boolean,
): void {
  const n = st.n, { rowPtr, rowIdx, superStart, factorPtr } = st;
  for (let s = 0; s < st.supernodeCount; s++) {
    const r0 = rowPtr[s], m = rowPtr[s + 1] - r0, f = superStart[s], c = superStart[s + 1] - f;
    const panel = factorPtr[s];
    for (let jj = 0; jj < c; jj++) {
      const col = panel + jj * m;
      const d = S[col + jj];
      for (let r = 0, yo = 0; r < k; r++, yo += n) {
        let yj = y[yo + f + jj];
        if (!unit) { yj /= d; y[yo + f + jj] = yj; }
        if (yj === 0) continue;
        for (let ii = jj + 1; ii < c; ii++) y[yo + f + ii] -= S[col + ii] * yj;
        for (let ii = c; ii < m; ii++) y[yo + rowIdx[r0 + ii]] -= S[col + ii] * yj;
      }
    }
  }
}

/** Backward solve Lᵀ·x = y in place. */
export function backwardSweep(
  S: Float64Array, st: SupernodalStructure, y: Float64Array, k: number, unit: boolean,
): void {
  const n = st.n, { rowPtr, rowIdx, superStart, factorPtr } = st;
  for (let s = st.supernodeCount - 1; s >= 0; s--) {
    const r0 = rowPtr[s], m = rowPtr[s + 1] - r0, f = superStart[s], c = superStart[s + 1] - f;
    const panel = factorPtr[s];
    for (let jj = c - 1; jj >= 0; jj--) {
      const col = panel + jj * m;
      const d = S[col + jj];
      for (let r = 0, yo = 0; r < k; r++, yo += n) {
        let t = y[yo + f + jj];
        for (let ii = jj + 1; ii < c; ii++) t -= S[col + ii] * y[yo + f + ii];
        for (let ii = c; ii < m; ii++) t -= S[col + ii] * y[yo + rowIdx[r0 + ii]];
        y[yo + f + jj] = unit ? t : t / d;
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
