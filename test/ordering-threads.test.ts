/**
 * Nested dissection on helper threads. A piece's cut depends only on the seed
 * and the piece's place, so the permutation and the separator tree must be
 * exactly those of one thread, whichever thread cut which piece, whether the
 * calling thread took pieces back from a helper, and whether a helper failed
 * (its work is then redone by the caller). The reference is therefore the
 * one-thread run of the same code (a property of the design; no outside
 * result applies), and validity is checked against the definition of a
 * separator tree (no edge between sibling subtrees: George 1973) by
 * expectTreeConsistent. The helper script is built from the sources here
 * (tsup, as `npm run build` builds it into dist/).
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { build } from "tsup";
import { beforeAll, describe, expect, it } from "vitest";
import { AbortedError, InputError } from "../src/errors.js";
import { elasticity3d } from "../src/generate/elasticity.js";
import { grid2d } from "../src/generate/grids.js";
import { analyze } from "../src/solver/analyze.js";
import { adjacencyGraph } from "../src/graph/adjacency.js";
import { compressIfSmaller } from "../src/graph/compress.js";
import type { Graph } from "../src/graph/types.js";
import { validateCoordinates } from "../src/ordering/coordinates.js";
import { computeOrdering } from "../src/ordering/index.js";
import { nestedDissection, type DissectionOptions } from "../src/ordering/nested-dissection/index.js";
import { Slot, takeHelper } from "../src/ordering/nested-dissection/threads.js";
import { cubeGraph, expectPermutation, expectTreeConsistent, graphOf, gridGraph } from "./helpers/graphs.js";

let dir = "";
let script: URL;
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), "septum-helper-"));
  await build({
    entry: { "dissection-worker": "src/ordering/nested-dissection/worker.ts" }, format: ["esm"], outDir: dir, outExtension: () => ({ js: ".mjs" }),
    config: false, silent: true, dts: false, sourcemap: false, clean: false, target: "node20",
  });
  script = pathToFileURL(join(dir, "dissection-worker.mjs"));
}, 60_000);

/** Two grids (one joined to a hub vertex, with hairs hanging from it) and a separate path: several components, hairs kept out of the cuts. */
function awkwardGraph(): Graph {
  const k = 90, n = 2 * k * k + 1 + 300 + 200;
  return graphOf(n, (e) => {
    for (let b = 0; b < 2; b++) {
      for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
        const v = b * k * k + y * k + x;
        if (x + 1 < k) e(v, v + 1);
        if (y + 1 < k) e(v, v + k);
      }
    }
    const hub = 2 * k * k;
    for (let v = 0; v < k * k; v += 5) e(hub, v);
    for (let i = 0; i < 300; i++) e(hub + 1 + i, i < 150 ? 7 * i : hub + i); // hairs: single vertices and a chain
    for (let i = 1; i < 200; i++) e(hub + 301 + i - 1, hub + 301 + i);
  });
}

function expectSame(g: Graph, o: DissectionOptions, threads: number): void {
  const one = nestedDissection(g, { ...o, threads: 1 });
  const many = nestedDissection(g, { ...o, threads, helperScript: script });
  expect(many.threads).toBeGreaterThan(1); // helpers really ran
  expectPermutation(many.permutation, g.n);
  expectTreeConsistent(g, many.permutation, many.separatorTree);
  expect(many.permutation).toEqual(one.permutation);
  expect(many.separatorTree).toEqual(one.separatorTree);
}

describe("nested dissection on helper threads", () => {
  it("gives the one-thread permutation and tree on a 2-D grid, 2 and 3 threads, several seeds", () => {
    const g = gridGraph(160);
    for (const seed of [1, 2, 3]) expectSame(g, { seed }, 2);
    expectSame(g, { seed: 4 }, 3);
  });

  it("gives the one-thread result on a 3-D grid, with coordinates, and on a weighted (compressed) elasticity graph", () => {
    const k = 26, g = cubeGraph(k);
    expectSame(g, { seed: 5 }, 2);
    const xyz = new Float64Array(3 * g.n);
    for (let v = 0; v < g.n; v++) { xyz[3 * v] = v % k; xyz[3 * v + 1] = Math.floor(v / k) % k; xyz[3 * v + 2] = Math.floor(v / (k * k)); }
    expectSame(g, { coordinates: validateCoordinates(xyz, g.n), coordinateMode: "refine" }, 2);
    const c = compressIfSmaller(adjacencyGraph(elasticity3d(14).matrix), 0.75)!;
    expectSame(c.graph, { vertexWeights: c.weights }, 2);
  });

  it("gives the one-thread result with a hub vertex, hairs and several components", () => {
    expectSame(awkwardGraph(), { seed: 2, leafSize: 64 }, 2);
  });

  it("gives the one-thread result when the calling thread only takes pieces back from a busy helper", () => {
    const g = gridGraph(140);
    const one = nestedDissection(g, { seed: 6, threads: 1 });
    const back = nestedDissection(g, { seed: 6, threads: 2, helperScript: script, keepNone: true });
    expect(back.threads).toBe(2);
    expect(back.takenBack).toBeGreaterThan(0); // the take-back path really ran
    expect(back.permutation).toEqual(one.permutation);
    expect(back.separatorTree).toEqual(one.separatorTree);
  });

  it("redoes a failed helper's pieces on the calling thread, with the same result", () => {
    const failing = join(dir, "failing-helper.mjs");
    writeFileSync(failing, `import { workerData } from "node:worker_threads";
const { control, port } = workerData;
Atomics.store(control, ${Slot.Started}, 1);
port.on("message", () => {
  port.postMessage({ error: "this helper always fails" });
  Atomics.store(control, ${Slot.State}, 2);
  Atomics.add(control, ${Slot.Event}, 1);
  Atomics.notify(control, ${Slot.Event});
});
`);
    const g = gridGraph(120);
    const one = nestedDissection(g, { threads: 1 });
    const r = nestedDissection(g, { threads: 2, helperScript: pathToFileURL(failing) });
    expect(r.threads).toBe(1);
    expect(r.permutation).toEqual(one.permutation);
    expect(r.separatorTree).toEqual(one.separatorTree);
  });

  it("gives up a helper script that never starts, once: same result, and the script is not tried again", () => {
    const broken = join(dir, "broken-helper.mjs");
    writeFileSync(broken, `throw new Error("this helper script cannot start");\n`);
    const url = pathToFileURL(broken);
    const g = gridGraph(100);
    const one = nestedDissection(g, { threads: 1 });
    const r = nestedDissection(g, { threads: 2, helperScript: url }); // waits for the start-up limit, then cuts alone
    expect(r.threads).toBe(1);
    expect(r.permutation).toEqual(one.permutation);
    expect(takeHelper(url)).toBeNull(); // remembered for the rest of the process
  }, 30_000);

  it("stops on an aborted signal while helpers work, and helpers serve the next call", () => {
    const g = gridGraph(150);
    const controller = new AbortController();
    expect(() => nestedDissection(g, {
      threads: 2, helperScript: script, signal: controller.signal, onProgress: (f) => { if (f > 0.3) controller.abort(); },
    })).toThrow(AbortedError);
    expectSame(g, { seed: 9 }, 2);
  });

  it("reports progress that rises to 1 and never beyond", () => {
    const seen: number[] = [];
    nestedDissection(gridGraph(150), { threads: 2, helperScript: script, onProgress: (f) => seen.push(f) });
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1] - 1e-12);
    expect(Math.max(...seen)).toBeLessThanOrEqual(1);
    expect(seen[seen.length - 1]).toBe(1);
  });
});

describe("threads option of computeOrdering", () => {
  it("rejects a thread count that is not an integer in 1..256, naming it, whatever the ordering", () => {
    const g = gridGraph(20);
    for (const threads of [0, -1, 1.5, Number.NaN, 257]) {
      for (const ordering of ["nested-dissection", "minimum-degree"] as const) {
        expect(() => computeOrdering(g, { ordering, threads })).toThrow(InputError);
      }
    }
    expect(() => computeOrdering(g, { ordering: "nested-dissection", threads: 1.5 })).toThrow(/threads must be an integer in 1\.\.256, got 1\.5/);
  });

  it("is passed on by analyze, which rejects a bad count the same way", () => {
    const A = grid2d(30).matrix;
    expect(() => analyze(A, { ordering: "nested-dissection", threads: 0 })).toThrow(/threads must be an integer in 1\.\.256, got 0/);
    expect(analyze(A, { ordering: "nested-dissection", threads: 2 }).permutation).toEqual(analyze(A, { ordering: "nested-dissection", threads: 1 }).permutation);
  });

  it("runs on this thread where no helper script is found (the sources, not the bundle), with the same ordering", () => {
    const g = gridGraph(60);
    const r = computeOrdering(g, { ordering: "nested-dissection", threads: 2 });
    expect(r.threads).toBe(1);
    expect(r.permutation).toEqual(computeOrdering(g, { ordering: "nested-dissection", threads: 1 }).permutation);
  });
});
