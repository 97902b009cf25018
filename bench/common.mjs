// Shared helpers for benchmarks: model problems, medians, table printing.
// Benchmarks import the built package (run `npm run build` first).
import { SparseMatrix } from "../dist/index.js";

/** Median of numbers. */
export function median(xs) {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Run fn `runs` times; medians of wall and process-CPU seconds, and the last result. */
export function measure(fn, runs = 3) {
  const wall = [], cpu = [];
  let result;
  for (let r = 0; r < runs; r++) {
    const c0 = process.cpuUsage(), t0 = performance.now();
    result = fn();
    const c = process.cpuUsage(c0);
    wall.push((performance.now() - t0) / 1000);
    cpu.push((c.user + c.system) / 1e6);
  }
  return { wall: median(wall), cpu: median(cpu), result };
}

/**
 * CPU seconds of one breadth-first sweep over graph g (median of 7): the
 * cheapest pass that touches every vertex and adjacency entry, used as the
 * unit in which ordering times are compared across machines and loads.
 */
export function sweepSeconds(g) {
  const order = new Int32Array(g.n), seen = new Uint8Array(g.n);
  const sweep = () => {
    seen.fill(0);
    for (let s = 0; s < g.n; s++) {
      if (seen[s]) continue;
      let head = 0, tail = 1;
      order[0] = s; seen[s] = 1;
      while (head < tail) {
        const v = order[head++];
        for (let p = g.offsets[v]; p < g.offsets[v + 1]; p++) {
          const u = g.neighbours[p];
          if (!seen[u]) { seen[u] = 1; order[tail++] = u; }
        }
      }
    }
  };
  return Math.max(1e-6, measure(sweep, 7).cpu);
}

/** 5-point Laplacian on a k×k grid, lower triangle. */
export function grid2d(k) {
  const n = k * k, nz = n + 2 * k * (k - 1);
  const r = new Int32Array(nz), c = new Int32Array(nz), v = new Float64Array(nz);
  let q = 0;
  for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
    const i = y * k + x;
    r[q] = i; c[q] = i; v[q++] = 4;
    if (x + 1 < k) { r[q] = i + 1; c[q] = i; v[q++] = -1; }
    if (y + 1 < k) { r[q] = i + k; c[q] = i; v[q++] = -1; }
  }
  return SparseMatrix.fromTriplets(n, n, r, c, v);
}

/** 7-point Laplacian on a k×k×k grid, lower triangle. */
export function grid3d(k) {
  const n = k * k * k, nz = n + 3 * k * k * (k - 1);
  const r = new Int32Array(nz), c = new Int32Array(nz), v = new Float64Array(nz);
  let q = 0;
  for (let z = 0; z < k; z++) for (let y = 0; y < k; y++) for (let x = 0; x < k; x++) {
    const i = (z * k + y) * k + x;
    r[q] = i; c[q] = i; v[q++] = 6;
    if (x + 1 < k) { r[q] = i + 1; c[q] = i; v[q++] = -1; }
    if (y + 1 < k) { r[q] = i + k; c[q] = i; v[q++] = -1; }
    if (z + 1 < k) { r[q] = i + k * k; c[q] = i; v[q++] = -1; }
  }
  return SparseMatrix.fromTriplets(n, n, r, c, v);
}

/** Print rows (array of objects) as an aligned text table. */
export function table(rows) {
  if (rows.length === 0) return;
  const keys = Object.keys(rows[0]);
  const cells = [keys, ...rows.map((r) => keys.map((k) => fmt(r[k])))];
  const widths = keys.map((_, i) => Math.max(...cells.map((row) => String(row[i]).length)));
  for (const row of cells) console.log(row.map((x, i) => String(x).padStart(widths[i])).join("  "));
}

function fmt(x) {
  if (typeof x !== "number") return String(x);
  if (Number.isInteger(x)) return x.toLocaleString("en-US");
  return Math.abs(x) >= 100 ? x.toFixed(1) : Math.abs(x) >= 1 ? x.toFixed(3) : x.toPrecision(3);
}
