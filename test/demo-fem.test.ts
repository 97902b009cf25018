import { describe, expect, it } from "vitest";
import fc from "fast-check";
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

describe("mesher and assembly properties (fast-check)", () => {
  /** Random plates with up to two holes, sized and placed so that the mesher accepts every one. */
  const plates = fc.record({
    width: fc.double({ min: 0.5, max: 2, noNaN: true }),
    height: fc.double({ min: 0.5, max: 2, noNaN: true }),
    fh: fc.double({ min: 0.03, max: 0.06, noNaN: true }),
    holes: fc.array(fc.record({ dx: fc.double({ min: -0.05, max: 0.05, noNaN: true }), fy: fc.double({ min: 0.35, max: 0.65, noNaN: true }), fr: fc.double({ min: 0.07, max: 0.12, noNaN: true }) }), { minLength: 1, maxLength: 2 }),
  }).map((p) => {
    const s = Math.min(p.width, p.height);
    return {
      width: p.width, height: p.height, h: p.fh * s,
      holes: p.holes.map((o, k) => ({ x: (0.25 + 0.5 * k + o.dx) * p.width, y: o.fy * p.height, r: o.fr * s })),
    };
  });

  it("every edge is shared by two triangles or lies on the rim or on a circle; areas are positive and add up", () => {
    fc.assert(fc.property(plates, (spec) => {
      const mesh = meshPlate(spec);
      const xy = mesh.coords, T = mesh.triangles;
      const edges = new Map<string, number>();
      let area = 0;
      for (let t = 0; t < T.length; t += 3) {
        const [i, j, k] = [T[t], T[t + 1], T[t + 2]];
        const a = ((xy[2 * j] - xy[2 * i]) * (xy[2 * k + 1] - xy[2 * i + 1]) - (xy[2 * k] - xy[2 * i]) * (xy[2 * j + 1] - xy[2 * i + 1])) / 2;
        expect(a).toBeGreaterThan(0);
        area += a;
        for (const [p, q] of [[i, j], [j, k], [k, i]]) {
          const key = `${Math.min(p, q)},${Math.max(p, q)}`;
          edges.set(key, (edges.get(key) ?? 0) + 1);
        }
      }
      const onRim = (v: number) => Math.min(xy[2 * v], xy[2 * v + 1], spec.width - xy[2 * v], spec.height - xy[2 * v + 1]) < 1e-9;
      for (const [key, count] of edges) {
        expect(count).toBeLessThanOrEqual(2);
        if (count === 2) continue;
        const [p, q] = key.split(",").map(Number);
        // a boundary edge: both ends on the rim, or both on the same circle
        expect((onRim(p) && onRim(q)) || (mesh.holeOf[p] >= 0 && mesh.holeOf[p] === mesh.holeOf[q])).toBe(true);
      }
      // closed form: rectangle minus disks, up to the chord error of the circles (≤ perimeter × (edge length)² / (8 r))
      const exact = spec.width * spec.height - spec.holes.reduce((s, o) => s + Math.PI * o.r * o.r, 0);
      const chord = spec.holes.reduce((s, o) => s + (2 * Math.PI * o.r * (2 * spec.h) ** 2) / (8 * o.r), 0);
      expect(Math.abs(area - exact)).toBeLessThanOrEqual(chord + 1e-9);
    }), { numRuns: 40 });
  });

  it("without Dirichlet nodes the P1 stiffness is symmetric and annihilates constants (common practice)", () => {
    fc.assert(fc.property(plates, fc.double({ min: 0.1, max: 10, noNaN: true }), (spec, kappa) => {
      const mesh = meshPlate(spec);
      const sys = assembleP1(mesh, { kappa, source: () => 0, dirichlet: () => undefined });
      const { n, rows, cols, values } = sys.matrix;
      const rowSum = new Float64Array(n), sym = new Map<string, number>();
      let scale = 0;
      for (let e = 0; e < rows.length; e++) {
        rowSum[rows[e]] += values[e];
        scale = Math.max(scale, Math.abs(values[e]));
        const key = `${rows[e]},${cols[e]}`;
        sym.set(key, (sym.get(key) ?? 0) + values[e]);
      }
      for (const s of rowSum) expect(Math.abs(s)).toBeLessThan(64 * Number.EPSILON * scale);
      for (const [key, v] of sym) {
        const [i, j] = key.split(",");
        expect(sym.get(`${j},${i}`)).toBe(v);
      }
    }), { numRuns: 25 });
  });
});
