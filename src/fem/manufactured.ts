/**
 * Verification of the P1 discretization by a manufactured solution: choose u,
 * derive f = −κΔu, impose g = u on the hole circles, and measure the L2 error
 * over the mesh with a degree-4 six-point triangle rule (Dunavant 1985,
 * "High degree efficient symmetrical Gaussian quadrature rules for the
 * triangle", IJNME 21; weights from memory, checked to sum to one). P1
 * elements converge as O(h²) in L2 for smooth u (common practice).
 */
import { meshPlate, type PlateSpec, type TriangleMesh } from "./mesh.js";
import { assembleP1, expandSolution, type Triplets } from "./p1.js";

/** A linear solver for the assembled system: returns x with A x = b. */
export type SystemSolver = (A: Triplets, b: Float64Array) => Float64Array;

/**
 * u(x, y) = cos(πx/W) cos(πy/H): its normal derivative vanishes on the whole
 * outer rim, so the insulated-rim condition holds exactly.
 */
export function manufactured(width: number, height: number, kappa: number) {
  const a = Math.PI / width, b = Math.PI / height;
  const u = (x: number, y: number) => Math.cos(a * x) * Math.cos(b * y);
  const f = (x: number, y: number) => kappa * (a * a + b * b) * u(x, y);
  return { u, f };
}

const Q_W = [0.223381589678011, 0.223381589678011, 0.223381589678011, 0.109951743655322, 0.109951743655322, 0.109951743655322];
const Q_A = 0.445948490915965, Q_B = 0.108103018168070, Q_C = 0.091576213509771, Q_D = 0.816847572980459;
const Q_L = [
  [Q_A, Q_A, Q_B], [Q_A, Q_B, Q_A], [Q_B, Q_A, Q_A],
  [Q_C, Q_C, Q_D], [Q_C, Q_D, Q_C], [Q_D, Q_C, Q_C],
];

/** ‖u_h − u‖_{L2(mesh)} for nodal values uh of a P1 function. */
export function l2Error(mesh: TriangleMesh, uh: Float64Array, u: (x: number, y: number) => number): number {
  let sum = 0;
  const xy = mesh.coords;
  for (let t = 0; t < mesh.triangles.length; t += 3) {
    const i = mesh.triangles[t], j = mesh.triangles[t + 1], k = mesh.triangles[t + 2];
    const area = Math.abs((xy[2 * j] - xy[2 * i]) * (xy[2 * k + 1] - xy[2 * i + 1]) - (xy[2 * k] - xy[2 * i]) * (xy[2 * j + 1] - xy[2 * i + 1])) / 2;
    for (let q = 0; q < 6; q++) {
      const [l0, l1, l2] = Q_L[q];
      const x = l0 * xy[2 * i] + l1 * xy[2 * j] + l2 * xy[2 * k];
      const y = l0 * xy[2 * i + 1] + l1 * xy[2 * j + 1] + l2 * xy[2 * k + 1];
      const e = l0 * uh[i] + l1 * uh[j] + l2 * uh[k] - u(x, y);
      sum += Q_W[q] * area * e * e;
    }
  }
  return Math.sqrt(sum);
}

/** One level of a refinement study. */
export interface ConvergenceLevel {
  readonly h: number;
  readonly unknowns: number;
  readonly error: number;
  /** log2(previous error / this error) for halved h; NaN on the first level */
  readonly rate: number;
}

/** Solve the manufactured problem on `plate` at h, h/2, h/4, … and report observed L2 rates. */
export function convergenceStudy(plate: PlateSpec, kappa: number, levels: number, solve: SystemSolver): ConvergenceLevel[] {
  const { u, f } = manufactured(plate.width, plate.height, kappa);
  const out: ConvergenceLevel[] = [];
  for (let l = 0; l < levels; l++) {
    const h = plate.h / 2 ** l;
    const mesh = meshPlate({ ...plate, h });
    const system = assembleP1(mesh, {
      kappa,
      source: f,
      dirichlet: (v, x, y) => (mesh.holeOf[v] >= 0 ? u(x, y) : undefined),
    });
    const uh = expandSolution(system, solve(system.matrix, system.rhs));
    const error = l2Error(mesh, uh, u);
    const rate = l === 0 ? NaN : Math.log2(out[l - 1].error / error);
    out.push({ h, unknowns: system.nodeOf.length, error, rate });
  }
  return out;
}
