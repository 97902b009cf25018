/**
 * Supernodal triangular solves with the factor in the store: forward
 * L·y = b over the supernodes in order, backward Lᵀ·x = y in reverse (the
 * column sweeps of Liu 1992 §6 / Golub & Van Loan §3.1 applied per panel).
 * Per supernode: a dense triangular solve on the diagonal block (contiguous
 * unknowns), a dense product with the rows below into a small gathered
 * block, and one scatter (forward) or gather (backward) through the row
 * indices, so the indirect accesses are m per supernode, not m·c.
 *
 * The k right-hand sides are interleaved (y[i·k + r], row-major), so every
 * factor entry is loaded once and applied to all k in a contiguous inner
 * loop: one pass over the factor per sweep, whatever k.
 */
import type { SupernodalStructure } from "../symbolic/types.js";

/** Forward solve L·Y = Y in place (Y n×k row-major); `unit` for L·D·Lᵀ. `tmp` holds max(m − c)·k doubles. */
export function forwardSweep(
  S: Float64Array, st: SupernodalStructure, y: Float64Array, k: number, unit: boolean, tmp: Float64Array,
): void {
  const { rowPtr, rowIdx, superStart, factorPtr } = st;
  for (let s = 0; s < st.supernodeCount; s++) {
    const r0 = rowPtr[s], m = rowPtr[s + 1] - r0, f = superStart[s], c = superStart[s + 1] - f, b = m - c;
    const panel = factorPtr[s];
    for (let jj = 0; jj < c; jj++) {
      const col = panel + jj * m, yj = (f + jj) * k;
      if (!unit) { const inv = 1 / S[col + jj]; for (let r = 0; r < k; r++) y[yj + r] *= inv; }
      for (let ii = jj + 1; ii < c; ii++) {
        const l = S[col + ii], yi = (f + ii) * k;
        for (let r = 0; r < k; r++) y[yi + r] -= l * y[yj + r];
      }
    }
    if (b === 0) continue;
    tmp.fill(0, 0, b * k);
    for (let jj = 0; jj < c; jj++) {
      const col = panel + jj * m + c, yj = (f + jj) * k;
      if (k === 1) {
        const v = y[yj];
        if (v !== 0) for (let ii = 0; ii < b; ii++) tmp[ii] += S[col + ii] * v;
      } else {
        for (let ii = 0; ii < b; ii++) {
          const l = S[col + ii], t = ii * k;
          for (let r = 0; r < k; r++) tmp[t + r] += l * y[yj + r];
        }
      }
    }
    for (let ii = 0, ri = r0 + c; ii < b; ii++) {
      const yi = rowIdx[ri + ii] * k, t = ii * k;
      for (let r = 0; r < k; r++) y[yi + r] -= tmp[t + r];
    }
  }
}

/** Backward solve Lᵀ·X = Y in place (row-major n×k). */
export function backwardSweep(
  S: Float64Array, st: SupernodalStructure, y: Float64Array, k: number, unit: boolean, tmp: Float64Array,
): void {
  const { rowPtr, rowIdx, superStart, factorPtr } = st;
  for (let s = st.supernodeCount - 1; s >= 0; s--) {
    const r0 = rowPtr[s], m = rowPtr[s + 1] - r0, f = superStart[s], c = superStart[s + 1] - f, b = m - c;
    const panel = factorPtr[s];
    if (b > 0) {
      for (let ii = 0, ri = r0 + c; ii < b; ii++) {
        const yi = rowIdx[ri + ii] * k, t = ii * k;
        for (let r = 0; r < k; r++) tmp[t + r] = y[yi + r];
      }
      for (let jj = 0; jj < c; jj++) {
        const col = panel + jj * m + c, yj = (f + jj) * k;
        if (k === 1) {
          let t = 0;
          for (let ii = 0; ii < b; ii++) t += S[col + ii] * tmp[ii];
          y[yj] -= t;
        } else {
          for (let ii = 0; ii < b; ii++) {
            const l = S[col + ii], t = ii * k;
            for (let r = 0; r < k; r++) y[yj + r] -= l * tmp[t + r];
          }
        }
      }
    }
    for (let jj = c - 1; jj >= 0; jj--) {
      const col = panel + jj * m, yj = (f + jj) * k;
      for (let ii = jj + 1; ii < c; ii++) {
        const l = S[col + ii], yi = (f + ii) * k;
        for (let r = 0; r < k; r++) y[yj + r] -= l * y[yi + r];
      }
      if (!unit) { const inv = 1 / S[col + jj]; for (let r = 0; r < k; r++) y[yj + r] *= inv; }
    }
  }
}

/** Y := D⁻¹·Y, D on the diagonals of the L·D·Lᵀ panels. */
export function diagonalSweep(S: Float64Array, st: SupernodalStructure, y: Float64Array, k: number): void {
  const { rowPtr, superStart, factorPtr } = st;
  for (let s = 0; s < st.supernodeCount; s++) {
    const m = rowPtr[s + 1] - rowPtr[s], f = superStart[s], c = superStart[s + 1] - f;
    for (let jj = 0; jj < c; jj++) {
      const inv = 1 / S[factorPtr[s] + jj * (m + 1)], yj = (f + jj) * k;
      for (let r = 0; r < k; r++) y[yj + r] *= inv;
    }
  }
}

/** Largest m − c over the supernodes: `tmp` needs this many doubles per right-hand side. */
export function largestBelow(st: SupernodalStructure): number {
  let b = 0;
  for (let s = 0; s < st.supernodeCount; s++) {
    b = Math.max(b, st.rowPtr[s + 1] - st.rowPtr[s] - (st.superStart[s + 1] - st.superStart[s]));
  }
  return b;
}
