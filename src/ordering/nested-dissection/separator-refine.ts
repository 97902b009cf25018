/**
 * Vertex-separator refinement by Fiduccia–Mattheyses passes (Ashcraft & Liu
 * 1994, "A partition improvement algorithm for generalized nested dissection",
 * Boeing Computer Services report BCSTECH-94-020; Hendrickson & Rothberg 1998,
 * "Improving the run time and quality of nested dissection ordering", SIAM J.
 * Sci. Comput. 20(2)). A move takes separator vertex v into part t and pulls
 * its neighbours in the other part into the separator; its gain is the drop in
 * separator weight. Moves run in order of gain under a balance bound, each
 * vertex is locked once moved, and the pass rolls back to its best state.
 */
import { excess, patience, type FmWork } from "./refine.js";
import type { WGraph } from "./wgraph.js";

/** Separator state: label[v] ∈ {0, 1, 2 (separator)} and the three weights. */
export interface SeparatorState {
  label: Int8Array;
  weight: [number, number, number];
}

export function separatorState(g: WGraph, label: Int8Array): SeparatorState {
  const weight: [number, number, number] = [0, 0, 0];
  for (let v = 0; v < g.n; v++) weight[label[v]] += g.vertexWeight[v];
  return { label, weight };
}

/**
 * Queues separator vertex v in both heaps: its gain for part t is its weight
 * minus the weight of its neighbours in the other part (one adjacency scan for both).
 */
function pushBoth(g: WGraph, label: Int8Array, v: number, heaps: FmWork["heaps"]): void {
  let in0 = 0;
  let in1 = 0;
  for (let p = g.offsets[v], pe = g.offsets[v + 1]; p < pe; p++) {
    const u = g.neighbours[p];
    const l = label[u];
    if (l === 0) in0 += g.vertexWeight[u]; else if (l === 1) in1 += g.vertexWeight[u];
  }
  heaps[0].push(v, g.vertexWeight[v] - in1);
  heaps[1].push(v, g.vertexWeight[v] - in0);
}

/** Runs up to `passes` separator-refinement passes in place. */
export function refineSeparator(g: WGraph, st: SeparatorState, maxPart: number, passes: number, w: FmWork): void {
  let count = collectSeparator(g, st.label, w.separator[0]);
  for (let pass = 0; pass < passes; pass++) {
    const before = st.weight[2];
    const beforeExcess = excess(st, maxPart);
    const length = separatorPass(g, st, maxPart, w, count);
    count = updateSeparator(st.label, w, length, count);
    if (st.weight[2] >= before && excess(st, maxPart) >= beforeExcess) break;
  }
}

function collectSeparator(g: WGraph, label: Int8Array, list: Int32Array): number {
  let count = 0;
  for (let v = 0; v < g.n; v++) if (label[v] === 2) list[count++] = v;
  return count;
}

/**
 * The separator after a pass, without scanning the graph: every vertex that
 * can be in it was in it before the pass or was touched by the pass (the log).
 * Writes it to the spare list and swaps the lists; returns its size.
 */
function updateSeparator(label: Int8Array, w: FmWork, length: number, count: number): number {
  const [from, to] = w.separator;
  const { mark, log } = w;
  let c = 0;
  for (let i = 0; i < count; i++) {
    const v = from[i];
    if (label[v] === 2 && mark[v] === 0) { mark[v] = 1; to[c++] = v; }
  }
  for (let i = 0; i < length; i += 2) {
    const v = log[i];
    if (label[v] === 2 && mark[v] === 0) { mark[v] = 1; to[c++] = v; }
  }
  for (let i = 0; i < c; i++) mark[to[i]] = 0;
  to.subarray(0, c).sort(); // ascending, as a scan would list them: same ties, same result
  w.separator = [to, from];
  return c;
}

function better(st: SeparatorState, maxPart: number, bestEx: number, bestSep: number, bestImb: number): boolean {
  const ex = excess(st, maxPart);
  if (ex !== bestEx) return ex < bestEx;
  if (st.weight[2] !== bestSep) return st.weight[2] < bestSep;
  return Math.abs(st.weight[0] - st.weight[1]) < bestImb;
}

/** One pass; returns the length of the move log (in w.log) that it leaves. */
function separatorPass(g: WGraph, st: SeparatorState, maxPart: number, w: FmWork, count: number): number {
  const { heaps, moved } = w;
  const offsets = g.offsets;
  const label = st.label;
  const list = w.separator[0];
  for (let i = 0; i < count; i++) {
    const v = list[i];
    pushBoth(g, label, v, heaps);
  }
  let length = 0;
  // at least the separator's length: shifting a straight separator of a 9-point
  // grid by one layer costs 2 at its first move and regains it only at its last
  const limit = Math.max(patience(g.n), count);
  let bestEx = excess(st, maxPart);
  let bestSep = st.weight[2];
  let bestImb = Math.abs(st.weight[0] - st.weight[1]);
  let bestLen = 0;
  let sinceBest = 0;
  while (sinceBest < limit) {
    const t = pickTarget(g, st, maxPart, heaps);
    if (t < 0) break;
    const v = heaps[t].top();
    const need = length + 2 * (1 + offsets[v + 1] - offsets[v]);
    if (need > w.log.length) w.log = growLog(w.log, length, need);
    length = moveInto(g, st, v, t, w, length);
    if (better(st, maxPart, bestEx, bestSep, bestImb)) {
      bestEx = excess(st, maxPart); bestSep = st.weight[2]; bestImb = Math.abs(st.weight[0] - st.weight[1]);
      bestLen = length; sinceBest = 0;
    } else sinceBest++;
  }
  heaps[0].clear();
  heaps[1].clear();
  const log = w.log;
  for (let i = length - 2; i >= bestLen; i -= 2) {
    const v = log[i];
    st.weight[label[v]] -= g.vertexWeight[v];
    label[v] = log[i + 1];
    st.weight[label[v]] += g.vertexWeight[v];
  }
  for (let i = 0; i < length; i += 2) moved[log[i]] = 0;
  return length;
}

/** A larger copy of the first `length` entries of the log. */
function growLog(log: Int32Array, length: number, need: number): Int32Array {
  const grown = new Int32Array(Math.max(need, 2 * log.length));
  grown.set(log.subarray(0, length));
  return grown;
}

/** Part to move into: the admissible top move with the larger gain, ties to the lighter part. */
function pickTarget(g: WGraph, st: SeparatorState, maxPart: number, heaps: FmWork["heaps"]): number {
  let best = -1;
  let bestKey = -Infinity;
  for (let t = 0; t < 2; t++) {
    if (heaps[t].size === 0) continue;
    const v = heaps[t].top();
    if (st.weight[t] + g.vertexWeight[v] > maxPart && st.weight[t] >= st.weight[1 - t]) continue;
    const key = heaps[t].topKey();
    if (key > bestKey || (key === bestKey && st.weight[t] < st.weight[best])) { best = t; bestKey = key; }
  }
  return best;
}

/**
 * Moves v from the separator into part t; neighbours in the other part join
 * the separator. Logs at most 1 + degree(v) pairs at w.log[length..]; returns the new length.
 */
function moveInto(g: WGraph, st: SeparatorState, v: number, t: number, w: FmWork, length: number): number {
  const { offsets, neighbours, vertexWeight } = g;
  const { moved, log } = w;
  const label = st.label;
  const other = 1 - t;
  const into = w.heaps[t]; // the queue of moves into t
  const away = w.heaps[other]; // and into the other part
  into.remove(v);
  away.remove(v);
  moved[v] = 1;
  log[length++] = v; log[length++] = 2;
  label[v] = t;
  const wv = vertexWeight[v];
  let pulled = 0; // weight pulled from the other part into the separator
  for (let p = offsets[v], pe = offsets[v + 1]; p < pe; p++) {
    const u = neighbours[p];
    if (label[u] === 2) {
      if (away.has(u)) away.update(u, away.key[u] - wv);
      continue;
    }
    if (label[u] !== other) continue;
    log[length++] = u; log[length++] = other;
    label[u] = 2;
    const wu = vertexWeight[u];
    pulled += wu;
    // one scan of u's list: its separator neighbours now cost u's weight less to move
    // into t, and its own gains count its neighbours in each part (what pushBoth counts)
    let in0 = 0;
    let in1 = 0;
    for (let q = offsets[u], qe = offsets[u + 1]; q < qe; q++) {
      const x = neighbours[q];
      const l = label[x];
      if (l === 2) {
        if (into.has(x)) into.update(x, into.key[x] + wu);
      } else if (l === 0) in0 += vertexWeight[x]; else in1 += vertexWeight[x];
    }
    if (!moved[u]) {
      w.heaps[0].push(u, wu - in1);
      w.heaps[1].push(u, wu - in0);
    }
  }
  st.weight[2] += pulled - wv;
  st.weight[t] += wv;
  st.weight[other] -= pulled;
  return length;
}
