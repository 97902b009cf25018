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
 * loop: one pass over the factor per sweep, whatever k. The products with
 * the rows below take four columns at a time: a quarter of the passes over
 * the gathered block and, with one right-hand side, four independent sums in
 * the backward dot products instead of one chain of dependent additions
 * (2-D 500² / 3-D 40³ per solve, ms: k = 1 63 → 46 / 77 → 59, k = 4 188 → 125
 * / 257 → 159, k = 16 648 → 434 / 890 → 489; medians of 30, 2026-12-02).
 */
import type { SupernodalStructure } from "../symbolic/types.js";

/**
 * Forward solve L·Y = Y in place (Y n×k row-major); `unit` for L·D·Lᵀ. `tmp`
 * holds max(m − c)·k doubles; recip[j] = 1 / L_jj (kept by the factorization:
 * the sweeps multiply instead of dividing, a division per column having shown in profiles).
 */
export function forwardSweep(
  S: Float64Array, st: SupernodalStructure, y: Float64Array, k: number, unit: boolean, tmp: Float64Array, recip: Float64Array,
): void {
  const { rowPtr, rowIdx, superStart, factorPtr } = st;
  const diag = unit ? null : recip;
  for (let s = 0; s < st.supernodeCount; s++) {
    const r0 = rowPtr[s], m = rowPtr[s + 1] - r0, f = superStart[s], c = superStart[s + 1] - f, b = m - c;
    const panel = factorPtr[s];
    if (k === 1) diagonalForward(S, panel, m, c, y, f, diag); else diagonalForwardK(S, panel, m, c, y, f, k, diag);
    if (b === 0) continue;
    tmp.fill(0, 0, b * k);
    if (k === 1) belowForward(S, panel + c, m, c, b, y, f, tmp); else belowForwardK(S, panel + c, m, c, b, y, f, k, tmp);
    for (let ii = 0, ri = r0 + c; ii < b; ii++) {
      const yi = rowIdx[ri + ii] * k, t = ii * k;
      for (let r = 0; r < k; r++) y[yi + r] -= tmp[t + r];
    }
  }
}

/** Backward solve Lᵀ·X = Y in place (row-major n×k); `tmp` and `recip` as in {@link forwardSweep}. */
export function backwardSweep(
  S: Float64Array, st: SupernodalStructure, y: Float64Array, k: number, unit: boolean, tmp: Float64Array, recip: Float64Array,
): void {
  const { rowPtr, rowIdx, superStart, factorPtr } = st;
  const diag = unit ? null : recip;
  for (let s = st.supernodeCount - 1; s >= 0; s--) {
    const r0 = rowPtr[s], m = rowPtr[s + 1] - r0, f = superStart[s], c = superStart[s + 1] - f, b = m - c;
    const panel = factorPtr[s];
    if (b > 0) {
      for (let ii = 0, ri = r0 + c; ii < b; ii++) {
        const yi = rowIdx[ri + ii] * k, t = ii * k;
        for (let r = 0; r < k; r++) tmp[t + r] = y[yi + r];
      }
      if (k === 1) belowBackward(S, panel + c, m, c, b, y, f, tmp); else belowBackwardK(S, panel + c, m, c, b, y, f, k, tmp);
    }
    if (k === 1) diagonalBackward(S, panel, m, c, y, f, diag); else diagonalBackwardK(S, panel, m, c, y, f, k, diag);
  }
}

/** k right-hand sides: Y[f..f+c) := L11⁻¹·Y[f..f+c) (unit diagonal when `recip` is null). */
function diagonalForwardK(S: Float64Array, panel: number, m: number, c: number, y: Float64Array, f: number, k: number, recip: Float64Array | null): void {
  for (let jj = 0; jj < c; jj++) {
    const col = panel + jj * m, yj = (f + jj) * k;
    if (recip !== null) { const inv = recip[f + jj]; for (let r = 0; r < k; r++) y[yj + r] *= inv; }
    for (let ii = jj + 1; ii < c; ii++) {
      const l = S[col + ii], yi = (f + ii) * k;
      for (let r = 0; r < k; r++) y[yi + r] -= l * y[yj + r];
    }
  }
}

/** k right-hand sides: Y[f..f+c) := L11⁻ᵀ·Y[f..f+c) (unit diagonal when `recip` is null). */
function diagonalBackwardK(S: Float64Array, panel: number, m: number, c: number, y: Float64Array, f: number, k: number, recip: Float64Array | null): void {
  for (let jj = c - 1; jj >= 0; jj--) {
    const col = panel + jj * m, yj = (f + jj) * k;
    for (let ii = jj + 1; ii < c; ii++) {
      const l = S[col + ii], yi = (f + ii) * k;
      for (let r = 0; r < k; r++) y[yj + r] -= l * y[yi + r];
    }
    if (recip !== null) { const inv = recip[f + jj]; for (let r = 0; r < k; r++) y[yj + r] *= inv; }
  }
}

/** k right-hand sides: tmp (b×k) += L21·Y[f..f+c), four columns of L21 per pass over tmp. */
function belowForwardK(S: Float64Array, at: number, m: number, c: number, b: number, y: Float64Array, f: number, k: number, tmp: Float64Array): void {
  let jj = 0;
  for (; jj + 4 <= c; jj += 4) {
    const c0 = at + jj * m, c1 = c0 + m, c2 = c1 + m, c3 = c2 + m, y0 = (f + jj) * k, y1 = y0 + k, y2 = y1 + k, y3 = y2 + k;
    for (let ii = 0; ii < b; ii++) {
      const l0 = S[c0 + ii], l1 = S[c1 + ii], l2 = S[c2 + ii], l3 = S[c3 + ii], t = ii * k;
      for (let r = 0; r < k; r++) tmp[t + r] += l0 * y[y0 + r] + l1 * y[y1 + r] + l2 * y[y2 + r] + l3 * y[y3 + r];
    }
  }
  for (; jj < c; jj++) {
    const col = at + jj * m, yj = (f + jj) * k;
    for (let ii = 0; ii < b; ii++) {
      const l = S[col + ii], t = ii * k;
      for (let r = 0; r < k; r++) tmp[t + r] += l * y[yj + r];
    }
  }
}

/** k right-hand sides: Y[f..f+c) −= L21ᵀ·tmp (b×k), four columns of L21 per pass over tmp. */
function belowBackwardK(S: Float64Array, at: number, m: number, c: number, b: number, y: Float64Array, f: number, k: number, tmp: Float64Array): void {
  let jj = 0;
  for (; jj + 4 <= c; jj += 4) {
    const c0 = at + jj * m, c1 = c0 + m, c2 = c1 + m, c3 = c2 + m, y0 = (f + jj) * k, y1 = y0 + k, y2 = y1 + k, y3 = y2 + k;
    for (let ii = 0; ii < b; ii++) {
      const l0 = S[c0 + ii], l1 = S[c1 + ii], l2 = S[c2 + ii], l3 = S[c3 + ii], t = ii * k;
      for (let r = 0; r < k; r++) { const x = tmp[t + r]; y[y0 + r] -= l0 * x; y[y1 + r] -= l1 * x; y[y2 + r] -= l2 * x; y[y3 + r] -= l3 * x; }
    }
  }
  for (; jj < c; jj++) {
    const col = at + jj * m, yj = (f + jj) * k;
    for (let ii = 0; ii < b; ii++) {
      const l = S[col + ii], t = ii * k;
      for (let r = 0; r < k; r++) y[yj + r] -= l * tmp[t + r];
    }
  }
}

/** One right-hand side: y[f..f+c) := L11⁻¹·y[f..f+c), L11 the diagonal block at `panel` (unit diagonal when `recip` is null). */
function diagonalForward(S: Float64Array, panel: number, m: number, c: number, y: Float64Array, f: number, recip: Float64Array | null): void {
  for (let jj = 0; jj < c; jj++) {
    const col = panel + jj * m;
    const v = recip === null ? y[f + jj] : (y[f + jj] *= recip[f + jj]);
    if (v !== 0) for (let ii = jj + 1; ii < c; ii++) y[f + ii] -= S[col + ii] * v;
  }
}

/** One right-hand side: y[f..f+c) := L11⁻ᵀ·y[f..f+c) (unit diagonal when `recip` is null). */
function diagonalBackward(S: Float64Array, panel: number, m: number, c: number, y: Float64Array, f: number, recip: Float64Array | null): void {
  for (let jj = c - 1; jj >= 0; jj--) {
    const col = panel + jj * m;
    let t = y[f + jj];
    for (let ii = jj + 1; ii < c; ii++) t -= S[col + ii] * y[f + ii];
    y[f + jj] = recip === null ? t : t * recip[f + jj];
  }
}

/**
 * One right-hand side: tmp[0..b) += L21·y[f..f+c), L21 the b×c block below the
 * diagonal block (column j at at + j·m), four columns per pass over tmp.
 */
function belowForward(S: Float64Array, at: number, m: number, c: number, b: number, y: Float64Array, f: number, tmp: Float64Array): void {
  let jj = 0;
  for (; jj + 4 <= c; jj += 4) {
    const c0 = at + jj * m, c1 = c0 + m, c2 = c1 + m, c3 = c2 + m;
    const v0 = y[f + jj], v1 = y[f + jj + 1], v2 = y[f + jj + 2], v3 = y[f + jj + 3];
    if (v0 === 0 && v1 === 0 && v2 === 0 && v3 === 0) continue;
    for (let ii = 0; ii < b; ii++) tmp[ii] += S[c0 + ii] * v0 + S[c1 + ii] * v1 + S[c2 + ii] * v2 + S[c3 + ii] * v3;
  }
  for (; jj < c; jj++) {
    const col = at + jj * m, v = y[f + jj];
    if (v !== 0) for (let ii = 0; ii < b; ii++) tmp[ii] += S[col + ii] * v;
  }
}

/** One right-hand side: y[f..f+c) −= L21ᵀ·tmp[0..b), four dot products per pass over tmp. */
function belowBackward(S: Float64Array, at: number, m: number, c: number, b: number, y: Float64Array, f: number, tmp: Float64Array): void {
  let jj = 0;
  for (; jj + 4 <= c; jj += 4) {
    const c0 = at + jj * m, c1 = c0 + m, c2 = c1 + m, c3 = c2 + m;
    let t0 = 0, t1 = 0, t2 = 0, t3 = 0;
    for (let ii = 0; ii < b; ii++) {
      const x = tmp[ii];
      t0 += S[c0 + ii] * x; t1 += S[c1 + ii] * x; t2 += S[c2 + ii] * x; t3 += S[c3 + ii] * x;
    }
    y[f + jj] -= t0; y[f + jj + 1] -= t1; y[f + jj + 2] -= t2; y[f + jj + 3] -= t3;
  }
  for (; jj < c; jj++) {
    const col = at + jj * m;
    let t = 0;
    for (let ii = 0; ii < b; ii++) t += S[col + ii] * tmp[ii];
    y[f + jj] -= t;
  }
}

/** Y := D⁻¹·Y, with recip[j] = 1/d_j (L·D·Lᵀ). */
export function diagonalSweep(y: Float64Array, k: number, recip: Float64Array): void {
  for (let j = 0; j < recip.length; j++) {
    const inv = recip[j], yj = j * k;
    for (let r = 0; r < k; r++) y[yj + r] *= inv;
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
