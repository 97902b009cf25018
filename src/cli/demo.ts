/**
 * `septum demo`: steady heat conduction in a cooling plate under a battery
 * module — an illustrative scenario with invented data (src/fem/battery.ts).
 * Meshes the plate, assembles P1 elements, solves with every ordering,
 * verifies the discretization on a manufactured solution, and writes the
 * report and a temperature picture.
 */
import type { SparseMatrix } from "../matrix/sparse.js";
import { symmetricMultiply } from "../matrix/symmetric.js";
import { analyze } from "../solver/analyze.js";
import { batteryHeat, batteryPlate, BATTERY_PLATE } from "../fem/battery.js";
import { convergenceStudy } from "../fem/manufactured.js";
import { meshPlate } from "../fem/mesh.js";
import { assembleP1, heatBalance, expandSolution, lowerMatrix, unknownCoordinates, type P1Problem, type Triplets } from "../fem/p1.js";
import { fieldSvg } from "../report/field.js";
import { renderReport } from "../report/page.js";
import { ORDERINGS, numberOption, shortOrderingName, type Parsed } from "./options.js";
import { progressLine, type ProgressLine } from "./progress.js";
import { progressCallback } from "./pipeline.js";
import { writeText } from "./files.js";
import { reportInput } from "./report.js";
import type { Analysed } from "./analyze.js";
import { compareTable } from "./analyze.js";
import { num, sci, secs, table } from "./format.js";
import type { CliIO } from "./io.js";

/** Solve an assembled system with nested dissection (used by the refinement study). */
function directSolve(t: Triplets, b: Float64Array): Float64Array {
  const A = lowerMatrix(t);
  return analyze(A, { ordering: "nested-dissection" }).factor(A).solve(b);
}

const INTRO = (P: typeof BATTERY_PLATE) => `septum demo — steady heat conduction in a battery cooling plate
ILLUSTRATIVE SCENARIO WITH INVENTED DATA: not a model of any real product; a small
residual does not validate a model. Results that feed design decisions must be checked
by qualified people under local codes and licensed practice.

Plate ${P.width * 1000} × ${P.height * 1000} mm, ${P.thickness * 1000} mm aluminium (k = ${P.conductivity} W/(m·K)), ${P.cells.length} cells
(${P.cells.reduce((s, c) => s + c.watts, 0)} W in total), ${P.channels.length} coolant channels held at ${P.coolantTemperature} °C, rim insulated.
`;

/** The plate meshed at spacing h, its P1 system, and the coordinates of the unknowns. */
function plateSystem(h: number) {
  const P = BATTERY_PLATE;
  const mesh = meshPlate(batteryPlate(h));
  const problem: P1Problem = {
    kappa: P.conductivity * P.thickness,
    source: batteryHeat,
    dirichlet: (v) => (mesh.holeOf[v] >= 0 ? P.coolantTemperature : undefined),
  };
  const system = assembleP1(mesh, problem);
  const A = lowerMatrix(system.matrix);
  // node coordinates of the unknowns: nested dissection uses them to seed its cuts
  const coordinates = unknownCoordinates(mesh, system);
  return { mesh, problem, system, A, coordinates };
}

/** Analyze, factor and solve with every ordering; returns the nested-dissection solution too. */
function solveEveryWay(io: CliIO, A: SparseMatrix, b: Float64Array, coordinates: Float64Array, line: ProgressLine) {
  const list: Analysed[] = [], factorSeconds: number[] = [];
  let x: Float64Array = new Float64Array(0);
  for (const ordering of ORDERINGS) {
    const label = `${shortOrderingName(ordering)}:`;
    const ta = io.now();
    const analysis = analyze(A, { ordering, coordinates, onProgress: progressCallback(line, `${label} `) });
    const tb = io.now();
    const F = analysis.factor(A, { onProgress: progressCallback(line, `${label} `) });
    const tc = io.now();
    const xo = F.solve(b);
    checkResidual(A, xo, b, ordering);
    list.push({ ordering, analysis, seconds: tb - ta });
    factorSeconds.push(tc - tb);
    if (ordering === "nested-dissection") x = xo;
  }
  line.done();
  return { list, factorSeconds, x };
}

/** Hottest point and heat balance, as text. */
function temperatureSummary(plate: ReturnType<typeof plateSystem>, u: Float64Array): string {
  const { load, outflow } = heatBalance(plate.mesh, plate.problem, plate.system, u);
  const total = BATTERY_PLATE.cells.reduce((s, c) => s + c.watts, 0);
  let hot = 0, cold = 0;
  for (let v = 0; v < u.length; v++) { if (u[v] > u[hot]) hot = v; if (u[v] < u[cold]) cold = v; }
  const xy = plate.mesh.coords;
  const cellMax = BATTERY_PLATE.cells.map((c) => {
    let m = -Infinity;
    for (let v = 0; v < u.length; v++) {
      const x = xy[2 * v], y = xy[2 * v + 1];
      if (x >= c.x && x <= c.x + c.w && y >= c.y && y <= c.y + c.h) m = Math.max(m, u[v]);
    }
    return m;
  });
  const perCell = cellMax.map((m, i) => `cell ${i + 1} ${m.toFixed(1)}`).join(", ");
  return `Temperature: ${u[cold].toFixed(2)} … ${u[hot].toFixed(2)} °C, hottest at (${(xy[2 * hot] * 1000).toFixed(0)}, ${(xy[2 * hot + 1] * 1000).toFixed(0)}) mm.
Hottest point under each cell (°C): ${perCell}.
Heat balance: ${load.toFixed(3)} W deposited (nominal ${total} W; the patch edges cut through triangles), ${outflow.toFixed(3)} W leave through the channels (relative gap ${sci(Math.abs(outflow - load) / load)}).

`;
}

/** The manufactured-solution study as terminal text and as an HTML table. */
function verification() {
  const P = BATTERY_PLATE;
  const study = convergenceStudy(batteryPlate(0.006), P.conductivity * P.thickness, 3, directSolve);
  const cells = study.map((l) => [(l.h * 1000).toFixed(2), num(l.unknowns), sci(l.error), Number.isNaN(l.rate) ? "" : l.rate.toFixed(2)]);
  const text = `Verification (manufactured solution u = cos(πx/W)·cos(πy/H), same plate and channels;
P1 elements should converge as O(h²) in L2 — common practice):
${table(["h (mm)", "unknowns", "L2 error", "rate"], cells)}
`;
  const rows = cells.map((r) => `<tr>${r.map((c) => `<td class="num">${c}</td>`).join("")}</tr>`).join("");
  const html = `<table class="cmp" style="width:auto"><thead><tr><th class="num">h (mm)</th><th class="num">unknowns</th><th class="num">L2 error</th><th class="num">observed rate</th></tr></thead><tbody>${rows}</tbody></table>
<p class="note">Manufactured solution u = cos(πx/W)·cos(πy/H) on the same plate and channels; P1 elements converge as O(h²) in L2 (common practice), so the rate should be close to 2.</p>`;
  return { text, html };
}

/** The temperature picture: the field, the cell patches and the channels. */
function temperaturePicture(plate: ReturnType<typeof plateSystem>, u: Float64Array): string {
  const P = BATTERY_PLATE;
  return fieldSvg({
    coords: plate.mesh.coords, triangles: plate.mesh.triangles, values: u, width: P.width, height: P.height,
    title: "Temperature of the cooling plate (illustrative scenario, invented data)", unit: "°C",
    boxes: P.cells.map((c, i) => ({ x: c.x, y: c.y, w: c.w, h: c.h, label: `cell ${i + 1}: ${c.watts} W` })),
    circles: P.channels,
  });
}

export function demoCommand(io: CliIO, p: Parsed): number {
  const dir = String(p.values.output ?? "septum-demo");
  const h = numberOption("size", p.values.size, 1.5, 0.3, 6, false) / 1000;
  const line = progressLine(io, io.stderrIsTTY && !p.values.quiet);
  io.stdout(INTRO(BATTERY_PLATE));
  const t0 = io.now();
  const plate = plateSystem(h);
  const { mesh, A } = plate;
  io.stdout(`Mesh: ${num(mesh.nodeCount)} nodes, ${num(mesh.triangles.length / 3)} triangles (h = ${(h * 1000).toFixed(2)} mm); ${num(A.ncols)} unknowns after the channel nodes are eliminated  [${secs(io.now() - t0)}]\n\n`);
  const solved = solveEveryWay(io, A, plate.system.rhs, plate.coordinates, line);
  io.stdout(`Every ordering solves the same system; they differ in fill and work:\n${compareTable(solved.list, solved.factorSeconds)}\n`);
  const u = expandSolution(plate.system, solved.x);
  io.stdout(temperatureSummary(plate, u));
  const check = verification();
  io.stdout(check.text);
  const picture = temperaturePicture(plate, u);
  writeText(io, `${dir}/temperature.svg`, picture);
  const input = reportInput("septum demo: battery cooling plate", `P1 stiffness matrix of the plate mesh, n = ${A.ncols} (illustrative scenario, invented data)`, A, solved.list, "nested-dissection", solved.factorSeconds);
  writeText(io, `${dir}/report.html`, renderReport({ ...input, extraSections: [
    { title: "Temperature field (illustrative scenario, invented data)", html: picture },
    { title: "Verification of the discretization", html: check.html },
  ] }));
  io.stdout(`Wrote ${dir}/report.html and ${dir}/temperature.svg  [total ${secs(io.now() - t0)}]\n`);
  return 0;
}

function checkResidual(A: SparseMatrix, x: Float64Array, b: Float64Array, ordering: string): void {
  const r = symmetricMultiply(A, x);
  let rr = 0, bb = 0;
  for (let i = 0; i < r.length; i++) { rr += (b[i] - r[i]) ** 2; bb += b[i] ** 2; }
  if (!(Math.sqrt(rr / bb) < 1e-8)) throw new Error(`demo: ${ordering} gave relative residual ${Math.sqrt(rr / bb)}`);
}
