/**
 * Graph Laplacians L + δI of random geometric graphs: n points uniform in the
 * unit square (a seeded generator), joined when closer than the radius that
 * gives the requested mean degree (r = sqrt(d / (π n)), common practice).
 * The graph may fall apart into several pieces; the shift δ keeps every piece
 * positive definite (the "screened" Laplacian used in graph-based learning).
 */
import { checkSize, LowerTriplets, type ModelProblem } from "./grids.js";
import { InputError } from "../errors.js";

/** Mulberry32: a tiny seeded 32-bit generator (public-domain folklore, common practice). */
function seededRandom(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Screened Laplacian of a random geometric graph on n points. */
export function geometricLaplacian(n: number, meanDegree = 8, shift = 1e-2, seed = 1): ModelProblem {
  checkSize("laplacian size", n, 2, 5_000_000);
  if (!(meanDegree > 0 && meanDegree < n)) throw new InputError(`laplacian mean degree must be in (0, ${n}), got ${meanDegree}`);
  if (!(shift > 0)) throw new InputError(`laplacian shift must be positive, got ${shift}`);
  const rand = seededRandom(seed);
  const xy = new Float64Array(2 * n);
  for (let i = 0; i < 2 * n; i++) xy[i] = rand();
  const r = Math.sqrt(meanDegree / (Math.PI * n));
  const cells = Math.max(1, Math.floor(1 / r));
  // bucket points by cell (counting sort)
  const cellOf = new Int32Array(n), start = new Int32Array(cells * cells + 1), sorted = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const cx = Math.min(cells - 1, Math.floor(xy[2 * i] * cells)), cy = Math.min(cells - 1, Math.floor(xy[2 * i + 1] * cells));
    cellOf[i] = cy * cells + cx;
    start[cellOf[i] + 1]++;
  }
  for (let c = 0; c < cells * cells; c++) start[c + 1] += start[c];
  const fill = start.slice(0, cells * cells);
  for (let i = 0; i < n; i++) sorted[fill[cellOf[i]]++] = i;
  const degree = new Float64Array(n);
  const t = new LowerTriplets();
  for (let i = 0; i < n; i++) {
    const cx = cellOf[i] % cells, cy = (cellOf[i] - cx) / cells;
    for (let dy = -1; dy <= 1; dy++) for (let dx = -1; dx <= 1; dx++) {
      const x = cx + dx, y = cy + dy;
      if (x < 0 || y < 0 || x >= cells || y >= cells) continue;
      const c = y * cells + x;
      for (let p = start[c]; p < start[c + 1]; p++) {
        const j = sorted[p];
        if (j >= i || Math.hypot(xy[2 * i] - xy[2 * j], xy[2 * i + 1] - xy[2 * j + 1]) > r) continue;
        t.add(i, j, -1);
        degree[i]++; degree[j]++;
      }
    }
  }
  for (let i = 0; i < n; i++) t.add(i, i, degree[i] + shift);
  return {
    name: `laplacian-${n}`,
    description: `screened Laplacian (L + ${shift}·I) of a random geometric graph, ${n} vertices, mean degree ≈ ${meanDegree}, seed ${seed}`,
    matrix: t.toMatrix(n), coordinates: xy, dim: 2,
  };
}
