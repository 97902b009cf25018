/**
 * Linear elasticity on a cube of k×k×k trilinear hexahedra (Q1), three
 * displacement unknowns per node, clamped on the face x = 0: the element
 * stiffness ∫ Bᵀ D B dV by 2×2×2 Gauss quadrature with isotropic Hooke's law
 * (Lamé parameters from E and ν). Textbook method (Hughes 1987, "The Finite
 * Element Method", ch. 2–3).
 */
import { checkSize, LowerTriplets, type ModelProblem } from "./grids.js";

const CORNERS = [
  [-1, -1, -1], [1, -1, -1], [1, 1, -1], [-1, 1, -1],
  [-1, -1, 1], [1, -1, 1], [1, 1, 1], [-1, 1, 1],
];

/** 24×24 stiffness (row-major) of a cube of side s, Young's modulus E, Poisson ratio nu. */
export function hexStiffness(s: number, E: number, nu: number): Float64Array {
  const lam = (E * nu) / ((1 + nu) * (1 - 2 * nu)), mu = E / (2 * (1 + nu));
  const ke = new Float64Array(576);
  const g = 1 / Math.sqrt(3);
  const B = new Float64Array(6 * 24);
  const DB = new Float64Array(6 * 24);
  const jac = (s / 2) ** 3; // determinant of the map from [-1,1]^3, times Gauss weights 1
  for (const gx of [-g, g]) for (const gy of [-g, g]) for (const gz of [-g, g]) {
    B.fill(0);
    for (let a = 0; a < 8; a++) {
      const [xa, ya, za] = CORNERS[a];
      const nx = (xa * (1 + gy * ya) * (1 + gz * za)) / 8 * (2 / s);
      const ny = (ya * (1 + gx * xa) * (1 + gz * za)) / 8 * (2 / s);
      const nz = (za * (1 + gx * xa) * (1 + gy * ya)) / 8 * (2 / s);
      // strain rows: xx, yy, zz, xy, yz, zx
      B[0 * 24 + 3 * a] = nx; B[3 * 24 + 3 * a] = ny; B[5 * 24 + 3 * a] = nz;
      B[1 * 24 + 3 * a + 1] = ny; B[3 * 24 + 3 * a + 1] = nx; B[4 * 24 + 3 * a + 1] = nz;
      B[2 * 24 + 3 * a + 2] = nz; B[4 * 24 + 3 * a + 2] = ny; B[5 * 24 + 3 * a + 2] = nx;
    }
    for (let c = 0; c < 24; c++) {
      const e0 = B[c], e1 = B[24 + c], e2 = B[48 + c];
      DB[c] = (lam + 2 * mu) * e0 + lam * (e1 + e2);
      DB[24 + c] = (lam + 2 * mu) * e1 + lam * (e0 + e2);
      DB[48 + c] = (lam + 2 * mu) * e2 + lam * (e0 + e1);
      for (let r = 3; r < 6; r++) DB[24 * r + c] = mu * B[24 * r + c];
    }
    for (let i = 0; i < 24; i++) for (let j = 0; j < 24; j++) {
      let sum = 0;
      for (let r = 0; r < 6; r++) sum += B[24 * r + i] * DB[24 * r + j];
      ke[24 * i + j] += jac * sum;
    }
  }
  return ke;
}

/**
 * Linear elasticity of the unit cube on k×k×k trilinear bricks, clamped on
 * x = 0: three displacement unknowns per free node, n = 3·k·(k+1)², lower triangle.
 */
export function elasticity3d(k: number, E = 1, nu = 0.3): ModelProblem {
  checkSize("elasticity3d size", k, 1, 80);
  const m = k + 1;
  const ke = hexStiffness(1 / k, E, nu);
  // node (x, y, z) with x ≥ 1 is free; unknown of component c is 3·free + c
  const free = (x: number, y: number, z: number) => (x === 0 ? -1 : (z * m + y) * k + (x - 1));
  const n = 3 * k * m * m;
  const coordinates = new Float64Array(3 * n);
  for (let z = 0; z < m; z++) for (let y = 0; y < m; y++) for (let x = 1; x < m; x++) {
    const f = free(x, y, z), cx = x / k, cy = y / k, cz = z / k;
    for (let q = 9 * f; q < 9 * f + 9; q += 3) { coordinates[q] = cx; coordinates[q + 1] = cy; coordinates[q + 2] = cz; }
  }
  const t = new LowerTriplets();
  const dof = new Int32Array(24);
  for (let ez = 0; ez < k; ez++) for (let ey = 0; ey < k; ey++) for (let ex = 0; ex < k; ex++) {
    for (let a = 0; a < 8; a++) {
      const [xa, ya, za] = CORNERS[a];
      const f = free(ex + (xa + 1) / 2, ey + (ya + 1) / 2, ez + (za + 1) / 2);
      for (let c = 0; c < 3; c++) dof[3 * a + c] = f < 0 ? -1 : 3 * f + c;
    }
    for (let i = 0; i < 24; i++) {
      if (dof[i] < 0) continue;
      for (let j = 0; j < 24; j++) if (dof[j] >= 0 && dof[j] <= dof[i]) t.add(dof[i], dof[j], ke[24 * i + j]);
    }
  }
  return {
    name: `elasticity3d-${k}`,
    description: `linear elasticity, ${k}×${k}×${k} trilinear hexahedra, 3 unknowns per node, clamped at x = 0 (E = ${E}, ν = ${nu})`,
    matrix: t.toMatrix(n), coordinates, dim: 3,
  };
}
