/**
 * Recursive coordinate bisection (Berger & Bokhari 1987, "A partitioning
 * strategy for nonuniform problems on multiprocessors", IEEE Trans. Comput.
 * C-36(5); Simon 1991, "Partitioning of unstructured problems for parallel
 * processing", Comput. Systems Eng. 2): cut a piece of the mesh at the weighted
 * median of its coordinate with the largest spread. The vertex separator is then
 * taken from the cut edges like any other edge bisection.
 */
import { InputError } from "../errors.js";
import type { WGraph } from "./nested-dissection/wgraph.js";

/** Node coordinates: d values per vertex, vertex v at values[d·v .. d·v + d). */
export interface Coordinates {
  readonly dimension: 2 | 3;
  readonly values: Float64Array;
}

/** Checks coordinates for an n-vertex graph; the error names the first bad entry. */
export function validateCoordinates(values: Float64Array, n: number): Coordinates {
  if (!(values instanceof Float64Array)) throw new InputError("coordinates must be a Float64Array");
  if (n === 0) {
    if (values.length !== 0) throw new InputError(`coordinates has length ${values.length}; expected 0 for an empty graph`);
    return { dimension: 2, values };
  }
  const d = values.length / n;
  if (d !== 2 && d !== 3) {
    throw new InputError(`coordinates has length ${values.length}; expected 2·n = ${2 * n} or 3·n = ${3 * n} for n = ${n}`);
  }
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) {
      throw new InputError(`coordinates[${i}] (vertex ${Math.floor(i / d)}, axis ${i % d}) is not finite: ${values[i]}`);
    }
  }
  return { dimension: d, values };
}

/**
 * Splits the vertices of g (whose ids in the coordinate array are `ids`) at
 * the weighted median of the axis with the largest extent: label 0 below, 1 above.
 */
export function coordinateCut(g: WGraph, ids: Int32Array, c: Coordinates): Int8Array {
  const d = c.dimension;
  const x = c.values;
  let axis = 0;
  let widest = -1;
  for (let a = 0; a < d; a++) {
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < g.n; i++) {
      const t = x[ids[i] * d + a];
      if (t < lo) lo = t;
      if (t > hi) hi = t;
    }
    if (hi - lo > widest) { widest = hi - lo; axis = a; }
  }
  const key = new Float64Array(g.n);
  for (let i = 0; i < g.n; i++) key[i] = x[ids[i] * d + axis];
  return lowerHalf(key, g.vertexWeight, g.totalWeight / 2);
}

/**
 * Labels 0 every vertex whose weight strictly before it, in the order of
 * (key, index), is below `half`, and 1 the rest: the lower half of a weighted
 * sort, found by quickselect (Hoare 1961, "Algorithm 65: Find", CACM 4(7))
 * with median-of-three pivots, in expected linear time and without sorting.
 */
function lowerHalf(key: Float64Array, weight: Int32Array, half: number): Int8Array {
  const n = key.length;
  const label = new Int8Array(n).fill(1);
  const idx = new Int32Array(n);
  for (let i = 0; i < n; i++) idx[i] = i;
  const before = (a: number, b: number): boolean => key[a] < key[b] || (key[a] === key[b] && a < b);
  let lo = 0;
  let hi = n;
  let base = 0; // weight known to come before idx[lo..hi)
  while (lo < hi) {
    swap(idx, medianOfThree(idx, lo, (lo + hi) >> 1, hi - 1, before), hi - 1);
    const p = idx[hi - 1];
    let m = lo;
    let lighter = 0;
    for (let k = lo; k < hi - 1; k++) {
      if (before(idx[k], p)) { lighter += weight[idx[k]]; swap(idx, k, m++); }
    }
    swap(idx, m, hi - 1);
    if (base + lighter < half) {
      for (let k = lo; k <= m; k++) label[idx[k]] = 0;
      base += lighter + weight[p];
      lo = m + 1;
    } else {
      hi = m;
    }
  }
  return label;
}

function swap(a: Int32Array, i: number, j: number): void {
  const t = a[i]; a[i] = a[j]; a[j] = t;
}

/** The position among i, j, k holding the median of their entries. */
function medianOfThree(idx: Int32Array, i: number, j: number, k: number, before: (a: number, b: number) => boolean): number {
  const a = idx[i], b = idx[j], c = idx[k];
  if (before(a, b)) return before(b, c) ? j : before(a, c) ? k : i;
  return before(a, c) ? i : before(b, c) ? k : j;
}
