import { describe, expect, it } from "vitest";
import { CholeskyDecomposition, Matrix } from "ml-matrix";
import { meshPlate } from "../src/fem/mesh.js";
import { assembleP1, expandSolution, type Triplets } from "../src/fem/p1.js";
import { convergenceStudy, l2Error } from "../src/fem/manufactured.js";

/** Dense reference solve with ml-matrix's Cholesky (the project's outside dense reference). */
function denseSolve(A: Triplets, b: Float64Array): Float64Array {
  const M = Matrix.zeros(A.n, A.n);
  for (let k = 0; k < A.rows.length; k++) M.set(A.rows[k], A.cols[k], M.get(A.rows[k], A.cols[k]) + A.values[k]);
  const x = new CholeskyDecomposition(M).solve(Matrix.columnVector(Array.from(b)));
  return Float64Array.from(x.getColumn(0));
}

const plate = { width: 1, height: 0.6, holes: [{ x: 0.5, y: 0.3, r: 0.15 }], h: 0.1 };

describe("plate mesh with holes", () => {
  it("covers the plate minus the hole: area = W·H − πr² up to O(h²) chord error, all triangles positive", () => {
    for (const h of [0.05, 0.025]) {
      const mesh = meshPlate({ ...plate, h });
      let area = 0;
      let minArea = Infinity;
      const xy = mesh.coords;
      for (let t = 0; t < mesh.triangles.length; t += 3) {
        const [i, j, k] = [mesh.triangles[t], mesh.triangles[t + 1], mesh.triangles[t + 2]];
        const a = ((xy[2 * j] - xy[2 * i]) * (xy[2 * k + 1] - xy[2 * i + 1]) - (xy[2 * k] - xy[2 * i]) * (xy[2 * j + 1] - xy[2 * i + 1])) / 2;
        area += a;
        minArea = Math.min(minArea, a);
      }
      // closed form: rectangle minus disk; an inscribed polygon with edges ≤ 2h loses at most ~ r·(2h)²/(12 r²)·2πr
      const exact = 0.6 - Math.PI * 0.15 ** 2;
      expect(Math.abs(area - exact)).toBeLessThan(2 * Math.PI * (2 * h) ** 2);
      expect(minArea).toBeGreaterThan(0.01 * h * h);
      // every node flagged on a hole lies on its circle (distance closed form)
      for (let v = 0; v < mesh.nodeCount; v++) {
        if (mesh.holeOf[v] < 0) continue;
        expect(Math.abs(Math.hypot(xy[2 * v] - 0.5, xy[2 * v + 1] - 0.3) - 0.15)).toBeLessThan(1e-12);
      }
    }
  });
});

describe("P1 manufactured solution", () => {
  it("observed L2 rate ≈ 2 over three refinements (P1 is O(h²) in L2: common practice)", () => {
    const levels = convergenceStudy(plate, 1.5, 3, denseSolve);
    for (let l = 1; l < levels.length; l++) {
      expect(levels[l].rate).toBeGreaterThan(1.8);
      expect(levels[l].rate).toBeLessThan(2.2);
    }
  });

  it("reproduces a linear field exactly (P1 contains linears: common practice)", () => {
    const mesh = meshPlate({ ...plate, h: 0.1 });
    const u = (x: number, y: number) => 2 + 3 * x - y;
    // Neumann data of a linear field is not zero on the rim, so impose Dirichlet everywhere on the rim and holes
    const onRim = (x: number, y: number) => x < 1e-12 || y < 1e-12 || x > 1 - 1e-12 || y > 0.6 - 1e-12;
    const sys = assembleP1(mesh, { kappa: 1, source: () => 0, dirichlet: (v, x, y) => (mesh.holeOf[v] >= 0 || onRim(x, y) ? u(x, y) : undefined) });
    const uh = expandSolution(sys, denseSolve(sys.matrix, sys.rhs));
    expect(l2Error(mesh, uh, u)).toBeLessThan(1e-12);
  });
});
