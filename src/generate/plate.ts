/**
 * An unstructured triangle mesh with holes as a model problem: the P1
 * stiffness matrix of the demo's cooling plate (src/fem), channels held fixed,
 * optionally with high-contrast conductivity (the cell patches `contrast`
 * times more conductive than the rest, a classic hard case for iterative
 * methods and harmless for a direct one).
 */
import { batteryHeat, batteryPlate, BATTERY_PLATE } from "../fem/battery.js";
import { meshPlate } from "../fem/mesh.js";
import { assembleP1, lowerMatrix, unknownCoordinates } from "../fem/p1.js";
import { InputError } from "../errors.js";
import { checkSize, type ModelProblem } from "./grids.js";

/** The plate meshed with k elements across its width (k ≥ 60 so the smallest channel is resolved). */
export function plateMesh2d(k: number, contrast = 1): ModelProblem {
  checkSize("mesh2d size", k, 60, 6000);
  if (!(contrast > 0 && isFinite(contrast))) throw new InputError(`mesh2d contrast must be a positive number, got ${contrast}`);
  const mesh = meshPlate(batteryPlate(BATTERY_PLATE.width / k));
  const kappa = contrast === 1 ? 1 : (x: number, y: number) => (batteryHeat(x, y) > 0 ? contrast : 1);
  const sys = assembleP1(mesh, { kappa, source: () => 0, dirichlet: (v) => (mesh.holeOf[v] >= 0 ? 0 : undefined) });
  return {
    name: `mesh2d-${k}${contrast === 1 ? "" : `-contrast${contrast}`}`,
    description: `P1 Laplacian on an unstructured triangle mesh of a plate with ${BATTERY_PLATE.channels.length} circular holes (${mesh.triangles.length / 3} triangles)${contrast === 1 ? "" : `, conductivity contrast ${contrast}`}`,
    matrix: lowerMatrix(sys.matrix), coordinates: unknownCoordinates(mesh, sys), dim: 2,
  };
}
