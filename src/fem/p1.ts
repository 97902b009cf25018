/**
 * Linear (P1) finite elements for the steady diffusion equation
 *   −∇·(κ ∇u) = f  in Ω,   u = g on the Dirichlet nodes,   κ ∂u/∂n = 0 elsewhere,
 * on a triangle mesh: element stiffness from the constant gradients of the
 * barycentric coordinates, load by the edge-midpoint rule (exact for
 * quadratics), Dirichlet nodes eliminated into the right-hand side.
 * The method is the textbook one (e.g. Johnson 1987, "Numerical Solution of
 * Partial Differential Equations by the Finite Element Method", ch. 1–4).
 */
import { SparseMatrix } from "../matrix/sparse.js";
import type { TriangleMesh } from "./mesh.js";

/** Coordinate-format (triplet) symmetric matrix holding both triangles; duplicates are to be summed. */
export interface Triplets {
  readonly n: number;
  readonly rows: Int32Array;
  readonly cols: Int32Array;
  readonly values: Float64Array;
}

/** An assembled system on the free (non-Dirichlet) nodes. */
export interface P1System {
  readonly matrix: Triplets;
  readonly rhs: Float64Array;
  /** node → unknown index, or -1 for a Dirichlet node */
  readonly unknownOf: Int32Array;
  /** unknown → node */
  readonly nodeOf: Int32Array;
  /** value of u at every node: g on Dirichlet nodes, 0 elsewhere until filled by `expandSolution` */
  readonly dirichlet: Float64Array;
}

export interface P1Problem {
  /** conductivity (constant, or per triangle) */
  readonly kappa: number | ((x: number, y: number) => number);
  /** source density f(x, y) */
  readonly source: (x: number, y: number) => number;
  /** Dirichlet value g at node v, or undefined for a free node */
  readonly dirichlet: (v: number, x: number, y: number) => number | undefined;
}

/** Assemble K u = F on the free nodes. */
export function assembleP1(mesh: TriangleMesh, problem: P1Problem): P1System {
  const { nodeOf, unknownOf, dirichlet } = splitNodes(mesh, problem);
  const m = mesh.triangles.length / 3;
  const cap = 9 * m;
  const rows = new Int32Array(cap), cols = new Int32Array(cap), values = new Float64Array(cap);
  const rhs = new Float64Array(nodeOf.length);
  const ke = new Float64Array(9), fe = new Float64Array(3), v = new Int32Array(3);
  let nnz = 0;
  for (let t = 0; t < m; t++) {
    for (let a = 0; a < 3; a++) v[a] = mesh.triangles[3 * t + a];
    elementMatrices(mesh.coords, v, problem, ke, fe);
    for (let a = 0; a < 3; a++) {
      const ia = unknownOf[v[a]];
      if (ia < 0) continue;
      rhs[ia] += fe[a];
      for (let b = 0; b < 3; b++) {
        const ib = unknownOf[v[b]];
        if (ib < 0) { rhs[ia] -= ke[3 * a + b] * dirichlet[v[b]]; continue; }
        rows[nnz] = ia; cols[nnz] = ib; values[nnz] = ke[3 * a + b]; nnz++;
      }
    }
  }
  const matrix = { n: nodeOf.length, rows: rows.slice(0, nnz), cols: cols.slice(0, nnz), values: values.slice(0, nnz) };
  return { matrix, rhs, unknownOf, nodeOf, dirichlet };
}

function splitNodes(mesh: TriangleMesh, problem: P1Problem) {
  const unknownOf = new Int32Array(mesh.nodeCount);
  const dirichlet = new Float64Array(mesh.nodeCount);
  const free: number[] = [];
  for (let v = 0; v < mesh.nodeCount; v++) {
    const g = problem.dirichlet(v, mesh.coords[2 * v], mesh.coords[2 * v + 1]);
    if (g === undefined) { unknownOf[v] = free.length; free.push(v); }
    else { unknownOf[v] = -1; dirichlet[v] = g; }
  }
  return { nodeOf: Int32Array.from(free), unknownOf, dirichlet };
}

const BX = new Float64Array(3), BY = new Float64Array(3);

/** Element stiffness ke (3×3, row-major) and load fe of the triangle with nodes v. */
function elementMatrices(xy: Float64Array, v: Int32Array, p: P1Problem, ke: Float64Array, fe: Float64Array): void {
  const x0 = xy[2 * v[0]], y0 = xy[2 * v[0] + 1];
  const x1 = xy[2 * v[1]], y1 = xy[2 * v[1] + 1];
  const x2 = xy[2 * v[2]], y2 = xy[2 * v[2] + 1];
  const twiceArea = (x1 - x0) * (y2 - y0) - (x2 - x0) * (y1 - y0);
  const area = Math.abs(twiceArea) / 2;
  const bx0 = (y1 - y2) / twiceArea, bx1 = (y2 - y0) / twiceArea, bx2 = (y0 - y1) / twiceArea;
  const by0 = (x2 - x1) / twiceArea, by1 = (x0 - x2) / twiceArea, by2 = (x1 - x0) / twiceArea;
  const cx = (x0 + x1 + x2) / 3, cy = (y0 + y1 + y2) / 3;
  const k = typeof p.kappa === "number" ? p.kappa : p.kappa(cx, cy);
  const bx = BX, by = BY;
  bx[0] = bx0; bx[1] = bx1; bx[2] = bx2; by[0] = by0; by[1] = by1; by[2] = by2;
  for (let a = 0; a < 3; a++) {
    for (let b = 0; b < 3; b++) ke[3 * a + b] = k * area * (bx[a] * bx[b] + by[a] * by[b]);
  }
  // edge midpoints m01, m12, m20; each basis function is 1/2 at its two adjacent midpoints
  const f01 = p.source((x0 + x1) / 2, (y0 + y1) / 2);
  const f12 = p.source((x1 + x2) / 2, (y1 + y2) / 2);
  const f20 = p.source((x2 + x0) / 2, (y2 + y0) / 2);
  fe[0] = (area / 6) * (f01 + f20);
  fe[1] = (area / 6) * (f01 + f12);
  fe[2] = (area / 6) * (f12 + f20);
}

/** Lower triangle (diagonal included) of an assembled triplet matrix as a SparseMatrix, duplicates summed. */
export function lowerMatrix(t: Triplets): SparseMatrix {
  let m = 0;
  for (let e = 0; e < t.rows.length; e++) if (t.rows[e] >= t.cols[e]) m++;
  const rows = new Int32Array(m), cols = new Int32Array(m), values = new Float64Array(m);
  for (let e = 0, k = 0; e < t.rows.length; e++) {
    if (t.rows[e] < t.cols[e]) continue;
    rows[k] = t.rows[e]; cols[k] = t.cols[e]; values[k++] = t.values[e];
  }
  return SparseMatrix.fromTriplets(t.n, t.n, rows, cols, values);
}

/** Node coordinates (x, y) of each unknown, in unknown order. */
export function unknownCoordinates(mesh: TriangleMesh, system: P1System): Float64Array {
  const n = system.nodeOf.length, coordinates = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    coordinates[2 * i] = mesh.coords[2 * system.nodeOf[i]];
    coordinates[2 * i + 1] = mesh.coords[2 * system.nodeOf[i] + 1];
  }
  return coordinates;
}

/** Nodal values of u: the solution on free nodes, g on Dirichlet nodes. */
export function expandSolution(system: P1System, x: Float64Array): Float64Array {
  const u = Float64Array.from(system.dirichlet);
  for (let i = 0; i < system.nodeOf.length; i++) u[system.nodeOf[i]] = x[i];
  return u;
}

/**
 * Heat balance of a solution: `load` = Σ F over all nodes (the source as
 * the assembly integrated it) and `outflow` = −Σ_d (K u − F)_d over the
 * Dirichlet nodes of the full (unreduced) system. K annihilates constants,
 * so the two agree up to the solve's accuracy (conservation, common practice).
 */
export function heatBalance(mesh: TriangleMesh, problem: P1Problem, system: P1System, u: Float64Array): { load: number; outflow: number } {
  const ke = new Float64Array(9), fe = new Float64Array(3), v = new Int32Array(3);
  let outflow = 0, load = 0;
  for (let t = 0; t < mesh.triangles.length; t += 3) {
    for (let a = 0; a < 3; a++) v[a] = mesh.triangles[t + a];
    elementMatrices(mesh.coords, v, problem, ke, fe);
    for (let a = 0; a < 3; a++) {
      load += fe[a];
      if (system.unknownOf[v[a]] >= 0) continue;
      let r = -fe[a];
      for (let b = 0; b < 3; b++) r += ke[3 * a + b] * u[v[b]];
      outflow -= r;
    }
  }
  return { load, outflow };
}
