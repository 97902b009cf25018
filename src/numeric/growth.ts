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

/**
 * ρ for the L·D·Lᵀ factor in store S (d_j on each panel's diagonal), given
 * terms[j] = Σ_{k<j} l_jk²·|d_k| (new numbering, summed by the multifrontal
 * pass): (|L|·|D|·|Lᵀ|)_jj = |d_j| + terms[j].
 */
export function ldltGrowth(st: SupernodalStructure, S: Float64Array, terms: Float64Array, maxA: number): number {
  let top = 0;
  for (let s = 0; s < st.supernodeCount; s++) {
    const m = st.rowPtr[s + 1] - st.rowPtr[s], f = st.superStart[s], c = st.superStart[s + 1] - f;
    for (let j = 0; j < c; j++) top = Math.max(top, Math.abs(S[st.factorPtr[s] + j * (m + 1)]) + terms[f + j]);
  }
  return maxA > 0 ? top / maxA : 1;
}
