/**
 * Growth of an L·D·Lᵀ factorization without pivoting. The computed factors
 * satisfy L·D·Lᵀ = A + ΔA with |ΔA| ≤ c·n·ε·|L|·|D|·|Lᵀ| (Higham 2002,
 * Accuracy and Stability of Numerical Algorithms, §10.4 and §11.1), so the
 * normwise backward error of a solve is at most about n·ε·ρ with
 *   ρ = max_j (|L|·|D|·|Lᵀ|)_jj / max_ij |a_ij|,
 * the diagonal bounding the off-diagonal entries (Cauchy–Schwarz on
 * |L|·|D|^½). For Cholesky, and for L·D·Lᵀ of a positive definite matrix,
 * (|L|·|D|·|Lᵀ|)_jj = a_jj and ρ ≤ 1; for a quasi-definite matrix ordered with
 * a constraint row before its neighbours, pivots of order 1/γ make ρ large.
 */
import type { SupernodalStructure } from "../symbolic/types.js";

/** ρ for the L·D·Lᵀ factor in store S (unit L below each panel's diagonal, d_j on it); `w` is an n-long workspace. */
export function ldltGrowth(st: SupernodalStructure, S: Float64Array, maxA: number, w: Float64Array): number {
  w.fill(0);
  for (let s = 0; s < st.supernodeCount; s++) {
    const r0 = st.rowPtr[s], m = st.rowPtr[s + 1] - r0, f = st.superStart[s], c = st.superStart[s + 1] - f;
    const panel = st.factorPtr[s];
    for (let j = 0; j < c; j++) {
      const col = panel + j * m, d = Math.abs(S[col + j]);
      w[f + j] += d;
      for (let i = j + 1; i < m; i++) {
        const l = S[col + i];
        w[st.rowIdx[r0 + i]] += l * l * d;
      }
    }
  }
  let top = 0;
  for (let j = 0; j < w.length; j++) if (w[j] > top) top = w[j];
  return maxA > 0 ? top / maxA : 1;
}
