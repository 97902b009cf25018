/**
 * Dense rows set aside. A vertex joined to a large part of the graph (a global
 * constraint, a ground node, a bordering row) lies in every separator anyway,
 * and it defeats coarsening: no matching shrinks a star. Such vertices are
 * taken out before dissection and numbered last, as minimum degree does with
 * its dense rows (Amestoy, Davis & Duff 1996, SIAM J. Matrix Anal. Appl. 17(4));
 * the threshold max(16, 10·√n) is minimum degree's default here.
 */
import { defaultDenseThreshold } from "../minimum-degree.js";
import type { WGraph } from "./wgraph.js";

/** The vertices of g with more neighbours than the dense threshold, ascending; null when there are none. */
export function denseVertices(g: WGraph): Int32Array | null {
  const threshold = defaultDenseThreshold(g.n);
  let count = 0;
  for (let v = 0; v < g.n; v++) if (g.offsets[v + 1] - g.offsets[v] > threshold) count++;
  if (count === 0) return null;
  const dense = new Int32Array(count);
  for (let v = 0, k = 0; v < g.n; v++) if (g.offsets[v + 1] - g.offsets[v] > threshold) dense[k++] = v;
  return dense;
}

/** The vertices of 0..n−1 not in the ascending list `out`. */
export function complement(n: number, out: Int32Array): Int32Array {
  const rest = new Int32Array(n - out.length);
  for (let v = 0, j = 0, k = 0; v < n; v++) {
    if (j < out.length && out[j] === v) j++;
    else rest[k++] = v;
  }
  return rest;
}
