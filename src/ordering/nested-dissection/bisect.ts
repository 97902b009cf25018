/**
 * Initial bisection of the coarsest graph by greedy graph growing (Karypis &
 * Kumar 1998, SIAM J. Sci. Comput. 20(1), §3.2): grow part 0 from a seed,
 * always adding the frontier vertex that lowers the edge cut most, until it
 * holds half the weight (or another given fraction); refine each try by FM and
 * keep the best of several seeds.
 */
import { MaxHeap } from "./heap.js";
import { evaluate, excess, refineBisection, type Bisection, type FmWork } from "./refine.js";
import type { Rng } from "./rng.js";
import type { WGraph } from "./wgraph.js";

/** Grows part 0 from `seed` to `fraction` of the total weight; returns the labelling. */
function growFrom(g: WGraph, seed: number, heap: MaxHeap, rng: Rng, fraction: number): Int8Array {
  const label = new Int8Array(g.n).fill(1);
  const target = g.totalWeight * fraction;
  let w0 = 0;
  let next = seed;
  heap.clear();
  while (w0 < target) {
    if (heap.size > 0) next = heap.pop();
    else if (next < 0 || label[next] === 0) {
      next = anyInPart1(label, rng);
      if (next < 0) break;
    }
    label[next] = 0;
    w0 += g.vertexWeight[next];
    for (let p = g.offsets[next]; p < g.offsets[next + 1]; p++) {
      const u = g.neighbours[p];
      if (label[u] === 0) continue;
      const w = 2 * g.edgeWeight[p];
      if (heap.has(u)) heap.update(u, heap.key[u] + w);
      else heap.push(u, cutGainToPart0(g, label, u));
    }
    next = -1;
  }
  heap.clear();
  return label;
}

function cutGainToPart0(g: WGraph, label: Int8Array, u: number): number {
  let gain = 0;
  for (let p = g.offsets[u]; p < g.offsets[u + 1]; p++) gain += label[g.neighbours[p]] === 0 ? g.edgeWeight[p] : -g.edgeWeight[p];
  return gain;
}

function anyInPart1(label: Int8Array, rng: Rng): number {
  const n = label.length;
  const start = n > 0 ? rng.below(n) : 0;
  for (let i = 0; i < n; i++) {
    const v = (start + i) % n;
    if (label[v] === 1) return v;
  }
  return -1;
}

/**
 * Best of `tries` bisections under the part-weight bound, each grown to
 * `fraction` of the weight (half by default) and refined.
 */
export function initialBisection(g: WGraph, rng: Rng, tries: number, maxPart: number, work: FmWork, fraction = 0.5): Bisection {
  const heap = work.heaps[0];
  let best: Bisection | null = null;
  for (let t = 0; t < tries; t++) {
    const b = evaluate(g, growFrom(g, rng.below(g.n), heap, rng, fraction), work);
    refineBisection(g, b, maxPart, 6, work);
    if (best === null || better(b, best, maxPart)) best = b;
  }
  return evaluate(g, best!.label, work);
}

function better(a: Bisection, b: Bisection, maxPart: number): boolean {
  const ea = excess(a, maxPart);
  const eb = excess(b, maxPart);
  return ea < eb || (ea === eb && a.cut < b.cut);
}
