/**
 * Model problems on regular grids, stored as the lower triangle (diagonal
 * included) with node coordinates:
 *  - grid2d 5-point: the finite-difference Laplacian on a k×k interior grid
 *    (Dirichlet boundary eliminated), diag 4, neighbours −1 (common practice;
 *    LeVeque 2007, "Finite Difference Methods for ODEs and PDEs", ch. 3);
 *  - grid2d 9-point: bilinear (Q1) finite elements for the Laplacian on the
 *    same nodes, diag 8/3, all eight neighbours −1/3 (common practice);
 *  - grid3d 7-point: diag 6, six neighbours −1.
 */
import { InputError } from "../errors.js";
import { SparseMatrix } from "../matrix/sparse.js";

/** A generated model problem: the lower triangle of a symmetric matrix (positive definite; quasi-definite for saddle2d), plus node coordinates (dim per unknown). */
export interface ModelProblem {
  readonly name: string;
  readonly description: string;
  readonly matrix: SparseMatrix;
  /** dim numbers per unknown (several unknowns of one node share a point), or undefined */
  readonly coordinates?: Float64Array;
  readonly dim: number;
}

/** Throws InputError unless k is an integer in [lo, hi]. */
export function checkSize(what: string, k: number, lo: number, hi: number): void {
  if (!Number.isInteger(k) || k < lo || k > hi) throw new InputError(`${what} must be an integer in ${lo}..${hi}, got ${k}`);
}

/** Lower-triangle triplet accumulator with amortized growth (generation only, not a hot path). */
export class LowerTriplets {
  rows = new Int32Array(1024);
  cols = new Int32Array(1024);
  values = new Float64Array(1024);
  count = 0;
  /** Add a(i, j) = v; (i, j) is mirrored into the lower triangle. */
  add(i: number, j: number, v: number): void {
    if (this.count === this.rows.length) this.grow();
    const lo = i >= j;
    this.rows[this.count] = lo ? i : j;
    this.cols[this.count] = lo ? j : i;
    this.values[this.count++] = v;
  }
  private grow(): void {
    const c = 2 * this.rows.length;
    const r = new Int32Array(c); r.set(this.rows); this.rows = r;
    const k = new Int32Array(c); k.set(this.cols); this.cols = k;
    const v = new Float64Array(c); v.set(this.values); this.values = v;
  }
  toMatrix(n: number): SparseMatrix {
    const m = this.count;
    return SparseMatrix.fromTriplets(n, n, this.rows.subarray(0, m), this.cols.subarray(0, m), this.values.subarray(0, m));
  }
}

/**
 * The Laplacian on a k×k interior grid (Dirichlet boundary eliminated), lower
 * triangle: `stencil` 5 gives the finite-difference 5-point matrix (diag 4,
 * neighbours −1), 9 the bilinear finite-element matrix (diag 8/3, all eight
 * neighbours −1/3). Coordinates are the grid points.
 */
export function grid2d(k: number, stencil: 5 | 9 = 5): ModelProblem {
  checkSize("grid2d size", k, 1, 4000);
  const t = new LowerTriplets();
  const coordinates = new Float64Array(2 * k * k);
  const diag = stencil === 5 ? 4 : 8 / 3;
  const off = stencil === 5 ? -1 : -1 / 3;
  for (let y = 0; y < k; y++) {
    for (let x = 0; x < k; x++) {
      const v = y * k + x;
      coordinates[2 * v] = x; coordinates[2 * v + 1] = y;
      t.add(v, v, diag);
      if (x > 0) t.add(v, v - 1, off);
      if (y > 0) t.add(v, v - k, off);
      if (stencil === 9 && y > 0 && x > 0) t.add(v, v - k - 1, off);
      if (stencil === 9 && y > 0 && x < k - 1) t.add(v, v - k + 1, off);
    }
  }
  return {
    name: `grid2d-${k}${stencil === 9 ? "-9pt" : ""}`,
    description: `${stencil}-point ${stencil === 5 ? "finite-difference" : "bilinear finite-element"} Laplacian on a ${k}×${k} grid, Dirichlet boundary`,
    matrix: t.toMatrix(k * k), coordinates, dim: 2,
  };
}

/** The 7-point Laplacian on a k×k×k interior grid (diag 6, neighbours −1), lower triangle, with grid coordinates. */
export function grid3d(k: number): ModelProblem {
  checkSize("grid3d size", k, 1, 250);
  const t = new LowerTriplets();
  const n = k * k * k;
  const coordinates = new Float64Array(3 * n);
  for (let z = 0; z < k; z++) {
    for (let y = 0; y < k; y++) {
      for (let x = 0; x < k; x++) {
        const v = (z * k + y) * k + x;
        coordinates[3 * v] = x; coordinates[3 * v + 1] = y; coordinates[3 * v + 2] = z;
        t.add(v, v, 6);
        if (x > 0) t.add(v, v - 1, -1);
        if (y > 0) t.add(v, v - k, -1);
        if (z > 0) t.add(v, v - k * k, -1);
      }
    }
  }
  return { name: `grid3d-${k}`, description: `7-point Laplacian on a ${k}×${k}×${k} grid, Dirichlet boundary`, matrix: t.toMatrix(n), coordinates, dim: 3 };
}
