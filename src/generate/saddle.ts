/**
 * A quasi-definite saddle-point model problem, the shape of stabilized
 * Stokes or mixed finite-element systems:
 *   K = [ A   Bᵀ ]     A: 5-point Laplacian for each velocity component (SPD)
 *       [ B  −C ]     B: discrete divergence (velocity nodes → pressure cells)
 *                     C = γ·I, a pressure stabilization (SPD)
 * A quasi-definite matrix has an L·D·Lᵀ factorization with diagonal D for
 * every symmetric permutation (Vanderbei 1995, "Symmetric quasi-definite
 * matrices", SIAM J. Optim. 5(1)); Cholesky fails on it by design.
 */
import { InputError } from "../errors.js";
import { checkSize, LowerTriplets, type ModelProblem } from "./grids.js";

/** Velocities on a k×k node grid (u then v), pressures on the (k−1)×(k−1) cells. */
export function saddle2d(k: number, gamma = 1e-2): ModelProblem {
  checkSize("saddle2d size", k, 2, 3000);
  // C = γ·I must be positive definite for the matrix to be quasi-definite, as its description says.
  if (!(gamma > 0 && gamma < Infinity)) throw new InputError(`saddle2d gamma must be a finite number > 0, got ${gamma}`);
  const nu = k * k, np = (k - 1) * (k - 1), n = 2 * nu + np;
  const t = new LowerTriplets();
  const coordinates = new Float64Array(2 * n);
  for (let c = 0; c < 2; c++) {
    for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
      const v = c * nu + y * k + x;
      coordinates[2 * v] = x; coordinates[2 * v + 1] = y;
      t.add(v, v, 4);
      if (x > 0) t.add(v, v - 1, -1);
      if (y > 0) t.add(v, v - k, -1);
    }
  }
  for (let y = 0; y < k - 1; y++) for (let x = 0; x < k - 1; x++) {
    const p = 2 * nu + y * (k - 1) + x;
    coordinates[2 * p] = x + 0.5; coordinates[2 * p + 1] = y + 0.5;
    const n00 = y * k + x, n10 = n00 + 1, n01 = n00 + k, n11 = n01 + 1;
    // ∂u/∂x + ∂v/∂y over the cell, averaged along its two edges
    t.add(p, n10, 0.5); t.add(p, n11, 0.5); t.add(p, n00, -0.5); t.add(p, n01, -0.5);
    t.add(p, nu + n01, 0.5); t.add(p, nu + n11, 0.5); t.add(p, nu + n00, -0.5); t.add(p, nu + n10, -0.5);
    t.add(p, p, -gamma);
  }
  return {
    name: `saddle2d-${k}`,
    description: `quasi-definite saddle point [A Bᵀ; B −${gamma}·I]: 2 velocity components on a ${k}×${k} grid, ${np} pressure cells (factor with --method ldlt)`,
    matrix: t.toMatrix(n), coordinates, dim: 2,
  };
}
