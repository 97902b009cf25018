/**
 * Iterative refinement in working precision (Wilkinson 1963; Skeel 1980,
 * Math. Comp. 35) with the normwise backward error of Rigal & Gaches (1967,
 * J. ACM 14(3)): η = ‖b − A·x‖∞ / (‖A‖∞·‖x‖∞ + ‖b‖∞), per right-hand side,
 * the largest reported. One step: r = b − A·x, solve A·d = r, x += d.
 */
import type { SparseMatrix } from "../matrix/sparse.js";
import { symmetricMultiply } from "../matrix/symmetric.js";
import type { SolveInfo } from "./types.js";

const EPS = Number.EPSILON;
const MAX_AUTO_STEPS = 10;

/** Residual r = b − A·x for every column and the largest backward error; `ax` is an n-long workspace. */
function residual(A: SparseMatrix, normA: number, b: Float64Array, x: Float64Array, r: Float64Array, ax: Float64Array): number {
  const n = A.ncols, k = n === 0 ? 0 : b.length / n;
  let worst = 0;
  for (let c = 0; c < k; c++) {
    const o = c * n;
    symmetricMultiply(A, x.subarray(o, o + n), ax);
    let rn = 0, xn = 0, bn = 0;
    for (let i = 0; i < n; i++) {
      const ri = b[o + i] - ax[i];
      r[o + i] = ri;
      rn = Math.max(rn, Math.abs(ri));
      xn = Math.max(xn, Math.abs(x[o + i]));
      bn = Math.max(bn, Math.abs(b[o + i]));
    }
    const den = normA * xn + bn;
    const eta = den > 0 ? rn / den : rn > 0 ? Infinity : 0;
    if (eta > worst) worst = eta;
  }
  return worst;
}

/**
 * Solve with `solveInPlace`, then refine: `steps` a count (stop early at ε)
 * or `true` (up to 10 steps while each at least halves η).
 */
export function refineSolve(
  A: SparseMatrix, normA: number, b: Float64Array,
  solveInPlace: (v: Float64Array) => Float64Array, steps: number | boolean,
): SolveInfo {
  const x = solveInPlace(b.slice());
  const r = new Float64Array(b.length), ax = new Float64Array(A.ncols);
  const trial = new Float64Array(b.length), r2 = new Float64Array(b.length);
  let eta = residual(A, normA, b, x, r, ax);
  const max = steps === true ? MAX_AUTO_STEPS : steps === false ? 0 : Math.max(0, Math.floor(steps));
  let taken = 0;
  while (taken < max && eta > EPS) {
    const d = solveInPlace(r);
    for (let i = 0; i < trial.length; i++) trial[i] = x[i] + d[i];
    const eta2 = residual(A, normA, b, trial, r2, ax);
    taken++;
    if (!(eta2 < eta)) break;
    const halved = eta2 <= 0.5 * eta;
    x.set(trial); r.set(r2); eta = eta2;
    if (steps === true && !halved) break;
  }
  return { x, backwardError: eta, refinementSteps: taken };
}
