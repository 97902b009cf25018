/**
 * Ordering dispatch: picks the fill-reducing ordering by name, validates a
 * caller's permutation, and returns the permutation (new → original) with the
 * separator tree when nested dissection built one.
 */
import { InputError } from "../errors.js";
import type { Graph } from "../graph/types.js";
import { validateCoordinates } from "./coordinates.js";
import { minimumDegree, minimumDegreeTrusted } from "./minimum-degree.js";
import { nestedDissection } from "./nested-dissection/index.js";
import type { OrderingResult } from "./types.js";

export type OrderingChoice = "nested-dissection" | "minimum-degree" | "reverse-cuthill-mckee" | "natural" | Int32Array;

/** Options of {@link computeOrdering}. */
export interface OrderingOptions {
  ordering?: OrderingChoice;
  seed?: number;
  coordinates?: Float64Array;
  signal?: AbortSignal;
  onProgress?: (fraction: number) => void;
}

/** Below this order the default is minimum degree, above it nested dissection. */
export const DISSECTION_THRESHOLD = 200;

/** Compute the ordering requested in `options` for graph g. */
export function computeOrdering(g: Graph, options: OrderingOptions = {}): OrderingResult {
  const n = g.n;
  const choice = options.ordering ?? (n > DISSECTION_THRESHOLD ? "nested-dissection" : "minimum-degree");
  if (choice instanceof Int32Array) return { permutation: validatePermutation(choice, n), name: "user" };
  switch (choice) {
    case "natural": return { permutation: Int32Array.from({ length: n }, (_, i) => i), name: choice };
    case "minimum-degree": return { permutation: minimumDegree(g), name: choice };
    case "nested-dissection": {
      const coordinates = options.coordinates ? validateCoordinates(options.coordinates, n) : undefined;
      const r = nestedDissection(g, {
        orderLeaf: (leaf) => minimumDegreeTrusted(leaf, Infinity, true),
        seed: options.seed, coordinates, signal: options.signal, onProgress: options.onProgress,
      });
      return { ...r, name: choice };
    }
    default: throw new InputError(`ordering "${String(choice)}" is not available`);
  }
}

/** Check that p is a permutation of 0..n−1; the error names the first bad entry. */
export function validatePermutation(p: Int32Array, n: number): Int32Array {
  if (p.length !== n) throw new InputError(`ordering has length ${p.length}, expected n = ${n}`);
  const seen = new Int32Array(n).fill(-1);
  for (let k = 0; k < n; k++) {
    const v = p[k];
    if (v < 0 || v >= n) throw new InputError(`ordering[${k}] = ${v} is out of range 0..${n - 1}`);
    if (seen[v] !== -1) throw new InputError(`ordering[${k}] = ${v} repeats ordering[${seen[v]}]; not a permutation`);
    seen[v] = k;
  }
  return p;
}
